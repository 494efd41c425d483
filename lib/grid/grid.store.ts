import "server-only";
// Server-side paging, sorting, filtering and totals for the grid's tables, and the row shapes it shows.
import type { Db, Tx } from "@/lib/core/connect";
import type { Prisma } from "@/lib/generated/sqlite/client";
import type { UnitSystem } from "@/lib/quantity/units";
import type { CellValue, GridColumn, GridRow, GridTable, TableKey } from "@/lib/grid/tables";
import { GRID_TABLES } from "@/lib/grid/tables";
import { labelOf } from "@/lib/core/vocabulary";
import type { ColumnFilter, FilterCondition } from "@/lib/grid/query.schema";
import { fromUnit, displayUnit } from "@/lib/grid/units";
import { getWasteDueBoard } from "@/lib/waste/container.store";

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

type Where = Record<string, unknown>;

function nest(path: string, leaf: unknown): Where {
  return path
    .split(".")
    .reverse()
    .reduce<unknown>((acc, key) => ({ [key]: acc }), leaf) as Where;
}

/** A filter value typed in display units → the stored unit (g, mL, °C). */
function toStored(col: GridColumn, v: number, system: UnitSystem): number {
  const canonical = col.quantity ? fromUnit(v, col.quantity, displayUnit(col.quantity, system)) : v;
  const scale = col.db?.scale;
  return scale ? Math.round(canonical * scale) : canonical;
}

function dayStart(s: string): Date {
  return new Date(`${s.slice(0, 10)}T00:00:00.000Z`);
}

/** A text filter on a choice column matches what the grid shows (the label) as well as the stored code. */
function choiceFilter(options: readonly string[], type: string, raw: string): Record<string, unknown> | null {
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

function conditionWhere(col: GridColumn, c: FilterCondition, system: UnitSystem): Where | null {
  const path = col.db?.path;
  if (!path) return null;
  if (c.type === "blank") return nest(path, null);
  if (c.type === "notBlank") return { NOT: nest(path, null) };
  if (c.filterType === "text" && col.kind === "enum" && col.options) {
    const leaf = choiceFilter(col.options, c.type, String(c.filter ?? ""));
    return leaf === null ? null : nest(path, leaf);
  }
  if (c.filterType === "text") {
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
    const leaf = op[c.type];
    return leaf === undefined ? null : nest(path, leaf);
  }
  if (c.filterType === "number") {
    if (typeof c.filter !== "number") return null;
    const a = toStored(col, c.filter, system);
    // A stored integer gram shown to 3 decimals: "equals" means the same displayed figure.
    const half = col.db?.scale
      ? Math.max(
          0,
          Math.floor(
            (col.db.scale * (col.quantity ? fromUnit(1, col.quantity, displayUnit(col.quantity, system)) : 1)) / 2000,
          ),
        )
      : 0;
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
    const leaf = op[c.type];
    return leaf === undefined ? null : nest(path, leaf);
  }
  if (!c.dateFrom) return null;
  const from = dayStart(c.dateFrom);
  const nextDay = new Date(from.getTime() + 86_400_000);
  const to = c.dateTo ? new Date(dayStart(c.dateTo).getTime() + 86_400_000) : nextDay;
  const op: Record<string, unknown> = {
    equals: { gte: from, lt: nextDay },
    notEqual: { OR: [{ lt: from }, { gte: nextDay }] },
    lessThan: { lt: from },
    greaterThan: { gte: nextDay },
    inRange: { gte: from, lt: to },
  };
  const leaf = op[c.type];
  if (leaf === undefined) return null;
  if (c.type === "notEqual") return { OR: [nest(path, { lt: from }), nest(path, { gte: nextDay })] };
  return nest(path, leaf);
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

const kg = (g: number | null | undefined) => (g === null || g === undefined ? null : g / 1000);
const litres = (ml: number | null | undefined) => (ml === null || ml === undefined ? null : ml / 1000);
const iso = (d: Date | null | undefined) => (d ? d.toISOString() : null);

interface TableQuery {
  where: Where;
  orderBy: Where[];
  skip: number;
  take: number;
}

/** The filtered row count and the sums within the filter, in one aggregate query (one scan, not two). */
async function sumOf(
  db: Db | Tx,
  model: "pickup" | "feedstockLot" | "batch" | "movement" | "productLot" | "shipment" | "disposal",
  where: Where,
  fields: string[],
): Promise<{ count: number; sums: Record<string, number> }> {
  const _sum = Object.fromEntries(fields.map((f) => [f, true]));
  // The aggregate arguments have the same shape for every model; the delegate types differ only by name.
  const delegate = db[model] as unknown as {
    aggregate(args: {
      where: Where;
      _sum: Record<string, boolean>;
      _count: true;
    }): Promise<{ _sum: Record<string, number | null>; _count: number }>;
  };
  const r = await delegate.aggregate({ where, _sum, _count: true });
  return { count: r._count, sums: Object.fromEntries(fields.map((f) => [f, r._sum[f] ?? 0])) };
}

/** One block of rows for the infinite row model, the filtered row count and the totals within the filter. */
export async function queryGridRows(db: Db | Tx, r: RowsRequest): Promise<RowsPage> {
  const table = GRID_TABLES[r.table];
  const filters = buildWhere(table, r.filter, r.system);
  const q = (base: Where): TableQuery => ({
    where: { AND: [base, ...filters, ...(r.extra ? [r.extra] : [])] },
    orderBy: buildOrderBy(table, r.sort),
    skip: r.start,
    take: r.end - r.start,
  });
  const siteId = r.siteId;
  switch (r.table) {
    case "sources": {
      const t = q({ siteId });
      const [rows, count] = await Promise.all([
        db.source.findMany({ ...(t as Prisma.SourceFindManyArgs) }),
        db.source.count({ where: t.where }),
      ]);
      return {
        lastRow: count,
        totals: { massKg: null, volumeL: null },
        rows: rows.map((s) => ({
          id: s.id,
          code: s.code,
          name: s.name,
          kind: s.kind,
          materials: s.materials.split(",").filter(Boolean).join(", "),
          address: s.address,
          certificateNo: s.certificateNo,
          certificateScheme: s.certificateScheme,
          certificateExpires: iso(s.certificateExpires),
          pickupEveryDays: s.pickupEveryDays,
          collectorNote: s.collectorNote,
          active: s.active,
        })),
      };
    }
    case "pickups": {
      const t = q({ siteId });
      const [rows, { count, sums }] = await Promise.all([
        db.pickup.findMany({
          ...(t as Prisma.PickupFindManyArgs),
          include: { source: { select: { code: true } }, lot: { select: { code: true } } },
        }),
        sumOf(db, "pickup", t.where, ["massG", "volumeMl"]),
      ]);
      return {
        lastRow: count,
        totals: { massKg: kg(sums.massG), volumeL: litres(sums.volumeMl) },
        rows: rows.map((p) => ({
          id: p.id,
          code: p.code,
          sourceCode: p.source.code,
          material: p.material,
          observedAt: iso(p.observedAt),
          containers: p.containers,
          containerTags: p.containerTags.split(",").filter(Boolean).join(", "),
          volumeL: litres(p.volumeMl),
          tempC: p.tempC,
          massKg: kg(p.massG),
          waterLook: p.waterLook,
          solidsLook: p.solidsLook,
          notes: p.notes,
          lotCode: p.lot?.code ?? null,
          receivedAt: iso(p.receivedAt),
        })),
      };
    }
    case "lots": {
      const t = q({ siteId });
      const [rows, { count, sums }] = await Promise.all([
        db.feedstockLot.findMany({
          ...(t as Prisma.FeedstockLotFindManyArgs),
          include: {
            supplier: { select: { code: true } },
            holder: { select: { stockG: true } },
            pickups: { select: { code: true } },
            titrations: {
              where: { voided: false },
              orderBy: [{ testedAt: "desc" }, { id: "desc" }],
              take: 1,
              select: { ffaPct: true },
            },
          },
        }),
        sumOf(db, "feedstockLot", t.where, ["massG", "standardVolumeMl"]),
      ]);
      return {
        lastRow: count,
        totals: { massKg: kg(sums.massG), volumeL: litres(sums.standardVolumeMl) },
        rows: rows.map((l) => ({
          id: l.id,
          code: l.code,
          material: l.material,
          origin: l.origin,
          supplierCode: l.supplier?.code ?? null,
          deliveryDocument: l.deliveryDocument,
          pickupCodes: l.pickups.map((p) => p.code).join(", "),
          receivedAt: iso(l.receivedAt),
          observedVolumeL: litres(l.observedVolumeMl),
          observedTempC: l.observedTempC,
          densityKgM3: l.densityKgM3,
          standardVolumeL: litres(l.standardVolumeMl),
          massKg: kg(l.massG),
          stockKg: kg(l.holder.stockG),
          ffaPct: l.titrations[0]?.ffaPct ?? null,
          status: l.status,
          certified: l.certified,
          notes: l.notes,
        })),
      };
    }
    case "titrations": {
      const t = q({ lot: { siteId } });
      const [rows, count] = await Promise.all([
        db.titration.findMany({
          ...(t as Prisma.TitrationFindManyArgs),
          include: { lot: { select: { code: true } }, analyst: { select: { fullName: true } } },
        }),
        db.titration.count({ where: t.where }),
      ]);
      return {
        lastRow: count,
        totals: { massKg: null, volumeL: null },
        rows: rows.map((x) => ({
          id: x.id,
          lotCode: x.lot.code,
          testedAt: iso(x.testedAt),
          sampleMassG: x.sampleMassG,
          titrant: x.titrant,
          concentrationMolL: x.concentrationMolL,
          titreMl: x.titreMl,
          blankMl: x.blankMl,
          basis: x.basis,
          ffaPct: x.ffaPct,
          acidValue: x.acidValue,
          analyst: x.analyst.fullName,
          voided: x.voided,
        })),
      };
    }
    case "labTests": {
      const t = q({ lot: { siteId } });
      const [rows, count] = await Promise.all([
        db.labTest.findMany({
          ...(t as Prisma.LabTestFindManyArgs),
          include: { lot: { select: { code: true } }, analyst: { select: { fullName: true } } },
        }),
        db.labTest.count({ where: t.where }),
      ]);
      return {
        lastRow: count,
        totals: { massKg: null, volumeL: null },
        rows: rows.map((x) => ({
          id: x.id,
          lotCode: x.lot.code,
          testedAt: iso(x.testedAt),
          kind: x.kind,
          method: x.method,
          valuePct: x.valuePct,
          analyst: x.analyst.fullName,
          voided: x.voided,
        })),
      };
    }
    case "batches": {
      const t = q({ siteId });
      const [rows, { count, sums }] = await Promise.all([
        db.batch.findMany({ ...(t as Prisma.BatchFindManyArgs), include: { holder: { select: { stockG: true } } } }),
        sumOf(db, "batch", t.where, ["targetOilG"]),
      ]);
      return {
        lastRow: count,
        totals: { massKg: kg(sums.targetOilG), volumeL: null },
        rows: rows.map((b) => ({
          id: b.id,
          code: b.code,
          status: b.status,
          pretreated: b.pretreated,
          plannedAt: iso(b.plannedAt),
          startedAt: iso(b.startedAt),
          completedAt: iso(b.completedAt),
          targetOilKg: kg(b.targetOilG),
          molarRatio: b.molarRatio,
          catalyst: b.catalyst,
          reactionTempC: b.reactionTempC,
          stockKg: kg(b.holder.stockG),
          notes: b.notes,
        })),
      };
    }
    case "batchFlows": {
      const t = q({ siteId, OR: [{ fromHolder: { kind: "BATCH" } }, { toHolder: { kind: "BATCH" } }] });
      const [rows, { count, sums }] = await Promise.all([
        db.movement.findMany({
          ...(t as Prisma.MovementFindManyArgs),
          include: {
            fromHolder: { select: { kind: true, code: true } },
            toHolder: { select: { kind: true, code: true } },
          },
        }),
        sumOf(db, "movement", t.where, ["massG", "volumeMl"]),
      ]);
      return {
        lastRow: count,
        totals: { massKg: kg(sums.massG), volumeL: litres(sums.volumeMl) },
        rows: rows.map((m) => {
          const into = m.toHolder.kind === "BATCH";
          const other = into ? m.fromHolder : m.toHolder;
          return {
            id: m.id,
            batchCode: into ? m.toHolder.code : (m.fromHolder?.code ?? null),
            direction: into ? "IN" : "OUT",
            role: m.role,
            otherCode: other ? other.code : null,
            at: iso(m.at),
            massKg: kg(m.massG),
            volumeL: litres(m.volumeMl),
            tempC: m.tempC,
            note: m.note,
          };
        }),
      };
    }
    case "products": {
      const t = q({ siteId });
      const [rows, { count, sums }] = await Promise.all([
        db.productLot.findMany({
          ...(t as Prisma.ProductLotFindManyArgs),
          include: { batch: { select: { code: true } }, holder: { select: { stockG: true } } },
        }),
        sumOf(db, "productLot", t.where, ["massG"]),
      ]);
      return {
        lastRow: count,
        totals: { massKg: kg(sums.massG), volumeL: null },
        rows: rows.map((p) => ({
          id: p.id,
          code: p.code,
          batchCode: p.batch?.code ?? null,
          producedAt: iso(p.producedAt),
          massKg: kg(p.massG),
          stockKg: kg(p.holder.stockG),
          status: p.status,
          releasedAt: iso(p.releasedAt),
        })),
      };
    }
    case "qcResults": {
      const t = q({ productLot: { siteId } });
      const [rows, count] = await Promise.all([
        db.qcResult.findMany({
          ...(t as Prisma.QcResultFindManyArgs),
          include: { productLot: { select: { code: true } } },
        }),
        db.qcResult.count({ where: t.where }),
      ]);
      return {
        lastRow: count,
        totals: { massKg: null, volumeL: null },
        rows: rows.map((x) => ({
          id: x.id,
          productCode: x.productLot.code,
          property: x.property,
          method: x.method,
          value: x.value,
          unit: x.unit,
          limitMin: x.limitMin,
          limitMax: x.limitMax,
          specRef: x.specRef,
          pass: x.pass,
          testedAt: iso(x.testedAt),
        })),
      };
    }
    case "shipments": {
      const t = q({ siteId });
      const [rows, { count, sums }] = await Promise.all([
        db.shipment.findMany({ ...(t as Prisma.ShipmentFindManyArgs) }),
        sumOf(db, "shipment", t.where, ["massG", "volumeMl"]),
      ]);
      return {
        lastRow: count,
        totals: { massKg: kg(sums.massG), volumeL: litres(sums.volumeMl) },
        rows: rows.map((s) => ({
          id: s.id,
          documentNo: s.documentNo,
          customer: s.customer,
          shippedAt: iso(s.shippedAt),
          massKg: kg(s.massG),
          volumeL: litres(s.volumeMl),
          certifiedClaim: s.certifiedClaim,
        })),
      };
    }
    case "wasteContainers": {
      const t = q({ siteId });
      const [rows, count, held] = await Promise.all([
        db.wasteContainer.findMany({
          ...(t as Prisma.WasteContainerFindManyArgs),
          include: { holder: { select: { stockG: true } } },
        }),
        db.wasteContainer.count({ where: t.where }),
        db.holder.aggregate({ where: { waste: { is: t.where } }, _sum: { stockG: true } }),
      ]);
      const due = "$transaction" in db ? await getWasteDueBoard(db as Db, siteId, r.now, 0) : null;
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
    case "disposals": {
      const t = q({ siteId });
      const [rows, { count, sums }] = await Promise.all([
        db.disposal.findMany({ ...(t as Prisma.DisposalFindManyArgs) }),
        sumOf(db, "disposal", t.where, ["massG"]),
      ]);
      return {
        lastRow: count,
        totals: { massKg: kg(sums.massG), volumeL: null },
        rows: rows.map((d) => ({
          id: d.id,
          documentNo: d.documentNo,
          hauler: d.hauler,
          disposedAt: iso(d.disposedAt),
          massKg: kg(d.massG),
        })),
      };
    }
  }
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
