import type { NextResponse } from "next/server";
import { getDb } from "@/lib/db";
import { idempotent, readJson, requireSameOrigin, respond } from "@/lib/api/json-route.service";
import { requireRole } from "@/lib/auth/request.service";
import { recordGauge } from "@/lib/tank/tank.service";
import { handled } from "@/lib/api/handle.service";

/** Records a tank gauge (volume, or level through the tank's calibration table) with the book stock at its time. */
export const POST = handled("POST /api/tanks/gauges", async (request: Request): Promise<NextResponse> => {
  const origin = requireSameOrigin(request);
  if (!origin.ok) return respond(origin);
  const who = await requireRole(["PRODUCTION"]);
  if (!who.ok) return respond(who);
  const body = await readJson(request);
  if (!body.ok) return respond(body);
  const actor = { siteId: who.value.siteId, userId: who.value.userId, now: who.value.now };
  return respond(await idempotent(request, who.value.userId, body.value, async () => recordGauge(await getDb(), actor, body.value)));
});
