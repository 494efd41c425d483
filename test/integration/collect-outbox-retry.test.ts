import { createHash, randomUUID } from "node:crypto";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type { TestDb } from "./support/test-db";
import { createTestDb, PROVIDERS } from "./support/test-db";
import type { TestPlant } from "./support/plant";
import { createTestPlant } from "./support/plant";
import { recordPickup } from "@/lib/feedstock/pickup.service";
import { receiveLotFromPickups } from "@/lib/feedstock/lot.service";
import { withIdempotencyKey } from "@/lib/ledger/transaction.store";
import { classifyReply, newEntry } from "@/lib/collect/outbox";

// What the phone's outbox relies on at the service level: a pickup re-sent under the same key (an answer
// that was lost) is stored once and answered with the original record id; both times are kept.
describe.each(PROVIDERS)("collector outbox retries on %s", (provider) => {
  let t: TestDb;
  let plant: TestPlant;
  beforeAll(async () => {
    t = await createTestDb(provider);
    plant = await createTestPlant(t.db);
  });
  afterAll(async () => {
    await t.drop();
  });

  const body = (key: string, code: string, observedAt = "2026-03-05T06:10:00.000Z") => ({
    code,
    sourceCode: "R1",
    material: "USED_COOKING_OIL" as const,
    observedAt,
    containers: 2,
    containerTags: [] as string[],
    volumeL: 120,
    tempC: 18,
    idempotencyKey: key,
  });
  // The route runs each write under the Idempotency-Key header with the body's SHA-256, as here.
  const send = (key: string, b: unknown, now: Date) =>
    withIdempotencyKey(
      {
        userId: plant.collector.userId,
        key,
        requestHash: createHash("sha256").update(JSON.stringify(b)).digest("hex"),
      },
      () => recordPickup(t.db, { ...plant.collector, now }, b),
    );

  it("records a re-sent pickup once and answers with the same record id", async () => {
    const key = randomUUID();
    const b = body(key, "PU-OUT-1");
    const first = await send(key, b, new Date("2026-03-05T09:00:00Z"));
    const again = await send(key, b, new Date("2026-03-05T09:05:00Z"));
    const third = await recordPickup(t.db, { ...plant.collector, now: new Date("2026-03-05T09:06:00Z") }, b); // no header: the body's key still finds it
    expect(first.ok && again.ok && third.ok).toBe(true);
    if (!first.ok || !again.ok || !third.ok) return;
    expect(again.value.id).toBe(first.value.id);
    expect(third.value.id).toBe(first.value.id);
    expect(await t.db.pickup.count({ where: { idempotencyKey: key } })).toBe(1);
    const row = await t.db.pickup.findUniqueOrThrow({ where: { idempotencyKey: key } });
    expect(row.observedAt.toISOString()).toBe("2026-03-05T06:10:00.000Z"); // the phone's time
    expect(row.receivedAt.toISOString()).toBe("2026-03-05T09:00:00.000Z"); // the server's, from the first arrival
    // The phone reads the replayed answer (as JSON on the wire) as confirmation of this entry.
    const entry = newEntry(b, { userId: plant.collector.userId, login: "c", fullName: "C" }, new Date());
    expect(
      classifyReply(entry, {
        status: 200,
        body: JSON.parse(JSON.stringify({ ok: true, value: again.value })) as unknown,
      }),
    ).toMatchObject({ kind: "STORED", recordId: first.value.id });
  });

  it("stores nothing for a refused pickup, so the corrected entry under the same key is evaluated afresh", async () => {
    const key = randomUUID();
    const bad = { ...body(key, "PU-OUT-2"), sourceCode: "NOPE" };
    const r1 = await send(key, bad, new Date("2026-03-05T10:00:00Z"));
    expect(r1.ok ? "ok" : r1.issues[0]).toMatchObject({ code: "RECORD.NOT_FOUND", field: "sourceCode" });
    const fixed = body(key, "PU-OUT-2");
    const r2 = await send(key, fixed, new Date("2026-03-05T10:01:00Z"));
    expect(r2.ok).toBe(true);
    expect(await t.db.pickup.count({ where: { idempotencyKey: key } })).toBe(1);
  });

  it("pools the phone's pickups into one lot and keeps each pickup's link to it", async () => {
    const codes = ["PU-OUT-1", "PU-OUT-2"];
    const lot = await receiveLotFromPickups(
      t.db,
      { ...plant.production, now: new Date("2026-03-05T16:00:00Z") },
      {
        code: "L-OUT-1",
        material: "USED_COOKING_OIL",
        receivedAt: "2026-03-05T16:00:00Z",
        observedVolumeL: 238,
        observedTempC: 20,
        pickupCodes: codes,
      },
    );
    expect(lot.ok).toBe(true);
    const linked = await t.db.pickup.findMany({
      where: { code: { in: codes } },
      select: { lot: { select: { code: true } } },
    });
    expect(linked.map((p) => p.lot?.code)).toEqual(["L-OUT-1", "L-OUT-1"]);
  });
});
