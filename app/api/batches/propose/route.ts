import type { NextResponse } from "next/server";
import { getDb } from "@/lib/core/db";
import { failMany, ok } from "@/lib/core/result";
import { SITE_ROLES } from "@/lib/core/vocabulary";
import { requireRole } from "@/lib/auth/request.service";
import { parseBody, requireSameOrigin, respond } from "@/lib/api/json-route.service";
import { BatchPlanRequestSchema } from "@/lib/batch/plan";
import { proposeBatchPlan } from "@/lib/batch/plan.service";
import { handled } from "@/lib/api/handle.service";
import { actorOf } from "@/lib/core/actor";

export const dynamic = "force-dynamic";

/** Draws and recipe card from the stock now; a blend that cannot be made is refused with the limit that fails. */
export const POST = handled("POST /api/batches/propose", async (request: Request): Promise<NextResponse> => {
  const origin = requireSameOrigin(request);
  if (!origin.ok) return respond(origin);
  const who = await requireRole(SITE_ROLES);
  if (!who.ok) return respond(who);
  const input = await parseBody(request, BatchPlanRequestSchema);
  if (!input.ok) return respond(input);
  const proposal = await proposeBatchPlan(await getDb(), actorOf(who.value), input.value);
  if (!proposal.ok) return respond(proposal);
  const { candidates, outcome } = proposal.value;
  return respond(outcome.ok ? ok({ candidates, card: outcome.card }) : failMany(outcome.issues));
});
