import { reportRoute } from "@/lib/api/report-route.service";
import { fail, ok } from "@/lib/core/result";
import { getLotDetail } from "@/lib/feedstock/lot-detail.store";
import { getLotFlow } from "@/lib/feedstock/lot-flow.service";
import { getLedgerVersion } from "@/lib/trace/trace.store";
import { codeParam } from "@/app/_ui/links";
import { buildLotHistoryDoc } from "@/app/lots/[code]/lot-report";

export const dynamic = "force-dynamic";

/** A lot's history as PDF, or one of its tables as CSV. */
export const GET = reportRoute("GET /lots/[code]/report", async ({ db, site, user, params, context }) => {
  const code = codeParam(params.code ?? "");
  const lot = await getLotDetail(db, site.id, code);
  if (lot === null) return fail("RECORD.NOT_FOUND", `Lot ${code} does not exist`, "code");
  const [flow, version] = await Promise.all([
    getLotFlow(db, site.id, lot.holderId, user.now),
    getLedgerVersion(db, site.id),
  ]);
  return ok(buildLotHistoryDoc(lot, flow, context, { movements: version.count, lastMoveId: version.lastId }));
});
