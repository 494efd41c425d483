// The per-site trace state (one index of the ledger plus monthly replay snapshots) and the pure steps on
// it: extending the snapshots, naming holders in issues, resuming a trace from the nearest snapshot.
// The cache that keeps one state per site lives in trace-cache.service.ts.
import { failMany, ok } from "@/lib/core/result";
import type { DomainIssue, Result } from "@/lib/core/result";
import { labelOf } from "@/lib/core/vocabulary";
import type { TraceLedger } from "@/lib/ledger/holder-ref";
import type { CompositionParts } from "@/lib/trace/composition";
import { resumeReplay, traceForward, traceHolder } from "@/lib/trace/genealogy";
import type { ForwardTrace, HolderTrace } from "@/lib/trace/genealogy";
import { indexLedger } from "@/lib/ledger/moves";
import { extendIndex } from "@/lib/ledger/extend-index";
import type { LedgerPosition } from "@/lib/ledger/position";
import type { LedgerIndex, TraceMove } from "@/lib/ledger/moves";
import { createReplay } from "@/lib/trace/replay";
import { isUnreadable } from "@/lib/trace/stored-snapshot";
import type { Replay, ReplaySnapshot } from "@/lib/trace/replay";
import type { LedgerFreshness } from "@/lib/trace/trace-answers";
import type { EntryHolderFacts, LedgerVersion } from "@/lib/trace/trace-facts";

export { MAX_SNAPSHOTS } from "@/lib/trace/monthly-snapshots";

export interface LedgerState {
  siteId: number;
  version: LedgerVersion;
  /**
   * A ledger position read no later than `version` (last movement id and audit head: two key reads).
   * While the site's position is still this one nothing was booked, so the state is reused without
   * counting the site's movements.
   */
  position: LedgerPosition | null;
  ledger: TraceLedger;
  index: LedgerIndex;
  order: "dated" | "booked";
  orderProblem: string | null;
  /** Real booking time of each move (the booked-order index replaces times by ids). */
  realAt: ReadonlyMap<number, number>;
  snapshots: ReplaySnapshot[];
  indexedAt: Date;
  indexMs: number;
  /** Answers at this version, or being computed (readers of the same question wait for one computation). */
  answers: Map<string, Promise<Result<unknown>>>;
  /** Per holder: what each of its outgoing moves carried, keyed by the holder's incoming move ids. */
  carriedByFeeder: Map<number, Map<number, CompositionParts>>;
  tankService: Map<number, string>;
  /** Lot, pickup, source and reagent facts, read once per ledger version (they are set when the material enters). */
  facts: Promise<Map<number, EntryHolderFacts>> | null;
}

export function sameVersion(a: LedgerVersion, b: LedgerVersion): boolean {
  return a.count === b.count && a.lastId === b.lastId;
}

export function indexInOrder(ledger: TraceLedger, order: "dated" | "booked"): Result<LedgerIndex> {
  return indexLedger(ledger.holders, inOrder(ledger.moves, order));
}

/** The moves as the index in this order sees them: in booking order each one's time is its id. */
function inOrder(moves: readonly TraceMove[], order: "dated" | "booked"): readonly TraceMove[] {
  return order === "dated" ? moves : moves.map((m) => ({ ...m, at: m.id }));
}

/**
 * The index of `ledger` in this order: carried from the state it was appended to (extendIndex) when
 * that state was indexed in the same order and the new moves simply append, else indexed whole.
 */
export function indexAfter(
  appendedTo: Pick<LedgerState, "ledger" | "index" | "order"> | null,
  ledger: TraceLedger,
  order: "dated" | "booked",
): Result<LedgerIndex> {
  if (appendedTo !== null && appendedTo.order === order) {
    const before = appendedTo.ledger;
    const carried = extendIndex(
      appendedTo.index,
      ledger.holders.slice(before.holders.length),
      inOrder(ledger.moves.slice(before.moves.length), order),
    );
    if (carried !== null) return ok(carried);
  }
  return indexInOrder(ledger, order);
}

/** Whether a snapshot still describes a prefix of this index (the check resumeReplay makes, without the copy). */
export function snapshotFits(index: LedgerIndex, s: ReplaySnapshot): boolean {
  const { count, massSumG, last } = s.applied;
  if (last === null) return count === 0;
  const pos = index.positionOf.get(last.moveId);
  return pos === count - 1 && index.moves[pos]?.at === last.at && index.massPrefixG[count] === massSumG;
}

// The trace core names holders by id; say which tank or lot that is.
export function describeIssues(ledger: TraceLedger, issues: readonly DomainIssue[]): string {
  return issues
    .slice(0, 3)
    .map((i) => i.message.replace(/\.$/, ""))
    .join("; ")
    .replace(/holder (-?\d+)/g, (whole, id: string) => {
      const ref = ledger.refs.get(Number(id));
      return ref ? `${labelOf(ref.kind).toLowerCase()} ${ref.code}` : whole;
    });
}

export function renameIssues(ledger: TraceLedger, issues: readonly DomainIssue[]): DomainIssue[] {
  return issues.map((i) => ({ ...i, message: describeIssues(ledger, [i]) }));
}

export function freshnessOf(state: LedgerState, computeMs: number, fromCache: boolean): LedgerFreshness {
  const latest = state.snapshots[state.snapshots.length - 1];
  const latestAt = latest?.applied.last ? state.realAt.get(latest.applied.last.moveId) : undefined;
  return {
    movements: state.version.count,
    lastMoveId: state.version.lastId,
    reversedPairsLeftOut: state.ledger.reversedPairsLeftOut,
    indexedAt: state.indexedAt,
    indexMs: state.indexMs,
    snapshots: state.snapshots.length,
    latestSnapshotAt: latestAt === undefined ? null : new Date(latestAt),
    order: state.order,
    orderProblem: state.orderProblem,
    computeMs,
    fromCache,
  };
}

/** The latest snapshot that has applied at most `count` moves (one whose stored body was unreadable is passed over). */
export function snapshotCovering(state: LedgerState, count: number): ReplaySnapshot | undefined {
  let best: ReplaySnapshot | undefined;
  for (const s of state.snapshots) if (s.applied.count <= count && !isUnreadable(s)) best = s;
  return best;
}

export function realPosition(
  state: LedgerState,
  pos: { moveId: number; at: number } | null,
): { moveId: number; at: Date } | null {
  return pos === null ? null : { moveId: pos.moveId, at: new Date(state.realAt.get(pos.moveId) ?? pos.at) };
}

/** In booking order the index's time is the movement id: the last id booked at or before a real time. */
export function lastIdAtOrBefore(state: LedgerState, atMs: number): number {
  let best = 0;
  for (const [id, real] of state.realAt) if (real <= atMs && id > best) best = id;
  return best;
}

export function receivedFromCache(state: LedgerState, holderId: number): Result<HolderTrace> {
  // "received" must see every move into the holder: resume from a snapshot taken before the first.
  const from = snapshotCovering(state, state.index.into.get(holderId)?.[0] ?? Number.POSITIVE_INFINITY);
  const back = traceHolder(state.index, holderId, from === undefined ? {} : { from });
  return back.ok ? back : failMany(renameIssues(state.ledger, back.issues));
}

/** Forward from a snapshot taken before the first origin entered, so the trace can stop once none of it can move. */
export function forwardFromCache(state: LedgerState, originIds: readonly number[]): Result<ForwardTrace> {
  const firstPos = originIds.reduce(
    (m, id) => Math.min(m, state.index.positionOf.get(id) ?? Number.POSITIVE_INFINITY),
    Number.POSITIVE_INFINITY,
  );
  const from = snapshotCovering(state, firstPos);
  const fwd = traceForward(state.index, originIds, from === undefined ? {} : { from });
  return fwd.ok ? fwd : failMany(renameIssues(state.ledger, fwd.issues));
}

/**
 * What the given moves carried, by origin, from one forward replay of the index (the chain of custody
 * uses it for the certified share of the oil charged to each batch). Reversed pairs are not in the trace
 * ledger, so a reversed move is absent from the answer.
 */
export function moveCompositions(
  state: LedgerState,
  wanted: readonly number[],
): Result<{ carried: Map<number, CompositionParts> }> {
  const { index } = state;
  const positions = wanted.map((id) => index.positionOf.get(id)).filter((p): p is number => p !== undefined);
  const carried = new Map<number, CompositionParts>();
  const firstPos = positions.length === 0 ? index.moves.length : Math.min(...positions);
  const lastPos = positions.length === 0 ? -1 : Math.max(...positions);
  const from = snapshotCovering(state, firstPos);
  let replay: Replay = createReplay(index.holders);
  if (from !== undefined) {
    const resumed = resumeReplay(index, from);
    if (!resumed.ok) return resumed;
    replay = resumed.value;
  }
  const want = new Set(wanted);
  for (let pos = replay.appliedCount; pos <= lastPos; pos++) {
    const move = index.moves[pos];
    if (move === undefined) break;
    const applied = replay.apply(move);
    if (!applied.ok) return failMany(renameIssues(state.ledger, applied.issues));
    if (want.has(move.id))
      carried.set(move.id, { originIds: [...applied.value.originIds], grams: [...applied.value.grams] });
  }
  return ok({ carried });
}
