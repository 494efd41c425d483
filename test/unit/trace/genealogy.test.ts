import { describe, expect, it } from "vitest";
import { findEntryOrigins, traceForward, traceHolder, traceMove } from "@/lib/trace/genealogy";
import { indexLedger } from "@/lib/ledger/moves";
import type { LedgerIndex, Mixing, TraceHolder, TraceMove } from "@/lib/ledger/moves";
import { groupOrigins, restrictToFeedstock } from "@/lib/trace/origin-groups";
import type { OriginInfo } from "@/lib/trace/origin-groups";
import {
  BATCH_1,
  BATCH_2,
  BATCH_3,
  BATCH_K,
  FEED_TANK,
  GLYCEROL_W,
  gramsByOrigin,
  LOSSES,
  LOT_A,
  LOT_E,
  ORIGIN_A,
  ORIGIN_B,
  ORIGIN_C,
  ORIGIN_E,
  ORIGIN_KOH,
  ORIGIN_METHANOL,
  PLANT_HOLDERS,
  PLANT_MOVES,
  PRODUCT_P,
  PRODUCT_TANK,
  SHIPMENT_S,
  TANK_MOVES,
  tankHolders,
} from "./fixtures";

// Expected values below are hand arithmetic in this file. The models are our own, stated in
// lib/trace: MIXED = a withdrawal carries every origin in proportion to its share of the vessel
// (well-mixed vessel, common practice, no source); FIFO = the oldest receipt leaves first (common
// practice, no source). Rounding: largest remainder (Hamilton) method as lib/quantity/allocate.ts
// documents — floor every exact share, then hand the spare grams to the largest fractional parts,
// ties to the lower origin id.

function requireIndex(holders: readonly TraceHolder[], moves: readonly TraceMove[]): LedgerIndex {
  const index = indexLedger(holders, moves);
  if (!index.ok) throw new Error(JSON.stringify(index.issues));
  return index.value;
}

function requireHolderTrace(index: LedgerIndex, holderId: number, at?: number) {
  const trace = traceHolder(index, holderId, at === undefined ? {} : { at });
  if (!trace.ok) throw new Error(JSON.stringify(trace.issues));
  return trace.value;
}

interface TankCase {
  name: string;
  mixing: Mixing;
  /** What each withdrawal carried, origin → grams. */
  batch1: Record<number, number>;
  batch2: Record<number, number>;
  batch3: Record<number, number>;
  /** Tank content after move 8 (at = 8 s) and at the end. */
  tankAfter8: Record<number, number>;
  tankAtEnd: Record<number, number>;
}

const TANK_CASES: TankCase[] = [
  {
    name: "MIXED",
    mixing: "MIXED",
    // Tank after moves 3–4: A 600 000 + B 400 000 = 1 000 000 g.
    // Move 5 takes 500 000 g: A 500 000·600 000/1 000 000 = 300 000; B 500 000·400 000/1 000 000 = 200 000 (exact).
    batch1: { [ORIGIN_A]: 300_000, [ORIGIN_B]: 200_000 },
    // Tank left: A 300 000, B 200 000; + C 300 000 (move 7) = 800 000 g.
    // Move 8 takes 400 000 g = exactly half of each: A 150 000, B 100 000, C 150 000.
    batch2: { [ORIGIN_A]: 150_000, [ORIGIN_B]: 100_000, [ORIGIN_C]: 150_000 },
    tankAfter8: { [ORIGIN_A]: 150_000, [ORIGIN_B]: 100_000, [ORIGIN_C]: 150_000 },
    // Move 9 takes 100 001 g of 400 000 g:
    //   A 100 001·150 000/400 000 = 37 500.375 → floor 37 500, remainder .375
    //   B 100 001·100 000/400 000 = 25 000.25  → floor 25 000, remainder .25
    //   C 100 001·150 000/400 000 = 37 500.375 → floor 37 500, remainder .375
    //   floors sum to 100 000; 1 g left; A and C tie at .375 → the lower origin id, A, gets it.
    batch3: { [ORIGIN_A]: 37_501, [ORIGIN_B]: 25_000, [ORIGIN_C]: 37_500 },
    // 150 000 − 37 501 = 112 499; 100 000 − 25 000 = 75 000; 150 000 − 37 500 = 112 500 (Σ 299 999).
    tankAtEnd: { [ORIGIN_A]: 112_499, [ORIGIN_B]: 75_000, [ORIGIN_C]: 112_500 },
  },
  {
    name: "FIFO",
    mixing: "FIFO",
    // Layers: [A 600 000] [B 400 000]. Move 5 takes 500 000 g from the A layer only: A 500 000, B 0.
    batch1: { [ORIGIN_A]: 500_000 },
    // Layers left: [A 100 000] [B 400 000] [C 300 000]. Move 8 takes 400 000 g: all of A's 100 000,
    // then 300 000 of B; C untouched.
    batch2: { [ORIGIN_A]: 100_000, [ORIGIN_B]: 300_000 },
    tankAfter8: { [ORIGIN_B]: 100_000, [ORIGIN_C]: 300_000 },
    // Layers: [B 100 000] [C 300 000]. Move 9 takes 100 001 g: B 100 000, then 1 g of C.
    batch3: { [ORIGIN_B]: 100_000, [ORIGIN_C]: 1 },
    tankAtEnd: { [ORIGIN_C]: 299_999 },
  },
];

describe("tank with two lots, a partial draw, a refill and two more draws", () => {
  it.each(TANK_CASES)("$name: each draw carries the hand-worked grams per lot", (c) => {
    const index = requireIndex(tankHolders(c.mixing), TANK_MOVES);
    expect(gramsByOrigin(requireHolderTrace(index, BATCH_1).stock)).toEqual(c.batch1);
    expect(gramsByOrigin(requireHolderTrace(index, BATCH_2).stock)).toEqual(c.batch2);
    expect(gramsByOrigin(requireHolderTrace(index, BATCH_3).stock)).toEqual(c.batch3);
    const move8 = traceMove(index, 8);
    expect(move8.ok && gramsByOrigin(move8.value)).toEqual(c.batch2);
  });

  it.each(TANK_CASES)("$name: tank content at a chosen time and at the end", (c) => {
    const index = requireIndex(tankHolders(c.mixing), TANK_MOVES);
    const after8 = requireHolderTrace(index, FEED_TANK, 8_000);
    expect(after8.asOf).toEqual({ moveId: 8, at: 8_000 });
    expect(gramsByOrigin(after8.stock)).toEqual(c.tankAfter8);
    expect(after8.stock.totalG).toBe(400_000); // 1 000 000 − 500 000 + 300 000 − 400 000
    const end = requireHolderTrace(index, FEED_TANK);
    expect(gramsByOrigin(end.stock)).toEqual(c.tankAtEnd);
    expect(end.stock.totalG).toBe(299_999); // 400 000 − 100 001
    // Everything that ever went in: 600 000 + 400 000 + 300 000, whatever the model.
    expect(gramsByOrigin(end.received)).toEqual({ [ORIGIN_A]: 600_000, [ORIGIN_B]: 400_000, [ORIGIN_C]: 300_000 });
  });

  it("MIXED: percentages are of the traced quantity", () => {
    const index = requireIndex(tankHolders("MIXED"), TANK_MOVES);
    const trace = requireHolderTrace(index, BATCH_2).stock;
    // 150 000 / 400 000 = 37.5 %, 100 000 / 400 000 = 25 %
    expect(trace.origins.map((o) => [o.originId, o.pct])).toEqual([
      [ORIGIN_A, 37.5],
      [ORIGIN_C, 37.5],
      [ORIGIN_B, 25],
    ]);
  });

  it("a tank at a time before anything entered is empty", () => {
    const index = requireIndex(tankHolders("MIXED"), TANK_MOVES);
    const trace = requireHolderTrace(index, FEED_TANK, 500);
    expect(trace.asOf).toBeNull();
    expect(trace.stock).toEqual({ totalG: 0, origins: [] });
  });
});

describe("reaction run charged from the tank plus methanol and KOH", () => {
  const index = requireIndex(PLANT_HOLDERS, PLANT_MOVES);

  // Tank after move 8 (MIXED, above): A 150 000, B 100 000, C 150 000. Move 9 charges 200 000 g =
  // half of each: A 75 000, B 50 000, C 75 000; with methanol 40 000 and KOH 2 000 the run holds 242 000 g.
  const charged = {
    [ORIGIN_A]: 75_000,
    [ORIGIN_B]: 50_000,
    [ORIGIN_C]: 75_000,
    [ORIGIN_METHANOL]: 40_000,
    [ORIGIN_KOH]: 2_000,
  };

  // Ester 200 000 g of 242 000 g, exact share = grams · 200 000 / 242 000:
  //   A 61 983.471 (r .471)  B 41 322.314 (r .314)  C 61 983.471 (r .471)
  //   methanol 33 057.851 (r .851)  KOH 1 652.893 (r .893)
  //   floors 61 983 + 41 322 + 61 983 + 33 057 + 1 652 = 199 997 → 3 g to the largest remainders:
  //   KOH, methanol, then A (ties C at .471; A has the lower origin id).
  const ester = {
    [ORIGIN_A]: 61_984,
    [ORIGIN_B]: 41_322,
    [ORIGIN_C]: 61_983,
    [ORIGIN_METHANOL]: 33_058,
    [ORIGIN_KOH]: 1_653,
  };

  // Left in the run: A 13 016, B 8 678, C 13 017, methanol 6 942, KOH 347 (Σ 42 000).
  // Glycerol phase 38 000 g, exact share = grams · 38 000 / 42 000:
  //   A 11 776.381  B 7 851.524  C 11 777.286  methanol 6 280.857  KOH 313.952
  //   floors sum to 37 997 → 3 g to KOH (.952), methanol (.857), B (.524).
  const glycerol = {
    [ORIGIN_A]: 11_776,
    [ORIGIN_B]: 7_852,
    [ORIGIN_C]: 11_777,
    [ORIGIN_METHANOL]: 6_281,
    [ORIGIN_KOH]: 314,
  };

  // The 4 000 g loss takes the rest: 13 016 − 11 776, 8 678 − 7 852, 13 017 − 11 777, 6 942 − 6 281, 347 − 314.
  const loss = { [ORIGIN_A]: 1_240, [ORIGIN_B]: 826, [ORIGIN_C]: 1_240, [ORIGIN_METHANOL]: 661, [ORIGIN_KOH]: 33 };

  it("backward trace of the product lot splits the charge in proportion", () => {
    const trace = requireHolderTrace(index, PRODUCT_P, 16_000);
    expect(gramsByOrigin(trace.stock)).toEqual(ester);
    expect(trace.stock.totalG).toBe(200_000);
    const a = trace.stock.origins.find((o) => o.originId === ORIGIN_A);
    expect(a?.pct).toBeCloseTo((61_984 / 200_000) * 100, 12); // 30.992 %
  });

  it("the run's received composition is its charge, even after it was emptied", () => {
    const trace = requireHolderTrace(index, BATCH_K);
    expect(gramsByOrigin(trace.received)).toEqual(charged);
    expect(trace.stock.totalG).toBe(0);
  });

  it("glycerol phase and loss carry the rest", () => {
    expect(gramsByOrigin(requireHolderTrace(index, GLYCEROL_W).stock)).toEqual(glycerol);
    expect(gramsByOrigin(requireHolderTrace(index, LOSSES).stock)).toEqual(loss);
  });

  it("feedstock-only view drops methanol and KOH and renormalises %", () => {
    const feedstock = new Set([ORIGIN_A, ORIGIN_B, ORIGIN_C, ORIGIN_E]);
    const trace = requireHolderTrace(index, PRODUCT_P, 16_000).stock;
    const only = restrictToFeedstock(trace, (id) => feedstock.has(id));
    expect(only.totalG).toBe(165_289); // 61 984 + 41 322 + 61 983
    expect(only.excludedG).toBe(34_711); // 33 058 + 1 653
    expect(gramsByOrigin(only)).toEqual({ [ORIGIN_A]: 61_984, [ORIGIN_B]: 41_322, [ORIGIN_C]: 61_983 });
    const pct = Object.fromEntries(only.origins.map((o) => [o.originId, o.pct]));
    expect(pct[ORIGIN_A]).toBeCloseTo((61_984 / 165_289) * 100, 12);
    expect(pct[ORIGIN_B]).toBeCloseTo((41_322 / 165_289) * 100, 12);
    expect(pct[ORIGIN_C]).toBeCloseTo((61_983 / 165_289) * 100, 12);
  });

  it("groups by source and by certified flag from caller metadata", () => {
    const info: Record<number, OriginInfo> = {
      [ORIGIN_A]: { lotId: 1, sourceId: 100, materialKind: "USED_COOKING_OIL", certified: true },
      [ORIGIN_B]: { lotId: 2, sourceId: 200, materialKind: "TALLOW", certified: false },
      [ORIGIN_C]: { lotId: 3, sourceId: 100, materialKind: "USED_COOKING_OIL", certified: true },
      [ORIGIN_METHANOL]: { materialKind: "METHANOL" },
      [ORIGIN_KOH]: { materialKind: "KOH" },
    };
    const trace = requireHolderTrace(index, PRODUCT_P, 16_000).stock;
    const bySource = groupOrigins(trace, (id) => info[id], "sourceId");
    // source 100 = A + C = 61 984 + 61 983 = 123 967; source 200 = B = 41 322;
    // no source (reagents) = 33 058 + 1 653 = 34 711; Σ 200 000.
    expect(bySource.map((g) => [g.key, g.grams])).toEqual([
      [100, 123_967],
      [200, 41_322],
      [null, 34_711],
    ]);
    expect(bySource[0]?.originIds).toEqual([ORIGIN_A, ORIGIN_C]);
    expect(bySource[0]?.pct).toBeCloseTo((123_967 / 200_000) * 100, 12);
    const byCertified = groupOrigins(trace, (id) => info[id], "certified");
    expect(byCertified.map((g) => [g.key, g.grams])).toEqual([
      [true, 123_967],
      [false, 41_322],
      [null, 34_711],
    ]);
    const byKind = groupOrigins(
      trace,
      (id) => info[id],
      (i) => (i?.materialKind === "METHANOL" || i?.materialKind === "KOH" ? "reagent" : "oil"),
    );
    expect(byKind.map((g) => [g.key, g.grams])).toEqual([
      ["oil", 165_289],
      ["reagent", 34_711],
    ]);
  });

  it("a shipment from the product tank carries half of the tank", () => {
    // Second run K2: lot E 90 000 g + methanol 10 000 g, all out as product lot Q (a full draw, no rounding).
    // Product tank = P + Q: A 61 984, B 41 322, C 61 983, methanol 33 058 + 10 000 = 43 058, KOH 1 653, E 90 000 (300 000 g).
    // Shipment 150 000 g = half: A 30 992, B 20 661, C 30 991.5, methanol 21 529, KOH 826.5, E 45 000;
    // floors sum to 149 999; 1 g to the .5 tie between C and KOH → C (lower origin id).
    const shipped = {
      [ORIGIN_A]: 30_992,
      [ORIGIN_B]: 20_661,
      [ORIGIN_C]: 30_992,
      [ORIGIN_METHANOL]: 21_529,
      [ORIGIN_KOH]: 826,
      [ORIGIN_E]: 45_000,
    };
    const byMove = traceMove(index, 23);
    expect(byMove.ok && gramsByOrigin(byMove.value)).toEqual(shipped);
    expect(byMove.ok && byMove.value.totalG).toBe(150_000);
    expect(gramsByOrigin(requireHolderTrace(index, SHIPMENT_S).received)).toEqual(shipped);
  });

  it("forward trace of lot A's origin reaches every holder it went to", () => {
    const forward = traceForward(index, [ORIGIN_A]);
    if (!forward.ok) throw new Error(JSON.stringify(forward.issues));
    // received / still held, from the hand-worked steps above:
    //   lot A 600 000 / 0; tank 600 000 / 75 000 (150 000 − 75 000 charged to K); batch 1 300 000 / 300 000;
    //   batch 2 150 000 / 150 000; K 75 000 / 0; P 61 984 / 0; glycerol 11 776 / 11 776; loss 1 240 / 1 240;
    //   product tank 61 984 / 30 992; shipment 30 992 / 30 992.
    expect(forward.value.holders.map((h) => [h.holderId, h.receivedG, h.heldG])).toEqual([
      [LOT_A, 600_000, 0],
      [FEED_TANK, 600_000, 75_000],
      [BATCH_1, 300_000, 300_000],
      [BATCH_2, 150_000, 150_000],
      [BATCH_K, 75_000, 0],
      [PRODUCT_P, 61_984, 0],
      [GLYCEROL_W, 11_776, 11_776],
      [LOSSES, 1_240, 1_240],
      [PRODUCT_TANK, 61_984, 30_992],
      [SHIPMENT_S, 30_992, 30_992],
    ]);
    // 75 000 + 300 000 + 150 000 + 11 776 + 1 240 + 30 992 + 30 992 = 600 000: all of A is somewhere.
    expect(forward.value.holders.reduce((s, h) => s + h.heldG, 0)).toBe(600_000);
    expect(forward.value.enteredG).toBe(600_000);
    expect(forward.value.moves.map((m) => m.moveId)).toEqual([1, 3, 5, 8, 9, 14, 15, 16, 21, 23]);
  });

  it("forward trace of a lot uses the origins its backward trace found", () => {
    const lotOrigins = requireHolderTrace(index, LOT_E).received.origins.map((o) => o.originId);
    expect(lotOrigins).toEqual([ORIGIN_E]);
    expect(findEntryOrigins(index, [LOT_E, LOT_A])).toEqual([ORIGIN_A, ORIGIN_E]);
    const forward = traceForward(index, lotOrigins);
    expect(forward.ok && forward.value.holders.find((h) => h.holderId === SHIPMENT_S)?.heldG).toBe(45_000);
  });

  it("an ancestor-only trace replays only the ancestors", () => {
    // Lot E: its entry (17) and its draw (18) — nothing else in the ledger touches it or feeds it.
    expect(requireHolderTrace(index, LOT_E).movesReplayed).toBe(2);
    // The feed tank at the end: moves 1–9 feed it or draw from it; the reagent and product side does not.
    expect(requireHolderTrace(index, FEED_TANK).movesReplayed).toBe(9);
  });

  it("forward trace refuses an id that is not an entry move", () => {
    const forward = traceForward(index, [3]);
    expect(forward.ok).toBe(false);
    expect(!forward.ok && forward.issues[0]).toMatchObject({ code: "TRACE.UNKNOWN_ORIGIN", moveId: 3 });
  });
});
