// The ancestor subgraph of a holder: which holders' states matter up to which ledger position, the
// moves among them, and their replay (a backward trace replays only these).
import { ok } from "@/lib/core/result";
import type { Result } from "@/lib/core/result";
import type { CompositionParts } from "@/lib/trace/composition";
import type { LedgerIndex, TraceMove } from "@/lib/ledger/moves";
import type { Replay } from "@/lib/trace/replay";

/** The first index in a sorted list whose value is at least `value`. */
/**
 * For each ancestor holder, the last ledger position up to which its state matters. Horizons only grow,
 * and each holder's incoming list is walked once overall, so this is O(ancestor moves).
 */
export function findAncestorHorizons(
  index: LedgerIndex,
  holderId: number,
  horizon: number,
  start: number,
): Map<number, number> {
  const horizons = new Map<number, number>();
  const walked = new Map<number, number>();
  const work: number[] = [];
  const raise = (h: number, pos: number) => {
    if ((horizons.get(h) ?? -1) < pos) {
      horizons.set(h, pos);
      work.push(h);
    }
  };
  if (horizon >= start) raise(holderId, horizon);
  for (let h = work.pop(); h !== undefined; h = work.pop()) {
    const list = index.into.get(h) ?? [];
    const limit = horizons.get(h) ?? -1;
    let i = walked.get(h) ?? lowerBound(list, start);
    for (let pos = list[i]; pos !== undefined && pos <= limit; pos = list[++i]) {
      const from = index.moves[pos]?.fromHolderId ?? null;
      if (from !== null) raise(from, pos);
    }
    walked.set(h, i);
  }
  return horizons;
}

export function collectAncestorMoves(
  index: LedgerIndex,
  horizons: ReadonlyMap<number, number>,
  start: number,
): number[] {
  const positions: number[] = [];
  for (const [h, limit] of horizons) {
    for (const list of [index.into.get(h) ?? [], index.outOf.get(h) ?? []]) {
      for (let i = lowerBound(list, start), pos = list[i]; pos !== undefined && pos <= limit; pos = list[++i]) {
        positions.push(pos);
      }
    }
  }
  positions.sort((a, b) => a - b);
  return positions.filter((pos, i) => i === 0 || pos !== positions[i - 1]);
}

export function replaySubgraph(
  index: LedgerIndex,
  replay: Replay,
  positions: readonly number[],
  horizons: ReadonlyMap<number, number>,
  onMove: (move: TraceMove, parts: CompositionParts) => void,
): Result<void> {
  for (const pos of positions) {
    const move = index.moves[pos];
    if (move === undefined) continue;
    const destinationNeeded = pos <= (horizons.get(move.toHolderId) ?? -1);
    const applied = destinationNeeded ? replay.apply(move) : replay.withdraw(move);
    if (!applied.ok) return applied;
    onMove(move, applied.value);
  }
  return ok(undefined);
}

export function lowerBound(list: readonly number[], value: number): number {
  let lo = 0;
  let hi = list.length;
  while (lo < hi) {
    const mid = (lo + hi) >>> 1;
    if ((list[mid] ?? value) < value) lo = mid + 1;
    else hi = mid;
  }
  return lo;
}
