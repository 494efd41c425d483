import type { NextResponse } from "next/server";
import { getDb } from "@/lib/core/db";
import { idempotent, MAX_BULK_JSON_BYTES, readJson, requireSameOrigin, respond } from "@/lib/api/json-route.service";
import { requireRole } from "@/lib/auth/request.service";
import { saveGridRows } from "@/lib/grid/grid.service";
import { handled } from "@/lib/api/handle.service";

/**
 * Saves a batch of grid rows (typed, pasted, filled) and corrections all-or-nothing through the record
 * services. A preview (dryRun) needs no Idempotency-Key: it is rolled back.
 */
export const POST = handled("POST /api/grid/save", async (request: Request): Promise<NextResponse> => {
  const origin = requireSameOrigin(request);
  if (!origin.ok) return respond(origin);
  const who = await requireRole(["COLLECTOR", "PRODUCTION"]);
  if (!who.ok) return respond(who);
  const body = await readJson(request, MAX_BULK_JSON_BYTES);
  if (!body.ok) return respond(body);
  const db = await getDb();
  const isPreview =
    typeof body.value === "object" && body.value !== null && (body.value as { dryRun?: unknown }).dryRun === true;
  if (isPreview) return respond(await saveGridRows(db, who.value, body.value));
  return respond(
    await idempotent(request, who.value.userId, body.value, async () => saveGridRows(db, who.value, body.value)),
  );
});
