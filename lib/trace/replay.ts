import { fail, failMany, invariant, ok } from "@/lib/core/result";
import type { Result } from "@/lib/core/result";
import {
  addToLayer,
  adoptAsLayer,
  copyToLayer,
  EMPTY_PARTS,
  mergeAllParts,
  settleLayer,
  takeFromLayer,
} from "@/lib/trace/composition";
import type { CompositionParts, MutableLayer, OwnedParts } from "@/lib/trace/composition";
import { checkMove, compareMoves, formatMoveField, isValidMove } from "@/lib/ledger/moves";
import type { Mixing, TraceHolder, TraceIssue, TraceMove } from "@/lib/ledger/moves";

/**
 * Replays the movement ledger keeping, per holder, grams per origin.
 * MIXED: one pooled composition; a withdrawal takes every origin in proportion (allocateByWeight).
 * FIFO: a queue of layers, one per incoming move; a withdrawal empties the oldest layers first and
 * splits the last one it touches in proportion.
 * Cost per move: O(composition size of the holders it touches); holders it doesn't touch cost nothing.
 */
export interface Replay {
  /** Last move applied (ledger order), or null before the first. */
  readonly position: ReplayPosition | null;
  /** Moves applied so far, including those a restored snapshot had applied. */
  readonly appliedCount: number;
  /** Applies one move in ledger order; returns the composition the move carried. */
  apply(move: TraceMove): Result<CompositionParts>;
  /**
   * As apply, but the destination takes over the arrays it returns instead of copying them: read them
   * before the next move and do not keep them (a forward trace only counts the traced grams in each).
   */
  applyTransient(move: TraceMove): Result<CompositionParts>;
  /**
   * Applies only the source side of a move: the material leaves its holder and is returned, but the
   * destination is not booked. For ancestor-only replays whose destination's later state is not needed.
   */
  withdraw(move: TraceMove): Result<CompositionParts>;
  getStockG(holderId: number): number;
  /** Current composition of a holder, merged over its FIFO layers. */
  getComposition(holderId: number): CompositionParts;
  /** FIFO layers oldest first (a MIXED holder has at most one). */
  getLayers(holderId: number): ReadonlyArray<{ enteredByMoveId: number; parts: CompositionParts }>;
  /** Ids of holders with stock > 0. */
  listStockedHolderIds(): number[];
  /**
   * Plain-JSON copy of the state, to store and resume from (resumeReplay checks it against the ledger).
   * With `leaveOut`, those holders are not copied: holders nothing is ever drawn from (shipments,
   * disposals, losses) keep every origin they received, and no later move depends on their mixture.
   */
  snapshot(leaveOut?: (holderId: number) => boolean): ReplaySnapshot;
}

export interface ReplayPosition {
  moveId: number;
  at: number;
}

export const REPLAY_SNAPSHOT_FORMAT = "tracevat.replay/1";

export interface ReplaySnapshot {
  format: typeof REPLAY_SNAPSHOT_FORMAT;
  /** What had been applied: lets a reader check the snapshot still matches its ledger. */
  applied: { count: number; massSumG: number; last: ReplayPosition | null };
  holders: Array<{
    holderId: number;
    mixing: Mixing;
    layers: Array<{ enteredByMoveId: number; originIds: number[]; grams: number[] }>;
  }>;
  /** Holders that held material but were not copied (snapshot's leaveOut): a replay restored from it cannot describe them. */
  leftOut?: number[];
}

interface Layer extends MutableLayer {
  enteredByMoveId: number;
}

interface HolderState {
  mixing: Mixing;
  totalG: number;
  layers: Layer[];
  /** FIFO queue head; layers before it are spent. */
  head: number;
}

const COMPACT_AFTER = 64;

export function createReplay(holders: ReadonlyMap<number, TraceHolder>): Replay {
  return buildReplay(holders, new Map(), { count: 0, massSumG: 0, last: null });
}

/**
 * Restores a snapshot. With `only`, restores just those holders (a backward trace needs only its
 * ancestors; the rest — shipments and disposals above all, which keep every origin they ever received —
 * would be copied for nothing). A replay restored in part answers only for the holders it restored.
 */
export function restoreReplay(
  holders: ReadonlyMap<number, TraceHolder>,
  snapshot: ReplaySnapshot,
  only?: ReadonlySet<number>,
): Result<Replay> {
  const issues: TraceIssue[] = [];
  const bad = (holderId: number, why: string) =>
    issues.push({
      code: "TRACE.SNAPSHOT_INVALID",
      message: `Snapshot holder ${holderId}: ${why}`,
      field: `snapshot.holders.${holderId}`,
      holderId,
    });
  if (snapshot.format !== REPLAY_SNAPSHOT_FORMAT) {
    return fail(
      "TRACE.SNAPSHOT_INVALID",
      `Snapshot format "${String(snapshot.format as unknown)}" is not ${String(REPLAY_SNAPSHOT_FORMAT)}.`,
      "snapshot.format",
    );
  }
  const states = new Map<number, HolderState>();
  for (const h of snapshot.holders) {
    if (only !== undefined && !only.has(h.holderId)) continue;
    const holder = holders.get(h.holderId);
    if (holder === undefined) {
      bad(h.holderId, "not in the holder list.");
      continue;
    }
    if (holder.mixing !== h.mixing) bad(h.holderId, `was replayed as ${h.mixing} but the holder is ${holder.mixing}.`);
    if (h.mixing === "MIXED" && h.layers.length > 1) bad(h.holderId, "a MIXED holder has at most one layer.");
    if (states.has(h.holderId)) bad(h.holderId, "listed twice.");
    const layers: Layer[] = [];
    for (const l of h.layers) {
      const sorted = l.originIds.every(
        (id, i) => Number.isSafeInteger(id) && (i === 0 || id > (l.originIds[i - 1] ?? id)),
      );
      const positive = l.grams.every((g) => Number.isSafeInteger(g) && g > 0);
      if (!sorted || !positive || l.originIds.length !== l.grams.length || l.originIds.length === 0) {
        bad(h.holderId, "each layer needs ascending origin ids with positive whole grams.");
        continue;
      }
      layers.push({ enteredByMoveId: l.enteredByMoveId, ...copyToLayer(l) });
    }
    states.set(h.holderId, { mixing: h.mixing, totalG: layers.reduce((s, l) => s + l.totalG, 0), layers, head: 0 });
  }
  const leftOut = new Set(snapshot.leftOut ?? []);
  for (const id of leftOut) {
    if (only?.has(id) === true)
      bad(
        id,
        "was left out of this snapshot, so a trace that needs its mixture must start before it received anything.",
      );
  }
  if (issues.length > 0) return failMany(issues);
  return ok(buildReplay(holders, states, { ...snapshot.applied }, only === undefined ? leftOut : new Set()));
}

interface ReplayContext {
  holders: ReadonlyMap<number, TraceHolder>;
  states: Map<number, HolderState>;
  applied: { count: number; massSumG: number; last: ReplayPosition | null };
  /** Holders whose mixture the restored snapshot did not carry: reading one is a programming error, not a zero. */
  unknown: ReadonlySet<number>;
}

function requireState(ctx: ReplayContext, holderId: number): HolderState {
  let s = ctx.states.get(holderId);
  if (s === undefined) {
    s = { mixing: ctx.holders.get(holderId)?.mixing ?? "MIXED", totalG: 0, layers: [], head: 0 };
    ctx.states.set(holderId, s);
  }
  return s;
}

function checkNext(ctx: ReplayContext, move: TraceMove): Result<void> {
  if (!isValidMove(move, ctx.holders)) return failMany(checkMove(move, ctx.holders));
  const last = ctx.applied.last;
  if (last !== null && compareMoves(move, { at: last.at, id: last.moveId }) <= 0) {
    const issue: TraceIssue = {
      code: "TRACE.OUT_OF_ORDER",
      message: `Move ${move.id} (at ${move.at}) is not after the last applied move ${last.moveId} (at ${last.at}); replay moves in ledger order.`,
      field: formatMoveField(move.id, "at"),
      moveId: move.id,
    };
    return failMany([issue]);
  }
  if (move.fromHolderId !== null) {
    const held = ctx.states.get(move.fromHolderId)?.totalG ?? 0;
    if (held < move.massG) {
      const issue: TraceIssue = {
        code: "TRACE.OVERDRAW",
        message: `Move ${move.id} draws ${move.massG} g from holder ${move.fromHolderId}, which holds ${held} g at that time (short by ${move.massG - held} g).`,
        field: formatMoveField(move.id, "massG"),
        moveId: move.id,
        holderId: move.fromHolderId,
        shortfallG: move.massG - held,
      };
      return failMany([issue]);
    }
  }
  return ok(undefined);
}

function take(ctx: ReplayContext, holderId: number, massG: number): OwnedParts {
  const s = requireState(ctx, holderId);
  s.totalG -= massG;
  // An emptied holder (every pickup, lot and batch in turn) holds nothing a later move could read: its
  // state goes, so it does not outlive the replay's young objects (a later receipt starts a new one).
  if (s.totalG === 0) ctx.states.delete(holderId);
  if (s.mixing === "MIXED") {
    const layer = s.layers[0];
    if (layer === undefined) return { originIds: [], grams: [] };
    const taken = takeFromLayer(layer, massG);
    if (layer.totalG === 0) s.layers = [];
    return taken;
  }
  const pieces: OwnedParts[] = [];
  let left = massG;
  for (let layer = s.layers[s.head]; layer !== undefined && left > 0; layer = s.layers[s.head]) {
    const piece = Math.min(left, layer.totalG);
    pieces.push(takeFromLayer(layer, piece));
    left -= piece;
    if (layer.totalG === 0) s.head++;
  }
  if (s.head >= COMPACT_AFTER && s.head * 2 >= s.layers.length) {
    s.layers = s.layers.slice(s.head);
    s.head = 0;
  }
  if (pieces.length === 1 && pieces[0] !== undefined) return pieces[0];
  const merged = mergeAllParts(pieces);
  return { originIds: [...merged.originIds], grams: [...merged.grams] };
}

/** Books parts into a holder; `adopt`: the parts are the caller's to give, so a new layer keeps their arrays. */
function put(
  ctx: ReplayContext,
  holderId: number,
  parts: OwnedParts,
  massG: number,
  moveId: number,
  adopt: boolean,
): void {
  const s = requireState(ctx, holderId);
  s.totalG += massG;
  const pool = s.mixing === "MIXED" ? s.layers[0] : undefined;
  if (pool === undefined) {
    const layer = adopt ? adoptAsLayer(parts, massG) : copyToLayer(parts, massG);
    // Spelled out rather than spread: every receipt of an empty holder makes one.
    s.layers.push({
      enteredByMoveId: moveId,
      originIds: layer.originIds,
      grams: layer.grams,
      totalG: layer.totalG,
      pending: layer.pending,
      pendingLength: layer.pendingLength,
    });
  } else addToLayer(pool, parts, massG, adopt);
}

/** Checks a move, takes its material from its holder (or makes it an origin) and counts it applied. */
function leave(ctx: ReplayContext, move: TraceMove): Result<OwnedParts> {
  const checked = checkNext(ctx, move);
  if (!checked.ok) return checked;
  const parts =
    move.fromHolderId === null
      ? { originIds: [move.id], grams: [move.massG] }
      : take(ctx, move.fromHolderId, move.massG);
  ctx.applied.count += 1;
  ctx.applied.massSumG += move.massG;
  ctx.applied.last = { moveId: move.id, at: move.at };
  return ok(parts);
}

function liveLayers(s: HolderState): Layer[] {
  const live = s.layers.slice(s.head);
  for (const l of live) settleLayer(l);
  return live;
}

function snapshotOf(ctx: ReplayContext, leaveOut: ((holderId: number) => boolean) | undefined): ReplaySnapshot {
  const { states, unknown, applied } = ctx;
  const leftOut = [...states]
    .filter(([holderId, s]) => s.totalG > 0 && leaveOut?.(holderId) === true)
    .map(([holderId]) => holderId);
  for (const id of unknown) if (!leftOut.includes(id)) leftOut.push(id);
  return {
    format: REPLAY_SNAPSHOT_FORMAT,
    ...(leftOut.length > 0 ? { leftOut: leftOut.sort((a, b) => a - b) } : {}),
    applied: {
      count: applied.count,
      massSumG: applied.massSumG,
      last: applied.last === null ? null : { ...applied.last },
    },
    holders: [...states]
      .filter(([holderId, s]) => s.totalG > 0 && leaveOut?.(holderId) !== true && !unknown.has(holderId))
      .sort((a, b) => a[0] - b[0])
      .map(([holderId, s]) => ({
        holderId,
        mixing: s.mixing,
        layers: liveLayers(s).map((l) => ({
          enteredByMoveId: l.enteredByMoveId,
          originIds: [...l.originIds],
          grams: [...l.grams],
        })),
      })),
  };
}

function buildReplay(
  holders: ReadonlyMap<number, TraceHolder>,
  states: Map<number, HolderState>,
  applied: { count: number; massSumG: number; last: ReplayPosition | null },
  unknown: ReadonlySet<number> = new Set(),
): Replay {
  const ctx: ReplayContext = { holders, states, applied, unknown };
  const known = (holderId: number): void =>
    invariant(!unknown.has(holderId), `holder ${holderId} was left out of the snapshot this replay resumed`);
  return {
    get position() {
      return applied.last === null ? null : { ...applied.last };
    },
    get appliedCount() {
      return applied.count;
    },
    apply(move) {
      const parts = leave(ctx, move);
      if (parts.ok) put(ctx, move.toHolderId, parts.value, move.massG, move.id, false);
      return parts;
    },
    applyTransient(move) {
      const parts = leave(ctx, move);
      if (parts.ok) put(ctx, move.toHolderId, parts.value, move.massG, move.id, true);
      return parts;
    },
    withdraw(move) {
      return leave(ctx, move);
    },
    getStockG(holderId) {
      known(holderId);
      return states.get(holderId)?.totalG ?? 0;
    },
    getComposition(holderId) {
      known(holderId);
      const s = states.get(holderId);
      if (s === undefined) return EMPTY_PARTS;
      const merged = mergeAllParts(liveLayers(s));
      return { originIds: [...merged.originIds], grams: [...merged.grams] };
    },
    getLayers(holderId) {
      known(holderId);
      const s = states.get(holderId);
      return s === undefined
        ? []
        : liveLayers(s).map((l) => ({
            enteredByMoveId: l.enteredByMoveId,
            parts: { originIds: [...l.originIds], grams: [...l.grams] },
          }));
    },
    listStockedHolderIds() {
      return [...states]
        .filter(([, s]) => s.totalG > 0)
        .map(([id]) => id)
        .sort((a, b) => a - b);
    },
    snapshot(leaveOut) {
      return snapshotOf(ctx, leaveOut);
    },
  };
}
