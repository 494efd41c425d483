// Reading a block of rows: a tab-separated paste from a spreadsheet or a CSV file (RFC 4180, parsed
// with papaparse), with or without a header row, under the sheet's locale and the units in its headers.
import Papa from "papaparse";
import { CONTROL_CHARACTERS } from "@/lib/core/fields";
import type { UnitSystem } from "@/lib/quantity/units";
import type { GridColumn, GridRow, GridTable } from "@/lib/grid/tables";
import { entryColumns } from "@/lib/grid/tables";
import type { HeaderMatch } from "@/lib/grid/cells";
import { looksLikeHeader, matchHeaders, readCell } from "@/lib/grid/cells";
import { dateOrderFor } from "@/lib/grid/locale-date";
import { numberStyleFor } from "@/lib/grid/locale-number";
import { checkRow } from "@/lib/grid/rows";

export const MAX_IMPORT_BYTES = 10 * 1024 * 1024;
export const MAX_IMPORT_ROWS = 50_000;

export interface SheetOptions {
  locale: string;
  system: UnitSystem;
  siteOffsetMin: number;
  /** Tab for a paste; undefined lets the reader pick comma, semicolon or tab (CSV files from other locales). */
  delimiter?: string;
  /** Without a header row, the columns the block's columns land in (the grid's columns from the focused cell on). */
  columnsWithoutHeader?: readonly GridColumn[];
  /** A header is required (CSV import); a paste may have none. */
  requireHeader?: boolean;
}

export interface SheetRow {
  /** Row number as the sheet shows it (1-based, the header row counted). */
  line: number;
  values: GridRow;
  /** Cell problems by field; "" for the row as a whole. */
  errors: Record<string, string>;
  /** The cells as given, so nothing typed is lost when a cell cannot be read. */
  raw: Record<string, string>;
}

export interface Sheet {
  hasHeader: boolean;
  columns: HeaderMatch[];
  rows: SheetRow[];
  /** Problems with the block as a whole (no rows, unknown or missing columns, broken quotes). */
  problems: string[];
}

/** Text of a file: UTF-8 (a BOM is dropped), UTF-16 with a BOM, otherwise Windows-1252 / Latin-1. */
export function decodeText(bytes: Uint8Array): { text: string; encoding: string } {
  if (bytes[0] === 0xff && bytes[1] === 0xfe)
    return { text: new TextDecoder("utf-16le").decode(bytes.subarray(2)), encoding: "UTF-16LE" };
  if (bytes[0] === 0xfe && bytes[1] === 0xff)
    return { text: new TextDecoder("utf-16be").decode(bytes.subarray(2)), encoding: "UTF-16BE" };
  const body = bytes[0] === 0xef && bytes[1] === 0xbb && bytes[2] === 0xbf ? bytes.subarray(3) : bytes;
  try {
    return {
      text: new TextDecoder("utf-8", { fatal: true }).decode(body),
      encoding: body === bytes ? "UTF-8" : "UTF-8 with BOM",
    };
  } catch {
    return { text: new TextDecoder("windows-1252").decode(body), encoding: "Latin-1 (Windows-1252)" };
  }
}

const QUOTE_MESSAGES: Record<string, string> = {
  MissingQuotes: "a quoted cell is never closed",
  InvalidQuotes: "a stray quote inside a cell (write a quote inside a quoted cell as two quotes)",
  UndetectableDelimiter: "",
  TooFewFields: "",
  TooManyFields: "",
};

/** The block's cells: parsed (delimiter guessed unless given), control characters named and removed. */
function parseBlock(body: string, delimiter: string | undefined, problems: string[]) {
  const parsed = Papa.parse<string[]>(body, {
    delimiter: delimiter ?? "",
    delimitersToGuess: [",", ";", "\t"],
    skipEmptyLines: "greedy",
  });
  const quoteRows = new Set<number>();
  for (const e of parsed.errors) {
    const what = QUOTE_MESSAGES[e.code] ?? e.message;
    if (what === "") continue;
    if (e.row !== undefined && e.row !== null) quoteRows.add(e.row);
    problems.push(`Row ${(e.row ?? 0) + 1}: ${what}`);
  }
  // Control characters (NUL above all, which PostgreSQL refuses) are named by row and column, removed
  // so nothing downstream sees them, and block the import like any other problem in the file.
  const grid = parsed.data.map((cells, r) =>
    cells.map((cell, c) => {
      if (!CONTROL_CHARACTERS.test(cell)) return cell;
      problems.push(`Row ${r + 1}, column ${c + 1}: contains a control character (check the file's encoding)`);
      return cell.replace(new RegExp(CONTROL_CHARACTERS.source, "g"), "");
    }),
  );
  return { grid, quoteRows };
}

const plural = (n: number) => (n > 1 ? "s" : "");

/** The columns a header row names, with unknown, repeated and missing columns as problems. */
function headerColumns(table: GridTable, first: string[], problems: string[]): HeaderMatch[] {
  const m = matchHeaders(table, first);
  if (m.unknown.length)
    problems.push(
      `Unknown column${plural(m.unknown.length)}: ${m.unknown.map((u) => `"${u}"`).join(", ")} (this table has: ${table.columns.map((c) => c.header).join(", ")})`,
    );
  problems.push(...m.unitIssues);
  const seen = new Map<string, number>();
  for (const c of m.matches) seen.set(c.column.field, (seen.get(c.column.field) ?? 0) + 1);
  for (const [field, n] of seen)
    if (n > 1)
      problems.push(`Column "${table.columns.find((c) => c.field === field)?.header ?? field}" appears ${n} times`);
  const given = new Set(m.matches.map((c) => c.column.field));
  const missing = requiredFields(table).filter((f) => !given.has(f));
  if (missing.length)
    problems.push(
      `Missing column${plural(missing.length)}: ${missing.map((f) => table.columns.find((c) => c.field === f)?.header ?? f).join(", ")}`,
    );
  return m.matches;
}

interface RowReading {
  columns: HeaderMatch[];
  hasHeader: boolean;
  width: number;
  quoteRows: Set<number>;
  style: ReturnType<typeof numberStyleFor>;
  order: ReturnType<typeof dateOrderFor>;
}

/** One data row read cell by cell, then checked with the table's shared schema. */
function readRow(table: GridTable, cells: string[], i: number, k: RowReading, o: SheetOptions): SheetRow {
  const line = i + 1 + (k.hasHeader ? 1 : 0);
  const values: GridRow = {};
  const errors: Record<string, string> = {};
  const raw: Record<string, string> = {};
  if (k.quoteRows.has(i + (k.hasHeader ? 1 : 0))) errors[""] = "broken quotes in this row";
  if (!k.hasHeader && cells.length > k.width && cells.slice(k.width).some((c) => c.trim() !== ""))
    errors[""] = `${cells.length} cells but only ${k.width} columns to put them in`;
  for (const { index, column, unit } of k.columns) {
    const cell = cells[index] ?? "";
    raw[column.field] = cell;
    if (column.entry !== true || column.computed === true) continue;
    const r = readCell(column, cell, {
      style: k.style,
      order: k.order,
      siteOffsetMin: o.siteOffsetMin,
      system: o.system,
      ...(unit ? { unit } : {}),
    });
    if (r.ok) values[column.field] = r.value;
    else {
      values[column.field] = cell;
      errors[column.field] = r.issues[0]?.message ?? "cannot be read";
    }
  }
  const check = checkRow(table, values);
  for (const [f, msg] of Object.entries(check.errors)) if (errors[f] === undefined) errors[f] = msg;
  return { line, values, errors, raw };
}

/** Reads a block into rows checked cell by cell and with the table's shared schema. */
export function readSheet(table: GridTable, text: string, o: SheetOptions): Sheet {
  const problems: string[] = [];
  const body = text.replace(/^\uFEFF/, "").replace(/(\r?\n)+$/, "");
  if (body.trim() === "")
    return {
      hasHeader: false,
      columns: [],
      rows: [],
      problems: ["The file or block is empty: there are no rows to read"],
    };
  const { grid, quoteRows } = parseBlock(body, o.delimiter, problems);
  const first = grid[0] ?? [];
  const hasHeader = looksLikeHeader(table, first);
  if (!hasHeader && o.requireHeader)
    problems.push(
      `Row 1 is not a header row: the first row must name the columns (${entryColumns(table)
        .map((c) => c.header)
        .join(", ")})`,
    );
  const columns = hasHeader
    ? headerColumns(table, first, problems)
    : (o.columnsWithoutHeader ?? entryColumns(table)).map((column, index) => ({ index, column }));
  const dataRows = hasHeader ? grid.slice(1) : grid;
  if (dataRows.length === 0) problems.push("There are no data rows under the header");
  if (dataRows.length > MAX_IMPORT_ROWS)
    problems.push(
      `${dataRows.length.toLocaleString("en")} rows: at most ${MAX_IMPORT_ROWS.toLocaleString("en")} rows per import`,
    );
  const reading: RowReading = {
    columns,
    hasHeader,
    width: Math.max(0, ...columns.map((c) => c.index + 1)),
    quoteRows,
    style: numberStyleFor(o.locale),
    order: dateOrderFor(o.locale),
  };
  const rows = dataRows.slice(0, MAX_IMPORT_ROWS).map((cells, i) => readRow(table, cells, i, reading, o));
  return { hasHeader, columns, rows, problems };
}

/** Fields a new row cannot do without: what the shared schema complains about for an empty row. */
export function requiredFields(table: GridTable): string[] {
  // A lot is either a delivery (supplier + document) or pooled pickups: neither column is required on its own.
  const either =
    table.key === "lots" ? new Set(["pickupCodes", "supplierCode", "deliveryDocument"]) : new Set<string>();
  return Object.keys(checkRow(table, {}).errors).filter((f) => f !== "" && !either.has(f));
}

/** A message per failing row, naming the row number and the column, for previews and import answers. */
export function describeRowErrors(table: GridTable, rows: readonly SheetRow[], limit = 200): string[] {
  const out: string[] = [];
  for (const r of rows) {
    for (const [field, msg] of Object.entries(r.errors)) {
      if (out.length >= limit) return out;
      const header = table.columns.find((c) => c.field === field)?.header;
      out.push(`Row ${r.line}${header ? `, column "${header}"` : ""}: ${msg}`);
    }
  }
  return out;
}
