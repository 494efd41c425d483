import "server-only";
import type { Db, Tx } from "@/lib/core/connect";
import { listHolderMovements, toHolderKind } from "@/lib/ledger/movement.store";
import type { HolderRef, MovementView } from "@/lib/ledger/movement.store";
import type { QcRecord } from "@/lib/product/certificate";
import { DEFAULT_PRODUCT_SPEC_KEY } from "@/lib/product/spec-default";

export interface ProductLotRow {
  code: string;
  batchCode: string | null;
  producedAt: Date;
  massG: number;
  stockG: number;
  status: string;
  releasedAt: Date | null;
  specKey: string;
  deviation: boolean;
  /** Every QC result of the lot, superseded ones included (judged by the caller against the spec). */
  qc: QcRecord[];
}

const QC_SELECT = {
  id: true,
  property: true,
  value: true,
  method: true,
  lab: true,
  reportNo: true,
  testedAt: true,
  supersedesId: true,
} as const;

function toQcRecord(q: {
  id: number;
  property: string;
  value: number;
  method: string;
  lab: string;
  reportNo: string;
  testedAt: Date;
  supersedesId: number | null;
}): QcRecord {
  return {
    id: q.id,
    property: q.property,
    value: q.value,
    method: q.method,
    lab: q.lab,
    reportNo: q.reportNo,
    testedAt: q.testedAt,
    supersedesId: q.supersedesId,
  };
}

export async function listProductLots(
  db: Db,
  siteId: number,
  opts: { skip?: number; take?: number } = {},
): Promise<{ rows: ProductLotRow[]; total: number }> {
  const where = { siteId };
  const [rows, total] = await Promise.all([
    db.productLot.findMany({
      where,
      orderBy: [{ producedAt: "desc" }, { id: "desc" }],
      skip: opts.skip ?? 0,
      take: opts.take ?? 100,
      include: { holder: { select: { stockG: true } }, batch: { select: { code: true } }, qc: { select: QC_SELECT } },
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
      specKey: r.specKey,
      deviation: r.deviation,
      qc: r.qc.map(toQcRecord),
    })),
  };
}

/** A stored QC result with what was snapshotted at entry (limits, specification, verdict). */
export interface QcView extends QcRecord {
  unit: string;
  limitMin: number | null;
  limitMax: number | null;
  specRef: string;
  /** The verdict at entry, against the specification chosen then. */
  verdict: string;
  recordedBy: string | null;
  recordedAt: Date;
  /** The later re-test that replaced this result, if any. */
  supersededById: number | null;
}

export interface ProductLotDetail extends Omit<ProductLotRow, "qc"> {
  holderId: number;
  batchStatus: string | null;
  decisionReason: string;
  decidedAt: Date | null;
  decidedBy: string | null;
  qc: QcView[];
  incoming: MovementView[];
  /** Shipments and transfers out of the lot. */
  outgoing: MovementView[];
}

async function userNames(db: Db, ids: ReadonlyArray<number | null>): Promise<Map<number, string>> {
  const wanted = [...new Set(ids.filter((i): i is number => i !== null))];
  if (wanted.length === 0) return new Map();
  const users = await db.user.findMany({ where: { id: { in: wanted } }, select: { id: true, fullName: true } });
  return new Map(users.map((u) => [u.id, u.fullName]));
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
  const [moves, names] = await Promise.all([
    listHolderMovements(db, r.holderId),
    userNames(db, [r.decidedById, ...r.qc.map((q) => q.recordedById)]),
  ]);
  const supersededBy = new Map(
    r.qc.filter((q) => q.supersedesId !== null).map((q) => [q.supersedesId as number, q.id]),
  );
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
    specKey: r.specKey,
    deviation: r.deviation,
    decisionReason: r.decisionReason,
    decidedAt: r.decidedAt,
    decidedBy: r.decidedById === null ? null : (names.get(r.decidedById) ?? null),
    qc: r.qc.map((q) => ({
      ...toQcRecord(q),
      unit: q.unit,
      limitMin: q.limitMin,
      limitMax: q.limitMax,
      specRef: q.specRef,
      verdict: q.verdict || (q.pass ? "PASS" : "FAIL"),
      recordedBy: q.recordedById === null ? null : (names.get(q.recordedById) ?? null),
      recordedAt: q.recordedAt,
      supersededById: supersededBy.get(q.id) ?? null,
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

export async function listShipments(
  db: Db,
  siteId: number,
  opts: { skip?: number; take?: number } = {},
): Promise<{ rows: ShipmentRow[]; total: number }> {
  const where = { siteId };
  const [rows, total] = await Promise.all([
    db.shipment.findMany({
      where,
      orderBy: [{ shippedAt: "desc" }, { id: "desc" }],
      skip: opts.skip ?? 0,
      take: opts.take ?? 100,
      include: {
        holder: {
          select: {
            incoming: {
              orderBy: { id: "asc" },
              take: 1,
              select: { fromHolder: { select: { id: true, kind: true, code: true } } },
            },
          },
        },
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

export async function insertProductLot(
  tx: Tx,
  p: {
    siteId: number;
    holderId: number;
    code: string;
    batchId: number;
    producedAt: Date;
    massG: number;
    specKey?: string;
  },
): Promise<void> {
  await tx.productLot.create({ data: { ...p, specKey: p.specKey ?? DEFAULT_PRODUCT_SPEC_KEY, status: "HELD" } });
}

export interface ProductState {
  id: number;
  status: string;
  specKey: string;
  deviation: boolean;
  decisionReason: string;
  producedAt: Date;
  qc: QcRecord[];
}

export async function getProductState(tx: Tx, holderId: number): Promise<ProductState> {
  const r = await tx.productLot.findUniqueOrThrow({
    where: { holderId },
    select: {
      id: true,
      status: true,
      specKey: true,
      deviation: true,
      decisionReason: true,
      producedAt: true,
      qc: { select: QC_SELECT },
    },
  });
  return { ...r, qc: r.qc.map(toQcRecord) };
}

export interface QcDraft {
  productLotId: number;
  property: string;
  method: string;
  value: number;
  unit: string;
  limitMin: number | null;
  limitMax: number | null;
  specRef: string;
  verdict: string;
  pass: boolean;
  lab: string;
  reportNo: string;
  testedAt: Date;
  supersedesId: number | null;
  recordedById: number;
  recordedAt: Date;
}

export async function insertQcResult(tx: Tx, q: QcDraft): Promise<{ id: number }> {
  return tx.qcResult.create({ data: q, select: { id: true } });
}

export async function setProductSpec(tx: Tx, id: number, specKey: string): Promise<void> {
  await tx.productLot.update({ where: { id }, data: { specKey } });
}

export async function setProductDecision(
  tx: Tx,
  id: number,
  d: {
    status: "HELD" | "RELEASED" | "REJECTED";
    releasedAt: Date | null;
    decisionReason: string;
    deviation: boolean;
    decidedAt: Date;
    decidedById: number;
  },
): Promise<void> {
  await tx.productLot.update({ where: { id }, data: d });
}

export async function insertShipment(
  tx: Tx,
  s: {
    siteId: number;
    holderId: number;
    documentNo: string;
    customer: string;
    shippedAt: Date;
    massG: number;
    volumeMl: number;
    certifiedClaim: boolean;
  },
): Promise<{ id: number; documentNo: string }> {
  return tx.shipment.create({ data: s, select: { id: true, documentNo: true } });
}

export interface ProductLotStanding {
  holderId: number;
  code: string;
  status: string;
  decisionReason: string;
}

/** Release state of the product lots among the given holders (a recall's reach). */
export async function listProductLotStandings(
  db: Db,
  siteId: number,
  holderIds: readonly number[],
): Promise<Map<number, ProductLotStanding>> {
  if (holderIds.length === 0) return new Map();
  const rows = await db.productLot.findMany({
    where: { siteId, holderId: { in: [...holderIds] } },
    select: { holderId: true, code: true, status: true, decisionReason: true },
  });
  return new Map(rows.map((r) => [r.holderId, r]));
}
