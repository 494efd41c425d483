import type { NextResponse } from "next/server";
import { getDb } from "@/lib/db";
import { idempotent, readJson, requireSameOrigin, respond } from "@/lib/api/json-route.service";
import { requireRole } from "@/lib/auth/request.service";
import { importGridFile } from "@/lib/grid/grid.service";

/**
 * Imports a CSV file into a grid table all-or-nothing. Rows already stored with the same key and values
 * are left alone (a re-import changes nothing); a preview (dryRun) is rolled back and needs no key.
 */
export async function POST(request: Request): Promise<NextResponse> {
  const origin = requireSameOrigin(request);
  if (!origin.ok) return respond(origin);
  const who = await requireRole(["PRODUCTION"]);
  if (!who.ok) return respond(who);
  const body = await readJson(request);
  if (!body.ok) return respond(body);
  const db = await getDb();
  const isPreview = typeof body.value === "object" && body.value !== null && (body.value as { dryRun?: unknown }).dryRun === true;
  if (isPreview) return respond(await importGridFile(db, who.value, body.value));
  return respond(await idempotent(request, who.value.userId, body.value, async () => importGridFile(db, who.value, body.value)));
}
