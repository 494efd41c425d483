import type { NextResponse } from "next/server";
import { getDb } from "@/lib/core/db";
import { requireRole } from "@/lib/auth/request.service";
import { parseBody, requireSameOrigin, respond } from "@/lib/api/json-route.service";
import { BatchCompleteSchema } from "@/lib/batch/batch.schema";
import { completeBatch } from "@/lib/batch/batch.service";
import { handled } from "@/lib/api/handle.service";
import { actorOf } from "@/lib/core/actor";

export const dynamic = "force-dynamic";

/** Records the outputs of a reacting batch. */
export const POST = handled("POST /api/batches/complete", async (request: Request): Promise<NextResponse> => {
  const origin = requireSameOrigin(request);
  if (!origin.ok) return respond(origin);
  const who = await requireRole(["PRODUCTION"]);
  if (!who.ok) return respond(who);
  const input = await parseBody(request, BatchCompleteSchema);
  if (!input.ok) return respond(input);
  const actor = actorOf(who.value);
  return respond(await completeBatch(await getDb(), actor, input.value));
});
