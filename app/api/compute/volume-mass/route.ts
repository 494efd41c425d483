import type { NextResponse } from "next/server";
import { SITE_ROLES } from "@/lib/core/vocabulary";
import { requireRole } from "@/lib/auth/request.service";
import { parseBody, requireSameOrigin, respond } from "@/lib/api/json-route.service";
import { VolumeMassRequestSchema, answerVolumeMass } from "@/lib/api/endpoints/lab";
import { handled } from "@/lib/api/handle.service";

export const dynamic = "force-dynamic";

/** Volume ↔ mass at a reference temperature (15 °C or 60 °F). */
export const POST = handled("POST /api/compute/volume-mass", async (request: Request): Promise<NextResponse> => {
  const origin = requireSameOrigin(request);
  if (!origin.ok) return respond(origin);
  const who = await requireRole(SITE_ROLES);
  if (!who.ok) return respond(who);
  const input = await parseBody(request, VolumeMassRequestSchema);
  if (!input.ok) return respond(input);
  return respond(answerVolumeMass(input.value));
});
