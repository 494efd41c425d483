// The vocabulary of a grid table: the cell and column types, the table's shape, and the column builders
// the tables are written with (a code, a date, a mass stored in grams and shown in the user's units …).
import type { Quantity } from "@/lib/grid/units";

export type CellKind = "code" | "text" | "number" | "integer" | "date" | "enum" | "list" | "boolean";
export type CellValue = string | number | boolean | null;
export type GridRow = Record<string, CellValue>;

export interface GridColumn {
  field: string;
  header: string;
  kind: CellKind;
  /** Rows carry kg, L or °C; the grid shows and accepts the user's units. */
  quantity?: Quantity;
  /** A unit that never converts (g, mL, mol/L, %), shown in the header. */
  fixedUnit?: string;
  options?: readonly string[];
  /** Part of the input typed on a new row (the shared schema's field of the same name). */
  entry?: boolean;
  /** Computed on the server after each save; never typed. */
  computed?: boolean;
  /** On an existing row this field can be changed through a service that records the change. */
  correctable?: readonly string[];
  /** Stored field for server-side sort and filter; `scale` = stored / shown (kg → g is 1000). */
  db?: { path: string; scale?: number };
  decimals?: number;
  width?: number;
}

export const TABLE_KEYS = [
  "sources",
  "pickups",
  "lots",
  "titrations",
  "labTests",
  "batches",
  "batchFlows",
  "products",
  "qcResults",
  "shipments",
  "wasteContainers",
  "disposals",
] as const;
export type TableKey = (typeof TABLE_KEYS)[number];

export interface GridTable {
  key: TableKey;
  label: string;
  /** Field that identifies a row on screen and in the URL of its page. */
  rowId: string;
  /** Fields that identify a row across imports: a re-imported row with these values is the same record. */
  importKey: readonly string[];
  /** Who may add rows by typing, pasting or importing; empty when rows are made elsewhere. */
  addRoles: readonly ("COLLECTOR" | "PRODUCTION" | "COMPLIANCE")[];
  columns: readonly GridColumn[];
  totals: { mass?: string; volume?: string };
  /** Plain-language note shown above the grid. */
  note: string;
  defaultSort: { field: string; dir: "asc" | "desc" };
}

export const code = (field: string, header: string, path = field, entry = true): GridColumn => ({
  field,
  header,
  kind: "code",
  entry,
  db: { path },
  width: 130,
});
export const text = (field: string, header: string, entry = true, width = 180): GridColumn => ({
  field,
  header,
  kind: "text",
  entry,
  db: { path: field },
  width,
});
export const date = (field: string, header: string, entry = true, path = field): GridColumn => ({
  field,
  header,
  kind: "date",
  entry,
  db: { path },
  width: 165,
});
export const oneOf = (
  field: string,
  header: string,
  options: readonly string[],
  entry = true,
  path = field,
): GridColumn => ({
  field,
  header,
  kind: "enum",
  options,
  entry,
  db: { path },
  width: 150,
});
export const kg = (field: string, header: string, path: string, computed = true): GridColumn => ({
  field,
  header,
  kind: "number",
  quantity: "mass",
  computed,
  db: { path, scale: 1000 },
  width: 130,
});
export const litres = (
  field: string,
  header: string,
  path: string,
  o: { entry?: boolean; computed?: boolean; scale?: number } = {},
): GridColumn => ({
  field,
  header,
  kind: "number",
  quantity: "volume",
  entry: o.entry ?? false,
  computed: o.computed ?? false,
  db: { path, scale: o.scale ?? 1000 },
  width: 130,
});
export const celsius = (field: string, header: string, entry = true, path = field): GridColumn => ({
  field,
  header,
  kind: "number",
  quantity: "temperature",
  entry,
  db: { path },
  width: 110,
});
export const num = (
  field: string,
  header: string,
  fixedUnit: string | undefined,
  o: { entry?: boolean; computed?: boolean; decimals?: number; integer?: boolean } = {},
): GridColumn => ({
  field,
  header,
  kind: o.integer ? "integer" : "number",
  ...(fixedUnit ? { fixedUnit } : {}),
  entry: o.entry ?? true,
  computed: o.computed ?? false,
  db: { path: field },
  decimals: o.decimals ?? 3,
  width: 120,
});
export const flag = (field: string, header: string, entry = true): GridColumn => ({
  field,
  header,
  kind: "boolean",
  entry,
  db: { path: field },
  width: 100,
});
export const ro = (c: GridColumn): GridColumn => ({ ...c, entry: false });
/** Derived on the server from other rows: shown, not sorted or filtered by the database. */
export const derived = (c: GridColumn): GridColumn => {
  const { db: _db, ...rest } = c;
  return { ...rest, entry: false };
};
