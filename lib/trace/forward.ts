// The replay behind a forward trace ("where did this material go"). Every gram it reports comes from
// the same replay as a backward trace: a draw splits the holder's whole mixture by largest remainder,
// so the traced origins' share of a draw depends on every other origin in the holder (the tie goes to
// the lower origin id), not only on the traced grams and the holder's stock. The mixtures of the
// holders the material reaches, and of everything that fed them, are therefore replayed in full.
// What a forward trace can leave out, it does:
// - a destination that is not drawn from again before the target is not booked: nothing later reads
//   its mixture, and its grams of the set are counted from the moves (Σ in − Σ out);
// - from a snapshot, only holders drawn from in the window are restored (sinks keep every origin they
//   ever received and are the bulk of a late snapshot);
// - the stop test looks only at the holders the move touched (a holder's grams and its next draw change
//   only when a move touches it), not at every open holder after every move.
import { ok } from "@/lib/core/result";
import type { Result } from "@/lib/core/result";
import { sumPartsOf } from "@/lib/trace/composition";
import type { LedgerIndex } from "@/lib/ledger/moves";
import { lowerBound } from "@/lib/trace/ancestors";
import type { Replay } from "@/lib/trace/replay";

export interface ForwardWindow {
  /** First position to replay: the replay's applied count (0 or a snapshot's). */
  start: number;
  /** Last position the answer includes. */
  target: number;
  /** Position of the last origin of the set at or before target (-1: none entered). */
  lastOrigin: number;
  /**
   * The replay started before any origin of the set entered: its grams per holder follow from the moves
   * that carry them, and the replay may stop once none of them can move again.
   */
  tracksHeld: boolean;
}

export interface ForwardCarry {
  /** Every move that carried part of the set, in ledger order. */
  moves: Array<{ moveId: number; grams: number }>;
  receivedBy: Map<number, number>;
  /** Σ in − Σ out of the set per holder (only when tracksHeld). */
  held: Map<number, number>;
  /** Moves the replay processed (applied or withdrawn). */
  processed: number;
}

/** Holder id → position of its last draw at or before target (-1: none); looked up once per holder. */
function lastDrawFinder(index: LedgerIndex, target: number): (holderId: number) => number {
  const cache = new Map<number, number>();
  return (holderId) => {
    let last = cache.get(holderId);
    if (last === undefined) {
      const outs = index.outOf.get(holderId);
      const i = outs === undefined ? 0 : lowerBound(outs, target + 1);
      last = i === 0 ? -1 : (outs?.[i - 1] ?? -1);
      cache.set(holderId, last);
    }
    return last;
  };
}

/**
 * The snapshot's holders a tracking forward replay reads: those drawn from in [start, target]. Looks
 * only at the snapshot's holders (holders that enter later start empty), not at every holder of the site.
 */
export function listDrawnHolders(
  index: LedgerIndex,
  holderIds: Iterable<number>,
  start: number,
  target: number,
): Set<number> {
  const drawn = new Set<number>();
  for (const holderId of holderIds) {
    const outs = index.outOf.get(holderId) ?? [];
    const i = lowerBound(outs, start);
    if (i < outs.length && (outs[i] ?? Number.POSITIVE_INFINITY) <= target) drawn.add(holderId);
  }
  return drawn;
}

/**
 * Replays from `replay`'s position to the window's target (or to where none of the set can move again)
 * and collects what carried the set. `replay` must stand at window.start.
 */
export function replayForward(
  index: LedgerIndex,
  replay: Replay,
  set: ReadonlySet<number>,
  window: ForwardWindow,
): Result<ForwardCarry> {
  const { start, target, lastOrigin, tracksHeld } = window;
  const lastDraw = lastDrawFinder(index, target);
  const carry: ForwardCarry = { moves: [], receivedBy: new Map(), held: new Map(), processed: 0 };
  const { held, receivedBy } = carry;
  /** Holders with grams of the set that are drawn from again before the target. */
  const open = new Set<number>();
  const review = (h: number, pos: number): void => {
    if ((held.get(h) ?? 0) === 0 || lastDraw(h) <= pos) open.delete(h);
  };
  for (let pos = start; pos <= target; pos++) {
    const move = index.moves[pos];
    if (move === undefined) break;
    const to = move.toHolderId;
    const applied = !tracksHeld || lastDraw(to) > pos ? replay.applyTransient(move) : replay.withdraw(move);
    if (!applied.ok) return applied;
    carry.processed++;
    const grams = sumPartsOf(applied.value, set);
    if (grams > 0) {
      carry.moves.push({ moveId: move.id, grams });
      receivedBy.set(to, (receivedBy.get(to) ?? 0) + grams);
      if (tracksHeld) {
        held.set(to, (held.get(to) ?? 0) + grams);
        if (move.fromHolderId !== null) held.set(move.fromHolderId, (held.get(move.fromHolderId) ?? 0) - grams);
        open.add(to);
      }
    }
    if (!tracksHeld || pos < lastOrigin) continue;
    if (pos === Math.max(lastOrigin, start)) for (const h of open) review(h, pos);
    else {
      if (open.has(to)) review(to, pos);
      if (move.fromHolderId !== null && open.has(move.fromHolderId)) review(move.fromHolderId, pos);
    }
    if (open.size === 0) break;
  }
  return ok(carry);
}
