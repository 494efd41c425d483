import type { NextResponse } from "next/server";
import { requireRole } from "@/lib/auth/request.service";
import { parseBody, requireSameOrigin, respond } from "@/lib/api/json-route.service";
import { getDb } from "@/lib/core/db";
import { closePeriod, PeriodCloseSchema } from "@/lib/period/period.service";
import { handled } from "@/lib/api/handle.service";
import { actorOf } from "@/lib/core/actor";

export const dynamic = "force-dynamic";

/** POST /api/periods/close {periodId, reason} — compliance only; recorded as a period event with who and when. */
export const POST = handled("POST /api/periods/close", async (request: Request): Promise<NextResponse> => {
  const origin = requireSameOrigin(request);
  if (!origin.ok) return respond(origin);
  const who = await requireRole(["COMPLIANCE"]);
  if (!who.ok) return respond(who);
  const body = await parseBody(request, PeriodCloseSchema);
  if (!body.ok) return respond(body);
  const actor = actorOf(who.value);
  return respond(await closePeriod(await getDb(), actor, body.value));
});
