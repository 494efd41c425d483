import type { NextResponse } from "next/server";
import { SITE_ROLES } from "@/lib/core/vocabulary";
import { requireRole } from "@/lib/auth/request.service";
import { parseBody, requireSameOrigin, respond } from "@/lib/api/json-route.service";
import { RecipeInputSchema } from "@/lib/recipe/recipe.schema";
import { answerRecipe } from "@/lib/api/endpoints/lab";
import { handled } from "@/lib/api/handle.service";

export const dynamic = "force-dynamic";

/** Base-catalysed recipe for the lots to charge. */
export const POST = handled("POST /api/compute/recipe", async (request: Request): Promise<NextResponse> => {
  const origin = requireSameOrigin(request);
  if (!origin.ok) return respond(origin);
  const who = await requireRole(SITE_ROLES);
  if (!who.ok) return respond(who);
  const input = await parseBody(request, RecipeInputSchema);
  if (!input.ok) return respond(input);
  return respond(answerRecipe(input.value));
});
