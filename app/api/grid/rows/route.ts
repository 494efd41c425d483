import type { NextResponse } from "next/server";
import { getDb } from "@/lib/core/db";
import { parseQuery, respond } from "@/lib/api/json-route.service";
import { requireReader } from "@/lib/auth/request.service";
import { GridQuerySchema } from "@/lib/grid/query.schema";
import { listGridRows } from "@/lib/grid/grid.service";
import { ok } from "@/lib/core/result";
import { handled } from "@/lib/api/handle.service";
import { respondAtPosition } from "@/lib/api/etag.service";

/**
 * One block of a grid table for the infinite row model: rows, the filtered count and totals within the
 * filter. Every grid table's rows are records whose changes are audited, so the answer is tagged (and
 * kept) by the ledger position, in the reader's units.
 */
export const GET = handled("GET /api/grid/rows", async (request: Request): Promise<NextResponse> => {
  const who = await requireReader(request);
  if (!who.ok) return respond(who);
  const q = parseQuery(request, GridQuerySchema);
  if (!q.ok) return respond(q);
  const db = await getDb();
  return respondAtPosition(
    request,
    db,
    who.value,
    async () => ok(await listGridRows(db, who.value, q.value)),
    who.value.unitSystem,
  );
});
