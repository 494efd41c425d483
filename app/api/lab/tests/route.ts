import type { NextResponse } from "next/server";
import { getDb } from "@/lib/core/db";
import { requireRole } from "@/lib/auth/request.service";
import { parseBody, requireSameOrigin, respond } from "@/lib/api/json-route.service";
import { LabTestSchema } from "@/lib/feedstock/lot.schema";
import { recordLabTest } from "@/lib/feedstock/lot.service";
import { handled } from "@/lib/api/handle.service";
import { screenAfterRecord } from "@/lib/screening/screening.service";
import { actorOf } from "@/lib/core/actor";

export const dynamic = "force-dynamic";

/** Records a water, insolubles or unsaponifiables result. */
export const POST = handled("POST /api/lab/tests", async (request: Request): Promise<NextResponse> => {
  const origin = requireSameOrigin(request);
  if (!origin.ok) return respond(origin);
  const who = await requireRole(["PRODUCTION"]);
  if (!who.ok) return respond(who);
  const input = await parseBody(request, LabTestSchema);
  if (!input.ok) return respond(input);
  const actor = actorOf(who.value);
  const db = await getDb();
  const saved = await recordLabTest(db, actor, input.value);
  if (saved.ok) await screenAfterRecord(db, actor, { lotCodes: [input.value.lotCode] });
  return respond(saved);
});
