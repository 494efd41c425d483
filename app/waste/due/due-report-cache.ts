import "server-only";
// The waste-due answer kept by ledger position (decision 0037): the page, GET /api/waste/due and the
// printable report ask the same question many times between bookings. Keyed by site, time zone, the
// query as typed and the quarter-hour (days left follow the date); any booking, characterisation,
// haul-away or rule choice moves the position (each writes an audit event) and the next ask recomputes.
import type { Db } from "@/lib/core/connect";
import type { Result } from "@/lib/core/result";
import { PositionCache, quarterHourOf } from "@/lib/ledger/position";
import { answerAtPosition, questionKey } from "@/lib/ledger/position-cache.service";
import type { KeptAnswer } from "@/lib/ledger/position-cache.service";
import { getWasteDueReport } from "@/app/waste/due/due-report";
import type { WasteDueReport } from "@/app/waste/due/due-report";

const home = globalThis as unknown as { tracevatWasteDueCache?: PositionCache<Result<WasteDueReport>> };
const cache: PositionCache<Result<WasteDueReport>> = (home.tracevatWasteDueCache ??= new PositionCache(100));

export async function getWasteDueReportTraced(
  db: Db,
  site: { id: number; timeZone: string },
  input: unknown,
  now: Date,
): Promise<KeptAnswer<WasteDueReport>> {
  const key = questionKey(site.id, input, site.timeZone, quarterHourOf(now));
  return answerAtPosition(cache, db, site.id, key, () => getWasteDueReport(db, site, input, now));
}

/** getWasteDueReport, kept by ledger position: recomputed only when the site's books have moved. */
export async function getWasteDueReportCached(
  db: Db,
  site: { id: number; timeZone: string },
  input: unknown,
  now: Date,
): Promise<Result<WasteDueReport>> {
  return (await getWasteDueReportTraced(db, site, input, now)).result;
}

/** Forgets every kept waste-due answer (tests, the benchmark's restart). */
export function clearWasteDueCache(): void {
  cache.clear();
}
