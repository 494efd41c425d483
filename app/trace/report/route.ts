import { reportRoute } from "@/lib/api/report-route.service";
import { ok } from "@/lib/core/result";
import { traceBackwardReport } from "@/lib/trace/trace.service";
import { buildBackwardTraceDoc } from "@/app/trace/trace-report";
import { toSiteInstant } from "@/app/trace/site-time";

export const dynamic = "force-dynamic";

/** The backward trace of the /trace page as a PDF, or one of its tables as CSV. */
export const GET = reportRoute("GET /trace/report", async ({ db, site, user, query, context }) => {
  const r = await traceBackwardReport(
    db,
    site.id,
    { kind: query.kind ?? "", code: query.code ?? "", at: toSiteInstant(query.at ?? "", site.timeZone) },
    user.now,
  );
  return r.ok ? ok(buildBackwardTraceDoc(r.value, context)) : r;
});
