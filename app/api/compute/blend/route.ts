import type { NextResponse } from "next/server";
import { SITE_ROLES } from "@/lib/core/vocabulary";
import { requireRole } from "@/lib/auth/request.service";
import { parseBody, requireSameOrigin, respond } from "@/lib/api/json-route.service";
import { BlendRequestSchema } from "@/lib/blend/blend.schema";
import { answerBlend } from "@/lib/api/endpoints/lab";
import { handled } from "@/lib/api/handle.service";

export const dynamic = "force-dynamic";

/** Blend draws within the FFA and water limits (HiGHS). */
export const POST = handled("POST /api/compute/blend", async (request: Request): Promise<NextResponse> => {
  const origin = requireSameOrigin(request);
  if (!origin.ok) return respond(origin);
  const who = await requireRole(SITE_ROLES);
  if (!who.ok) return respond(who);
  const input = await parseBody(request, BlendRequestSchema);
  if (!input.ok) return respond(input);
  return respond(await answerBlend(input.value));
});
