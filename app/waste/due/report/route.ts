import { reportRoute } from "@/lib/api/report-route.service";
import { ok } from "@/lib/core/result";
import { getLedgerVersion } from "@/lib/trace/trace.store";
import { getWasteDueReportCached } from "@/app/waste/due/due-report-cache";
import { buildWasteListDoc } from "@/app/waste/due/waste-list-report";

export const dynamic = "force-dynamic";

/** The waste list for the hauler (same query string as the waste-due page) as PDF, or one table as CSV. */
export const GET = reportRoute("GET /waste/due/report", async ({ db, site, user, query, context }) => {
  const version = await getLedgerVersion(db, site.id);
  const r = await getWasteDueReportCached(
    db,
    site,
    { days: query.days ?? "", category: query.category ?? "", tsdfMiles: query.tsdfMiles ?? "" },
    user.now,
  );
  return r.ok ? ok(buildWasteListDoc(r.value, context, { movements: version.count, lastMoveId: version.lastId })) : r;
});
