// The grid's server-side query, built without the database: a table's filter model becomes a Prisma
// WHERE (display units back to stored units, choice labels back to codes, whole days for dates), its
// sort model an ORDER BY with a stable tiebreak, and a block request the skip and take.
import type { UnitSystem } from "@/lib/quantity/units";
import type { GridColumn, GridRow, GridTable, TableKey } from "@/lib/grid/tables";
import { labelOf } from "@/lib/core/vocabulary";
import type { ColumnFilter, FilterCondition } from "@/lib/grid/query.schema";
import { fromUnit, displayUnit } from "@/lib/grid/units";

export type Where = Record<string, unknown>;

export interface RowsRequest {
  siteId: number;
  table: TableKey;
  start: number;
  end: number;
  sort: Array<{ colId: string; sort: "asc" | "desc" }>;
  filter: Record<string, ColumnFilter>;
  system: UnitSystem;
  now: Date;
  /** One more condition, for key lookups. */
  extra?: Where;
}

export interface RowsPage {
  rows: GridRow[];
  lastRow: number;
  totals: { massKg: number | null; volumeL: number | null };
}

export interface TableQuery {
  where: Where;
  orderBy: Where[];
  skip: number;
  take: number;
}

/** "lot.code" and a leaf → { lot: { code: leaf } }. */
export function nest(path: string, leaf: unknown): Where {
  return path
    .split(".")
    .reverse()
    .reduce<unknown>((acc, key) => ({ [key]: acc }), leaf) as Where;
}

/** A filter value typed in display units → the stored unit (g, mL, °C). */
export function toStored(col: GridColumn, v: number, system: UnitSystem): number {
  const canonical = col.quantity ? fromUnit(v, col.quantity, displayUnit(col.quantity, system)) : v;
  const scale = col.db?.scale;
  return scale ? Math.round(canonical * scale) : canonical;
}

function dayStart(s: string): Date {
  return new Date(`${s.slice(0, 10)}T00:00:00.000Z`);
}

/** A text filter on a choice column matches what the grid shows (the label) as well as the stored code. */
export function choiceFilter(options: readonly string[], type: string, raw: string): Where | null {
  const text = raw.trim().toLowerCase();
  const key = raw.toUpperCase().replace(/[\s-]+/g, "_");
  const label = (o: string) => labelOf(o).toLowerCase();
  const test: Record<string, (o: string) => boolean> = {
    contains: (o) => label(o).includes(text) || o.includes(key),
    notContains: (o) => !(label(o).includes(text) || o.includes(key)),
    equals: (o) => label(o) === text || o === key,
    notEqual: (o) => !(label(o) === text || o === key),
    startsWith: (o) => label(o).startsWith(text) || o.startsWith(key),
    endsWith: (o) => label(o).endsWith(text) || o.endsWith(key),
  };
  const match = test[type];
  return match ? { in: options.filter(match) } : null;
}

function textLeaf(col: GridColumn, c: FilterCondition): unknown {
  const raw = String(c.filter ?? "");
  const text =
    col.kind === "code" || col.kind === "enum" || col.kind === "list"
      ? raw.toUpperCase().replace(col.kind === "enum" ? /[\s-]+/g : /$^/, "_")
      : raw;
  const op: Record<string, unknown> = {
    contains: { contains: text },
    notContains: { not: { contains: text } },
    equals: { equals: text },
    notEqual: { not: text },
    startsWith: { startsWith: text },
    endsWith: { endsWith: text },
  };
  return op[c.type];
}

/** Half a displayed step in stored units: a stored integer gram shown to 3 decimals "equals" the same figure. */
function halfStep(col: GridColumn, system: UnitSystem): number {
  if (!col.db?.scale) return 0;
  const perShown = col.quantity ? fromUnit(1, col.quantity, displayUnit(col.quantity, system)) : 1;
  return Math.max(0, Math.floor((col.db.scale * perShown) / 2000));
}

function numberLeaf(col: GridColumn, c: FilterCondition, system: UnitSystem): unknown {
  if (typeof c.filter !== "number") return undefined;
  const a = toStored(col, c.filter, system);
  const half = halfStep(col, system);
  const b = typeof c.filterTo === "number" ? toStored(col, c.filterTo, system) : a;
  const op: Record<string, unknown> = {
    equals: half > 0 ? { gte: a - half, lte: a + half } : { equals: a },
    notEqual: { not: a },
    lessThan: { lt: a },
    lessThanOrEqual: { lte: a },
    greaterThan: { gt: a },
    greaterThanOrEqual: { gte: a },
    inRange: { gte: Math.min(a, b), lte: Math.max(a, b) },
  };
  return op[c.type];
}

function dateWhere(path: string, c: FilterCondition): Where | null {
  if (!c.dateFrom) return null;
  const from = dayStart(c.dateFrom);
  const nextDay = new Date(from.getTime() + 86_400_000);
  const to = c.dateTo ? new Date(dayStart(c.dateTo).getTime() + 86_400_000) : nextDay;
  if (c.type === "notEqual") return { OR: [nest(path, { lt: from }), nest(path, { gte: nextDay })] };
  const op: Record<string, unknown> = {
    equals: { gte: from, lt: nextDay },
    lessThan: { lt: from },
    greaterThan: { gte: nextDay },
    inRange: { gte: from, lt: to },
  };
  const leaf = op[c.type];
  return leaf === undefined ? null : nest(path, leaf);
}

/** One filter condition on one column as a WHERE, or null when it cannot be applied. */
export function conditionWhere(col: GridColumn, c: FilterCondition, system: UnitSystem): Where | null {
  const path = col.db?.path;
  if (!path) return null;
  if (c.type === "blank") return nest(path, null);
  if (c.type === "notBlank") return { NOT: nest(path, null) };
  if (c.filterType === "date") return dateWhere(path, c);
  const leaf =
    c.filterType === "number"
      ? numberLeaf(col, c, system)
      : col.kind === "enum" && col.options
        ? choiceFilter(col.options, c.type, String(c.filter ?? ""))
        : textLeaf(col, c);
  return leaf === undefined || leaf === null ? null : nest(path, leaf);
}

/** The WHERE for a table's filter model; filters on columns without a stored field are ignored. */
export function buildWhere(table: GridTable, filter: Record<string, ColumnFilter>, system: UnitSystem): Where[] {
  const out: Where[] = [];
  for (const [field, f] of Object.entries(filter)) {
    const col = table.columns.find((c) => c.field === field);
    if (!col) continue;
    if ("conditions" in f) {
      const parts = f.conditions.map((c) => conditionWhere(col, c, system)).filter((w): w is Where => w !== null);
      if (parts.length) out.push({ [f.operator]: parts });
    } else {
      const w = conditionWhere(col, f, system);
      if (w) out.push(w);
    }
  }
  return out;
}

/** The ORDER BY: the asked columns, else the table's default, then the id so pages never overlap. */
export function buildOrderBy(table: GridTable, sort: RowsRequest["sort"]): Where[] {
  const order: Where[] = [];
  for (const s of sort) {
    const path = table.columns.find((c) => c.field === s.colId)?.db?.path;
    if (path) order.push(nest(path, s.sort));
  }
  if (order.length === 0) {
    const path = table.columns.find((c) => c.field === table.defaultSort.field)?.db?.path;
    if (path) order.push(nest(path, table.defaultSort.dir));
  }
  order.push({ id: order.length && table.defaultSort.dir === "desc" ? "desc" : "asc" });
  return order;
}

/** Which rows belong to the site: lab and QC rows through their lot, batch flows through a batch holder. */
export function siteScope(table: TableKey, siteId: number): Where {
  if (table === "titrations" || table === "labTests") return { lot: { siteId } };
  if (table === "qcResults") return { productLot: { siteId } };
  if (table === "batchFlows")
    return { siteId, OR: [{ fromHolder: { kind: "BATCH" } }, { toHolder: { kind: "BATCH" } }] };
  return { siteId };
}

/** The whole query for one block of rows. */
export function buildTableQuery(table: GridTable, r: RowsRequest): TableQuery {
  const filters = buildWhere(table, r.filter, r.system);
  return {
    where: { AND: [siteScope(r.table, r.siteId), ...filters, ...(r.extra ? [r.extra] : [])] },
    orderBy: buildOrderBy(table, r.sort),
    skip: r.start,
    take: r.end - r.start,
  };
}

export const kg = (g: number | null | undefined) => (g === null || g === undefined ? null : g / 1000);
export const litres = (ml: number | null | undefined) => (ml === null || ml === undefined ? null : ml / 1000);
export const iso = (d: Date | null | undefined) => (d ? d.toISOString() : null);
