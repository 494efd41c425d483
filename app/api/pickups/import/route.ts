import type { NextResponse } from "next/server";
import { getDb } from "@/lib/core/db";
import { idempotent, MAX_BULK_JSON_BYTES, readJson, requireSameOrigin, respond } from "@/lib/api/json-route.service";
import { requireRole } from "@/lib/auth/request.service";
import { importPickups } from "@/lib/feedstock/pickup.service";
import { handled } from "@/lib/api/handle.service";
import { actorOf } from "@/lib/core/actor";

/** Imports many pickups all-or-nothing; rows already stored (same idempotency key) are skipped. */
export const POST = handled("POST /api/pickups/import", async (request: Request): Promise<NextResponse> => {
  const origin = requireSameOrigin(request);
  if (!origin.ok) return respond(origin);
  const who = await requireRole(["PRODUCTION"]);
  if (!who.ok) return respond(who);
  const body = await readJson(request, MAX_BULK_JSON_BYTES);
  if (!body.ok) return respond(body);
  const actor = actorOf(who.value);
  return respond(
    await idempotent(request, who.value.userId, body.value, async () =>
      importPickups(await getDb(), actor, body.value),
    ),
  );
});
