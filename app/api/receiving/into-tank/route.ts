import type { NextResponse } from "next/server";
import { getDb } from "@/lib/db";
import { idempotent, readJson, requireSameOrigin, respond } from "@/lib/api/json-route.service";
import { requireRole } from "@/lib/auth/request.service";
import { receiveLotIntoTank } from "@/lib/feedstock/receive-tank.service";
import { handled } from "@/lib/api/handle.service";

/** Pools pickups into a lot, accepts it with a reason and moves all of it into a tank: one transaction. */
export const POST = handled("POST /api/receiving/into-tank", async (request: Request): Promise<NextResponse> => {
  const origin = requireSameOrigin(request);
  if (!origin.ok) return respond(origin);
  const who = await requireRole(["PRODUCTION"]);
  if (!who.ok) return respond(who);
  const body = await readJson(request);
  if (!body.ok) return respond(body);
  const actor = { siteId: who.value.siteId, userId: who.value.userId, now: who.value.now };
  return respond(await idempotent(request, who.value.userId, body.value, async () => receiveLotIntoTank(await getDb(), actor, body.value)));
});
