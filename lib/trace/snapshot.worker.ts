// The worker thread's side of snapshot-worker.service.ts: rebuilds the index from the columns it is
// sent, replays from the base snapshot and posts back the snapshots taken. Pure computation only.
import { parentPort } from "node:worker_threads";
import { indexLedger } from "@/lib/ledger/moves";
import type { TraceHolder, TraceMove } from "@/lib/ledger/moves";
import { extendSnapshots } from "@/lib/trace/monthly-snapshots";
import type { ReplaySnapshot } from "@/lib/trace/replay";
import type { DomainIssue } from "@/lib/core/result";

export interface SnapshotJob {
  holders: TraceHolder[];
  /** Moves in the index's order as columns; NaN stands for "from outside the books". */
  ids: Float64Array;
  at: Float64Array;
  from: Float64Array;
  to: Float64Array;
  mass: Float64Array;
  /** Real booking time by move id (the booked-order index replaces times by ids). */
  realIds: Float64Array;
  realAt: Float64Array;
  base: ReplaySnapshot | null;
}

export type SnapshotReply =
  { ok: true; keptBase: boolean; fresh: ReplaySnapshot[] } | { ok: false; issues: DomainIssue[] };

export function runSnapshotJob(job: SnapshotJob): SnapshotReply {
  const moves: TraceMove[] = [];
  for (let i = 0; i < job.ids.length; i++) {
    const from = job.from[i] ?? Number.NaN;
    moves.push({
      id: job.ids[i] ?? 0,
      at: job.at[i] ?? 0,
      fromHolderId: Number.isNaN(from) ? null : from,
      toHolderId: job.to[i] ?? 0,
      massG: job.mass[i] ?? 0,
    });
  }
  const index = indexLedger(job.holders, moves);
  if (!index.ok) return index;
  const realAt = new Map<number, number>();
  for (let i = 0; i < job.realIds.length; i++) realAt.set(job.realIds[i] ?? 0, job.realAt[i] ?? 0);
  const built = extendSnapshots(index.value, job.base === null ? [] : [job.base], realAt);
  if (!built.ok) return built;
  const keptBase = job.base !== null && built.value[0] === job.base;
  return { ok: true, keptBase, fresh: built.value.filter((s) => s !== job.base) };
}

parentPort?.on("message", (job: SnapshotJob) => {
  parentPort?.postMessage(runSnapshotJob(job));
});
