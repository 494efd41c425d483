// The cells of an export: figures in the user's units with the unit in the header, ISO 8601 dates,
// and text cells that could run as spreadsheet formulas neutralised.
import Papa from "papaparse";
import type { UnitSystem } from "@/lib/quantity/units";
import type { CellValue, GridColumn, GridRow, GridTable } from "@/lib/grid/tables";
import { headerWithUnit } from "@/lib/grid/cells";
import { neutraliseFormula } from "@/lib/grid/formula";
import { decimalsFor, displayUnit, toDisplay } from "@/lib/grid/units";

export function exportHeaders(table: GridTable, system: UnitSystem): string[] {
  return table.columns.map((c) => headerWithUnit(c, system));
}

/** ISO 8601 UTC, without a zero milliseconds part: 2026-03-01T08:30:00Z. */
export function isoCell(iso: string): string {
  return iso.replace(/\.000Z$/, "Z");
}

export function exportCell(col: GridColumn, v: CellValue | undefined, system: UnitSystem): string | number | null {
  if (v === null || v === undefined) return null;
  if (typeof v === "boolean") return v ? "yes" : "no";
  if (typeof v === "number") {
    if (!col.quantity) return v;
    const u = displayUnit(col.quantity, system);
    return Number(toDisplay(v, col.quantity, system).toFixed(decimalsFor(u)));
  }
  if (col.kind === "date") return isoCell(v);
  return neutraliseFormula(v);
}

/** RFC 4180 CSV: comma-separated, CRLF line ends, quotes doubled; with a UTF-8 BOM so spreadsheet programs read UTF-8. */
export function toCsv(table: GridTable, rows: readonly GridRow[], system: UnitSystem, withHeader = true): string {
  const data = rows.map((r) => table.columns.map((c) => exportCell(c, r[c.field], system) ?? ""));
  const text = Papa.unparse({ fields: exportHeaders(table, system), data }, { newline: "\r\n", header: withHeader, quotes: false });
  return text;
}
