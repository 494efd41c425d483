import type { NextResponse } from "next/server";
import { getDb } from "@/lib/db";
import { idempotent, readJson, requireSameOrigin, respond } from "@/lib/api/json-route.service";
import { requireRole } from "@/lib/auth/request.service";
import { transferToTank } from "@/lib/tank/tank.service";
import { handled } from "@/lib/api/handle.service";

/** Moves material from a lot, tank or product lot into a tank; the draw is guarded against over-drawing. */
export const POST = handled("POST /api/transfers", async (request: Request): Promise<NextResponse> => {
  const origin = requireSameOrigin(request);
  if (!origin.ok) return respond(origin);
  const who = await requireRole(["PRODUCTION"]);
  if (!who.ok) return respond(who);
  const body = await readJson(request);
  if (!body.ok) return respond(body);
  const actor = { siteId: who.value.siteId, userId: who.value.userId, now: who.value.now };
  return respond(await idempotent(request, who.value.userId, body.value, async () => transferToTank(await getDb(), actor, body.value)));
});
