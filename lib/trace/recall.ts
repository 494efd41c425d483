// Recall: where did the material that moved into a holder (or a source's pickups, or a tank within a
// window) go? The forward trace follows origins (material as it entered the books). To follow the part
// of a mixture that moved into a tank or a batch, each seed move is re-booked as a draw to a sink plus a
// fresh entry at its destination: the replay then treats that part as an origin of its own, under the
// same mixing models (pooled or first-in-first-out) as every other trace. Pure: no database, no clock.
import { ok } from "@/lib/core/result";
import type { Result } from "@/lib/core/result";
import { indexLedger } from "@/lib/ledger/moves";
import type { HolderKind, LedgerIndex, TraceHolder, TraceMove } from "@/lib/ledger/moves";
import type { ShipmentCustomer } from "@/lib/trace/customers";
import type { RecallKind } from "@/lib/trace/recall.schema";

export interface SeededLedger {
  index: LedgerIndex;
  /** The origins to follow: entry seeds keep their own id, re-booked seeds get a fresh one. */
  originIds: number[];
  /** Fresh origin id → the real movement it stands for. */
  seedOf: Map<number, number>;
  /** The sink re-booked seeds are drawn into (not a real holder; leave it out of answers). */
  sinkHolderId: number | null;
  /** Ledger position of the first seed: a snapshot taken at or before it fits the seeded index. */
  firstPosition: number;
}

/**
 * Seeds in ledger order. Entry moves (material entering the books) are origins already; other seeds are
 * split so that the replay before the first seed is unchanged (snapshots up to it stay valid).
 */
export function seedLedger(index: LedgerIndex, seedMoveIds: readonly number[]): Result<SeededLedger> {
  const seeds = new Set(seedMoveIds);
  let firstPosition = Number.POSITIVE_INFINITY;
  let needsSplit = false;
  for (const id of seeds) {
    const pos = index.positionOf.get(id);
    if (pos === undefined) continue;
    firstPosition = Math.min(firstPosition, pos);
    if (index.moves[pos]?.fromHolderId !== null) needsSplit = true;
  }
  const known = [...seeds]
    .filter((id) => index.positionOf.has(id))
    .sort((a, b) => (index.positionOf.get(a) ?? 0) - (index.positionOf.get(b) ?? 0));
  if (!needsSplit) return ok({ index, originIds: known, seedOf: new Map(), sinkHolderId: null, firstPosition });

  let maxMoveId = 0;
  for (const m of index.moves) maxMoveId = Math.max(maxMoveId, m.id);
  let maxHolderId = 0;
  for (const h of index.holders.keys()) maxHolderId = Math.max(maxHolderId, h);
  const sinkHolderId = maxHolderId + 1;
  const holders: TraceHolder[] = [...index.holders.values(), { id: sinkHolderId, kind: "LOSS", mixing: "MIXED" }];
  const moves: TraceMove[] = [];
  const originIds: number[] = [];
  const seedOf = new Map<number, number>();
  let nextId = maxMoveId + 1;
  for (const m of index.moves) {
    if (!seeds.has(m.id) || m.fromHolderId === null) {
      moves.push(m);
      if (seeds.has(m.id)) originIds.push(m.id);
      continue;
    }
    // The same instant: the fresh entry sorts after the draw (a larger id), before any later move.
    moves.push({ ...m, toHolderId: sinkHolderId });
    moves.push({ id: nextId, at: m.at, fromHolderId: null, toHolderId: m.toHolderId, massG: m.massG });
    originIds.push(nextId);
    seedOf.set(nextId, m.id);
    nextId += 1;
  }
  const indexed = indexLedger(holders, moves);
  if (!indexed.ok) return indexed;
  return ok({ index: indexed.value, originIds, seedOf, sinkHolderId, firstPosition });
}

/** Movements into the given holders (in ledger order), optionally only those at real times in [from, to). */
export function findSeedMoves(
  index: LedgerIndex,
  holderIds: readonly number[],
  window: { from: number | null; to: number | null; realAt: (moveId: number) => number },
): number[] {
  const positions: number[] = [];
  for (const h of new Set(holderIds)) {
    for (const pos of index.into.get(h) ?? []) {
      const m = index.moves[pos];
      if (m === undefined) continue;
      const at = window.realAt(m.id);
      if (window.from !== null && at < window.from) continue;
      if (window.to !== null && at >= window.to) continue;
      positions.push(pos);
    }
  }
  return positions
    .sort((a, b) => a - b)
    .flatMap((pos) => {
      const m = index.moves[pos];
      return m === undefined ? [] : [m.id];
    });
}

export interface ReachedRow {
  holderId: number;
  receivedG: number;
  heldG: number;
}

export interface ShipmentReach {
  holderId: number;
  grams: number;
  /** Real time of the first and last movement carrying traced material into it. */
  firstAt: number;
  lastAt: number;
}

export interface CustomerReach<C> {
  customer: C;
  grams: number;
  shipments: number;
  firstAt: number;
  lastAt: number;
}

/** Totals per customer with the first and last shipment date (largest first, then by name). */
export function groupCustomers<C extends { name: string; code: string | null }>(
  shipments: readonly ShipmentReach[],
  customerOf: ReadonlyMap<number, C>,
): Array<CustomerReach<C>> {
  const out = new Map<string, CustomerReach<C>>();
  for (const s of shipments) {
    const c = customerOf.get(s.holderId);
    if (c === undefined || s.grams === 0) continue;
    const key = c.code ?? `name:${c.name}`;
    const row = out.get(key) ?? { customer: c, grams: 0, shipments: 0, firstAt: s.firstAt, lastAt: s.lastAt };
    row.grams += s.grams;
    row.shipments += 1;
    row.firstAt = Math.min(row.firstAt, s.firstAt);
    row.lastAt = Math.max(row.lastAt, s.lastAt);
    out.set(key, row);
  }
  return [...out.values()].sort((a, b) => b.grams - a.grams || a.customer.name.localeCompare(b.customer.name));
}

/** Share of the traced quantity in percent (0 when nothing was traced). */
export function shareOf(grams: number, totalG: number): number {
  return totalG === 0 ? 0 : (grams * 100) / totalG;
}

// ---- the answer ------------------------------------------------------------------------------------

export interface RecallHolderRow {
  holder: { id: number; kind: HolderKind; code: string };
  stage: number;
  stageLabel: string;
  /** Grams of the recalled material that moved into the holder. */
  receivedG: number;
  /** Grams of it the holder still holds (shipments, disposals, losses: what left the books there). */
  heldG: number;
  /** receivedG as % of the recalled material. */
  pct: number;
  firstAt: Date | null;
  lastAt: Date | null;
  customer: ShipmentCustomer | null;
  /** Product lots: release state and the reason of the last decision. */
  standing: { status: string; reason: string } | null;
}

export interface RecallCustomerRow {
  customer: ShipmentCustomer;
  grams: number;
  pct: number;
  shipments: number;
  firstAt: Date;
  lastAt: Date;
}

export interface RecallReport {
  query: { kind: RecallKind; code: string; from: Date | null; to: Date | null };
  subject: { kind: RecallKind; code: string; label: string };
  /** Movements whose material is followed. */
  seedMoves: number;
  /** Grams followed (Σ of the seed movements). */
  tracedG: number;
  asOf: { moveId: number; at: Date } | null;
  /** The ledger this answer was computed at: a reprint at the same position gives the same figures. */
  ledger: { movements: number; lastMoveId: number | null };
  holders: RecallHolderRow[];
  productLots: RecallHolderRow[];
  shipments: RecallHolderRow[];
  customers: RecallCustomerRow[];
  /** Holders on site that still hold some of it (not shipped, hauled or lost). */
  onSite: RecallHolderRow[];
  /** Product lots on site that a hold would cover (not rejected). */
  toHold: string[];
  /** Grams shipped, and still on site. */
  shippedG: number;
  onSiteG: number;
}
