import "server-only";
import type { Db, Tx } from "@/lib/database/connect";
import { listHolderMovements, toHolderKind } from "@/lib/ledger/movement.store";
import type { HolderRef, MovementView } from "@/lib/ledger/movement.store";

export interface ProductLotRow {
  code: string;
  batchCode: string | null;
  producedAt: Date;
  massG: number;
  stockG: number;
  status: string;
  releasedAt: Date | null;
  qcCount: number;
  qcFailed: number;
}

export async function listProductLots(db: Db, siteId: number, opts: { skip?: number; take?: number } = {}): Promise<{ rows: ProductLotRow[]; total: number }> {
  const where = { siteId };
  const [rows, total] = await Promise.all([
    db.productLot.findMany({
      where,
      orderBy: [{ producedAt: "desc" }, { id: "desc" }],
      skip: opts.skip ?? 0,
      take: opts.take ?? 100,
      include: { holder: { select: { stockG: true } }, batch: { select: { code: true } }, qc: { select: { pass: true } } },
    }),
    db.productLot.count({ where }),
  ]);
  return {
    total,
    rows: rows.map((r) => ({
      code: r.code,
      batchCode: r.batch?.code ?? null,
      producedAt: r.producedAt,
      massG: r.massG,
      stockG: r.holder.stockG,
      status: r.status,
      releasedAt: r.releasedAt,
      qcCount: r.qc.length,
      qcFailed: r.qc.filter((q) => !q.pass).length,
    })),
  };
}

export interface QcView {
  id: number;
  property: string;
  method: string;
  value: number;
  unit: string;
  limitMin: number | null;
  limitMax: number | null;
  specRef: string;
  pass: boolean;
  testedAt: Date;
}

export interface ProductLotDetail extends ProductLotRow {
  holderId: number;
  batchStatus: string | null;
  qc: QcView[];
  incoming: MovementView[];
  /** Shipments and transfers out of the lot. */
  outgoing: MovementView[];
}

export async function getProductLotDetail(db: Db, siteId: number, code: string): Promise<ProductLotDetail | null> {
  const r = await db.productLot.findUnique({
    where: { siteId_code: { siteId, code } },
    include: {
      holder: { select: { stockG: true } },
      batch: { select: { code: true, status: true } },
      qc: { orderBy: [{ testedAt: "asc" }, { id: "asc" }] },
    },
  });
  if (!r) return null;
  const moves = await listHolderMovements(db, r.holderId);
  return {
    code: r.code,
    holderId: r.holderId,
    batchCode: r.batch?.code ?? null,
    batchStatus: r.batch?.status ?? null,
    producedAt: r.producedAt,
    massG: r.massG,
    stockG: r.holder.stockG,
    status: r.status,
    releasedAt: r.releasedAt,
    qcCount: r.qc.length,
    qcFailed: r.qc.filter((q) => !q.pass).length,
    qc: r.qc.map((q) => ({
      id: q.id,
      property: q.property,
      method: q.method,
      value: q.value,
      unit: q.unit,
      limitMin: q.limitMin,
      limitMax: q.limitMax,
      specRef: q.specRef,
      pass: q.pass,
      testedAt: q.testedAt,
    })),
    incoming: moves.incoming,
    outgoing: moves.outgoing,
  };
}

export interface ShipmentRow {
  documentNo: string;
  customer: string;
  shippedAt: Date;
  massG: number;
  volumeMl: number;
  certifiedClaim: boolean;
  /** Where it was loaded from (the source of its first incoming movement). */
  from: HolderRef | null;
}

export async function listShipments(db: Db, siteId: number, opts: { skip?: number; take?: number } = {}): Promise<{ rows: ShipmentRow[]; total: number }> {
  const where = { siteId };
  const [rows, total] = await Promise.all([
    db.shipment.findMany({
      where,
      orderBy: [{ shippedAt: "desc" }, { id: "desc" }],
      skip: opts.skip ?? 0,
      take: opts.take ?? 100,
      include: {
        holder: { select: { incoming: { orderBy: { id: "asc" }, take: 1, select: { fromHolder: { select: { id: true, kind: true, code: true } } } } } },
      },
    }),
    db.shipment.count({ where }),
  ]);
  return {
    total,
    rows: rows.map((r) => {
      const from = r.holder.incoming[0]?.fromHolder ?? null;
      return {
        documentNo: r.documentNo,
        customer: r.customer,
        shippedAt: r.shippedAt,
        massG: r.massG,
        volumeMl: r.volumeMl,
        certifiedClaim: r.certifiedClaim,
        from: from ? { id: from.id, kind: toHolderKind(from.kind), code: from.code } : null,
      };
    }),
  };
}

export interface ShipmentDetail extends ShipmentRow {
  holderId: number;
  incoming: MovementView[];
}

export async function getShipmentDetail(db: Db, siteId: number, documentNo: string): Promise<ShipmentDetail | null> {
  const r = await db.shipment.findUnique({ where: { siteId_documentNo: { siteId, documentNo } } });
  if (!r) return null;
  const moves = await listHolderMovements(db, r.holderId);
  const first = moves.incoming[0];
  return {
    documentNo: r.documentNo,
    customer: r.customer,
    shippedAt: r.shippedAt,
    massG: r.massG,
    volumeMl: r.volumeMl,
    certifiedClaim: r.certifiedClaim,
    from: first?.from ?? null,
    holderId: r.holderId,
    incoming: moves.incoming,
  };
}

// ---- writes used by lib/product/product.service.ts and lib/batch/batch.service.ts

export async function insertProductLot(tx: Tx, p: { siteId: number; holderId: number; code: string; batchId: number; producedAt: Date; massG: number }): Promise<void> {
  await tx.productLot.create({ data: { ...p, status: "HELD" } });
}

export async function getProductState(tx: Tx, holderId: number): Promise<{ id: number; status: string; qc: Array<{ property: string; pass: boolean }> }> {
  return tx.productLot.findUniqueOrThrow({ where: { holderId }, select: { id: true, status: true, qc: { select: { property: true, pass: true } } } });
}

export async function insertQcResult(
  tx: Tx,
  q: { productLotId: number; property: string; method: string; value: number; unit: string; limitMin: number | null; limitMax: number | null; specRef: string; pass: boolean; testedAt: Date },
): Promise<{ id: number; pass: boolean }> {
  return tx.qcResult.create({ data: q, select: { id: true, pass: true } });
}

export async function setProductStatus(tx: Tx, id: number, status: string, releasedAt: Date | null): Promise<void> {
  await tx.productLot.update({ where: { id }, data: { status, releasedAt } });
}

export async function insertShipment(
  tx: Tx,
  s: { siteId: number; holderId: number; documentNo: string; customer: string; shippedAt: Date; massG: number; volumeMl: number; certifiedClaim: boolean },
): Promise<{ id: number; documentNo: string }> {
  return tx.shipment.create({ data: s, select: { id: true, documentNo: true } });
}
