import { failMany, ok } from "@/lib/core/result";
import { denseLookupOf, denseSpan, idMapOf } from "@/lib/ledger/id-map";
import type { DomainIssue, Result } from "@/lib/core/result";
import type { HolderKind, MixingModel } from "@/lib/core/vocabulary";

export type { HolderKind };
export type Mixing = MixingModel;

export interface TraceHolder {
  id: number;
  kind: HolderKind;
  mixing: Mixing;
}

export interface TraceMove {
  /** Ledger order tiebreak between moves at the same instant. */
  id: number;
  /** Epoch milliseconds. */
  at: number;
  /** null = material enters the books here; the move's id then names a new origin. */
  fromHolderId: number | null;
  toHolderId: number;
  /** Positive integer grams. */
  massG: number;
}

/** A DomainIssue with the ids a caller needs to point at the offending row. */
export interface TraceIssue extends DomainIssue {
  moveId?: number;
  holderId?: number;
  shortfallG?: number;
}

/**
 * Moves in ledger order plus per-holder position lists. Build it once per ledger version and reuse it
 * across queries: every query then costs only what it replays.
 */
export interface LedgerIndex {
  /** Sorted by (at, id). A move's position is its index here. */
  readonly moves: readonly TraceMove[];
  readonly holders: ReadonlyMap<number, TraceHolder>;
  readonly positionOf: ReadonlyMap<number, number>;
  /** Holder id → positions of the moves into it, ascending. */
  readonly into: ReadonlyMap<number, readonly number[]>;
  /** Holder id → positions of the moves out of it, ascending. */
  readonly outOf: ReadonlyMap<number, readonly number[]>;
  /** massPrefixG[p] = Σ massG of moves at positions < p; lets a snapshot be checked against the ledger. */
  readonly massPrefixG: readonly number[];
}

export function compareMoves(a: Pick<TraceMove, "at" | "id">, b: Pick<TraceMove, "at" | "id">): number {
  return a.at - b.at || a.id - b.id;
}

export function formatMoveField(moveId: number, key?: keyof TraceMove): string {
  return key === undefined ? `moves.${moveId}` : `moves.${moveId}.${key}`;
}

/** Checks one move's own fields against the holder list; returns the issues found (empty = valid). */
export function checkMove(move: TraceMove, holders: ReadonlyMap<number, TraceHolder>): TraceIssue[] {
  const issues: TraceIssue[] = [];
  const moveId = move.id;
  if (!Number.isSafeInteger(move.id)) {
    issues.push({
      code: "TRACE.INVALID_MOVE",
      message: `Move id ${move.id} is not an integer.`,
      field: "moves.id",
      moveId,
    });
  }
  if (!Number.isSafeInteger(move.massG) || move.massG <= 0) {
    issues.push({
      code: "TRACE.INVALID_MOVE",
      message: `Move ${moveId}: mass must be a positive whole number of grams, got ${move.massG}.`,
      field: formatMoveField(moveId, "massG"),
      moveId,
    });
  }
  if (!Number.isFinite(move.at)) {
    issues.push({
      code: "TRACE.INVALID_MOVE",
      message: `Move ${moveId}: time must be a finite epoch-millisecond value, got ${move.at}.`,
      field: formatMoveField(moveId, "at"),
      moveId,
    });
  }
  if (!holders.has(move.toHolderId)) {
    issues.push({
      code: "TRACE.UNKNOWN_HOLDER",
      message: `Move ${moveId} goes to holder ${move.toHolderId}, which is not in the holder list.`,
      field: formatMoveField(moveId, "toHolderId"),
      moveId,
      holderId: move.toHolderId,
    });
  }
  if (move.fromHolderId !== null && !holders.has(move.fromHolderId)) {
    issues.push({
      code: "TRACE.UNKNOWN_HOLDER",
      message: `Move ${moveId} comes from holder ${move.fromHolderId}, which is not in the holder list.`,
      field: formatMoveField(moveId, "fromHolderId"),
      moveId,
      holderId: move.fromHolderId,
    });
  }
  if (move.fromHolderId === move.toHolderId) {
    issues.push({
      code: "TRACE.SELF_MOVE",
      message: `Move ${moveId} goes from holder ${move.toHolderId} to itself; a move must change holder.`,
      field: formatMoveField(moveId, "toHolderId"),
      moveId,
      holderId: move.toHolderId,
    });
  }
  return issues;
}

export function mapHolders(holders: readonly TraceHolder[]): Result<Map<number, TraceHolder>> {
  const byId = new Map<number, TraceHolder>();
  const issues: TraceIssue[] = [];
  for (const h of holders) {
    if (byId.has(h.id)) {
      issues.push({
        code: "TRACE.DUPLICATE_HOLDER",
        message: `Holder ${h.id} is listed twice.`,
        field: `holders.${h.id}`,
        holderId: h.id,
      });
    }
    byId.set(h.id, h);
  }
  return issues.length > 0 ? failMany(issues) : ok(byId);
}

/**
 * Validates a ledger and indexes it. Pass the ledger with reversed pairs left out (a move and the move
 * that reverses it): a reversal is a booking correction, not a physical flow, and replaying it as a
 * flow would carry the holder's current mixture instead of cancelling the original move.
 */
export function indexLedger(holders: readonly TraceHolder[], moves: readonly TraceMove[]): Result<LedgerIndex> {
  const mapped = mapHolders(holders);
  if (!mapped.ok) return mapped;
  // Every move's holders are looked up here and again by every replay: read them by id from an array.
  const holderMap = denseLookupOf(mapped.value);
  // The usual ledger is valid and already in order (it is read in id order and booked as it happens):
  // a check per move and no sort. Anything off goes through the full check, which names every issue.
  if (!moves.every((m) => isValidMove(m, holderMap))) return failMany(listLedgerIssues(moves, holderMap));
  const sorted = isInOrder(moves) ? moves.slice() : [...moves].sort(compareMoves);
  const positionOf = idMapOf(
    sorted.length,
    (pos) => (sorted[pos] as TraceMove).id,
    (pos) => pos,
  );
  // A repeated id: the full check names it.
  if (positionOf === null) return failMany(listLedgerIssues(moves, holderMap));
  const lists = positionLists(sorted, holderMap);
  const massPrefixG: number[] = [0];
  let sum = 0;
  for (let pos = 0; pos < sorted.length; pos++) {
    sum += (sorted[pos] as TraceMove).massG;
    massPrefixG.push(sum);
  }
  return ok({
    moves: sorted,
    holders: holderMap,
    positionOf,
    into: lists.into,
    outOf: lists.outOf,
    massPrefixG,
  });
}

/**
 * Per holder, the ascending positions of the moves into it and out of it (keys in order of first
 * appearance). Holder ids are an autoincrement key, so each list is counted into a typed array by id
 * first and made at its final length: at ten years (222 k moves, 99 k holders) that is a third of the
 * work of growing each list move by move through the map, which sparse ids still do.
 */
function positionLists(
  sorted: readonly TraceMove[],
  holders: ReadonlyMap<number, TraceHolder>,
): { into: ReadonlyMap<number, number[]>; outOf: ReadonlyMap<number, number[]> } {
  let lo = Number.POSITIVE_INFINITY;
  let hi = Number.NEGATIVE_INFINITY;
  for (const id of holders.keys()) {
    if (id < lo) lo = id;
    if (id > hi) hi = id;
  }
  const span = denseSpan(lo, hi, holders.size);
  if (span === null) {
    const into = new Map<number, number[]>();
    const outOf = new Map<number, number[]>();
    sorted.forEach((m, pos) => {
      pushTo(into, m.toHolderId, pos);
      if (m.fromHolderId !== null) pushTo(outOf, m.fromHolderId, pos);
    });
    return { into, outOf };
  }
  return {
    into: countedLists(sorted.length, (pos) => (sorted[pos] as TraceMove).toHolderId, lo, span),
    outOf: countedLists(sorted.length, (pos) => (sorted[pos] as TraceMove).fromHolderId, lo, span),
  };
}

/** Holder id → ascending positions p < n with holderAt(p) equal to it; every id lies in [lo, lo + span). */
function countedLists(
  n: number,
  holderAt: (pos: number) => number | null,
  lo: number,
  span: number,
): ReadonlyMap<number, number[]> {
  const counts = new Int32Array(span);
  const order: number[] = [];
  for (let pos = 0; pos < n; pos++) {
    const h = holderAt(pos);
    if (h === null) continue;
    const seen = counts[h - lo] ?? 0;
    counts[h - lo] = seen + 1;
    if (seen === 0) order.push(h);
  }
  const lists = new Map<number, number[]>();
  const bySlot = new Array<number[]>(span);
  for (const h of order) {
    const list = new Array<number>(counts[h - lo] ?? 0);
    bySlot[h - lo] = list;
    lists.set(h, list);
  }
  const filled = new Int32Array(span);
  for (let pos = 0; pos < n; pos++) {
    const h = holderAt(pos);
    if (h === null) continue;
    const slot = h - lo;
    const at = filled[slot] ?? 0;
    (bySlot[slot] as number[])[at] = pos;
    filled[slot] = at + 1;
  }
  return denseLookupOf(lists, { firstId: lo, slots: bySlot });
}

/** Exactly when checkMove finds nothing, without building its issue list (a replay checks every move). */
export function isValidMove(m: TraceMove, holders: ReadonlyMap<number, TraceHolder>): boolean {
  return (
    Number.isSafeInteger(m.id) &&
    Number.isSafeInteger(m.massG) &&
    m.massG > 0 &&
    Number.isFinite(m.at) &&
    holders.has(m.toHolderId) &&
    (m.fromHolderId === null || holders.has(m.fromHolderId)) &&
    m.fromHolderId !== m.toHolderId
  );
}

function isInOrder(moves: readonly TraceMove[]): boolean {
  for (let i = 1; i < moves.length; i++)
    if (compareMoves(moves[i - 1] as TraceMove, moves[i] as TraceMove) > 0) return false;
  return true;
}

/** Every issue of the moves: each move's own fields, then repeated ids, in ledger order as given. */
function listLedgerIssues(moves: readonly TraceMove[], holderMap: ReadonlyMap<number, TraceHolder>): TraceIssue[] {
  const issues: TraceIssue[] = [];
  const seen = new Set<number>();
  for (const m of moves) {
    issues.push(...checkMove(m, holderMap));
    if (seen.has(m.id)) {
      issues.push({
        code: "TRACE.DUPLICATE_MOVE",
        message: `Move id ${m.id} appears more than once.`,
        field: formatMoveField(m.id),
        moveId: m.id,
      });
    }
    seen.add(m.id);
  }
  return issues;
}

/** Position of the last move with at ≤ t, or -1 when every move is later. */
export function findLastPositionAtOrBefore(index: LedgerIndex, t: number): number {
  let lo = 0;
  let hi = index.moves.length;
  while (lo < hi) {
    const mid = (lo + hi) >>> 1;
    const m = index.moves[mid];
    if (m !== undefined && m.at <= t) lo = mid + 1;
    else hi = mid;
  }
  return lo - 1;
}

function pushTo(map: Map<number, number[]>, key: number, value: number): void {
  const list = map.get(key);
  if (list === undefined) map.set(key, [value]);
  else list.push(value);
}
