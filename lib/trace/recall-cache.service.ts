import "server-only";
// The recall answer kept by ledger position (decision 0037). Keyed by site, the query as typed and
// whether customers are shown (the answer differs by reader); a product decision, a booking or any
// audited change moves the position and the next ask recomputes. No period seal: a recall follows the
// material to the present, so a closed period does not fix its answer.
import type { Db } from "@/lib/core/connect";
import type { Result } from "@/lib/core/result";
import { PositionCache } from "@/lib/ledger/position";
import { answerAtPosition, questionKey } from "@/lib/ledger/position-cache.service";
import type { KeptAnswer } from "@/lib/ledger/position-cache.service";
import { recallReport } from "@/lib/trace/recall.service";
import type { RecallReport } from "@/lib/trace/recall";

const home = globalThis as unknown as { tracevatRecallCache?: PositionCache<Result<RecallReport>> };
const cache: PositionCache<Result<RecallReport>> = (home.tracevatRecallCache ??= new PositionCache(100));

export async function recallReportTraced(
  db: Db,
  siteId: number,
  input: unknown,
  now: Date,
  opts: { withCustomers: boolean },
): Promise<KeptAnswer<RecallReport>> {
  const key = questionKey(siteId, input, opts.withCustomers);
  return answerAtPosition(cache, db, siteId, key, () => recallReport(db, siteId, input, now, opts));
}

/** recallReport, answered from memory while the site's books have not moved. */
export async function recallReportCached(
  db: Db,
  siteId: number,
  input: unknown,
  now: Date,
  opts: { withCustomers: boolean },
): Promise<Result<RecallReport>> {
  return (await recallReportTraced(db, siteId, input, now, opts)).result;
}

/** Forgets every kept recall answer (tests, the benchmark's restart). */
export function clearRecallCache(): void {
  cache.clear();
}
