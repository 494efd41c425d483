// Monthly replay snapshots, built by replaying the ledger from the latest snapshot that still fits it:
// pure, so the trace service can run it on its own thread (snapshot-worker.service.ts) or inline.
import { TERMINAL_KINDS } from "@/lib/core/vocabulary";
import { ok } from "@/lib/core/result";
import type { Result } from "@/lib/core/result";
import { resumeReplay } from "@/lib/trace/genealogy";
import type { LedgerIndex, TraceMove } from "@/lib/ledger/moves";
import { createReplay } from "@/lib/trace/replay";
import type { Replay, ReplaySnapshot } from "@/lib/trace/replay";

/**
 * Monthly snapshots kept per site (twenty years); older months are dropped (a trace then resumes from
 * an earlier start). Without the terminal holders a month's snapshot is the tanks', lots' and open
 * batches' mixtures: about 20 holders and 9,500 origin entries on the ten-year bench plant.
 */
export const MAX_SNAPSHOTS = 240;

function monthStartAfter(at: number): number {
  const d = new Date(at);
  return Date.UTC(d.getUTCFullYear(), d.getUTCMonth() + 1, 1);
}

/**
 * Which holders a snapshot may leave out: shipments, disposals and losses, which keep every origin they
 * ever received (nearly all of a full snapshot's size) and which nothing is drawn from, so no later move
 * depends on their mixture. A backward trace of one of them resumes from before its first receipt.
 * Undefined (leave nothing out) if the ledger does draw from one.
 */
function terminalHolders(index: LedgerIndex): ((holderId: number) => boolean) | undefined {
  const terminal = new Set<number>();
  for (const h of index.holders.values()) {
    if (!TERMINAL_KINDS.has(h.kind)) continue;
    if (index.outOf.has(h.id)) return undefined;
    terminal.add(h.id);
  }
  return (holderId) => terminal.has(holderId);
}

/**
 * Replays from the latest snapshot still valid for this index to the end, taking a snapshot at every
 * month start crossed (UTC months; booking-order indexes use the real dates). Fails when the ledger
 * cannot be replayed in this order.
 */
export function extendSnapshots(
  index: LedgerIndex,
  kept: readonly ReplaySnapshot[],
  realAt: ReadonlyMap<number, number>,
): Result<ReplaySnapshot[]> {
  const leaveOut = terminalHolders(index);
  // Snapshots that left terminal holders out cannot serve a ledger that draws from one.
  const snapshots = leaveOut === undefined ? [] : [...kept];
  const base = snapshots[snapshots.length - 1];
  let replay: Replay;
  if (base === undefined) replay = createReplay(index.holders);
  else {
    const resumed = resumeReplay(index, base);
    if (!resumed.ok) return resumed;
    replay = resumed.value;
  }
  const timeOf = (m: TraceMove) => realAt.get(m.id) ?? m.at;
  const first = index.moves[replay.appliedCount];
  if (first === undefined) return ok(snapshots);
  const baseLast = base?.applied.last ?? null;
  let boundary = monthStartAfter(baseLast === null ? timeOf(first) - 1 : (realAt.get(baseLast.moveId) ?? baseLast.at));
  for (let pos = replay.appliedCount; pos < index.moves.length; pos++) {
    const move = index.moves[pos];
    if (move === undefined) break;
    if (timeOf(move) >= boundary) {
      if (pos > 0) snapshots.push(replay.snapshot(leaveOut));
      boundary = monthStartAfter(timeOf(move));
    }
    const applied = replay.apply(move);
    if (!applied.ok) return applied;
  }
  return ok(snapshots.slice(-MAX_SNAPSHOTS));
}
