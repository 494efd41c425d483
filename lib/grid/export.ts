// The cells of an export: figures in the user's units with the unit in the header; a choice as its label
// with the stored code in the next column; a time as the site's wall clock with UTC in the next column;
// text cells that could run as spreadsheet formulas neutralised.
import Papa from "papaparse";
import type { UnitSystem } from "@/lib/quantity/units";
import type { CellValue, GridColumn, GridRow, GridTable } from "@/lib/grid/tables";
import { headerWithUnit, showChoice } from "@/lib/grid/cells";
import { neutraliseFormula } from "@/lib/grid/formula";
import { decimalsFor, displayUnit, toDisplay } from "@/lib/grid/units";
import { getUtcOffsetMin } from "@/lib/period/site-time";

/** ISO 8601 UTC, without a zero milliseconds part: 2026-03-01T08:30:00Z. */
export function isoCell(iso: string): string {
  return iso.replace(/\.000Z$/, "Z");
}

/** A site wall-clock time: its text for CSV and the parts a spreadsheet date cell is built from. */
export interface SiteTime {
  text: string;
  /** Milliseconds of the wall-clock time read as if it were UTC (what a spreadsheet date serial holds). */
  wallMs: number;
}

export function siteTimeOf(iso: string, timeZone: string): SiteTime | null {
  const ms = Date.parse(iso);
  if (Number.isNaN(ms)) return null;
  const wallMs = ms + getUtcOffsetMin(timeZone, new Date(ms)) * 60_000;
  const local = new Date(wallMs).toISOString();
  const text = local.endsWith("T00:00:00.000Z") ? local.slice(0, 10) : `${local.slice(0, 10)} ${local.slice(11, 16)}`;
  return { text, wallMs };
}

/** One column of an exported file: its header and how a row's cell is written. */
export interface ExportColumn {
  header: string;
  /** "site-time" cells become real date cells in XLSX. */
  kind: "value" | "site-time";
  cell: (row: GridRow) => string | number | SiteTime | null;
}

function figure(col: GridColumn, v: CellValue | undefined, system: UnitSystem): string | number | null {
  if (v === null || v === undefined) return null;
  if (typeof v === "boolean") return v ? "yes" : "no";
  if (typeof v === "number") {
    if (!col.quantity) return v;
    const u = displayUnit(col.quantity, system);
    return Number(toDisplay(v, col.quantity, system).toFixed(decimalsFor(u)));
  }
  return neutraliseFormula(v);
}

/** The exported columns of a table: choices get a code column beside the label, times a UTC column beside the site time. */
export function exportColumns(table: GridTable, system: UnitSystem, timeZone: string): ExportColumn[] {
  return table.columns.flatMap<ExportColumn>((c) => {
    const header = headerWithUnit(c, system);
    const raw = (r: GridRow) => r[c.field];
    if (c.kind === "date")
      return [
        {
          header: `${c.header} (site time: ${timeZone})`,
          kind: "site-time",
          cell: (r) => (typeof raw(r) === "string" ? siteTimeOf(raw(r) as string, timeZone) : null),
        },
        {
          header: `${c.header} (UTC)`,
          kind: "value",
          cell: (r) => (typeof raw(r) === "string" ? isoCell(raw(r) as string) : null),
        },
      ];
    if (c.kind === "enum" || (c.kind === "list" && c.options))
      return [
        {
          header,
          kind: "value",
          cell: (r) => (typeof raw(r) === "string" ? neutraliseFormula(showChoice(c, raw(r) as string)) : null),
        },
        { header: `${c.header} (code)`, kind: "value", cell: (r) => figure(c, raw(r), system) },
      ];
    return [{ header, kind: "value", cell: (r) => figure(c, raw(r), system) }];
  });
}

function csvCell(v: string | number | SiteTime | null): string | number {
  if (v === null) return "";
  return typeof v === "object" ? v.text : v;
}

/** RFC 4180 CSV: comma-separated, CRLF line ends, quotes doubled (the caller adds a UTF-8 BOM for spreadsheet programs). */
export function toCsv(
  table: GridTable,
  rows: readonly GridRow[],
  system: UnitSystem,
  timeZone: string,
  withHeader = true,
): string {
  const cols = exportColumns(table, system, timeZone);
  const data = rows.map((r) => cols.map((c) => csvCell(c.cell(r))));
  return Papa.unparse(
    { fields: cols.map((c) => c.header), data },
    { newline: "\r\n", header: withHeader, quotes: false },
  );
}
