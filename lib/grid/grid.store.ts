import "server-only";
// Server-side paging, sorting, filtering and totals for the grid's tables: the query is built by the pure
// grid-query.ts, each table's rows are read by its reader (intake-rows, plant-rows, waste containers here).
import type { Db, Tx } from "@/lib/core/connect";
import type { Prisma } from "@/lib/generated/sqlite/client";
import type { CellValue, GridRow, TableKey } from "@/lib/grid/tables";
import { GRID_TABLES } from "@/lib/grid/tables";
import type { RowsPage, RowsRequest, TableQuery } from "@/lib/grid/grid-query";
import { buildTableQuery, iso, kg, litres, nest } from "@/lib/grid/grid-query";
import { INTAKE_ROWS } from "@/lib/grid/intake-rows.store";
import { PLANT_ROWS } from "@/lib/grid/plant-rows.store";
import { getWasteDueBoard } from "@/lib/waste/container.store";

export type { RowsPage, RowsRequest } from "@/lib/grid/grid-query";

async function wasteContainerRows(db: Db | Tx, t: TableQuery, siteId: number, now: Date): Promise<RowsPage> {
  const [rows, count, held] = await Promise.all([
    db.wasteContainer.findMany({
      ...(t as Prisma.WasteContainerFindManyArgs),
      include: { holder: { select: { stockG: true } } },
    }),
    db.wasteContainer.count({ where: t.where }),
    db.holder.aggregate({ where: { waste: { is: t.where } }, _sum: { stockG: true } }),
  ]);
  const due = "$transaction" in db ? await getWasteDueBoard(db as Db, siteId, now, 0) : null;
  return {
    lastRow: count,
    totals: { massKg: kg(held._sum.stockG ?? 0), volumeL: null },
    rows: rows.map((w) => ({
      id: w.id,
      code: w.code,
      stream: w.stream,
      accumulationStart: iso(w.accumulationStart),
      capacityL: litres(w.capacityMl),
      satellite: w.satellite,
      methanolPct: w.methanolPct,
      pH: w.pH,
      flashPointC: w.flashPointC,
      waterPct: w.waterPct,
      status: w.status,
      stockKg: kg(w.holder.stockG),
      daysUntilDue: due?.byCode.get(w.code)?.daysLeft ?? null,
    })),
  };
}

const READERS = { ...INTAKE_ROWS, ...PLANT_ROWS };

/** One block of rows for the infinite row model, the filtered row count and the totals within the filter. */
export async function queryGridRows(db: Db | Tx, r: RowsRequest): Promise<RowsPage> {
  const t = buildTableQuery(GRID_TABLES[r.table], r);
  if (r.table === "wasteContainers") return wasteContainerRows(db, t, r.siteId, r.now);
  const reader: (db: Db | Tx, t: TableQuery) => Promise<RowsPage> = READERS[r.table];
  return reader(db, t);
}

/** Stored rows whose import key's first field is one of `values` (codes, or lot codes for lab rows). */
export async function findRowsByKey(
  db: Db | Tx,
  siteId: number,
  table: TableKey,
  values: readonly string[],
  now: Date,
): Promise<GridRow[]> {
  const t = GRID_TABLES[table];
  const col = t.columns.find((c) => c.field === t.importKey[0]);
  if (!col?.db || values.length === 0) return [];
  const out: GridRow[] = [];
  const unique = [...new Set(values)];
  for (let i = 0; i < unique.length; i += 500) {
    const chunk = unique.slice(i, i + 500);
    const page = await queryGridRows(db, {
      siteId,
      table,
      start: 0,
      end: 1_000_000,
      sort: [],
      filter: {},
      system: "metric",
      now,
      extra: nest(col.db.path, { in: chunk }),
    });
    out.push(...page.rows);
  }
  return out;
}

export type { CellValue };

/** The site's time zone, for times written as the site's wall clock in exports. */
export async function getSiteTimeZone(db: Db, siteId: number): Promise<string> {
  const site = await db.site.findUnique({ where: { id: siteId }, select: { timeZone: true } });
  return site?.timeZone ?? "UTC";
}
