import "server-only";
// Route handlers for printable reports: who reads, which site, and the report as PDF or one table as CSV.
import { NextResponse } from "next/server";
import { z } from "zod";
import { requireReader } from "@/lib/auth/request.service";
import type { SignedIn } from "@/lib/auth/request.service";
import { respond } from "@/lib/api/json-route.service";
import { handled } from "@/lib/api/handle.service";
import { getDb } from "@/lib/core/db";
import type { Db } from "@/lib/core/connect";
import { fail } from "@/lib/core/result";
import type { Result } from "@/lib/core/result";
import { oneOf } from "@/lib/core/fields";
import { parseInput } from "@/lib/ledger/parse";
import type { ReportContext, ReportDoc } from "@/lib/report/report";
import { reportCsv, reportFileName } from "@/lib/report/report-csv";
import { renderReportPdf } from "@/lib/report/report-pdf";
import { getSiteById } from "@/lib/site/site.store";
import type { SiteRow } from "@/lib/site/site.store";

/** Every report route takes these two besides its own query: PDF (default) or one table as CSV. */
export const ReportFormatSchema = z.object({
  format: z.preprocess((v) => (v === "" || v === undefined ? "pdf" : v), oneOf("Format", ["pdf", "csv"] as const)),
  table: z.string().trim().max(40, "Table: at most 40 characters").optional(),
});

export interface ReportRequest {
  db: Db;
  site: SiteRow;
  user: SignedIn;
  query: Record<string, string>;
  /** The route's dynamic segments (e.g. a lot's code). */
  params: Record<string, string>;
  context: ReportContext;
}

/** A GET route that answers a report built by `build` from the request's query string. */
export function reportRoute(name: string, build: (r: ReportRequest) => Promise<Result<ReportDoc>>) {
  return handled(
    name,
    async (request: Request, segment?: { params: Promise<Record<string, string>> }): Promise<NextResponse> => {
      const who = await requireReader(request);
      if (!who.ok) return respond(who);
      const query = Object.fromEntries(new URL(request.url).searchParams);
      const format = parseInput(ReportFormatSchema, { format: query.format ?? "", table: query.table });
      if (!format.ok) return respond(format);
      const db = await getDb();
      const site = await getSiteById(db, who.value.siteId);
      if (site === null) return respond(fail("RECORD.NOT_FOUND", "Your site does not exist"));
      const context: ReportContext = {
        plant: `${site.name}, ${site.town}`,
        producedAt: who.value.now,
        producedBy: who.value.fullName,
        timeZone: site.timeZone,
      };
      const params = segment === undefined ? {} : await segment.params;
      const doc = await build({ db, site, user: who.value, query, params, context });
      if (!doc.ok) return respond(doc);
      const headers = (type: string, file: string) => ({
        "content-type": type,
        "content-disposition": `attachment; filename="${file}"`,
        "cache-control": "no-store",
      });
      if (format.value.format === "csv") {
        const key = format.value.table ?? doc.value.tables[0]?.key;
        const table = doc.value.tables.find((t) => t.key === key);
        if (table === undefined)
          return respond(
            fail("INPUT.INVALID", `Table: one of ${doc.value.tables.map((t) => t.key).join(", ")}`, "table"),
          );
        return new NextResponse(reportCsv(doc.value, table), {
          headers: headers("text/csv; charset=utf-8; header=present", reportFileName(doc.value, "csv", table.key)),
        });
      }
      const bytes = await renderReportPdf(doc.value);
      return new NextResponse(Buffer.from(bytes), {
        headers: headers("application/pdf", reportFileName(doc.value, "pdf")),
      });
    },
  );
}
