import { NextResponse } from "next/server";
import { getDb } from "@/lib/core/db";
import { parseQuery, respond } from "@/lib/api/json-route.service";
import { requireReader } from "@/lib/auth/request.service";
import { GridExportSchema } from "@/lib/grid/query.schema";
import { exportGrid } from "@/lib/grid/export.service";
import { handled } from "@/lib/api/handle.service";
import { checkEtag } from "@/lib/api/etag.service";

/** The whole filtered, sorted view as CSV or XLSX, in the user's units, formula-like text neutralised. */
export const GET = handled("GET /api/grid/export", async (request: Request): Promise<NextResponse> => {
  const who = await requireReader(request);
  if (!who.ok) return respond(who);
  const q = parseQuery(request, GridExportSchema);
  if (!q.ok) return respond(q);
  const db = await getDb();
  const { tag, notModified } = await checkEtag(request, db, who.value, who.value.unitSystem);
  if (notModified) return notModified;
  const file = await exportGrid(db, who.value, q.value);
  if (!file.ok) return respond(file);
  return new NextResponse(file.value.body as unknown as BodyInit, {
    headers: {
      "content-type": file.value.contentType,
      "content-disposition": `attachment; filename="${file.value.filename}"`,
      "x-row-count": String(file.value.rows),
      "cache-control": "private, no-cache",
      etag: tag,
    },
  });
});
