import type { NextResponse } from "next/server";
import { requireReader } from "@/lib/auth/request.service";
import { canRead } from "@/lib/auth/read-matrix";
import { respond } from "@/lib/api/json-route.service";
import { handled } from "@/lib/api/handle.service";
import { getDb } from "@/lib/core/db";
import { fail } from "@/lib/core/result";
import { epcisForTrace } from "@/lib/epcis/epcis.service";
import { getSiteById } from "@/lib/site/site.store";
import { requestOrigin } from "@/app/labels/origin";
import { answerEpcis } from "@/app/api/epcis/download";

export const dynamic = "force-dynamic";

/** GET /api/epcis/trace?dir=back|fwd&kind=&code=&at= — the EPCIS 2.0 events behind one trace answer. */
export const GET = handled("GET /api/epcis/trace", async (request: Request): Promise<NextResponse> => {
  const who = await requireReader(request);
  if (!who.ok) return respond(who);
  const db = await getDb();
  const site = await getSiteById(db, who.value.siteId);
  if (!site) return respond(fail("RECORD.NOT_FOUND", "Your site is not set up"));
  const query = Object.fromEntries(new URL(request.url).searchParams);
  return answerEpcis(
    await epcisForTrace(db, site, query, who.value.now, {
      baseUri: await requestOrigin(),
      withCustomers: canRead(who.value.role, "/customers"),
    }),
  );
});
