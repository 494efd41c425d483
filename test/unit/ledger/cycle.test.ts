import { describe, expect, it } from "vitest";
import { getCycleThrough, refuseCycle, wouldCreateCycle } from "@/lib/ledger/cycle";
import { mapHolders } from "@/lib/ledger/moves";
import type { TraceHolder, TraceMove } from "@/lib/ledger/moves";
import {
  BATCH_K,
  FEED_TANK,
  GLYCEROL_W,
  holder,
  LOT_A,
  LOT_B,
  move,
  PLANT_HOLDERS,
  PLANT_MOVES,
  PRODUCT_P,
  PRODUCT_TANK,
} from "../trace/fixtures";

// The cycle rule is our own definition (lib/ledger/cycle.ts): a non-tank holder must not receive
// material through a time-ordered chain of moves that starts with its own output.

function requireHolderMap(holders: readonly TraceHolder[]) {
  const map = mapHolders(holders);
  if (!map.ok) throw new Error(JSON.stringify(map.issues));
  return map.value;
}

const plant = requireHolderMap(PLANT_HOLDERS);
const SECOND_TANK = 11;
const tanks = requireHolderMap([...PLANT_HOLDERS, holder(SECOND_TANK, "TANK")]);

interface CycleCase {
  name: string;
  moves: TraceMove[];
  newMove: TraceMove;
  cycle: { holderId: number; moveIds: number[] } | null;
}

const CASES: CycleCase[] = [
  {
    name: "product lot charged back into the run that made it",
    moves: PLANT_MOVES.slice(0, 14),
    newMove: move(30, PRODUCT_P, BATCH_K, 1_000),
    // K → P (move 14), then P → K: K would be its own ancestor.
    cycle: { holderId: BATCH_K, moveIds: [14, 30] },
  },
  {
    name: "the same run fed its own ester through the product tank",
    moves: PLANT_MOVES,
    newMove: move(30, PRODUCT_TANK, BATCH_K, 1_000),
    // K → P (14) → product tank (21) → K.
    cycle: { holderId: BATCH_K, moveIds: [14, 21, 30] },
  },
  {
    name: "tank to tank and back again",
    moves: [...PLANT_MOVES.slice(0, 4), move(5, FEED_TANK, SECOND_TANK, 10_000)],
    newMove: move(6, SECOND_TANK, FEED_TANK, 5_000),
    cycle: null,
  },
  {
    name: "a lot receiving from a tank before its own oil went in",
    // Lot B receives from the tank at 5 s; only later (6 s) does B send to the tank.
    moves: [
      move(1, null, LOT_A, 1_000),
      move(2, LOT_A, FEED_TANK, 1_000),
      move(3, null, LOT_B, 500),
      move(5, FEED_TANK, LOT_B, 200),
    ],
    newMove: move(6, LOT_B, FEED_TANK, 700),
    cycle: null,
  },
  {
    name: "a lot receiving from a tank after its own oil went in",
    moves: [
      move(1, null, LOT_A, 1_000),
      move(2, LOT_A, FEED_TANK, 1_000),
      move(3, null, LOT_B, 500),
      move(4, LOT_B, FEED_TANK, 500),
    ],
    newMove: move(5, FEED_TANK, LOT_B, 200),
    cycle: { holderId: LOT_B, moveIds: [4, 5] },
  },
  {
    name: "a back-dated move that closes a chain running after it",
    // P → glycerol container at 20 s and the container → K at 30 s exist; K → P is booked at 15 s.
    moves: [
      move(1, null, BATCH_K, 100),
      move(2, null, PRODUCT_P, 100),
      move(20, PRODUCT_P, GLYCEROL_W, 50),
      move(30, GLYCEROL_W, BATCH_K, 10),
    ],
    newMove: move(15, BATCH_K, PRODUCT_P, 20),
    cycle: { holderId: BATCH_K, moveIds: [15, 20, 30] },
  },
  {
    name: "the same move booked between the two is not a cycle",
    // At 25 s: P's material left for the container at 20 s, before K → P; K's new material reaches P
    // after the container → K move of 30 s could carry it anywhere. No chain returns to its start.
    moves: [
      move(1, null, BATCH_K, 100),
      move(2, null, PRODUCT_P, 100),
      move(20, PRODUCT_P, GLYCEROL_W, 50),
      move(30, GLYCEROL_W, BATCH_K, 10),
    ],
    newMove: move(25, BATCH_K, PRODUCT_P, 20),
    cycle: null,
  },
  {
    name: "the same move booked after the chain closes a cycle on the product lot",
    moves: [
      move(1, null, BATCH_K, 100),
      move(2, null, PRODUCT_P, 100),
      move(20, PRODUCT_P, GLYCEROL_W, 50),
      move(30, GLYCEROL_W, BATCH_K, 10),
    ],
    newMove: move(35, BATCH_K, PRODUCT_P, 20),
    // P → container (20) → K (30) → P (35).
    cycle: { holderId: PRODUCT_P, moveIds: [20, 30, 35] },
  },
  {
    name: "an entry move never closes a cycle",
    moves: PLANT_MOVES,
    newMove: move(30, null, BATCH_K, 1_000),
    cycle: null,
  },
];

describe("getCycleThrough", () => {
  it.each(CASES)("$name", ({ moves, newMove, cycle }) => {
    expect(getCycleThrough(moves, newMove, tanks)).toEqual(cycle);
    expect(wouldCreateCycle(moves, newMove, tanks)).toBe(cycle !== null);
  });

  it("a kind listed as reusable is exempt as a cycle end", () => {
    const moves = [move(1, null, GLYCEROL_W, 100), move(2, GLYCEROL_W, PRODUCT_P, 50)];
    const back = move(3, PRODUCT_P, GLYCEROL_W, 10);
    expect(wouldCreateCycle(moves, back, plant)).toBe(true);
    // Only the product lot could close it now, and the chain does not return to it.
    expect(wouldCreateCycle(moves, back, plant, { reusableKinds: ["TANK", "WASTE_CONTAINER"] })).toBe(false);
  });

  it("refuseCycle returns TRACE.CYCLE naming the moves", () => {
    const refused = refuseCycle(PLANT_MOVES.slice(0, 14), move(30, PRODUCT_P, BATCH_K, 1_000), plant);
    expect(!refused.ok && refused.issues[0]).toMatchObject({ code: "TRACE.CYCLE", field: "moves.30.toHolderId" });
    expect(!refused.ok && refused.issues[0]?.message).toContain("14 → 30");
    expect(refuseCycle(PLANT_MOVES, move(30, null, BATCH_K, 1), plant).ok).toBe(true);
  });
});
