import { NextResponse } from "next/server";
import { z } from "zod";
import { requireReader } from "@/lib/auth/request.service";
import { respond } from "@/lib/api/json-route.service";
import { oneOf } from "@/lib/core/fields";
import { parseInput } from "@/lib/ledger/parse";
import { getSiteById } from "@/lib/site/site.store";
import { getDb } from "@/lib/core/db";
import { traceBackwardReport, traceForwardReport } from "@/lib/trace/trace.service";
import { BACKWARD_TABLES, backwardCsv, csvFileName, forwardCsv } from "@/app/trace/csv";
import { toSiteInstant } from "@/app/trace/site-time";
import { handled } from "@/lib/api/handle.service";
import { canRead } from "@/lib/auth/read-matrix";

export const dynamic = "force-dynamic";

const CsvQuerySchema = z.object({
  dir: oneOf("Direction", ["back", "fwd"] as const),
  table: oneOf("Table", [...BACKWARD_TABLES, "holders"] as const).default("lots"),
  view: z.enum(["all", "feedstock"]).default("all"),
  kind: z.string().default(""),
  code: z.string().default(""),
  at: z.string().default(""),
});

function csvResponse(body: string, name: string): NextResponse {
  return new NextResponse(body, {
    headers: {
      "content-type": "text/csv; charset=utf-8; header=present",
      "content-disposition": `attachment; filename="${name}"`,
      "cache-control": "no-store",
    },
  });
}

/** The trace tables of the /trace page as CSV, from the same service answer the page shows. */
export const GET = handled("GET /trace/csv", async (request: Request): Promise<NextResponse> => {
  const who = await requireReader(request);
  if (!who.ok) return respond(who);
  const q = parseInput(CsvQuerySchema, Object.fromEntries(new URL(request.url).searchParams));
  if (!q.ok) return respond(q);
  const db = await getDb();
  const { siteId, now } = who.value;
  if (q.value.dir === "fwd") {
    const r = await traceForwardReport(db, siteId, { kind: q.value.kind, code: q.value.code }, now, {
      withCustomers: canRead(who.value.role, "/customers"),
    });
    if (!r.ok) return respond(r);
    return csvResponse(forwardCsv(r.value), csvFileName(["where-it-went", r.value.subject.code]));
  }
  if (q.value.table === "holders")
    return respond({
      ok: false,
      issues: [{ code: "INPUT.INVALID", message: "Table: a backward trace has no holders table", field: "table" }],
    });
  const site = await getSiteById(db, siteId);
  const r = await traceBackwardReport(
    db,
    siteId,
    { kind: q.value.kind, code: q.value.code, at: toSiteInstant(q.value.at, site?.timeZone ?? "UTC") },
    now,
  );
  if (!r.ok) return respond(r);
  const feedstock = q.value.view === "feedstock";
  return csvResponse(
    backwardCsv(r.value, q.value.table, feedstock),
    csvFileName(["made-of", r.value.target.code, q.value.table, ...(feedstock ? ["feedstock"] : [])]),
  );
});
