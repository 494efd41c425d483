import type { NextResponse } from "next/server";
import { requireReader } from "@/lib/auth/request.service";
import { respond } from "@/lib/api/json-route.service";
import { getDb } from "@/lib/core/db";
import { traceBackwardReport } from "@/lib/trace/trace.service";
import { handled } from "@/lib/api/handle.service";
import { respondAtPosition } from "@/lib/api/etag.service";

export const dynamic = "force-dynamic";

/** GET /api/trace/backward?kind=PRODUCT_LOT|TANK|SHIPMENT|BATCH&code=…&at=… — the /trace page's backward answer. */
export const GET = handled("GET /api/trace/backward", async (request: Request): Promise<NextResponse> => {
  const who = await requireReader(request);
  if (!who.ok) return respond(who);
  const query = Object.fromEntries(new URL(request.url).searchParams);
  const db = await getDb();
  return respondAtPosition(request, db, who.value, () =>
    traceBackwardReport(db, who.value.siteId, query, who.value.now),
  );
});
