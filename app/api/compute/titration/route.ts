import type { NextResponse } from "next/server";
import { SITE_ROLES } from "@/lib/core/vocabulary";
import { requireRole } from "@/lib/auth/request.service";
import { parseBody, requireSameOrigin, respond } from "@/lib/api/json-route.service";
import { TitrationEntrySchema } from "@/lib/titration/titration.schema";
import { answerTitration } from "@/lib/api/endpoints/lab";
import { handled } from "@/lib/api/handle.service";

export const dynamic = "force-dynamic";

/** FFA % (AOCS Ca 5a-40) and acid value (EN 14104 form) from one titration. */
export const POST = handled("POST /api/compute/titration", async (request: Request): Promise<NextResponse> => {
  const origin = requireSameOrigin(request);
  if (!origin.ok) return respond(origin);
  const who = await requireRole(SITE_ROLES);
  if (!who.ok) return respond(who);
  const input = await parseBody(request, TitrationEntrySchema);
  if (!input.ok) return respond(input);
  return respond(answerTitration(input.value));
});
