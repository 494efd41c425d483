import { reportRoute } from "@/lib/api/report-route.service";
import { canRead } from "@/lib/auth/read-matrix";
import { ok } from "@/lib/core/result";
import { buildRecallDoc } from "@/lib/trace/recall-report";
import { recallReportCached } from "@/lib/trace/recall-cache.service";
import { readRecallSearch, recallInput } from "@/app/trace/recall/query";

export const dynamic = "force-dynamic";

/** The recall page's report: PDF, or one of its tables as CSV (format=csv&table=customers…). */
export const GET = reportRoute("GET /trace/recall/report", async ({ db, site, user, query, context }) => {
  const withCustomers = canRead(user.role, "/customers");
  const r = await recallReportCached(
    db,
    site.id,
    recallInput(
      readRecallSearch((k) => query[k]),
      site.timeZone,
    ),
    user.now,
    { withCustomers },
  );
  return r.ok ? ok(buildRecallDoc(r.value, context, { withCustomers })) : r;
});
