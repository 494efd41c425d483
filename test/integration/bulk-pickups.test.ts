import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type { TestDb } from "./support/test-db";
import { createTestDb, PROVIDERS } from "./support/test-db";
import type { TestPlant } from "./support/plant";
import { createTestPlant } from "./support/plant";
import { importPickupRows, importPickups, recordPickup } from "@/lib/feedstock/pickup.service";
import { loadChain } from "@/lib/audit/audit.store";
import { verifyChain } from "@/lib/audit/chain";
import { closePeriod, openPeriod } from "@/lib/period/period.service";

// The bulk pickup writer must leave exactly what one recordPickup per row leaves: the same pickup,
// holder stock, RECEIPT movement and audit event per row, the chain intact (integrity.md), and refuse
// a bad row by its own row and field with nothing written.
const row = (code: string, extra: Record<string, unknown> = {}) => ({
  code,
  sourceCode: "R1",
  material: "USED_COOKING_OIL",
  observedAt: "2026-02-10T09:00:00Z",
  containers: 2,
  volumeL: 123.4,
  tempC: 21.5,
  phoneDistanceBand: "KM_10", // every column travels through both writers, the phone's distance band too
  ...extra,
});

describe.each(PROVIDERS)("bulk pickup import on %s", (provider) => {
  let t: TestDb;
  let plant: TestPlant;
  beforeAll(async () => {
    t = await createTestDb(provider);
    plant = await createTestPlant(t.db);
  });
  afterAll(async () => {
    await t.drop();
  });

  const snapshot = async (code: string) => {
    const p = await t.db.pickup.findFirstOrThrow({ where: { code }, include: { holder: true } });
    const m = await t.db.movement.findFirstOrThrow({ where: { toHolderId: p.holderId } });
    const a = await t.db.auditEvent.findFirstOrThrow({ where: { entity: "Pickup", entityKey: code } });
    const { id: _id, holderId: _h, code: _c, holder: _holder, ...pickup } = p;
    const recordedSecondsAgo = (Date.now() - m.recordedAt.getTime()) / 1000;
    return {
      pickup,
      stockG: p.holder.stockG,
      move: [
        m.role,
        m.fromHolderId,
        m.massG,
        m.volumeMl,
        m.tempC,
        m.note,
        m.reversesId,
        m.at.toISOString(),
        recordedSecondsAgo >= 0 && recordedSecondsAgo < 120,
      ],
      audit: JSON.parse(a.after) as Record<string, unknown>,
      auditAt: a.at.toISOString(),
    };
  };

  it("writes the same records as one recordPickup per row, in row order", async () => {
    const one = await recordPickup(t.db, plant.collector, row("B-ONE"));
    expect(one.ok).toBe(true);
    const bulk = await importPickupRows(t.db, plant.collector, [
      row("B-1", { containerTags: [], notes: "" }),
      row("B-2", { volumeL: 50, tempC: 40 }),
      row("B-3", { idempotencyKey: "7c0e8a52-3f1b-4c6e-9d2a-5b8e1f0a9c31" }),
      row("B-4", { idempotencyKey: "7c0e8a52-3f1b-4c6e-9d2a-5b8e1f0a9c31" }),
    ]);
    expect(bulk.ok && bulk.value).toEqual({ written: 3, skipped: 1 }); // the repeated key is skipped, not duplicated
    const a = await snapshot("B-ONE");
    const b = await snapshot("B-1");
    expect({ ...b, audit: { ...b.audit, code: "B-ONE" } }).toEqual(a);
    // Stored as the same text Prisma writes (SQLite compares dates as text, so the format must match).
    const text = await t.db.$queryRawUnsafe<Array<{ code: string; o: string; r: string }>>(
      `SELECT "code", CAST("observedAt" AS TEXT) AS "o", CAST("receivedAt" AS TEXT) AS "r" FROM "Pickup" WHERE "code" IN ('B-ONE', 'B-1') ORDER BY "code"`,
    );
    expect(text.length).toBe(2);
    expect([text[0]?.o, text[0]?.r]).toEqual([text[1]?.o, text[1]?.r]);
    expect((await snapshot("B-2")).stockG).toBeLessThan(a.stockG);
    const seqs = (
      await t.db.auditEvent.findMany({ where: { entityKey: { in: ["B-1", "B-2", "B-3"] } }, orderBy: { seq: "asc" } })
    ).map((e) => e.entityKey);
    expect(seqs).toEqual(["B-1", "B-2", "B-3"]);
    expect(verifyChain(await loadChain(t.db, plant.siteId)).ok).toBe(true);
    // A re-sent file with the same keys writes nothing new.
    const again = await importPickupRows(t.db, plant.collector, [
      row("B-3", { idempotencyKey: "7c0e8a52-3f1b-4c6e-9d2a-5b8e1f0a9c31" }),
    ]);
    expect(again.ok && again.value).toEqual({ written: 0, skipped: 1 });
  });

  it("writes thousands of rows across statement boundaries, each in full, the chain intact", async () => {
    const n = 4_000; // more rows than one multi-row statement binds (bulk-insert.ts)
    const rows = Array.from({ length: n }, (_, i) =>
      row(`M-${i}`, {
        volumeL: 10 + (i % 97),
        tempC: 5 + (i % 40),
        notes: i % 2 ? `note ${i}` : "",
        containerTags: i % 3 ? [] : [`T${i}`, `U${i}`],
        observedAt: new Date(Date.UTC(2026, 1, 10, 9) + i * 60_000).toISOString(),
      }),
    );
    const r = await importPickups(t.db, plant.collector, { rows });
    if (!r.ok) throw new Error(JSON.stringify(r.issues.slice(0, 3)));
    expect(r.value).toEqual({ written: n, skipped: 0 });
    const stored = await t.db.pickup.findMany({
      where: { code: { startsWith: "M-" } },
      include: { holder: true },
      orderBy: { id: "asc" },
    });
    expect(stored.length).toBe(n);
    const moves = new Map(
      (await t.db.movement.findMany({ where: { toHolderId: { in: stored.map((p) => p.holderId) } } })).map((m) => [
        m.toHolderId,
        m,
      ]),
    );
    for (const [i, p] of stored.entries()) {
      expect(p.code).toBe(`M-${i}`);
      expect(p.observedAt.toISOString()).toBe(rows[i]?.observedAt);
      expect(p.notes).toBe(i % 2 ? `note ${i}` : "");
      expect(p.containerTags).toBe(i % 3 ? "" : `T${i},U${i}`);
      expect(p.holder.stockG).toBe(p.massG);
      expect(moves.get(p.holderId)?.massG).toBe(p.massG);
      expect(moves.get(p.holderId)?.at.getTime()).toBe(p.observedAt.getTime());
    }
    expect(await t.db.auditEvent.count({ where: { entity: "Pickup", entityKey: { startsWith: "M-" } } })).toBe(n);
    expect(verifyChain(await loadChain(t.db, plant.siteId)).ok).toBe(true);
    // A large import refreshes the planner statistics (lib/database/maintenance.ts).
    const analysed =
      provider === "sqlite"
        ? await t.db.$queryRawUnsafe<Array<{ n: number | bigint }>>(
            `SELECT count(*) AS "n" FROM sqlite_stat1 WHERE tbl = 'Pickup'`,
          )
        : await t.db.$queryRawUnsafe<Array<{ n: number | bigint }>>(
            `SELECT count(*) AS "n" FROM pg_stat_user_tables WHERE relname = 'Pickup' AND last_analyze IS NOT NULL`,
          );
    expect(Number(analysed[0]?.n)).toBeGreaterThan(0);
  });

  it("answers a retry with the first record, and refuses the same key for a different pickup", async () => {
    const key = "2b7f4c1e-9a3d-4e8b-b6f0-1c2d3e4f5a6b";
    const first = await recordPickup(t.db, plant.collector, row("K-1", { idempotencyKey: key }));
    const retry = await recordPickup(t.db, plant.collector, row("K-1", { idempotencyKey: key }));
    expect(first.ok && retry.ok && retry.value.id === first.value.id).toBe(true);
    const other = await recordPickup(t.db, plant.collector, row("K-2", { idempotencyKey: key }));
    expect(!other.ok && other.issues[0]).toMatchObject({ code: "IDEMPOTENCY.KEY_REUSED", field: "idempotencyKey" });
    expect(await t.db.pickup.count({ where: { code: "K-2" } })).toBe(0);
  });

  it("refuses a bad row by its row and field, and writes nothing", async () => {
    const before = {
      pickups: await t.db.pickup.count(),
      moves: await t.db.movement.count(),
      audit: await t.db.auditEvent.count(),
    };
    const unknown = await importPickupRows(t.db, plant.collector, [row("C-1"), row("C-2", { sourceCode: "NOPE" })]);
    expect(!unknown.ok && unknown.issues[0]).toMatchObject({ code: "RECORD.NOT_FOUND", field: "rows.1.sourceCode" });
    const twice = await importPickupRows(t.db, plant.collector, [row("C-3"), row("C-3")]);
    expect(!twice.ok && twice.issues[0]).toMatchObject({ code: "RECORD.DUPLICATE", field: "rows.1.code" });
    const taken = await importPickupRows(t.db, plant.collector, [row("C-4"), row("B-1")]);
    expect(!taken.ok && taken.issues[0]).toMatchObject({ code: "RECORD.DUPLICATE", field: "rows.1.code" });
    expect({
      pickups: await t.db.pickup.count(),
      moves: await t.db.movement.count(),
      audit: await t.db.auditEvent.count(),
    }).toEqual(before);
  });

  it("refuses a row dated in a closed period", async () => {
    const p = await openPeriod(t.db, plant.compliance, {
      startsAt: "2026-01-01T00:00:00Z",
      endsAt: "2026-02-01T00:00:00Z",
    });
    if (!p.ok) throw new Error(JSON.stringify(p.issues));
    expect((await closePeriod(t.db, plant.compliance, { periodId: p.value.id })).ok).toBe(true);
    const r = await importPickupRows(t.db, plant.collector, [
      row("D-1"),
      row("D-2", { observedAt: "2026-01-15T09:00:00Z" }),
    ]);
    expect(!r.ok && r.issues[0]).toMatchObject({ code: "PERIOD.CLOSED", field: "rows.1.observedAt" });
    expect(await t.db.pickup.count({ where: { code: { in: ["D-1", "D-2"] } } })).toBe(0);
  });
});
