// The draft grid's rows without the browser: a draft row holds the text as typed (in the user's units)
// with its reference and state; these functions work out what an edit, a fill-down, a clear, a copy or a
// paste changes, so the grid component only applies the answer and records it for undo.
import type { GridRow, GridTable } from "@/lib/grid/tables";
import { showCell } from "@/lib/grid/cells";
import type { Sheet } from "@/lib/grid/sheet";
import type { UnitSystem } from "@/lib/quantity/units";
import type { CellChange } from "@/lib/grid/undo";
import type { CellRange } from "@/lib/grid/selection";
import { fillDown } from "@/lib/grid/selection";

/** A draft row holds the text as typed (in the user's units), plus its reference and state. */
export type DraftRow = Record<string, string>;
export const REF = "__ref";
export const STATE = "__state"; // "draft" | "saved"

export const refOf = (r: DraftRow | undefined): string => r?.[REF] ?? "";
export const isSaved = (r: DraftRow | undefined): boolean => r?.[STATE] === "saved";

/** Whether a row has anything typed in the columns a person can type into. */
export function hasTyping(row: DraftRow, entry: ReadonlySet<string>, table: GridTable): boolean {
  return table.columns.some((c) => entry.has(c.field) && (row[c.field] ?? "") !== "");
}

/** The list with one empty draft row at the end, for the next row to be typed. */
export function withTrailingBlank(
  list: DraftRow[],
  blank: () => DraftRow,
  entry: ReadonlySet<string>,
  table: GridTable,
): DraftRow[] {
  const last = list.at(-1);
  return !last || isSaved(last) || hasTyping(last, entry, table) ? [...list, blank()] : list;
}

function asText(raw: unknown): string {
  if (raw === null || raw === undefined) return "";
  if (typeof raw === "string") return raw;
  if (typeof raw === "number" || typeof raw === "boolean") return String(raw);
  return JSON.stringify(raw);
}

/** Cell values applied to draft rows; saved rows and columns nobody types into are left alone. */
export function applyValues(
  base: readonly DraftRow[],
  values: ReadonlyArray<{ rowId: string; field: string; value: unknown }>,
  entry: ReadonlySet<string>,
): { rows: DraftRow[]; touched: Set<string> } {
  const byRef = new Map(base.map((r) => [refOf(r), { ...r }]));
  const touched = new Set<string>();
  for (const v of values) {
    const row = byRef.get(v.rowId);
    if (!row || isSaved(row) || !entry.has(v.field)) continue;
    row[v.field] = asText(v.value);
    touched.add(v.rowId);
  }
  return { rows: base.map((r) => byRef.get(refOf(r)) ?? r), touched };
}

const editable = (row: DraftRow | undefined, field: string, entry: ReadonlySet<string>): row is DraftRow =>
  row !== undefined && !isSaved(row) && entry.has(field);

/** Ctrl+D: each selected cell takes the value of the top cell of its column. */
export function fillDownChanges(
  rows: readonly DraftRow[],
  range: CellRange,
  cols: readonly string[],
  entry: ReadonlySet<string>,
): CellChange[] {
  return fillDown(range, (p) => rows[p.row]?.[cols[p.col] ?? ""] ?? "").flatMap(({ pos, value }) => {
    const row = rows[pos.row];
    const field = cols[pos.col] ?? "";
    return editable(row, field, entry)
      ? [{ rowId: refOf(row), field, before: row[field] ?? "", after: String(value ?? "") }]
      : [];
  });
}

/** Delete: the selected cells that hold something and can be typed into, emptied. */
export function clearChanges(
  rows: readonly DraftRow[],
  range: CellRange,
  cols: readonly string[],
  entry: ReadonlySet<string>,
): CellChange[] {
  const changes: CellChange[] = [];
  for (let i = range.top; i <= range.bottom; i++) {
    const row = rows[i];
    for (let j = range.left; j <= range.right; j++) {
      const field = cols[j] ?? "";
      if (editable(row, field, entry) && (row[field] ?? "") !== "")
        changes.push({ rowId: refOf(row), field, before: row[field] ?? "", after: "" });
    }
  }
  return changes;
}

/** Ctrl+C on a rectangle: tab-separated lines, as a spreadsheet copies them. */
export function copyText(rows: readonly DraftRow[], range: CellRange, cols: readonly string[]): string {
  const lines: string[] = [];
  for (let i = range.top; i <= range.bottom; i++)
    lines.push(
      cols
        .slice(range.left, range.right + 1)
        .map((f) => rows[i]?.[f] ?? "")
        .join("\t"),
    );
  return lines.join("\n");
}

/**
 * The rows a pasted block of `count` rows lands in from `startRow`: saved rows are stepped over (moved
 * below), new draft rows are added where the block runs past the end, and an empty trailing row is used.
 */
export function pasteTargets(
  rows: readonly DraftRow[],
  startRow: number,
  count: number,
  blank: () => DraftRow,
  entry: ReadonlySet<string>,
  table: GridTable,
): { base: DraftRow[]; added: string[]; targets: string[] } {
  let base = [...rows];
  const added: string[] = [];
  const targets: string[] = [];
  const trailing = base.at(-1);
  if (trailing && base.length - 1 < startRow + count && !hasTyping(trailing, entry, table)) base = base.slice(0, -1);
  for (let i = 0; i < count; i++) {
    const at = startRow + i;
    let row = base[at];
    if (row && isSaved(row)) {
      // Saved rows move below the next draft row; with none below, a new draft row goes in here.
      const tail = base.slice(at);
      const firstDraft = tail.findIndex((r) => !isSaved(r));
      if (firstDraft === -1) {
        row = blank();
        added.push(refOf(row));
        base = [...base.slice(0, at), row, ...tail];
      } else {
        base = [...base.slice(0, at), ...tail.slice(firstDraft), ...tail.slice(0, firstDraft)];
        row = base[at];
      }
    }
    if (!row) {
      row = blank();
      base = [...base, row];
      added.push(refOf(row));
    }
    targets.push(refOf(row));
  }
  return { base, added, targets };
}

/** The pasted cells as text in the user's units; a cell that could not be read keeps what was pasted. */
export function pasteChanges(
  sheet: Sheet,
  base: readonly DraftRow[],
  targets: readonly string[],
  entry: ReadonlySet<string>,
  system: UnitSystem,
): CellChange[] {
  const changes: CellChange[] = [];
  sheet.rows.forEach((sr, i) => {
    const target = base.find((r) => refOf(r) === targets[i]);
    if (!target) return;
    for (const { column } of sheet.columns) {
      if (!entry.has(column.field)) continue;
      const v = sr.values[column.field];
      const bad = sr.errors[column.field] !== undefined && (sr.raw[column.field] ?? "") !== "";
      const shown = bad
        ? (sr.raw[column.field] ?? "")
        : v === null || v === undefined
          ? ""
          : showCell(column, v, system);
      changes.push({ rowId: refOf(target), field: column.field, before: target[column.field] ?? "", after: shown });
    }
  });
  return changes;
}

/** Saved rows show the server's record from now on (computed fields included). */
export function markSavedRows(
  rows: readonly DraftRow[],
  saved: ReadonlyArray<{ ref: string; row: GridRow | null }>,
  table: GridTable,
  system: UnitSystem,
): DraftRow[] {
  const byRef = new Map(saved.map((s) => [s.ref, s.row]));
  return rows.map((r) => {
    if (!byRef.has(refOf(r))) return r;
    const server = byRef.get(refOf(r));
    const out: DraftRow = { [REF]: refOf(r), [STATE]: "saved" };
    for (const c of table.columns)
      out[c.field] = server ? showCell(c, server[c.field] ?? null, system) : (r[c.field] ?? "");
    return out;
  });
}
