// One cell's text ↔ value: what a person types or pastes, read under the sheet's locale and units.
import type { Result } from "@/lib/core/result";
import { fail, ok } from "@/lib/core/result";
import type { UnitSystem } from "@/lib/quantity/units";
import { parseUnitFromHeader } from "@/lib/quantity/units";
import type { DateOrder } from "@/lib/grid/locale-date";
import { parseDateCell } from "@/lib/grid/locale-date";
import type { NumberStyle } from "@/lib/grid/locale-number";
import { parseLocaleNumber } from "@/lib/grid/locale-number";
import type { CellValue, GridColumn, GridTable } from "@/lib/grid/tables";
import type { GridUnit } from "@/lib/grid/units";
import { decimalsFor, displayUnit, fromUnit, quantityOf, toDisplay, unitSymbol } from "@/lib/grid/units";
import { unneutralise } from "@/lib/grid/formula";
import { labelOf } from "@/lib/core/vocabulary";

/** A typed or pasted choice as its stored code: the label shown in the grid ("Oilseed crusher"), or the code itself. */
export function codeOfChoice(options: readonly string[] | undefined, text: string): string {
  const key = text.toUpperCase().replace(/[\s-]+/g, "_");
  if (!options) return key;
  const folded = text.trim().toLowerCase();
  return options.find((o) => labelOf(o).toLowerCase() === folded) ?? key;
}

/** The label shown for a stored choice or list of choices: "Used cooking oil, Tallow". */
export function showChoice(col: GridColumn, value: string): string {
  if (col.kind === "enum") return labelOf(value);
  if (col.kind === "list" && col.options)
    return value
      .split(",")
      .map((s) => s.trim())
      .filter((s) => s !== "")
      .map(labelOf)
      .join(", ");
  return value;
}

export interface ReadContext {
  style: NumberStyle;
  order: DateOrder;
  siteOffsetMin: number;
  /** The unit a value is typed or pasted in for a quantity column (from the header, else the user's system). */
  unit?: GridUnit;
  system: UnitSystem;
}

const TRUE = new Set(["true", "yes", "y", "1", "ja", "oui", "sí", "si", "x", "✓"]);
const FALSE = new Set(["false", "no", "n", "0", "nein", "non", ""]);

/** Reads a cell's text into the value the row carries (kg, L, °C; ISO dates; upper-case codes). Empty is null. */
export function readCell(col: GridColumn, raw: string, ctx: ReadContext): Result<CellValue> {
  const text = unneutralise(raw).trim();
  if (text === "" && col.kind !== "boolean") return ok(null);
  switch (col.kind) {
    case "code":
      return ok(text.toUpperCase());
    case "text":
      return ok(text);
    case "list":
      return ok(
        text
          .split(/[,;]/)
          .map((s) => s.trim())
          .filter((s) => s !== "")
          .map((s) => (col.options ? codeOfChoice(col.options, s) : s.toUpperCase()))
          .join(", "),
      );
    case "enum":
      return ok(codeOfChoice(col.options, text));
    case "boolean": {
      const k = text.toLowerCase();
      if (TRUE.has(k)) return ok(true);
      if (FALSE.has(k)) return ok(false);
      return fail("INPUT.NOT_YES_NO", `${col.header}: "${text}" is not yes or no`, col.field);
    }
    case "date":
      return parseDateCell(text, ctx.order, ctx.siteOffsetMin, col.field);
    case "number":
    case "integer": {
      const n = parseLocaleNumber(text, ctx.style, col.field);
      if (!n.ok)
        return fail("INPUT.NOT_A_NUMBER", `${col.header}: ${n.issues[0]?.message ?? "not a number"}`, col.field);
      if (col.quantity === undefined) return n;
      const unit = ctx.unit ?? displayUnit(col.quantity, ctx.system);
      return ok(fromUnit(n.value, col.quantity, unit));
    }
  }
}

/** The text shown in a cell: quantities in the user's units, dates as "YYYY-MM-DD HH:MM" (UTC offset of the site). */
export function showCell(col: GridColumn, value: CellValue | undefined, system: UnitSystem, siteOffsetMin = 0): string {
  if (value === null || value === undefined) return "";
  if (typeof value === "boolean") return value ? "yes" : "no";
  if (typeof value === "string") {
    if (col.kind === "date") return showDate(value, siteOffsetMin);
    return showChoice(col, value);
  }
  if (col.quantity) {
    const u = displayUnit(col.quantity, system);
    return toDisplay(value, col.quantity, system).toFixed(Math.min(decimalsFor(u), 3));
  }
  return col.kind === "integer" ? String(value) : String(Number(value.toFixed(col.decimals ?? 3)));
}

export function showDate(iso: string, siteOffsetMin = 0): string {
  const t = Date.parse(iso);
  if (Number.isNaN(t)) return iso;
  const local = new Date(t + siteOffsetMin * 60_000).toISOString();
  return local.endsWith("T00:00:00.000Z") ? local.slice(0, 10) : `${local.slice(0, 10)} ${local.slice(11, 16)}`;
}

/** Header text with its unit: "Volume (gal)", "Sample (g)". */
export function headerWithUnit(col: GridColumn, system: UnitSystem): string {
  if (col.quantity) return `${col.header} (${unitSymbol(displayUnit(col.quantity, system))})`;
  if (col.fixedUnit) return `${col.header} (${col.fixedUnit})`;
  return col.header;
}

const norm = (s: string) =>
  s
    .normalize("NFKC")
    .toLowerCase()
    .replace(/[([].*?[)\]]/g, "")
    .replace(/[^a-z0-9]+/g, "");

export interface HeaderMatch {
  index: number;
  column: GridColumn;
  unit?: GridUnit;
}

/**
 * Matches a header row to columns by name (with or without its unit, case and punctuation ignored) or
 * by field name. A unit in a quantity column's header ("Volume (gal)", "Temp °F") says how to read
 * that column. Returns the matches and the headers that matched nothing, each named.
 */
export function matchHeaders(
  table: GridTable,
  headers: readonly string[],
): { matches: HeaderMatch[]; unknown: string[]; unitIssues: string[] } {
  const matches: HeaderMatch[] = [];
  const unknown: string[] = [];
  const unitIssues: string[] = [];
  headers.forEach((h, index) => {
    const key = norm(h);
    if (key === "") return;
    const column =
      table.columns.find((c) => norm(c.header) === key || norm(c.field) === key) ??
      table.columns.find((c) => key.startsWith(norm(c.header)) && norm(c.header).length >= 4);
    if (!column) {
      unknown.push(h);
      return;
    }
    if (column.quantity) {
      const u = parseUnitFromHeader(h);
      if (u.ok) {
        if (quantityOf(u.value) !== column.quantity)
          unitIssues.push(`Column "${h}": ${u.value} is not a unit of ${column.quantity}`);
        else matches.push({ index, column, unit: u.value });
        return;
      }
    }
    matches.push({ index, column });
  });
  return { matches: preferCompanions(matches, headers), unknown, unitIssues };
}

/** Our exports write a choice as label + "(code)" column and a time as site time + "(UTC)" column; rank of each variant. */
function variantRank(header: string): number {
  if (/\(code\)\s*$/i.test(header) || /\(utc\)\s*$/i.test(header)) return 2;
  if (/\(site time\b/i.test(header)) return 1;
  return 0;
}

/**
 * Re-reading one of our exports: where a column comes as a pair (label and code, site time and UTC),
 * the exact one is read (the code; the UTC instant) and its companion is left aside. Two headers of the
 * same kind for one column still count as a repeated column.
 */
function preferCompanions(matches: HeaderMatch[], headers: readonly string[]): HeaderMatch[] {
  const best = new Map<string, number>();
  for (const m of matches)
    best.set(m.column.field, Math.max(best.get(m.column.field) ?? 0, variantRank(headers[m.index] ?? "")));
  return matches.filter((m) => variantRank(headers[m.index] ?? "") === best.get(m.column.field));
}

/** Does a first row look like a header (most of its cells name a column of this table)? */
export function looksLikeHeader(table: GridTable, cells: readonly string[]): boolean {
  const nonEmpty = cells.filter((c) => c.trim() !== "");
  if (nonEmpty.length === 0) return false;
  const { matches } = matchHeaders(table, cells);
  return matches.length >= Math.ceil(nonEmpty.length / 2);
}
