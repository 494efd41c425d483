import "server-only";
// The home page's read model kept by ledger position (decision 0037): the dashboard and the waste
// board read a dozen lists and counts across the domains, and every change they show (bookings, lab
// results, lots, batches, containers, periods, sources, site rules) moves the position. Both depend on
// the date too (this month, the period open now, days left before a container is due), so the key
// carries the quarter-hour and the time zone; the page shows the same to every role that may see it.
import type { Db } from "@/lib/core/connect";
import { PositionCache, quarterHourOf } from "@/lib/ledger/position";
import { keptAtPosition, questionKey } from "@/lib/ledger/position-cache.service";
import type { Kept } from "@/lib/ledger/position-cache.service";
import { getUtcOffsetMin } from "@/lib/period/site-time";
import { getWasteDueBoard } from "@/lib/waste/container.store";
import type { WasteDueBoard } from "@/lib/waste/container.store";
import { getDashboard } from "@/app/_today/today";
import type { Dashboard } from "@/app/_today/today";

export interface TodayModel {
  dashboard: Dashboard;
  waste: WasteDueBoard | null;
}

const home = globalThis as unknown as { tracevatTodayCache?: PositionCache<TodayModel> };
const cache: PositionCache<TodayModel> = (home.tracevatTodayCache ??= new PositionCache<TodayModel>(50));

export function keptToday(db: Db, site: { id: number; timeZone: string }, now: Date): Promise<Kept<TodayModel>> {
  const key = questionKey(site.id, null, site.timeZone, quarterHourOf(now));
  return keptAtPosition(cache, db, site.id, key, async () => {
    const [dashboard, waste] = await Promise.all([
      getDashboard(db, site, now),
      getWasteDueBoard(db, site.id, now, getUtcOffsetMin(site.timeZone, now)),
    ]);
    return { dashboard, waste };
  });
}

/** Forgets every kept home page read model (tests). */
export function clearTodayCache(): void {
  cache.clear();
}
