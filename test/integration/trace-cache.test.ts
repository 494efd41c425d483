import { afterAll, beforeAll, describe, expect, it, vi } from "vitest";
import type { TestDb } from "./support/test-db";
import { createTestDb, PROVIDERS } from "./support/test-db";
import type { TestPlant } from "./support/plant";
import { acceptedLot, createTestPlant } from "./support/plant";
import { recordGauge, transferToTank } from "@/lib/tank/tank.service";
import { reverseMovement } from "@/lib/correction/correction.service";
import { extendTraceLedger, loadTraceLedger } from "@/lib/ledger/movement.store";
import type { TraceLedger } from "@/lib/ledger/movement.store";
import { getLedgerVersion } from "@/lib/trace/trace.store";
import { clearTraceCache, traceBackwardReport, traceForwardReport, warmTraceCache } from "@/lib/trace/trace.service";
import { requireLedgerState } from "@/lib/trace/trace-cache.service";
import { getLotFlow } from "@/lib/feedstock/lot-flow.service";
import type { Result } from "@/lib/core/result";

function value<T>(r: Result<T>): T {
  if (!r.ok) throw new Error(`expected success, got ${JSON.stringify(r.issues)}`);
  return r.value;
}

/** A ledger in a fixed order, to compare an extended one with one read whole. */
function canonical(l: TraceLedger) {
  return {
    holders: [...l.holders].sort((a, b) => a.id - b.id),
    moves: [...l.moves].sort((a, b) => a.id - b.id),
    refs: [...l.refs.values()].sort((a, b) => a.id - b.id),
    reversedPairsLeftOut: l.reversedPairsLeftOut,
    rowsRead: l.rowsRead,
    lastMoveId: l.lastMoveId,
  };
}

// Our own consistency checks: the trace cache reads only new bookings after the first full read, and
// must give exactly the answers a fresh full read gives.
describe.each(PROVIDERS)("trace cache on %s", (provider) => {
  let t: TestDb;
  let plant: TestPlant;
  const NOW = new Date("2026-03-01T12:00:00Z");

  const lot = (code: string, pickup: string, day: number) => acceptedLot(t.db, plant, { lot: code, pickup, day });

  beforeAll(async () => {
    t = await createTestDb(provider);
    plant = await createTestPlant(t.db);
    clearTraceCache();
    await lot("L-1", "PU-1", 2);
    value(
      await transferToTank(t.db, plant.production, {
        fromKind: "LOT",
        fromCode: "L-1",
        toTankCode: "T1",
        at: "2026-02-03T08:00:00Z",
        massKg: 120,
      }),
    );
  });
  afterAll(async () => {
    clearTraceCache();
    await t.drop();
  });

  it("extends a ledger with later holders and movements to exactly what a full read gives", async () => {
    const before = await loadTraceLedger(t.db, plant.siteId);
    await lot("L-2", "PU-2", 1);
    value(
      await transferToTank(t.db, plant.production, {
        fromKind: "LOT",
        fromCode: "L-2",
        toTankCode: "T1",
        at: "2026-02-02T08:00:00Z",
        massKg: 80,
      }),
    ); // dated before the earlier transfer
    const version = await getLedgerVersion(t.db, plant.siteId);
    const extended = await extendTraceLedger(t.db, plant.siteId, before, version.count);
    expect(extended).not.toBeNull();
    expect(canonical(extended as TraceLedger)).toEqual(canonical(await loadTraceLedger(t.db, plant.siteId)));
    // A count that does not add up (rows committed under lower ids, a restored file) means a full read.
    expect(await extendTraceLedger(t.db, plant.siteId, before, version.count + 1)).toBeNull();
  });

  it("answers after a booking exactly as a freshly built index does", async () => {
    warmTraceCache(t.db, plant.siteId, NOW);
    const first = value(await traceBackwardReport(t.db, plant.siteId, { kind: "TANK", code: "T1" }, NOW));
    expect(first.totalG).toBeGreaterThan(0);
    await lot("L-3", "PU-3", 6);
    value(
      await transferToTank(t.db, plant.production, {
        fromKind: "LOT",
        fromCode: "L-3",
        toTankCode: "T1",
        at: "2026-02-06T18:00:00Z",
        massKg: 50,
      }),
    );
    const cached = value(await traceBackwardReport(t.db, plant.siteId, { kind: "TANK", code: "T1" }, NOW));
    const cachedFlow = await getLotFlow(
      t.db,
      plant.siteId,
      (await t.db.feedstockLot.findFirstOrThrow({ where: { code: "L-1" } })).holderId,
      NOW,
    );
    const cachedForward = value(await traceForwardReport(t.db, plant.siteId, { kind: "LOT", code: "L-3" }, NOW));
    clearTraceCache();
    const fresh = value(await traceBackwardReport(t.db, plant.siteId, { kind: "TANK", code: "T1" }, NOW));
    const freshFlow = await getLotFlow(
      t.db,
      plant.siteId,
      (await t.db.feedstockLot.findFirstOrThrow({ where: { code: "L-1" } })).holderId,
      NOW,
    );
    const freshForward = value(await traceForwardReport(t.db, plant.siteId, { kind: "LOT", code: "L-3" }, NOW));
    expect(cached.totalG).toBe(first.totalG + 50_000);
    expect(cached.all.byLot).toEqual(fresh.all.byLot);
    expect(cached.origins).toEqual(fresh.origins);
    expect(cachedFlow).toEqual(freshFlow);
    expect(cachedForward.holders).toEqual(freshForward.holders);
    expect(cachedForward.holders.find((h) => h.holder.kind === "TANK")?.heldG).toBe(50_000);
  });

  it("reads the ledger whole again when a new movement reverses an earlier one", async () => {
    const before = await loadTraceLedger(t.db, plant.siteId);
    const transfer = await t.db.movement.findFirstOrThrow({ where: { role: "TRANSFER" }, orderBy: { id: "desc" } });
    value(
      await reverseMovement(t.db, plant.production, { movementId: transfer.id, reason: "Booked into the wrong tank" }),
    );
    const version = await getLedgerVersion(t.db, plant.siteId);
    expect(await extendTraceLedger(t.db, plant.siteId, before, version.count)).toBeNull();
    const after = value(await traceBackwardReport(t.db, plant.siteId, { kind: "TANK", code: "T1" }, NOW));
    clearTraceCache();
    const fresh = value(await traceBackwardReport(t.db, plant.siteId, { kind: "TANK", code: "T1" }, NOW));
    expect(after.all.byLot).toEqual(fresh.all.byLot);
    expect(after.all.byLot.find((r) => r.lotCode === "L-3")).toBeUndefined();
  });

  it("keeps its index while the ledger position stands, through a change that moves nothing, and not past a booking", async () => {
    const first = value(await requireLedgerState(t.db, plant.siteId, NOW));
    // Same position: answered without counting the site's movements.
    const counted = vi.spyOn(t.db.movement, "aggregate");
    expect(value(await requireLedgerState(t.db, plant.siteId, NOW))).toBe(first);
    expect(counted).not.toHaveBeenCalled();
    // A gauge reading writes an audit event and no movement: the position moves, the movements do not.
    value(
      await recordGauge(t.db, plant.production, { tankCode: "T1", at: "2026-02-20T08:00:00Z", volumeL: 10, tempC: 20 }),
    );
    const afterGauge = value(await requireLedgerState(t.db, plant.siteId, NOW));
    expect(afterGauge).toBe(first);
    expect(counted).toHaveBeenCalledTimes(1);
    counted.mockRestore();
    expect(afterGauge.position?.auditSeq).toBeGreaterThan(0);
    await lot("L-4", "PU-4", 7);
    const afterLot = value(await requireLedgerState(t.db, plant.siteId, NOW));
    expect(afterLot).not.toBe(first);
    expect(afterLot.version.count).toBeGreaterThan(first.version.count);
    expect(afterLot.version).toEqual(await getLedgerVersion(t.db, plant.siteId));
  });
});
