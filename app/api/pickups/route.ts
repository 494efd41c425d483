import type { NextResponse } from "next/server";
import { getDb } from "@/lib/db";
import { idempotent, readJson, requireSameOrigin, respond } from "@/lib/api/json-route.service";
import { requireRole } from "@/lib/auth/request.service";
import { recordPickup } from "@/lib/feedstock/pickup.service";
import { handled } from "@/lib/api/handle.service";

/** Records one pickup; collectors record their own, production staff may record for them. */
export const POST = handled("POST /api/pickups", async (request: Request): Promise<NextResponse> => {
  const origin = requireSameOrigin(request);
  if (!origin.ok) return respond(origin);
  const who = await requireRole(["COLLECTOR", "PRODUCTION"]);
  if (!who.ok) return respond(who);
  const body = await readJson(request);
  if (!body.ok) return respond(body);
  const actor = { siteId: who.value.siteId, userId: who.value.userId, now: who.value.now };
  return respond(await idempotent(request, who.value.userId, body.value, async () => recordPickup(await getDb(), actor, body.value)));
});
