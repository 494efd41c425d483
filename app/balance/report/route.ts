import { reportRoute } from "@/lib/api/report-route.service";
import { ok } from "@/lib/core/result";
import { getBalanceReport } from "@/lib/mass-balance/balance.service";
import { getLedgerVersion } from "@/lib/trace/trace.store";
import { buildBalanceDoc } from "@/app/balance/balance-report";

export const dynamic = "force-dynamic";

const FIELDS = ["period", "year", "month", "quarter", "start", "end", "warnPct", "failPct"] as const;

/** The period balance statement of the /balance page (same query string) as PDF, or one table as CSV. */
export const GET = reportRoute("GET /balance/report", async ({ db, site, user, query, context }) => {
  const version = await getLedgerVersion(db, site.id);
  const r = await getBalanceReport(db, site, Object.fromEntries(FIELDS.map((f) => [f, query[f] ?? ""])), user.now);
  return r.ok ? ok(buildBalanceDoc(r.value, context, { movements: version.count, lastMoveId: version.lastId })) : r;
});
