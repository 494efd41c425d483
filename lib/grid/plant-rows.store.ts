import "server-only";
// Grid rows of what the plant makes and sends out: batches and their flows, product lots, QC, shipments, disposals.
import type { Db, Tx } from "@/lib/core/connect";
import type { Prisma } from "@/lib/generated/sqlite/client";
import type { RowsPage, TableQuery } from "@/lib/grid/grid-query";
import { iso, kg, litres } from "@/lib/grid/grid-query";
import { sumOf } from "@/lib/grid/sum.store";

async function batchesRows(db: Db | Tx, t: TableQuery): Promise<RowsPage> {
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

async function batchFlowsRows(db: Db | Tx, t: TableQuery): Promise<RowsPage> {
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

async function productsRows(db: Db | Tx, t: TableQuery): Promise<RowsPage> {
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

async function qcResultsRows(db: Db | Tx, t: TableQuery): Promise<RowsPage> {
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

async function shipmentsRows(db: Db | Tx, t: TableQuery): Promise<RowsPage> {
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

async function disposalsRows(db: Db | Tx, t: TableQuery): Promise<RowsPage> {
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

export const PLANT_ROWS = {
  batches: batchesRows,
  batchFlows: batchFlowsRows,
  products: productsRows,
  qcResults: qcResultsRows,
  shipments: shipmentsRows,
  disposals: disposalsRows,
} as const;
