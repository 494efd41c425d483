// A CSV import checked against what is stored: each read row is new, the same as a stored record (left
// alone, so re-importing a file or an export changes nothing), a second copy of an earlier row, or in
// error — and every problem becomes a message naming the row and the column.
import type { DomainIssue } from "@/lib/core/result";
import type { GridRow, GridTable } from "@/lib/grid/tables";
import type { SheetRow } from "@/lib/grid/sheet";
import { sameStored } from "@/lib/grid/compare";

export const PREVIEW_ROWS = 200;
export const MAX_MESSAGES = 500;

export interface ImportRowPreview {
  line: number;
  status: "new" | "unchanged" | "error";
  values: GridRow;
  errors: Record<string, string>;
}

export interface ImportSorting {
  /** Rows to write. */
  fresh: SheetRow[];
  unchanged: number;
  failed: number;
  messages: string[];
  /** The first rows, for the preview table. */
  preview: ImportRowPreview[];
}

/** The row's import key as one string: rows with equal keys are the same record. */
export function importKeyOf(table: GridTable, row: GridRow): string {
  return table.importKey.map((f) => JSON.stringify(row[f] ?? null)).join("|");
}

/** "Row 4, column "Volume": …" — or just "Row 4: …" when the field is not a column. */
export function rowMessage(table: GridTable, line: number, field: string, message: string): string {
  const header = table.columns.find((c) => c.field === field)?.header;
  return `Row ${line}${header ? `, column "${header}"` : ""}: ${message}`;
}

function rowStatus(
  table: GridTable,
  r: SheetRow,
  errors: Record<string, string>,
  existing: GridRow | undefined,
): ImportRowPreview["status"] {
  if (Object.keys(errors).length) return "error";
  if (!existing) return "new";
  const diff = sameStored(table, r, existing);
  if (diff.length === 0) return "unchanged";
  for (const d of diff)
    errors[d.field] =
      `differs from the stored record (stored ${d.stored}); stored records are not overwritten by an import`;
  return "error";
}

/** Sorts read rows into new, unchanged and refused, against the stored rows with the same keys. */
export function sortImportRows(
  table: GridTable,
  rows: readonly SheetRow[],
  stored: readonly GridRow[],
  problems: readonly string[],
): ImportSorting {
  const byKey = new Map(stored.map((row) => [importKeyOf(table, row), row]));
  const out: ImportSorting = { fresh: [], unchanged: 0, failed: 0, messages: [...problems], preview: [] };
  const seen = new Map<string, number>();
  for (const r of rows) {
    const k = importKeyOf(table, r.values);
    const errors = { ...r.errors };
    const twin = seen.get(k);
    if (twin !== undefined && Object.keys(errors).length === 0)
      errors[table.importKey[0] ?? ""] = `the same record as row ${twin}`;
    seen.set(k, r.line);
    const status = rowStatus(table, r, errors, byKey.get(k));
    if (status === "error") {
      out.failed++;
      for (const [field, msg] of Object.entries(errors)) {
        if (out.messages.length >= MAX_MESSAGES) break;
        out.messages.push(rowMessage(table, r.line, field, msg));
      }
    } else if (status === "unchanged") out.unchanged++;
    else out.fresh.push(r);
    if (out.preview.length < PREVIEW_ROWS) out.preview.push({ line: r.line, status, values: r.values, errors });
  }
  return out;
}

/** A service's issue about one row, re-addressed to the file's row and column (field "rows.<line>.<field>"). */
export function rowIssue(table: GridTable, line: number, i: DomainIssue): DomainIssue {
  return {
    ...i,
    field: `rows.${line}.${i.field ?? ""}`,
    message: rowMessage(table, line, (i.field ?? "").split(".")[0] ?? "", i.message),
  };
}

/**
 * A preview whose rows the services refused: those rows turn to errors with the refusal beside their cell.
 * Returns how many distinct rows were refused.
 */
export function markRefusedRows(preview: ImportRowPreview[], issues: readonly DomainIssue[]): number {
  const failedLines = new Set(issues.map((i) => (i.field ?? "").split(".")[1]));
  for (const p of preview) {
    const mine = issues.filter((i) => (i.field ?? "").split(".")[1] === String(p.line));
    if (mine.length === 0) continue;
    p.status = "error";
    for (const i of mine)
      p.errors[(i.field ?? "").split(".")[2] ?? ""] = i.message.replace(/^Row \d+(, column "[^"]*")?: /, "");
  }
  return failedLines.size;
}
