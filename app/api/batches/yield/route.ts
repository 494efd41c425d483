import type { NextResponse } from "next/server";
import { getDb } from "@/lib/core/db";
import { fail, ok } from "@/lib/core/result";
import { requireReader } from "@/lib/auth/request.service";
import { parseQuery, respond } from "@/lib/api/json-route.service";
import { BatchYieldQuerySchema } from "@/lib/api/endpoints/lab";
import { getBatchDetail } from "@/lib/batch/batch.store";
import { computeRecordedYield } from "@/lib/batch/plan";
import { handled } from "@/lib/api/handle.service";

export const dynamic = "force-dynamic";

/** Yield of a recorded batch against its plan. */
export const GET = handled("GET /api/batches/yield", async (request: Request): Promise<NextResponse> => {
  const who = await requireReader(request);
  if (!who.ok) return respond(who);
  const input = parseQuery(request, BatchYieldQuerySchema);
  if (!input.ok) return respond(input);
  const b = await getBatchDetail(await getDb(), who.value.siteId, input.value.code);
  if (!b) return respond(fail("RECORD.NOT_FOUND", `Batch ${input.value.code} does not exist`, "code"));
  const y = computeRecordedYield(b, b.charges, b.outputs);
  return respond(y.ok ? ok({ basis: y.value.planned.basis, notes: y.value.planned.notes, yield: y.value.yield }) : y);
});
