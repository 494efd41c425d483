// Is an imported row the record already stored? Compared on the columns the file gives, within the
// rounding of the exported figures (3 decimals of kg/L = 1 g/1 mL; 4 decimals of lb/gal).
import type { CellValue, GridColumn, GridRow, GridTable } from "@/lib/grid/tables";
import { showCell } from "@/lib/grid/cells";

const TOLERANCE: Record<string, number> = { mass: 0.0006, volume: 0.0006, temperature: 0.006 };

function same(col: GridColumn, a: CellValue, b: CellValue | undefined): boolean {
  if (b === undefined) return a === null;
  if ((a === null || a === "") && (b === null || b === "")) return true;
  if (a === null || b === null) return false;
  if (col.kind === "date") return Date.parse(String(a)) === Date.parse(String(b));
  if (typeof a === "number" && typeof b === "number") {
    const tol = col.quantity ? (TOLERANCE[col.quantity] ?? 1e-9) : Math.max(1e-9, Math.abs(b) * 1e-9);
    return Math.abs(a - b) <= tol;
  }
  if (col.kind === "list") {
    const norm = (v: CellValue) =>
      String(v)
        .split(",")
        .map((s) => s.trim())
        .filter(Boolean)
        .sort()
        .join(",");
    return norm(a) === norm(b);
  }
  return a === b;
}

/** Columns where the imported row differs from the stored one (cells left empty in the file are not compared). */
export function sameStored(
  table: GridTable,
  row: { values: GridRow },
  stored: GridRow,
): Array<{ field: string; stored: string }> {
  const out: Array<{ field: string; stored: string }> = [];
  for (const col of table.columns) {
    if (col.entry !== true || col.computed === true) continue;
    const v = row.values[col.field];
    if (v === undefined || v === null || v === "") continue;
    if (!same(col, v, stored[col.field]))
      out.push({ field: col.field, stored: showCell(col, stored[col.field] ?? null, "metric") || "empty" });
  }
  return out;
}
