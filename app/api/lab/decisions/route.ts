import type { NextResponse } from "next/server";
import { getDb } from "@/lib/core/db";
import { requireRole } from "@/lib/auth/request.service";
import { parseBody, requireSameOrigin, respond } from "@/lib/api/json-route.service";
import { LotDecisionSchema } from "@/lib/feedstock/lot.schema";
import { decideLot } from "@/lib/feedstock/lot.service";
import { handled } from "@/lib/api/handle.service";
import { actorOf } from "@/lib/core/actor";

export const dynamic = "force-dynamic";

/** Accepts (needs a titration) or rejects a lot. */
export const POST = handled("POST /api/lab/decisions", async (request: Request): Promise<NextResponse> => {
  const origin = requireSameOrigin(request);
  if (!origin.ok) return respond(origin);
  const who = await requireRole(["PRODUCTION"]);
  if (!who.ok) return respond(who);
  const input = await parseBody(request, LotDecisionSchema);
  if (!input.ok) return respond(input);
  const actor = actorOf(who.value);
  return respond(await decideLot(await getDb(), actor, input.value));
});
