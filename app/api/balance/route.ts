import { getBalanceReportCached } from "@/lib/mass-balance/balance-cache.service";
import { respondAtPosition } from "@/lib/api/etag.service";
import { siteReadRoute } from "@/lib/api/site-read.service";

export const dynamic = "force-dynamic";

/** GET /api/balance?period=MONTH|QUARTER|CUSTOM&year=&month=&quarter=&start=&end=&warnPct=&failPct= — the /balance page's answer. */
export const GET = siteReadRoute("GET /api/balance", async ({ request, db, site, who, query }) =>
  respondAtPosition(request, db, who, () => getBalanceReportCached(db, site, query, who.now)),
);
