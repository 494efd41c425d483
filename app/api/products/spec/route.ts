import type { NextResponse } from "next/server";
import { getDb } from "@/lib/db";
import { idempotent, readJson, requireSameOrigin, respond } from "@/lib/api/json-route.service";
import { requireRole } from "@/lib/auth/request.service";
import { chooseProductSpec } from "@/lib/product/product.service";
import { handled } from "@/lib/api/handle.service";

export const dynamic = "force-dynamic";

/** Chooses the specification a held product lot is judged against. */
export const POST = handled("POST /api/products/spec", async (request: Request): Promise<NextResponse> => {
  const origin = requireSameOrigin(request);
  if (!origin.ok) return respond(origin);
  const who = await requireRole(["COMPLIANCE"]);
  if (!who.ok) return respond(who);
  const body = await readJson(request);
  if (!body.ok) return respond(body);
  const actor = { siteId: who.value.siteId, userId: who.value.userId, now: who.value.now };
  return respond(await idempotent(request, who.value.userId, body.value, async () => chooseProductSpec(await getDb(), actor, body.value)));
});
