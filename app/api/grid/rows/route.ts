import type { NextResponse } from "next/server";
import { getDb } from "@/lib/core/db";
import { parseQuery, respond } from "@/lib/api/json-route.service";
import { requireReader } from "@/lib/auth/request.service";
import { GridQuerySchema } from "@/lib/grid/query.schema";
import { listGridRows } from "@/lib/grid/grid.service";
import { ok } from "@/lib/core/result";
import { handled } from "@/lib/api/handle.service";

/** One block of a grid table for the infinite row model: rows, the filtered count and totals within the filter. */
export const GET = handled("GET /api/grid/rows", async (request: Request): Promise<NextResponse> => {
  const who = await requireReader(request);
  if (!who.ok) return respond(who);
  const q = parseQuery(request, GridQuerySchema);
  if (!q.ok) return respond(q);
  const t0 = performance.now();
  const page = await listGridRows(await getDb(), who.value, q.value);
  const res = respond(ok(page));
  res.headers.set("Server-Timing", `db;dur=${(performance.now() - t0).toFixed(1)}`);
  return res;
});
