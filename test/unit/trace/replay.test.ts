import { describe, expect, it } from "vitest";
import { describeComposition, replayLedger, resumeReplay, traceHolder, traceMove } from "@/lib/trace/genealogy";
import { ReplaySnapshotSchema } from "@/lib/trace/genealogy.schema";
import { indexLedger, mapHolders } from "@/lib/ledger/moves";
import type { LedgerIndex, TraceHolder, TraceMove } from "@/lib/ledger/moves";
import { createReplay, restoreReplay } from "@/lib/trace/replay";
import type { ReplaySnapshot } from "@/lib/trace/replay";
import {
  BATCH_1,
  FEED_TANK,
  gramsByOrigin,
  LOT_A,
  move,
  ORIGIN_A,
  ORIGIN_B,
  ORIGIN_C,
  PLANT_HOLDERS,
  PLANT_MOVES,
  PRODUCT_TANK,
  TANK_MOVES,
  tankHolders,
} from "./fixtures";

function requireIndex(holders: readonly TraceHolder[], moves: readonly TraceMove[]): LedgerIndex {
  const index = indexLedger(holders, moves);
  if (!index.ok) throw new Error(JSON.stringify(index.issues));
  return index.value;
}

function requireHolderMap(holders: readonly TraceHolder[]) {
  const map = mapHolders(holders);
  if (!map.ok) throw new Error(JSON.stringify(map.issues));
  return map.value;
}

describe("overdraw", () => {
  it("a move drawing more than the holder holds is a returned failure naming the move and the shortfall", () => {
    // Tank holds 600 000 + 400 000 = 1 000 000 g; move 5 asks for 1 000 250 g → short by 250 g.
    const moves = [...TANK_MOVES.slice(0, 4), move(5, FEED_TANK, BATCH_1, 1_000_250)];
    const index = requireIndex(tankHolders("MIXED"), moves);
    const replayed = replayLedger(index);
    expect(replayed.ok).toBe(false);
    expect(!replayed.ok && replayed.issues).toEqual([
      expect.objectContaining({
        code: "TRACE.OVERDRAW",
        moveId: 5,
        holderId: FEED_TANK,
        shortfallG: 250,
        field: "moves.5.massG",
      }),
    ]);
    const traced = traceHolder(index, BATCH_1);
    expect(!traced.ok && traced.issues[0]).toMatchObject({ code: "TRACE.OVERDRAW", moveId: 5, shortfallG: 250 });
  });

  it("a failed move leaves the replay state untouched", () => {
    const replay = createReplay(requireHolderMap(tankHolders("FIFO")));
    for (const m of TANK_MOVES.slice(0, 4)) expect(replay.apply(m).ok).toBe(true);
    expect(replay.apply(move(5, FEED_TANK, BATCH_1, 1_000_001)).ok).toBe(false);
    expect(replay.getStockG(FEED_TANK)).toBe(1_000_000);
    expect(replay.position).toEqual({ moveId: 4, at: 4_000 });
    expect(replay.apply(move(5, FEED_TANK, BATCH_1, 1_000_000)).ok).toBe(true);
  });

  it("moves must come in ledger order", () => {
    const replay = createReplay(requireHolderMap(tankHolders("MIXED")));
    expect(replay.apply(TANK_MOVES[1] as TraceMove).ok).toBe(true);
    const early = replay.apply(TANK_MOVES[0] as TraceMove);
    expect(!early.ok && early.issues[0]).toMatchObject({ code: "TRACE.OUT_OF_ORDER", moveId: 1 });
  });
});

describe("ledger validation", () => {
  it.each([
    { name: "zero mass", moves: [move(1, null, LOT_A, 0)], code: "TRACE.INVALID_MOVE", field: "moves.1.massG" },
    {
      name: "fractional grams",
      moves: [move(1, null, LOT_A, 1.5)],
      code: "TRACE.INVALID_MOVE",
      field: "moves.1.massG",
    },
    {
      name: "unknown holder",
      moves: [move(1, null, 999, 5)],
      code: "TRACE.UNKNOWN_HOLDER",
      field: "moves.1.toHolderId",
    },
    {
      name: "self move",
      moves: [move(1, null, LOT_A, 5), move(2, LOT_A, LOT_A, 5)],
      code: "TRACE.SELF_MOVE",
      field: "moves.2.toHolderId",
    },
    {
      name: "duplicate id",
      moves: [move(1, null, LOT_A, 5), move(1, null, LOT_A, 6)],
      code: "TRACE.DUPLICATE_MOVE",
      field: "moves.1",
    },
  ])("$name is refused with $code", ({ moves, code, field }) => {
    const index = indexLedger(tankHolders("MIXED"), moves);
    expect(!index.ok && index.issues[0]).toMatchObject({ code, field });
  });

  it("orders moves by time, then id, whatever order they arrive in", () => {
    const shuffled = [...TANK_MOVES].reverse();
    const index = requireIndex(tankHolders("MIXED"), shuffled);
    expect(index.moves.map((m) => m.id)).toEqual([1, 2, 3, 4, 5, 6, 7, 8, 9]);
    // Same instant: the id breaks the tie, so the entry (id 1) comes before the draw (id 2).
    const sameInstant = requireIndex(tankHolders("MIXED"), [
      { id: 2, at: 0, fromHolderId: LOT_A, toHolderId: FEED_TANK, massG: 5 },
      { id: 1, at: 0, fromHolderId: null, toHolderId: LOT_A, massG: 5 },
    ]);
    expect(replayLedger(sameInstant).ok).toBe(true);
  });
});

describe("FIFO layers", () => {
  it("keeps one layer per receipt, oldest first, and splits the one it stops in", () => {
    const replay = createReplay(requireHolderMap(tankHolders("FIFO")));
    for (const m of TANK_MOVES.slice(0, 7)) expect(replay.apply(m).ok).toBe(true);
    // After move 5 took 500 000 g of A's 600 000 g layer: [A 100 000 (move 3)] [B 400 000 (move 4)] [C 300 000 (move 7)].
    expect(replay.getLayers(FEED_TANK).map((l) => [l.enteredByMoveId, l.parts.originIds, l.parts.grams])).toEqual([
      [3, [ORIGIN_A], [100_000]],
      [4, [ORIGIN_B], [400_000]],
      [7, [ORIGIN_C], [300_000]],
    ]);
  });
});

describe("snapshots", () => {
  const index = requireIndex(PLANT_HOLDERS, PLANT_MOVES);

  function snapshotAfter(moveCount: number): ReplaySnapshot {
    const replay = createReplay(index.holders);
    for (const m of index.moves.slice(0, moveCount)) expect(replay.apply(m).ok).toBe(true);
    // Through JSON and the schema, as it would be stored and read back.
    const parsed = ReplaySnapshotSchema.parse(JSON.parse(JSON.stringify(replay.snapshot())));
    return parsed;
  }

  it("a replay resumed from a stored snapshot ends where a full replay ends", () => {
    const full = replayLedger(index);
    const resumed = replayLedger(index, { from: snapshotAfter(12) });
    if (!full.ok || !resumed.ok) throw new Error("replay failed");
    for (const h of PLANT_HOLDERS) {
      expect(resumed.value.getComposition(h.id)).toEqual(full.value.getComposition(h.id));
    }
    expect(resumed.value.appliedCount).toBe(PLANT_MOVES.length);
  });

  it("traces from a snapshot give the same stock and the same shipment", () => {
    const from = snapshotAfter(12);
    const tank = traceHolder(index, PRODUCT_TANK, { from });
    const plain = traceHolder(index, PRODUCT_TANK);
    expect(tank.ok && plain.ok && tank.value.stock).toEqual(plain.ok && plain.value.stock);
    expect(tank.ok && tank.value.receivedSince).toEqual({ moveId: 12, at: 12_000 });
    const shipment = traceMove(index, 23, { from });
    const plainShipment = traceMove(index, 23);
    expect(shipment.ok && shipment.value).toEqual(plainShipment.ok && plainShipment.value);
    // A snapshot taken after the asked-for time is ignored rather than misused.
    const early = traceHolder(index, FEED_TANK, { at: 5_000, from: snapshotAfter(20) });
    expect(early.ok && gramsByOrigin(early.value.stock)).toEqual({ [ORIGIN_A]: 300_000, [ORIGIN_B]: 200_000 });
    expect(early.ok && early.value.receivedSince).toBeNull();
  });

  it("a snapshot no longer matching its ledger is refused as stale", () => {
    const snapshot = snapshotAfter(12);
    const backdated = requireIndex(PLANT_HOLDERS, [
      ...PLANT_MOVES,
      { id: 99, at: 500, fromHolderId: null, toHolderId: LOT_A, massG: 1 },
    ]);
    const resumed = resumeReplay(backdated, snapshot);
    expect(!resumed.ok && resumed.issues[0]?.code).toBe("TRACE.SNAPSHOT_STALE");
  });

  it("a snapshot whose mixing model differs from the holder's is refused", () => {
    const snapshot = snapshotAfter(8);
    const asFifo = requireHolderMap(
      PLANT_HOLDERS.map((h) => (h.id === FEED_TANK ? { ...h, mixing: "FIFO" as const } : h)),
    );
    const restored = restoreReplay(asFifo, snapshot);
    expect(!restored.ok && restored.issues[0]).toMatchObject({ code: "TRACE.SNAPSHOT_INVALID", holderId: FEED_TANK });
  });

  it("the snapshot holds only stocked holders with their exact grams", () => {
    const snapshot = snapshotAfter(8);
    const tank = snapshot.holders.find((h) => h.holderId === FEED_TANK);
    // MIXED tank after move 8: A 150 000, B 100 000, C 150 000 (genealogy.test.ts works it out).
    expect(tank?.layers.map((l) => [l.originIds, l.grams])).toEqual([
      [
        [ORIGIN_A, ORIGIN_B, ORIGIN_C],
        [150_000, 100_000, 150_000],
      ],
    ]);
    expect(snapshot.holders.some((h) => h.holderId === LOT_A)).toBe(false); // emptied by move 3
    // 600 000 + 400 000 + 600 000 + 400 000 + 500 000 + 300 000 + 300 000 + 400 000 = 3 500 000 g over moves 1–8
    expect(snapshot.applied).toEqual({ count: 8, massSumG: 3_500_000, last: { moveId: 8, at: 8_000 } });
  });
});

describe("describeComposition", () => {
  it("lists the largest first, then by origin id", () => {
    expect(describeComposition({ originIds: [1, 2, 3], grams: [5, 20, 5] }).origins.map((o) => o.originId)).toEqual([
      2, 1, 3,
    ]);
  });
});
