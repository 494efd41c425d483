import type { NextResponse } from "next/server";
import { getDb } from "@/lib/db";
import { idempotent, readJson, requireSameOrigin, respond } from "@/lib/api/json-route.service";
import { requireRole } from "@/lib/auth/request.service";
import { recordQcResult } from "@/lib/product/product.service";
import { handled } from "@/lib/api/handle.service";

export const dynamic = "force-dynamic";

/** Records one QC result of a held product lot, judged at once against the lot's specification; a second result for a property supersedes the first. */
export const POST = handled("POST /api/products/qc", async (request: Request): Promise<NextResponse> => {
  const origin = requireSameOrigin(request);
  if (!origin.ok) return respond(origin);
  const who = await requireRole(["PRODUCTION", "COMPLIANCE"]);
  if (!who.ok) return respond(who);
  const body = await readJson(request);
  if (!body.ok) return respond(body);
  const actor = { siteId: who.value.siteId, userId: who.value.userId, now: who.value.now };
  return respond(await idempotent(request, who.value.userId, body.value, async () => recordQcResult(await getDb(), actor, body.value)));
});
