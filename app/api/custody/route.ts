import type { NextResponse } from "next/server";
import { requireReader } from "@/lib/auth/request.service";
import { respond } from "@/lib/api/json-route.service";
import { getCustodyReport } from "@/lib/custody/custody.service";
import { getDb } from "@/lib/core/db";
import { fail } from "@/lib/core/result";
import { getSiteById } from "@/lib/site/site.store";
import { handled } from "@/lib/api/handle.service";

export const dynamic = "force-dynamic";

/** GET /api/custody?period=2026-Q4&operatorType=&claimKg=&claimSet= — the chain-of-custody page's answer. */
export const GET = handled("GET /api/custody", async (request: Request): Promise<NextResponse> => {
  const who = await requireReader(request);
  if (!who.ok) return respond(who);
  const db = await getDb();
  const site = await getSiteById(db, who.value.siteId);
  if (!site) return respond(fail("RECORD.NOT_FOUND", "Your site is not set up"));
  return respond(
    await getCustodyReport(db, site, Object.fromEntries(new URL(request.url).searchParams), who.value.now),
  );
});
