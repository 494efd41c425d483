import { randomUUID } from "node:crypto";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type { TestDb } from "./support/test-db";
import { createTestDb, PROVIDERS } from "./support/test-db";
import type { TestPlant } from "./support/plant";
import { createTestPlant } from "./support/plant";
import { importPickups } from "@/lib/feedstock/pickup.service";
import { receiveReagent } from "@/lib/batch/batch.service";
import { withIdempotencyKey } from "@/lib/ledger/transaction.store";

const row = (i: number, extra: Record<string, unknown> = {}) => ({
  code: `IMP-${i}`,
  sourceCode: "R1",
  material: "USED_COOKING_OIL",
  observedAt: "2026-03-05T09:00:00Z",
  containers: 1,
  volumeL: 50 + i,
  tempC: 15,
  idempotencyKey: randomUUID(),
  ...extra,
});

describe.each(PROVIDERS)("idempotent writes and all-or-nothing imports on %s", (provider) => {
  let t: TestDb;
  let plant: TestPlant;
  beforeAll(async () => {
    t = await createTestDb(provider);
    plant = await createTestPlant(t.db);
  });
  afterAll(async () => {
    await t.drop();
  });

  const reagent = (code: string, massKg: number) => ({
    code,
    reagent: "METHANOL",
    supplier: "S",
    strengthPct: 99.9,
    receivedAt: "2026-03-01T08:00:00Z",
    massKg,
  });

  it("records a retried write once and answers it with the original result", async () => {
    const ctx = { userId: plant.production.userId, key: "retry-key-0001", requestHash: "h1" };
    const first = await withIdempotencyKey(ctx, () => receiveReagent(t.db, plant.production, reagent("MEOH-R1", 100)));
    const second = await withIdempotencyKey(ctx, () => receiveReagent(t.db, plant.production, reagent("MEOH-R1", 100)));
    expect(first.ok && second.ok).toBe(true);
    expect(second).toEqual(first);
    expect(await t.db.reagentLot.count({ where: { code: "MEOH-R1" } })).toBe(1);
  });

  it("refuses the same key with a different request", async () => {
    const r = await withIdempotencyKey(
      { userId: plant.production.userId, key: "retry-key-0001", requestHash: "h2" },
      () => receiveReagent(t.db, plant.production, reagent("MEOH-R2", 5)),
    );
    expect(r.ok ? "ok" : r.issues[0]?.code).toBe("IDEMPOTENCY.KEY_REUSED");
    expect(await t.db.reagentLot.count({ where: { code: "MEOH-R2" } })).toBe(0);
  });

  it("answers concurrent twins once", async () => {
    // Several rounds, so a race between a twin's first read and another's commit shows up here and not in CI.
    for (let round = 0; round < 8; round++) {
      const ctx = { userId: plant.production.userId, key: `twin-key-${round}`, requestHash: "t" };
      const code = `MEOH-TWIN-${round}`;
      const results = await Promise.all(
        Array.from({ length: 8 }, () =>
          withIdempotencyKey(ctx, () => receiveReagent(t.db, plant.production, reagent(code, 7))),
        ),
      );
      expect(results.filter((r) => !r.ok)).toEqual([]);
      expect(new Set(results.map((r) => JSON.stringify(r))).size).toBe(1);
      expect(await t.db.reagentLot.count({ where: { code } })).toBe(1);
      expect(await t.db.idempotencyRecord.count({ where: { key: ctx.key } })).toBe(1);
    }
  });

  it("imports nothing when any row is bad, and names every bad row and field", async () => {
    const rows = [row(1), row(2), row(3, { volumeL: -4 }), row(4, { sourceCode: "" })];
    const r = await importPickups(t.db, plant.production, { rows });
    expect(r.ok).toBe(false);
    if (!r.ok) expect(r.issues.map((i) => i.field)).toEqual(["rows.2.volumeL", "rows.3.sourceCode"]);
    expect(await t.db.pickup.count({ where: { code: { startsWith: "IMP-" } } })).toBe(0);
    const unknown = await importPickups(t.db, plant.production, { rows: [row(5), row(6, { sourceCode: "NOPE" })] });
    expect(unknown.ok ? "ok" : unknown.issues[0]?.field).toBe("rows.1.sourceCode");
    expect(await t.db.pickup.count({ where: { code: { startsWith: "IMP-" } } })).toBe(0);
  });

  it("skips rows already stored when an import is sent again", async () => {
    const rows = Array.from({ length: 30 }, (_, i) => row(100 + i));
    const a = await importPickups(t.db, plant.production, { rows });
    const b = await importPickups(t.db, plant.production, { rows });
    expect(a.ok && a.value).toEqual({ written: 30, skipped: 0 });
    expect(b.ok && b.value).toEqual({ written: 0, skipped: 30 });
    expect(await t.db.pickup.count({ where: { code: { startsWith: "IMP-1" } } })).toBe(30);
  });
});
