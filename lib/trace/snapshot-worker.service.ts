import "server-only";
// Building a site's monthly snapshots replays the ledger from the latest stored snapshot that still
// fits: a few thousand moves after a booking, but the whole ledger (seconds at ten years) when nothing
// is stored yet. A long replay runs on a worker thread so the request thread keeps answering other
// people's pages meanwhile (decision 0042); a short one runs inline, where posting the ledger to a
// thread would cost more than the replay. The answer is the same either way (tested).
import path from "node:path";
import { existsSync } from "node:fs";
import { pathToFileURL } from "node:url";
import { Worker } from "node:worker_threads";
import { log } from "@/lib/log/log.service";
import type { Result } from "@/lib/core/result";
import { ok } from "@/lib/core/result";
import type { LedgerIndex } from "@/lib/ledger/moves";
import { extendSnapshots, MAX_SNAPSHOTS } from "@/lib/trace/monthly-snapshots";
import type { ReplaySnapshot } from "@/lib/trace/replay";
import type { SnapshotJob, SnapshotReply } from "@/lib/trace/snapshot.worker";

/** Replays at least this long go to a worker thread (about 0.2 s of replay on the bench machine). */
export const WORKER_MIN_MOVES = 20_000;

/** The worker's source; the app runs from its repository, and tsx (a dependency) loads TypeScript there. */
const WORKER_FILE = path.join(process.cwd(), "lib", "trace", "snapshot.worker.ts");

function workerEnabled(): boolean {
  return process.env.TRACEVAT_TRACE_WORKER !== "0" && existsSync(WORKER_FILE);
}

function jobOf(index: LedgerIndex, base: ReplaySnapshot | null, realAt: ReadonlyMap<number, number>): SnapshotJob {
  const n = index.moves.length;
  const job: SnapshotJob = {
    holders: [...index.holders.values()],
    ids: new Float64Array(n),
    at: new Float64Array(n),
    from: new Float64Array(n),
    to: new Float64Array(n),
    mass: new Float64Array(n),
    realIds: new Float64Array(realAt.size),
    realAt: new Float64Array(realAt.size),
    base,
  };
  index.moves.forEach((m, i) => {
    job.ids[i] = m.id;
    job.at[i] = m.at;
    job.from[i] = m.fromHolderId ?? Number.NaN;
    job.to[i] = m.toHolderId;
    job.mass[i] = m.massG;
  });
  let i = 0;
  for (const [id, at] of realAt) {
    job.realIds[i] = id;
    job.realAt[i] = at;
    i += 1;
  }
  return job;
}

/** Runs one job on a fresh worker thread (loaded through tsx), which exits when it has answered. */
export function runOnWorker(job: SnapshotJob): Promise<SnapshotReply> {
  const boot = `import("tsx/esm/api").then((t) => { t.register(); return import(${JSON.stringify(pathToFileURL(WORKER_FILE).href)}); })`;
  return new Promise((resolve, reject) => {
    const worker = new Worker(boot, { eval: true });
    worker.once("message", (reply: SnapshotReply) => {
      resolve(reply);
      void worker.terminate();
    });
    worker.once("error", reject);
    worker.once("exit", (code) => reject(new Error(`snapshot worker exited with code ${code}`)));
    const buffers = [job.ids, job.at, job.from, job.to, job.mass, job.realIds, job.realAt].map((a) => a.buffer);
    worker.postMessage(job, buffers as ArrayBuffer[]);
  });
}

/**
 * extendSnapshots (lib/trace/monthly-snapshots.ts), on a worker thread when the replay is long. Falls
 * back to running inline if the worker cannot start or fails; `force` (tests) always uses the worker
 * and throws instead of falling back.
 */
export async function extendSnapshotsOffThread(
  index: LedgerIndex,
  kept: readonly ReplaySnapshot[],
  realAt: ReadonlyMap<number, number>,
  opts: { force?: boolean } = {},
): Promise<Result<ReplaySnapshot[]>> {
  const base = kept[kept.length - 1] ?? null;
  const toReplay = index.moves.length - (base?.applied.count ?? 0);
  if (!(opts.force === true || (toReplay >= WORKER_MIN_MOVES && workerEnabled())))
    return extendSnapshots(index, kept, realAt);
  try {
    const reply = await runOnWorker(jobOf(index, base, realAt));
    if (!reply.ok) return reply;
    return ok((reply.keptBase ? [...kept, ...reply.fresh] : reply.fresh).slice(-MAX_SNAPSHOTS));
  } catch (err) {
    if (opts.force === true) throw err;
    log.warn({ err, event: "trace.snapshots.worker" }, "the snapshot worker failed; replaying on the request thread");
    return extendSnapshots(index, kept, realAt);
  }
}
