// Where a lot's material went and what a product was made of, worked out from trace answers without the
// database: the moves that carried the lot downstream, the first arrival per holder, the time-ordered
// fallback, and a backward trace's origins grouped by the lot they entered through.
import type { HolderKind, MoveRole } from "@/lib/core/vocabulary";
import type { ForwardTrace, HolderTrace } from "@/lib/trace/genealogy";
import type { LedgerIndex, TraceMove } from "@/lib/ledger/moves";
import type { OriginGroup } from "@/lib/trace/ingredients";

/** A holder as the flow names it (its kind and code). */
export interface FlowHolder {
  id: number;
  kind: HolderKind;
  code: string;
}

/** The parts of the site's trace ledger the flow reads. */
export interface FlowLedger {
  moves: readonly TraceMove[];
  refs: ReadonlyMap<number, FlowHolder>;
  reversedPairsLeftOut: number;
}

export interface FlowDestination {
  holder: FlowHolder;
  /** Grams of the lot's material that moved in (trace), or the full mass of the moves in (time-ordered flow). */
  receivedG: number;
  /** Grams of the lot's material still there (trace only; null for the time-ordered flow). */
  heldG: number | null;
  firstAt: Date;
}

export interface FlowMove {
  id: number;
  at: Date;
  role: MoveRole;
  from: FlowHolder | null;
  to: FlowHolder;
  /** Grams of the lot's material the move carried (trace), or the whole move (time-ordered flow). */
  grams: number;
  moveMassG: number;
}

export interface LotFlow {
  /**
   * "trace": grams attributed by replaying the ledger in date order under each holder's mixing model.
   * "booking-order": the same replay in the order the movements were booked, used when their dates are
   * inconsistent (a draw dated before the stock it needs); book stock was checked in that order.
   * "time-ordered": every later move out of a holder the lot's material had reached (possible destinations).
   */
  method: "trace" | "booking-order" | "time-ordered";
  /** Why the date-ordered trace could not be used, when method is not "trace". */
  traceProblem: string | null;
  /** Grams that entered the lot. */
  enteredG: number;
  /** Grams of the lot's material still in the lot. */
  stillInLotG: number;
  destinations: FlowDestination[];
  /** The first MAX_FLOW_MOVES movements that carried the lot's material, in ledger order. */
  moves: FlowMove[];
  movesTotal: number;
  reversedPairsLeftOut: number;
}

export const MAX_FLOW_MOVES = 200;

export type ReplayOrder = "dated" | "booked";

const UPSTREAM_KINDS: ReadonlySet<HolderKind> = new Set(["PICKUP", "DELIVERY"]);

export function moveAt(index: LedgerIndex, moveId: number): TraceMove | undefined {
  const pos = index.positionOf.get(moveId);
  return pos === undefined ? undefined : index.moves[pos];
}

export interface CarriedFlow {
  /** Moves that carried the lot's material on downstream (not back to pickups or deliveries), in replay order. */
  carried: Array<{ moveId: number; grams: number }>;
  /** Holders downstream of the lot, in order of the lot's first arrival; dates are the movements' own. */
  destinations: FlowDestination[];
  /** Grams of the lot's material still in the lot. */
  stillInLotG: number;
}

/** The downstream part of a forward trace from the lot. */
export function carriedFlow(
  ledger: FlowLedger,
  index: LedgerIndex,
  fwd: ForwardTrace,
  lotHolderId: number,
): CarriedFlow {
  const isDownstream = (holderId: number) => {
    const ref = ledger.refs.get(holderId);
    return ref !== undefined && holderId !== lotHolderId && !UPSTREAM_KINDS.has(ref.kind);
  };
  const carried = fwd.moves.filter((m) => {
    const move = moveAt(index, m.moveId);
    return move !== undefined && move.fromHolderId !== null && isDownstream(move.toHolderId);
  });
  const realAt = new Map(ledger.moves.map((m) => [m.id, m.at]));
  const first = new Map<number, { rank: number; at: Date }>();
  carried.forEach((m, rank) => {
    const move = moveAt(index, m.moveId);
    if (move && !first.has(move.toHolderId))
      first.set(move.toHolderId, { rank, at: new Date(realAt.get(m.moveId) ?? move.at) });
  });
  const destinations: Array<FlowDestination & { rank: number }> = [];
  for (const h of fwd.holders) {
    const ref = ledger.refs.get(h.holderId);
    const f = first.get(h.holderId);
    if (ref === undefined || f === undefined || !isDownstream(h.holderId)) continue;
    destinations.push({ holder: ref, receivedG: h.receivedG, heldG: h.heldG, firstAt: f.at, rank: f.rank });
  }
  destinations.sort((a, b) => a.rank - b.rank);
  return {
    carried,
    destinations: destinations.map(({ rank: _rank, ...d }) => d),
    stillInLotG: fwd.holders.find((h) => h.holderId === lotHolderId)?.heldG ?? 0,
  };
}

/**
 * Fallback when the ledger cannot be replayed: a move out of holder H counts when it is later than the
 * first arrival of the lot's material in H. It over-states (a tank may have been emptied in between).
 */
export function timeOrderedMoves(
  ledger: FlowLedger,
  lotHolderId: number,
): { picked: TraceMove[]; enteredG: number; destinations: FlowDestination[] } {
  const sorted = [...ledger.moves].sort((a, b) => a.at - b.at || a.id - b.id);
  const reachedAt = new Map<number, number>();
  let enteredG = 0;
  const picked: TraceMove[] = [];
  for (const m of sorted) {
    if (m.toHolderId === lotHolderId) {
      enteredG += m.massG;
      if (!reachedAt.has(lotHolderId)) reachedAt.set(lotHolderId, m.at);
      continue;
    }
    if (m.fromHolderId === null) continue;
    const since = reachedAt.get(m.fromHolderId);
    if (since === undefined || m.at < since) continue;
    picked.push(m);
    if (!reachedAt.has(m.toHolderId)) reachedAt.set(m.toHolderId, m.at);
  }
  const byHolder = new Map<number, FlowDestination>();
  for (const m of picked) {
    const to = ledger.refs.get(m.toHolderId);
    if (!to) continue;
    const d = byHolder.get(to.id) ?? { holder: to, receivedG: 0, heldG: null, firstAt: new Date(m.at) };
    d.receivedG += m.massG;
    byHolder.set(to.id, d);
  }
  return { picked, enteredG, destinations: [...byHolder.values()] };
}

/** A backward trace's origins summed by the feedstock lot, reagent lot or other holder each entered through. */
export function groupOrigins(
  ledger: FlowLedger,
  index: LedgerIndex,
  back: HolderTrace,
  lotOfHolder: ReadonlyMap<number, string>,
  reagentOf: ReadonlyMap<number, string>,
): OriginGroup[] {
  const groups = new Map<string, OriginGroup>();
  for (const o of back.received.origins) {
    const h = moveAt(index, o.originId)?.toHolderId;
    const ref = h === undefined ? undefined : ledger.refs.get(h);
    const lotCode = h === undefined ? undefined : lotOfHolder.get(h);
    const reagent = h === undefined ? undefined : reagentOf.get(h);
    const share: OriginGroup =
      lotCode !== undefined
        ? { kind: "LOT", code: lotCode, grams: 0 }
        : ref?.kind === "REAGENT_LOT"
          ? { kind: "REAGENT_LOT", code: ref.code, grams: 0, ...(reagent ? { reagent } : {}) }
          : { kind: "OTHER", code: ref ? ref.code : `origin ${o.originId}`, grams: 0 };
    const key = `${share.kind}:${share.code}`;
    const g = groups.get(key) ?? share;
    g.grams += o.grams;
    groups.set(key, g);
  }
  return [...groups.values()];
}
