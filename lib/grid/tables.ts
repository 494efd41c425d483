// What each grid table shows: columns per record type, which can be typed on new rows, which are
// computed on the server (read-only), and how a column maps to the stored field for sort and filter.
// The tables themselves are written per record family in intake-tables.ts and plant-tables.ts.
import type { GridColumn, GridTable, TableKey } from "@/lib/grid/columns";
import { TABLE_KEYS } from "@/lib/grid/columns";
import { INTAKE_TABLES } from "@/lib/grid/intake-tables";
import { PLANT_TABLES } from "@/lib/grid/plant-tables";

export type { CellKind, CellValue, GridColumn, GridRow, GridTable, TableKey } from "@/lib/grid/columns";
export { TABLE_KEYS } from "@/lib/grid/columns";

export const GRID_TABLES: Readonly<Record<TableKey, GridTable>> = { ...INTAKE_TABLES, ...PLANT_TABLES };

export function isTableKey(s: string): s is TableKey {
  return (TABLE_KEYS as readonly string[]).includes(s);
}

export function columnOf(table: GridTable, field: string): GridColumn | undefined {
  return table.columns.find((c) => c.field === field);
}

/** Columns a person can type into on a new row. */
export function entryColumns(table: GridTable): GridColumn[] {
  return table.columns.filter((c) => c.entry === true && c.computed !== true);
}
