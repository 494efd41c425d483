import type { NextResponse } from "next/server";
import { getDb } from "@/lib/db";
import { idempotent, readJson, requireSameOrigin, respond } from "@/lib/api/json-route.service";
import { requireRole } from "@/lib/auth/request.service";
import { recordCharacterisation } from "@/lib/waste/container.service";
import { handled } from "@/lib/api/handle.service";

/** Records lab results for a container's contents; the hazard assessment and due dates use them at once. */
export const POST = handled("POST /api/waste/characterisation", async (request: Request): Promise<NextResponse> => {
  const origin = requireSameOrigin(request);
  if (!origin.ok) return respond(origin);
  const who = await requireRole(["PRODUCTION", "COMPLIANCE"]);
  if (!who.ok) return respond(who);
  const body = await readJson(request);
  if (!body.ok) return respond(body);
  const actor = { siteId: who.value.siteId, userId: who.value.userId, now: who.value.now };
  return respond(await idempotent(request, who.value.userId, body.value, async () => recordCharacterisation(await getDb(), actor, body.value)));
});
