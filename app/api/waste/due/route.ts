import type { NextResponse } from "next/server";
import { requireReader } from "@/lib/auth/request.service";
import { respond } from "@/lib/api/json-route.service";
import { getDb } from "@/lib/core/db";
import { fail } from "@/lib/core/result";
import { getSiteById } from "@/lib/site/site.store";
import { getWasteDueReportCached } from "@/app/waste/due/due-report-cache";
import { handled } from "@/lib/api/handle.service";
import { respondAtPosition } from "@/lib/api/etag.service";

export const dynamic = "force-dynamic";

/** GET /api/waste/due?days=30&category=LQG|SQG|VSQG&tsdfMiles= — the waste-due page's answer. */
export const GET = handled("GET /api/waste/due", async (request: Request): Promise<NextResponse> => {
  const who = await requireReader(request);
  if (!who.ok) return respond(who);
  const db = await getDb();
  const site = await getSiteById(db, who.value.siteId);
  if (!site) return respond(fail("RECORD.NOT_FOUND", "Your site is not set up"));
  return respondAtPosition(request, db, who.value, () =>
    getWasteDueReportCached(db, site, Object.fromEntries(new URL(request.url).searchParams), who.value.now),
  );
});
