import type { NextResponse } from "next/server";
import { requireRole } from "@/lib/auth/request.service";
import { respond } from "@/lib/api/json-route.service";
import { getDb } from "@/lib/db";
import { SITE_ROLES } from "@/lib/ledger/kinds";
import { traceBackwardReport } from "@/lib/trace/trace.service";

export const dynamic = "force-dynamic";

/** GET /api/trace/backward?kind=PRODUCT_LOT|TANK|SHIPMENT|BATCH&code=…&at=… — the /trace page's backward answer. */
export async function GET(request: Request): Promise<NextResponse> {
  const who = await requireRole(SITE_ROLES);
  if (!who.ok) return respond(who);
  const query = Object.fromEntries(new URL(request.url).searchParams);
  return respond(await traceBackwardReport(await getDb(), who.value.siteId, query, who.value.now));
}
