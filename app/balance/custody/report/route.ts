import { reportRoute } from "@/lib/api/report-route.service";
import { ok } from "@/lib/core/result";
import { getCustodyReport } from "@/lib/custody/custody.service";
import { buildCustodyDoc } from "@/app/balance/custody/custody-report";

export const dynamic = "force-dynamic";

/** The chain-of-custody statement of the custody page (same query string) as PDF, or one table as CSV. */
export const GET = reportRoute("GET /balance/custody/report", async ({ db, site, user, query, context }) => {
  const r = await getCustodyReport(
    db,
    site,
    { period: query.period ?? "", operatorType: query.operatorType ?? "", claimKg: "", claimSet: "" },
    user.now,
  );
  return r.ok ? ok(buildCustodyDoc(r.value, context)) : r;
});
