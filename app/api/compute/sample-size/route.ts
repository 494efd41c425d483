import type { NextResponse } from "next/server";
import { requireReader } from "@/lib/auth/request.service";
import { parseQuery, respond } from "@/lib/api/json-route.service";
import { SampleSizeQuerySchema, answerSampleSize } from "@/lib/api/endpoints/lab";
import { handled } from "@/lib/api/handle.service";

export const dynamic = "force-dynamic";

/** AOCS Ca 5a-40 Table 1: sample mass and titrant for an expected FFA. */
export const GET = handled("GET /api/compute/sample-size", async (request: Request): Promise<NextResponse> => {
  const who = await requireReader(request);
  if (!who.ok) return respond(who);
  const input = parseQuery(request, SampleSizeQuerySchema);
  if (!input.ok) return respond(input);
  return respond(answerSampleSize(input.value));
});
