import "server-only";
// Export of the whole filtered, sorted view — every row, not only the blocks loaded in the browser.
import ExcelJS from "exceljs";
import type { Db } from "@/lib/core/connect";
import { GRID_TABLES } from "@/lib/grid/tables";
import type { GridExport } from "@/lib/grid/query.schema";
import { getSiteTimeZone, queryGridRows } from "@/lib/grid/grid.store";
import { exportColumns, toCsv } from "@/lib/grid/export";
import type { GridActor } from "@/lib/grid/grid.service";
import type { Result } from "@/lib/core/result";
import { fail, ok } from "@/lib/core/result";

export const MAX_EXPORT_ROWS = 250_000;
const PAGE = 2_000;

export interface ExportFile {
  body: Uint8Array;
  contentType: string;
  filename: string;
  rows: number;
}

export async function exportGrid(db: Db, actor: GridActor, q: GridExport): Promise<Result<ExportFile>> {
  const table = GRID_TABLES[q.table];
  const rows = [];
  for (let start = 0; ; start += PAGE) {
    const page = await queryGridRows(db, {
      siteId: actor.siteId,
      table: q.table,
      start,
      end: start + PAGE,
      sort: q.sort,
      filter: q.filter,
      system: actor.unitSystem,
      now: actor.now,
    });
    if (page.lastRow > MAX_EXPORT_ROWS)
      return fail(
        "GRID.EXPORT_TOO_LARGE",
        `${page.lastRow.toLocaleString("en")} rows: narrow the filter to at most ${MAX_EXPORT_ROWS.toLocaleString("en")} rows per export`,
        "filter",
      );
    rows.push(...page.rows);
    if (page.rows.length < PAGE) break;
  }
  const stamp = actor.now.toISOString().slice(0, 10);
  const base = `tracevat-${q.table}-${stamp}`;
  const timeZone = await getSiteTimeZone(db, actor.siteId);
  if (q.format === "csv") {
    const csv = toCsv(table, rows, actor.unitSystem, timeZone);
    return ok({
      body: new TextEncoder().encode(`\uFEFF${csv}\r\n`),
      contentType: "text/csv; charset=utf-8",
      filename: `${base}.csv`,
      rows: rows.length,
    });
  }
  const cols = exportColumns(table, actor.unitSystem, timeZone);
  const wb = new ExcelJS.Workbook();
  wb.creator = "Tracevat";
  const ws = wb.addWorksheet(table.label.slice(0, 31));
  ws.addRow(cols.map((c) => c.header));
  ws.getRow(1).font = { bold: true };
  ws.views = [{ state: "frozen", ySplit: 1 }];
  // A site time is written as a real date cell: the wall-clock time as the spreadsheet's serial date
  // (spreadsheets hold no zone), so it sorts and filters as a date; the UTC column beside it keeps the instant.
  for (const r of rows)
    ws.addRow(
      cols.map((c) => {
        const v = c.cell(r);
        return v !== null && typeof v === "object" ? new Date(v.wallMs) : v;
      }),
    );
  cols.forEach((c, i) => {
    const column = ws.getColumn(i + 1);
    column.width = Math.max(12, Math.min(40, c.header.length + 2));
    if (c.kind === "site-time") column.numFmt = "yyyy-mm-dd hh:mm";
  });
  const buffer = await wb.xlsx.writeBuffer();
  return ok({
    body: new Uint8Array(buffer),
    contentType: "application/vnd.openxmlformats-officedocument.spreadsheetml.sheet",
    filename: `${base}.xlsx`,
    rows: rows.length,
  });
}
