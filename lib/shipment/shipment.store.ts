import "server-only";
import type { Db, Tx } from "@/lib/core/connect";
import type { HolderKind } from "@/lib/core/vocabulary";
import { listHolderMovements, toHolderKind } from "@/lib/ledger/movement.store";
import type { HolderRef, MovementView } from "@/lib/ledger/movement.store";

/** What a shipment line would draw from: its holder and, for a lot, its release state; for a tank, its service. */
export interface DrawSource {
  holderId: number;
  stockG: number;
  productStatus: string | null;
  tankService: string | null;
}

export async function getDrawSource(
  tx: Tx,
  siteId: number,
  kind: HolderKind,
  code: string,
): Promise<DrawSource | null> {
  const h = await tx.holder.findUnique({
    where: { siteId_kind_code: { siteId, kind, code } },
    select: { id: true, stockG: true, product: { select: { status: true } }, tank: { select: { service: true } } },
  });
  return h
    ? {
        holderId: h.id,
        stockG: h.stockG,
        productStatus: h.product?.status ?? null,
        tankService: h.tank?.service ?? null,
      }
    : null;
}

export async function shipmentExists(tx: Tx, siteId: number, documentNo: string): Promise<boolean> {
  return (await tx.shipment.count({ where: { siteId, documentNo } })) > 0;
}

export async function insertShipmentRecord(
  tx: Tx,
  s: {
    siteId: number;
    holderId: number;
    documentNo: string;
    customer: string;
    customerId: number;
    shippedAt: Date;
    massG: number;
    volumeMl: number;
    certifiedClaim: boolean;
    vehicle: string;
    compartment: string;
  },
): Promise<{ id: number; documentNo: string }> {
  return tx.shipment.create({ data: s, select: { id: true, documentNo: true } });
}

export interface ShipmentListRow {
  documentNo: string;
  customer: string;
  customerCode: string | null;
  shippedAt: Date;
  massG: number;
  volumeMl: number;
  certifiedClaim: boolean;
  vehicle: string;
  /** Where it was loaded from: the sources of its lines. */
  from: HolderRef[];
}

export async function listShipmentRows(
  db: Db,
  siteId: number,
  opts: { skip?: number; take?: number; customerCode?: string } = {},
): Promise<{ rows: ShipmentListRow[]; total: number }> {
  const where = { siteId, ...(opts.customerCode === undefined ? {} : { customerRef: { code: opts.customerCode } }) };
  const [rows, total] = await Promise.all([
    db.shipment.findMany({
      where,
      orderBy: [{ shippedAt: "desc" }, { id: "desc" }],
      skip: opts.skip ?? 0,
      take: opts.take ?? 100,
      include: {
        customerRef: { select: { code: true } },
        holder: {
          select: {
            incoming: {
              orderBy: { id: "asc" },
              take: 20,
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
      const from = new Map<number, HolderRef>();
      for (const m of r.holder.incoming)
        if (m.fromHolder)
          from.set(m.fromHolder.id, {
            id: m.fromHolder.id,
            kind: toHolderKind(m.fromHolder.kind),
            code: m.fromHolder.code,
          });
      return {
        documentNo: r.documentNo,
        customer: r.customer,
        customerCode: r.customerRef?.code ?? null,
        shippedAt: r.shippedAt,
        massG: r.massG,
        volumeMl: r.volumeMl,
        certifiedClaim: r.certifiedClaim,
        vehicle: r.vehicle,
        from: [...from.values()],
      };
    }),
  };
}

export interface ShipmentRecordDetail {
  documentNo: string;
  customer: string;
  customerRef: { code: string; name: string; address: string; contact: string } | null;
  shippedAt: Date;
  massG: number;
  volumeMl: number;
  certifiedClaim: boolean;
  vehicle: string;
  compartment: string;
  holderId: number;
  /** The loading movements, one per line. */
  lines: MovementView[];
}

export async function getShipmentRecord(
  db: Db,
  siteId: number,
  documentNo: string,
): Promise<ShipmentRecordDetail | null> {
  const r = await db.shipment.findUnique({
    where: { siteId_documentNo: { siteId, documentNo } },
    include: { customerRef: { select: { code: true, name: true, address: true, contact: true } } },
  });
  if (!r) return null;
  const moves = await listHolderMovements(db, r.holderId);
  return {
    documentNo: r.documentNo,
    customer: r.customer,
    customerRef: r.customerRef,
    shippedAt: r.shippedAt,
    massG: r.massG,
    volumeMl: r.volumeMl,
    certifiedClaim: r.certifiedClaim,
    vehicle: r.vehicle,
    compartment: r.compartment,
    holderId: r.holderId,
    lines: moves.incoming,
  };
}

export interface ShippableStock {
  kind: "PRODUCT_LOT" | "TANK";
  code: string;
  stockG: number;
  /** A product lot's state (only released lots can leave); null for a tank. */
  status: string | null;
}

/** Released product lots and product tanks that hold fuel now: what a shipment can be loaded from. */
export async function listShippableStock(db: Db, siteId: number, take = 30): Promise<ShippableStock[]> {
  const [lots, tanks] = await Promise.all([
    db.productLot.findMany({
      where: { siteId, status: "RELEASED", holder: { stockG: { gt: 0 } } },
      orderBy: [{ producedAt: "desc" }, { id: "desc" }],
      take,
      select: { code: true, status: true, holder: { select: { stockG: true } } },
    }),
    db.tank.findMany({
      where: { siteId, service: "PRODUCT" },
      orderBy: { code: "asc" },
      select: { code: true, holder: { select: { stockG: true } } },
    }),
  ]);
  return [
    ...tanks.map((t) => ({ kind: "TANK" as const, code: t.code, stockG: t.holder.stockG, status: null })),
    ...lots.map((l) => ({ kind: "PRODUCT_LOT" as const, code: l.code, stockG: l.holder.stockG, status: l.status })),
  ];
}

/** A product lot's state and stock, for the "ship from this lot" prefill. */
export async function getProductLotForShipping(db: Db, siteId: number, code: string): Promise<ShippableStock | null> {
  const l = await db.productLot.findUnique({
    where: { siteId_code: { siteId, code } },
    select: { code: true, status: true, holder: { select: { stockG: true } } },
  });
  return l ? { kind: "PRODUCT_LOT", code: l.code, stockG: l.holder.stockG, status: l.status } : null;
}

/** Customer name as shipped by shipment holder id, for traces that reach shipments. */
export async function listShipmentCustomers(
  db: Db,
  siteId: number,
  holderIds: readonly number[],
): Promise<Map<number, { name: string; code: string | null }>> {
  if (holderIds.length === 0) return new Map();
  const rows = await db.shipment.findMany({
    where: { siteId, holderId: { in: [...holderIds] } },
    select: { holderId: true, customer: true, customerRef: { select: { code: true } } },
  });
  return new Map(rows.map((r) => [r.holderId, { name: r.customer, code: r.customerRef?.code ?? null }]));
}
