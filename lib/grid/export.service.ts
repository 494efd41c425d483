import "server-only";
// Export of the whole filtered, sorted view — every row, not only the blocks loaded in the browser.
import ExcelJS from "exceljs";
import type { Db } from "@/lib/database/connect";
import { GRID_TABLES } from "@/lib/grid/tables";
import type { GridExport } from "@/lib/grid/query.schema";
import { queryGridRows } from "@/lib/grid/grid.store";
import { exportCell, exportHeaders, toCsv } from "@/lib/grid/export";
import type { GridActor } from "@/lib/grid/grid.service";
import type { Result } from "@/lib/errors";
import { fail, ok } from "@/lib/errors";

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
    const page = await queryGridRows(db, { siteId: actor.siteId, table: q.table, start, end: start + PAGE, sort: q.sort, filter: q.filter, system: actor.unitSystem, now: actor.now });
    if (page.lastRow > MAX_EXPORT_ROWS) return fail("GRID.EXPORT_TOO_LARGE", `${page.lastRow.toLocaleString("en")} rows: narrow the filter to at most ${MAX_EXPORT_ROWS.toLocaleString("en")} rows per export`, "filter");
    rows.push(...page.rows);
    if (page.rows.length < PAGE) break;
  }
  const stamp = actor.now.toISOString().slice(0, 10);
  const base = `tracevat-${q.table}-${stamp}`;
  if (q.format === "csv") {
    return ok({ body: new TextEncoder().encode(`\uFEFF${toCsv(table, rows, actor.unitSystem)}\r\n`), contentType: "text/csv; charset=utf-8", filename: `${base}.csv`, rows: rows.length });
  }
  const wb = new ExcelJS.Workbook();
  wb.creator = "Tracevat";
  const ws = wb.addWorksheet(table.label.slice(0, 31));
  ws.addRow(exportHeaders(table, actor.unitSystem));
  ws.getRow(1).font = { bold: true };
  ws.views = [{ state: "frozen", ySplit: 1 }];
  for (const r of rows) ws.addRow(table.columns.map((c) => exportCell(c, r[c.field], actor.unitSystem)));
  table.columns.forEach((c, i) => {
    ws.getColumn(i + 1).width = Math.max(10, Math.round((c.width ?? 120) / 7));
  });
  const buffer = await wb.xlsx.writeBuffer();
  return ok({ body: new Uint8Array(buffer), contentType: "application/vnd.openxmlformats-officedocument.spreadsheetml.sheet", filename: `${base}.xlsx`, rows: rows.length });
}
