// Lot genealogy over the movement ledger: backward ("what is in it"), forward ("where did it go").
// Cost model: a full replay is O(moves × composition size of the holders each move touches). The size
// of a vessel that is drawn from does not grow with history: rounding to whole grams drops an origin
// once its share no longer earns a gram, so a tank that is never emptied settles at a steady size.
// Sinks never drawn from (a site's loss holder) keep every origin; their deposits are buffered
// (composition.ts), so they cost memory and snapshot size, not time per move.
// Backward traces replay only the target's ancestor subgraph; periodic snapshots bound any replay to
// the moves since the last snapshot.
import { fail, failMany, invariant, ok } from "@/lib/core/result";
import type { Result } from "@/lib/core/result";
import { addPartsToTally, sumParts, sumPartsOf, tallyToParts } from "@/lib/trace/composition";
import type { CompositionParts } from "@/lib/trace/composition";
import { findLastPositionAtOrBefore } from "@/lib/ledger/moves";
import type { HolderKind, LedgerIndex, TraceIssue, TraceMove } from "@/lib/ledger/moves";
import { createReplay, restoreReplay } from "@/lib/trace/replay";
import { collectAncestorMoves, findAncestorHorizons, replaySubgraph } from "@/lib/trace/ancestors";
import { listDrawnHolders, replayForward } from "@/lib/trace/forward";
import type { Replay, ReplayPosition, ReplaySnapshot } from "@/lib/trace/replay";

export interface OriginShare {
  /** The entry move's id. */
  originId: number;
  grams: number;
  /** Percent of the traced quantity (grams × 100 / totalG); the grams, not the percents, add up exactly. */
  pct: number;
}

export interface TraceComposition {
  totalG: number;
  /** Largest first, then by origin id. Σ grams = totalG exactly. */
  origins: OriginShare[];
}

export interface HolderTrace {
  holderId: number;
  kind: HolderKind;
  /** Last move the answer includes (the last at or before the requested time), or null if none. */
  asOf: ReplayPosition | null;
  /** What the holder held at asOf. */
  stock: TraceComposition;
  /** Everything that went into the holder up to asOf (what a batch was charged with, even once emptied). */
  received: TraceComposition;
  /** null = received counts the whole ledger; otherwise only moves after this snapshot position. */
  receivedSince: ReplayPosition | null;
  /** Moves replayed to answer: the ancestor subgraph, not the whole ledger. */
  movesReplayed: number;
}

export interface ForwardHolderReach {
  holderId: number;
  kind: HolderKind;
  /** Grams of the origin set that moved into the holder (since receivedSince). */
  receivedG: number;
  /** Grams of the origin set the holder still held at asOf. */
  heldG: number;
}

export interface ForwardTrace {
  originIds: number[];
  /** Σ entry mass of the origins that had entered by asOf. */
  enteredG: number;
  asOf: ReplayPosition | null;
  receivedSince: ReplayPosition | null;
  /** Every holder that received or holds part of the set, by holder id. */
  holders: ForwardHolderReach[];
  /** Every move that carried part of the set, in ledger order. */
  moves: Array<{ moveId: number; grams: number }>;
  /**
   * Moves replayed to answer: from the starting snapshot to where none of the set could move again.
   * Each is split off its source; one into a holder not drawn from again before asOf is not booked there.
   */
  movesReplayed: number;
}

export interface TraceOptions {
  /** Epoch ms; include moves with at ≤ this. Default: the whole ledger. */
  at?: number;
  /** Resume from a stored snapshot instead of the ledger start (ignored when it lies after `at`). */
  from?: ReplaySnapshot;
}

export function describeComposition(parts: CompositionParts): TraceComposition {
  const totalG = sumParts(parts);
  const origins = parts.originIds
    .map((originId, i) => {
      const grams = parts.grams[i] ?? 0;
      return { originId, grams, pct: totalG === 0 ? 0 : (grams * 100) / totalG };
    })
    .filter((o) => o.grams > 0)
    .sort((a, b) => b.grams - a.grams || a.originId - b.originId);
  return { totalG, origins };
}

/**
 * Full forward replay of the ledger up to `until` (inclusive), optionally from a snapshot.
 * O(moves × composition size of the holders each move touches).
 */
export function replayLedger(
  index: LedgerIndex,
  options: {
    until?: number;
    from?: ReplaySnapshot;
    /** Called after each move; returning exactly true stops the replay there (the replay is then at that move). */
    onMove?: (move: TraceMove, parts: CompositionParts, position: number) => unknown;
  } = {},
): Result<Replay> {
  const horizon = findLastPositionAtOrBefore(index, options.until ?? Number.POSITIVE_INFINITY);
  const started = startReplay(index, pickSnapshot(options.from, horizon));
  if (!started.ok) return started;
  const replay = started.value;
  for (let pos = replay.appliedCount; pos <= horizon; pos++) {
    const move = index.moves[pos];
    if (move === undefined) break;
    const applied = replay.apply(move);
    if (!applied.ok) return applied;
    if (options.onMove?.(move, applied.value, pos) === true) break;
  }
  return ok(replay);
}

/**
 * Backward trace of a holder at a time (a tank at t, a lot, a batch, a product lot), replaying only
 * its ancestors: the moves into the holder, the moves out of it (they change its mixture), and the same
 * recursively for every holder that fed it, each only up to the last moment it fed the chain.
 */
export function traceHolder(index: LedgerIndex, holderId: number, options: TraceOptions = {}): Result<HolderTrace> {
  const holder = index.holders.get(holderId);
  if (holder === undefined) {
    return fail("TRACE.UNKNOWN_HOLDER", `Holder ${holderId} is not in the holder list.`, "holderId");
  }
  const target = findLastPositionAtOrBefore(index, options.at ?? Number.POSITIVE_INFINITY);
  const from = pickSnapshot(options.from, target);
  const start = from?.applied.count ?? 0;
  const horizons = findAncestorHorizons(index, holderId, target, start);
  const started = startReplay(index, from, new Set([holderId, ...horizons.keys()]));
  if (!started.ok) return started;
  const replay = started.value;
  const received = new Map<number, number>();
  const positions = collectAncestorMoves(index, horizons, start);
  const replayed = replaySubgraph(index, replay, positions, horizons, (move, parts) => {
    if (move.toHolderId === holderId) addPartsToTally(received, parts);
  });
  if (!replayed.ok) return replayed;
  const last = index.moves[target];
  return ok({
    holderId,
    kind: holder.kind,
    asOf: last === undefined ? null : { moveId: last.id, at: last.at },
    stock: describeComposition(replay.getComposition(holderId)),
    received: describeComposition(tallyToParts(received)),
    receivedSince: from === undefined ? null : from.applied.last,
    movesReplayed: positions.length,
  });
}

/** Backward trace of one move (a shipment = the move into it): the composition it carried. */
export function traceMove(
  index: LedgerIndex,
  moveId: number,
  options: { from?: ReplaySnapshot } = {},
): Result<TraceComposition> {
  const pos = index.positionOf.get(moveId);
  const move = pos === undefined ? undefined : index.moves[pos];
  if (pos === undefined || move === undefined) {
    return fail("TRACE.UNKNOWN_MOVE", `Move ${moveId} is not in the ledger.`, "moveId");
  }
  if (move.fromHolderId === null) return ok(describeComposition({ originIds: [move.id], grams: [move.massG] }));
  const from = pickSnapshot(options.from, pos - 1);
  const start = from?.applied.count ?? 0;
  const horizons = findAncestorHorizons(index, move.fromHolderId, pos, start);
  const started = startReplay(index, from, new Set([move.fromHolderId, ...horizons.keys()]));
  if (!started.ok) return started;
  const replay = started.value;
  const positions = collectAncestorMoves(index, horizons, start);
  let carried: CompositionParts | undefined;
  const replayed = replaySubgraph(index, replay, positions, horizons, (m, parts) => {
    if (m.id === moveId) carried = parts;
  });
  if (!replayed.ok) return replayed;
  invariant(carried !== undefined, `move ${moveId} is an ancestor move of itself but was not replayed`);
  return ok(describeComposition(carried));
}

/** Issues for ids that are not entry moves (moves with no source holder) of the ledger. */
function checkOrigins(index: LedgerIndex, originIds: readonly number[]): TraceIssue[] {
  return originIds.flatMap((id) => {
    const pos = index.positionOf.get(id);
    const m = pos === undefined ? undefined : index.moves[pos];
    return m === undefined || m.fromHolderId !== null
      ? [
          {
            code: "TRACE.UNKNOWN_ORIGIN",
            message: `Origin ${id} is not an entry move (a move with no source holder) of this ledger.`,
            field: "originIds",
            moveId: id,
          },
        ]
      : [];
  });
}

function massOf(index: LedgerIndex, moveId: number): number {
  const pos = index.positionOf.get(moveId);
  return pos === undefined ? 0 : (index.moves[pos]?.massG ?? 0);
}

/** The holders' grams of the set as counted from the moves (Σ in − Σ out), those above zero. */
function positiveHeld(held: ReadonlyMap<number, number>): Map<number, number> {
  const heldBy = new Map<number, number>();
  for (const [h, g] of held) {
    invariant(g >= 0, `holder ${h} gave more of the traced origins than it received`);
    if (g > 0) heldBy.set(h, g);
  }
  return heldBy;
}

/** The holders' grams of the set as the replay's mixtures hold them. */
function heldInReplay(replay: Replay, set: ReadonlySet<number>): Map<number, number> {
  const heldBy = new Map<number, number>();
  for (const h of replay.listStockedHolderIds()) {
    const g = sumPartsOf(replay.getComposition(h), set);
    if (g > 0) heldBy.set(h, g);
  }
  return heldBy;
}

/**
 * Forward trace: where the material of an origin set went. Origins of a pickup or delivery come from
 * findEntryOrigins; origins of a lot are the origin ids of traceHolder(lot).received.
 * One forward replay from a snapshot taken before the first origin entered, stopped once none of the
 * set can move again: O(moves over the set's lifetime × composition size), not O(history after it).
 */
export function traceForward(
  index: LedgerIndex,
  originIds: readonly number[],
  options: TraceOptions = {},
): Result<ForwardTrace> {
  const issues = checkOrigins(index, originIds);
  if (issues.length > 0) return failMany(issues);
  const set = new Set(originIds);
  const target = findLastPositionAtOrBefore(index, options.at ?? Number.POSITIVE_INFINITY);
  const from = pickSnapshot(options.from, target);
  let firstOrigin = Number.POSITIVE_INFINITY;
  let lastOrigin = -1;
  for (const id of set) {
    const pos = index.positionOf.get(id) ?? Number.POSITIVE_INFINITY;
    firstOrigin = Math.min(firstOrigin, pos);
    if (pos <= target) lastOrigin = Math.max(lastOrigin, pos);
  }
  // Starting before any origin entered, the set's grams per holder follow from the moves that carry
  // them (Σ in − Σ out), and the replay may stop once every gram sits in holders nothing is drawn from
  // again up to the target: no later move can carry any of it. An early lot's material reaches
  // shipments and disposals within months, so this bounds a forward trace by the lot's lifetime, not
  // by the history after it (lib/trace/forward.ts).
  const start = from?.applied.count ?? 0;
  const tracksHeld = start <= firstOrigin;
  const started = startReplay(index, from, tracksHeld ? drawnHolders(index, from, start, target) : undefined);
  if (!started.ok) return started;
  const replay = started.value;
  const carried = replayForward(index, replay, set, { start, target, lastOrigin, tracksHeld });
  if (!carried.ok) return carried;
  const { moves, receivedBy, held } = carried.value;
  const movesReplayed = carried.value.processed;
  const heldBy = tracksHeld ? positiveHeld(held) : heldInReplay(replay, set);
  const holderIds = [...new Set([...receivedBy.keys(), ...heldBy.keys()])].sort((a, b) => a - b);
  let enteredG = 0;
  for (const id of set)
    enteredG += (index.positionOf.get(id) ?? Number.POSITIVE_INFINITY) <= target ? massOf(index, id) : 0;
  const last = index.moves[target];
  return ok({
    originIds: [...set].sort((a, b) => a - b),
    enteredG,
    asOf: last === undefined ? null : { moveId: last.id, at: last.at },
    receivedSince: from === undefined ? null : from.applied.last,
    holders: holderIds.map((holderId) => ({
      holderId,
      kind: requireHolderKind(index, holderId),
      receivedG: receivedBy.get(holderId) ?? 0,
      heldG: heldBy.get(holderId) ?? 0,
    })),
    moves,
    movesReplayed,
  });
}

/** Origins that entered the books at the given holders (pickups, deliveries, reagent lots), ledger order. */
export function findEntryOrigins(index: LedgerIndex, holderIds: readonly number[]): number[] {
  const positions: number[] = [];
  for (const h of new Set(holderIds)) {
    for (const pos of index.into.get(h) ?? []) {
      if (index.moves[pos]?.fromHolderId === null) positions.push(pos);
    }
  }
  return positions
    .sort((a, b) => a - b)
    .flatMap((pos) => {
      const m = index.moves[pos];
      return m === undefined ? [] : [m.id];
    });
}

/**
 * Checks a stored snapshot against the ledger it claims to come from (same move count, same last move,
 * same mass total up to it) and restores it. A move back-dated before the snapshot makes it stale.
 */
export function resumeReplay(index: LedgerIndex, snapshot: ReplaySnapshot, only?: ReadonlySet<number>): Result<Replay> {
  const { count, massSumG, last } = snapshot.applied;
  const pos = last === null ? -1 : (index.positionOf.get(last.moveId) ?? -2);
  const sameLast = last === null || index.moves[pos]?.at === last.at;
  if (pos !== count - 1 || !sameLast || index.massPrefixG[count] !== massSumG) {
    return fail(
      "TRACE.SNAPSHOT_STALE",
      "The snapshot does not match this ledger up to its position (a move was added, removed or changed before it); rebuild it.",
      "snapshot.applied",
    );
  }
  return restoreReplay(index.holders, snapshot, only);
}

function requireHolderKind(index: LedgerIndex, holderId: number): HolderKind {
  const holder = index.holders.get(holderId);
  invariant(holder !== undefined, `holder ${holderId} was replayed but is not indexed`);
  return holder.kind;
}

/** The snapshot, if it covers no move after `lastPosition`; one taken later cannot answer an earlier question. */
function pickSnapshot(from: ReplaySnapshot | undefined, lastPosition: number): ReplaySnapshot | undefined {
  return from !== undefined && from.applied.count <= lastPosition + 1 ? from : undefined;
}

/** Holders a tracking forward replay reads: the snapshot's holders drawn from in the window. */
function drawnHolders(index: LedgerIndex, from: ReplaySnapshot | undefined, start: number, target: number) {
  return from === undefined
    ? undefined
    : listDrawnHolders(
        index,
        from.holders.map((h) => h.holderId),
        start,
        target,
      );
}

function startReplay(index: LedgerIndex, from: ReplaySnapshot | undefined, only?: ReadonlySet<number>): Result<Replay> {
  return from === undefined ? ok(createReplay(index.holders)) : resumeReplay(index, from, only);
}
