// A ledger index carried past a booking instead of rebuilt. A booking adds a few moves near the end of
// the ledger (a transfer dated now, a pickup dated an hour ago): every move before the first new one
// keeps its place, and only the holders that the new and the shifted moves touch get new lists.
// Indexing ten years again after every booking (222 k moves, 99 k holders) cost about a quarter of a
// second of the one request thread. New moves dated far back (more than MAX_SHIFTED moves would move),
// a repeated id or an unknown holder return null and the caller indexes the whole ledger, which names
// anything wrong.
import { denseLookupOf, idMapOf } from "@/lib/ledger/id-map";
import { compareMoves, isValidMove } from "@/lib/ledger/moves";
import type { LedgerIndex, TraceHolder, TraceMove } from "@/lib/ledger/moves";
import { withChanges } from "@/lib/ledger/overlay-map";

/** At most this many indexed moves may shift to make room; a booking dated further back re-indexes. */
export const MAX_SHIFTED = 20_000;

function withHolders(
  holders: ReadonlyMap<number, TraceHolder>,
  added: readonly TraceHolder[],
): ReadonlyMap<number, TraceHolder> | null {
  if (added.some((h) => holders.has(h.id))) return null;
  if (new Set(added.map((h) => h.id)).size !== added.length) return null;
  return withChanges(
    holders,
    added.map((h) => [h.id, h]),
    denseLookupOf,
  );
}

/** The first position whose move sorts after `m` (moves sorted by compareMoves). */
function firstAfter(moves: readonly TraceMove[], m: TraceMove): number {
  let lo = 0;
  let hi = moves.length;
  while (lo < hi) {
    const mid = (lo + hi) >>> 1;
    if (compareMoves(moves[mid] as TraceMove, m) <= 0) lo = mid + 1;
    else hi = mid;
  }
  return lo;
}

/** The first index of an ascending list holding a value ≥ p. */
function lowerBound(list: readonly number[], p: number): number {
  let lo = 0;
  let hi = list.length;
  while (lo < hi) {
    const mid = (lo + hi) >>> 1;
    if ((list[mid] as number) < p) lo = mid + 1;
    else hi = mid;
  }
  return lo;
}

/** Each touched holder's list: its positions before `from`, then its positions among the moves from `from` on. */
function relisted(
  lists: ReadonlyMap<number, readonly number[]>,
  moves: readonly TraceMove[],
  from: number,
  holderOf: (m: TraceMove) => number | null,
): ReadonlyMap<number, readonly number[]> {
  const changed = new Map<number, number[]>();
  for (let pos = from; pos < moves.length; pos++) {
    const h = holderOf(moves[pos] as TraceMove);
    if (h === null) continue;
    let list = changed.get(h);
    if (list === undefined) {
      const before = lists.get(h) ?? [];
      list = before.slice(0, lowerBound(before, from));
      changed.set(h, list);
    }
    list.push(pos);
  }
  return withChanges<number, readonly number[]>(lists, [...changed], denseLookupOf);
}

/**
 * The index of the ledger `index` was built from plus `addedHolders` and `addedMoves`, equal to what
 * indexLedger builds from the whole of it; null when the moves reach too far back or are not valid
 * (index it all). The given index is left as it was: answers still computed on it read the same ledger.
 */
export function extendIndex(
  index: LedgerIndex,
  addedHolders: readonly TraceHolder[],
  addedMoves: readonly TraceMove[],
): LedgerIndex | null {
  if (addedHolders.length === 0 && addedMoves.length === 0) return index;
  const holders = withHolders(index.holders, addedHolders);
  if (holders === null) return null;
  const ids = new Set<number>();
  for (const m of addedMoves) {
    if (!isValidMove(m, holders) || index.positionOf.has(m.id) || ids.has(m.id)) return null;
    ids.add(m.id);
  }
  // New holders alone (a lot recorded, nothing moved yet) change no position.
  if (addedMoves.length === 0) return { ...index, holders };
  const added = [...addedMoves].sort(compareMoves);
  const from = firstAfter(index.moves, added[0] as TraceMove);
  if (index.moves.length - from > MAX_SHIFTED) return null;
  const moves = index.moves.slice(0, from).concat([...index.moves.slice(from), ...added].sort(compareMoves));
  const positionOf = idMapOf(
    moves.length,
    (pos) => (moves[pos] as TraceMove).id,
    (pos) => pos,
  );
  if (positionOf === null) return null;
  const massPrefixG = index.massPrefixG.slice(0, from + 1);
  let sum = massPrefixG[from] ?? 0;
  for (let pos = from; pos < moves.length; pos++) {
    sum += (moves[pos] as TraceMove).massG;
    massPrefixG.push(sum);
  }
  return {
    moves,
    holders,
    positionOf,
    into: relisted(index.into, moves, from, (m) => m.toHolderId),
    outOf: relisted(index.outOf, moves, from, (m) => m.fromHolderId),
    massPrefixG,
  };
}
