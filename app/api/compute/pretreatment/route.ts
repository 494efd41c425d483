import type { NextResponse } from "next/server";
import { SITE_ROLES } from "@/lib/core/vocabulary";
import { requireRole } from "@/lib/auth/request.service";
import { parseBody, requireSameOrigin, respond } from "@/lib/api/json-route.service";
import { PretreatmentInputSchema } from "@/lib/recipe/recipe.schema";
import { answerPretreatment } from "@/lib/api/endpoints/lab";
import { handled } from "@/lib/api/handle.service";

export const dynamic = "force-dynamic";

/** Route by FFA, and the acid step plus base step when needed. */
export const POST = handled("POST /api/compute/pretreatment", async (request: Request): Promise<NextResponse> => {
  const origin = requireSameOrigin(request);
  if (!origin.ok) return respond(origin);
  const who = await requireRole(SITE_ROLES);
  if (!who.ok) return respond(who);
  const input = await parseBody(request, PretreatmentInputSchema);
  if (!input.ok) return respond(input);
  return respond(answerPretreatment(input.value));
});
