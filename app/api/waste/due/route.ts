import { getWasteDueReportCached } from "@/app/waste/due/due-report-cache";
import { respondAtPosition } from "@/lib/api/etag.service";
import { siteReadRoute } from "@/lib/api/site-read.service";

export const dynamic = "force-dynamic";

/** GET /api/waste/due?days=30&category=LQG|SQG|VSQG&tsdfMiles= — the waste-due page's answer. */
export const GET = siteReadRoute("GET /api/waste/due", async ({ request, db, site, who, query }) =>
  respondAtPosition(request, db, who, () => getWasteDueReportCached(db, site, query, who.now)),
);
