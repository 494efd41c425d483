import type { NextResponse } from "next/server";
import { getDb } from "@/lib/db";
import { idempotent, readJson, requireSameOrigin, respond } from "@/lib/api/json-route.service";
import { requireRole } from "@/lib/auth/request.service";
import { saveSiteSpec } from "@/lib/spec/site-spec.service";
import { handled } from "@/lib/api/handle.service";

/** Writes a site specification: version 1 of a new name, or the next version of an existing one. */
export const POST = handled("POST /api/specs", async (request: Request): Promise<NextResponse> => {
  const origin = requireSameOrigin(request);
  if (!origin.ok) return respond(origin);
  const who = await requireRole(["COMPLIANCE"]);
  if (!who.ok) return respond(who);
  const body = await readJson(request);
  if (!body.ok) return respond(body);
  const actor = { siteId: who.value.siteId, userId: who.value.userId, now: who.value.now };
  return respond(await idempotent(request, who.value.userId, body.value, async () => saveSiteSpec(await getDb(), actor, body.value)));
});
