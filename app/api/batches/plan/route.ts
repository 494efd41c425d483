import type { NextResponse } from "next/server";
import { getDb } from "@/lib/core/db";
import { requireRole } from "@/lib/auth/request.service";
import { parseBody, requireSameOrigin, respond } from "@/lib/api/json-route.service";
import { BatchPlanRequestSchema } from "@/lib/batch/plan";
import { recordPlannedBatch } from "@/lib/batch/plan.service";
import { handled } from "@/lib/api/handle.service";
import { actorOf } from "@/lib/core/actor";

export const dynamic = "force-dynamic";

/** Proposes draws and a recipe from the stock now and records the batch as planned. */
export const POST = handled("POST /api/batches/plan", async (request: Request): Promise<NextResponse> => {
  const origin = requireSameOrigin(request);
  if (!origin.ok) return respond(origin);
  const who = await requireRole(["PRODUCTION"]);
  if (!who.ok) return respond(who);
  const input = await parseBody(request, BatchPlanRequestSchema);
  if (!input.ok) return respond(input);
  const actor = actorOf(who.value);
  return respond(await recordPlannedBatch(await getDb(), actor, input.value));
});
