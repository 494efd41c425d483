import type { NextResponse } from "next/server";
import { getDb } from "@/lib/core/db";
import { idempotent, MAX_JSON_BYTES, readJson, requireSameOrigin, respond } from "@/lib/api/json-route.service";
import { MAX_IMPORT_BYTES } from "@/lib/grid/sheet";
import { requireRole } from "@/lib/auth/request.service";
import { importGridFile } from "@/lib/grid/grid.service";
import { handled } from "@/lib/api/handle.service";

/**
 * Imports a CSV file into a grid table all-or-nothing. Rows already stored with the same key and values
 * are left alone (a re-import changes nothing); a preview (dryRun) is rolled back and needs no key.
 */
export const POST = handled("POST /api/grid/import", async (request: Request): Promise<NextResponse> => {
  const origin = requireSameOrigin(request);
  if (!origin.ok) return respond(origin);
  const who = await requireRole(["PRODUCTION"]);
  if (!who.ok) return respond(who);
  // The file travels as JSON text: escaping can double it, so the route reads up to twice the file limit.
  const body = await readJson(request, 2 * MAX_IMPORT_BYTES + MAX_JSON_BYTES);
  if (!body.ok) return respond(body);
  const db = await getDb();
  const isPreview =
    typeof body.value === "object" && body.value !== null && (body.value as { dryRun?: unknown }).dryRun === true;
  if (isPreview) return respond(await importGridFile(db, who.value, body.value));
  return respond(
    await idempotent(request, who.value.userId, body.value, async () => importGridFile(db, who.value, body.value)),
  );
});
