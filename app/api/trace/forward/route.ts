import type { NextResponse } from "next/server";
import { requireReader } from "@/lib/auth/request.service";
import { respond } from "@/lib/api/json-route.service";
import { getDb } from "@/lib/core/db";
import { traceForwardReport } from "@/lib/trace/trace.service";
import { handled } from "@/lib/api/handle.service";
import { respondAtPosition } from "@/lib/api/etag.service";
import { canRead } from "@/lib/auth/read-matrix";

export const dynamic = "force-dynamic";

/** GET /api/trace/forward?kind=SOURCE|PICKUP|LOT&code=… — the /trace page's forward answer. */
export const GET = handled("GET /api/trace/forward", async (request: Request): Promise<NextResponse> => {
  const who = await requireReader(request);
  if (!who.ok) return respond(who);
  const query = Object.fromEntries(new URL(request.url).searchParams);
  const db = await getDb();
  return respondAtPosition(request, db, who.value, () =>
    traceForwardReport(db, who.value.siteId, query, who.value.now, {
      withCustomers: canRead(who.value.role, "/customers"),
    }),
  );
});
