import type { HolderKind, Mixing, TraceHolder, TraceMove } from "@/lib/ledger/moves";
import type { TraceComposition } from "@/lib/trace/genealogy";

/** Moves in these fixtures are at id × 1 s, so ledger order is id order. */
export function move(id: number, fromHolderId: number | null, toHolderId: number, massG: number): TraceMove {
  return { id, at: id * 1000, fromHolderId, toHolderId, massG };
}

export function holder(id: number, kind: HolderKind, mixing: Mixing = "MIXED"): TraceHolder {
  return { id, kind, mixing };
}

/** origin id → grams, the shape the hand-worked expectations are written in. */
export function gramsByOrigin(trace: TraceComposition): Record<number, number> {
  return Object.fromEntries(trace.origins.map((o) => [o.originId, o.grams]));
}

// Holder ids of the hand-worked plant.
export const LOT_A = 1;
export const LOT_B = 2;
export const LOT_C = 3;
export const LOT_E = 4;
export const FEED_TANK = 10;
export const BATCH_1 = 31;
export const BATCH_2 = 32;
export const BATCH_3 = 33;
export const BATCH_K = 40;
export const BATCH_K2 = 41;
export const METHANOL_LOT = 50;
export const KOH_LOT = 51;
export const PRODUCT_P = 60;
export const PRODUCT_Q = 61;
export const GLYCEROL_W = 70;
export const LOSSES = 80;
export const PRODUCT_TANK = 90;
export const SHIPMENT_S = 95;

// Origins are the ids of the entry moves.
export const ORIGIN_A = 1;
export const ORIGIN_B = 2;
export const ORIGIN_C = 6;
export const ORIGIN_METHANOL = 10;
export const ORIGIN_KOH = 11;
export const ORIGIN_E = 17;

export function tankHolders(tankMixing: Mixing): TraceHolder[] {
  return [
    holder(LOT_A, "LOT"),
    holder(LOT_B, "LOT"),
    holder(LOT_C, "LOT"),
    holder(FEED_TANK, "TANK", tankMixing),
    holder(BATCH_1, "BATCH"),
    holder(BATCH_2, "BATCH"),
    holder(BATCH_3, "BATCH"),
  ];
}

/**
 * 600 kg of lot A and 400 kg of lot B into one tank, 500 kg out, 300 kg of lot C in, 400 kg out,
 * then 100 001 g out (an amount that does not split evenly, to exercise the rounding rule).
 * Entries go straight into the lots: the trace core accepts an entry into any holder.
 */
export const TANK_MOVES: TraceMove[] = [
  move(1, null, LOT_A, 600_000),
  move(2, null, LOT_B, 400_000),
  move(3, LOT_A, FEED_TANK, 600_000),
  move(4, LOT_B, FEED_TANK, 400_000),
  move(5, FEED_TANK, BATCH_1, 500_000),
  move(6, null, LOT_C, 300_000),
  move(7, LOT_C, FEED_TANK, 300_000),
  move(8, FEED_TANK, BATCH_2, 400_000),
  move(9, FEED_TANK, BATCH_3, 100_001),
];

export const PLANT_HOLDERS: TraceHolder[] = [
  ...tankHolders("MIXED"),
  holder(LOT_E, "LOT"),
  holder(BATCH_K, "BATCH"),
  holder(BATCH_K2, "BATCH"),
  holder(METHANOL_LOT, "REAGENT_LOT"),
  holder(KOH_LOT, "REAGENT_LOT"),
  holder(PRODUCT_P, "PRODUCT_LOT"),
  holder(PRODUCT_Q, "PRODUCT_LOT"),
  holder(GLYCEROL_W, "WASTE_CONTAINER"),
  holder(LOSSES, "LOSS"),
  holder(PRODUCT_TANK, "TANK"),
  holder(SHIPMENT_S, "SHIPMENT"),
];

/**
 * The tank story up to move 8, then a reaction run K charged with 200 kg of tank oil, 40 kg methanol
 * and 2 kg KOH, giving 200 kg ester (product lot P), 38 kg glycerol phase and 4 kg loss; a second run
 * K2 on lot E; both product lots into a product tank; a 150 kg shipment from it.
 */
export const PLANT_MOVES: TraceMove[] = [
  ...TANK_MOVES.slice(0, 8),
  move(9, FEED_TANK, BATCH_K, 200_000),
  move(10, null, METHANOL_LOT, 100_000),
  move(11, null, KOH_LOT, 10_000),
  move(12, METHANOL_LOT, BATCH_K, 40_000),
  move(13, KOH_LOT, BATCH_K, 2_000),
  move(14, BATCH_K, PRODUCT_P, 200_000),
  move(15, BATCH_K, GLYCEROL_W, 38_000),
  move(16, BATCH_K, LOSSES, 4_000),
  move(17, null, LOT_E, 90_000),
  move(18, LOT_E, BATCH_K2, 90_000),
  move(19, METHANOL_LOT, BATCH_K2, 10_000),
  move(20, BATCH_K2, PRODUCT_Q, 100_000),
  move(21, PRODUCT_P, PRODUCT_TANK, 200_000),
  move(22, PRODUCT_Q, PRODUCT_TANK, 100_000),
  move(23, PRODUCT_TANK, SHIPMENT_S, 150_000),
];
