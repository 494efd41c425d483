import "server-only";
import type { Db } from "@/lib/core/connect";
import type { HolderKind } from "@/lib/core/vocabulary";
import { toHolderKind } from "@/lib/ledger/movement.store";
import type { EntryHolderFacts, LedgerVersion, TraceSubject } from "@/lib/trace/trace-facts";

export type { EntryHolderFacts, LedgerVersion, LotFacts, SourceFacts, TraceSubject } from "@/lib/trace/trace-facts";

export async function getLedgerVersion(db: Db, siteId: number): Promise<LedgerVersion> {
  const agg = await db.movement.aggregate({ where: { siteId }, _count: { _all: true }, _max: { id: true } });
  return { count: agg._count._all, lastId: agg._max.id };
}

const SOURCE_SELECT = {
  code: true,
  name: true,
  kind: true,
  certificateScheme: true,
  certificateNo: true,
  certificateExpires: true,
  creditWithheld: true,
} as const;
const LOT_SELECT = {
  holderId: true,
  code: true,
  material: true,
  origin: true,
  certified: true,
  receivedAt: true,
} as const;

/** Facts about every holder of the site that material can enter the books at, by holder id. */
export async function listEntryHolderFacts(db: Db, siteId: number): Promise<Map<number, EntryHolderFacts>> {
  const [pickups, lots, reagents] = await Promise.all([
    db.pickup.findMany({
      where: { siteId },
      select: {
        holderId: true,
        code: true,
        material: true,
        observedAt: true,
        source: { select: SOURCE_SELECT },
        lot: { select: LOT_SELECT },
      },
    }),
    db.feedstockLot.findMany({ where: { siteId }, select: { ...LOT_SELECT, supplier: { select: SOURCE_SELECT } } }),
    db.reagentLot.findMany({
      where: { siteId },
      select: { holderId: true, code: true, reagent: true, supplier: true },
    }),
  ]);
  const facts = new Map<number, EntryHolderFacts>();
  for (const p of pickups) {
    facts.set(p.holderId, {
      holderId: p.holderId,
      kind: "PICKUP",
      code: p.code,
      pickup: { code: p.code, observedAt: p.observedAt },
      lot: p.lot,
      source: p.source,
      material: p.material,
      reagent: null,
    });
  }
  for (const l of lots) {
    const { supplier, ...lot } = l;
    facts.set(l.holderId, {
      holderId: l.holderId,
      kind: "LOT",
      code: l.code,
      pickup: null,
      lot,
      source: supplier,
      material: l.material,
      reagent: null,
    });
  }
  for (const r of reagents) {
    facts.set(r.holderId, {
      holderId: r.holderId,
      kind: "REAGENT_LOT",
      code: r.code,
      pickup: null,
      lot: null,
      source: null,
      material: r.reagent,
      reagent: { reagent: r.reagent, supplier: r.supplier },
    });
  }
  return facts;
}

/** A holder by kind and code (a shipment's code is its document number). */
export async function getHolderSubject(
  db: Db,
  siteId: number,
  kind: HolderKind,
  code: string,
): Promise<TraceSubject | null> {
  const h = await db.holder.findUnique({
    where: { siteId_kind_code: { siteId, kind, code } },
    select: { id: true, kind: true, code: true },
  });
  return h ? { kind: toHolderKind(h.kind), code: h.code, holderIds: [h.id], label: h.code } : null;
}

/** A source with the holders its material entered the books at: its pickups and the lots it delivered. */
export async function getSourceSubject(db: Db, siteId: number, code: string): Promise<TraceSubject | null> {
  const s = await db.source.findUnique({
    where: { siteId_code: { siteId, code } },
    select: {
      code: true,
      name: true,
      pickups: { select: { holderId: true } },
      deliveries: { select: { holderId: true } },
    },
  });
  if (!s) return null;
  return {
    kind: "SOURCE",
    code: s.code,
    holderIds: [...s.pickups.map((p) => p.holderId), ...s.deliveries.map((d) => d.holderId)],
    label: `${s.code} ${s.name}`,
  };
}

export interface TraceChoices {
  productLots: string[];
  tanks: string[];
  shipments: string[];
  batches: string[];
  sources: string[];
  lots: string[];
  pickups: string[];
}

/** Codes offered in the trace form, newest first (the form accepts any code). */
export async function listTraceChoices(db: Db, siteId: number, take = 60): Promise<TraceChoices> {
  const [productLots, tanks, shipments, batches, sources, lots, pickups] = await Promise.all([
    db.productLot.findMany({
      where: { siteId },
      orderBy: [{ producedAt: "desc" }, { id: "desc" }],
      take,
      select: { code: true },
    }),
    db.tank.findMany({ where: { siteId }, orderBy: { code: "asc" }, select: { code: true } }),
    db.shipment.findMany({
      where: { siteId },
      orderBy: [{ shippedAt: "desc" }, { id: "desc" }],
      take,
      select: { documentNo: true },
    }),
    db.batch.findMany({
      where: { siteId },
      orderBy: [{ plannedAt: "desc" }, { id: "desc" }],
      take,
      select: { code: true },
    }),
    db.source.findMany({ where: { siteId }, orderBy: { code: "asc" }, select: { code: true } }),
    db.feedstockLot.findMany({
      where: { siteId },
      orderBy: [{ receivedAt: "desc" }, { id: "desc" }],
      take,
      select: { code: true },
    }),
    db.pickup.findMany({
      where: { siteId },
      orderBy: [{ observedAt: "desc" }, { id: "desc" }],
      take,
      select: { code: true },
    }),
  ]);
  return {
    productLots: productLots.map((r) => r.code),
    tanks: tanks.map((r) => r.code),
    shipments: shipments.map((r) => r.documentNo),
    batches: batches.map((r) => r.code),
    sources: sources.map((r) => r.code),
    lots: lots.map((r) => r.code),
    pickups: pickups.map((r) => r.code),
  };
}

/** Tank service by holder id, so a graph can put feedstock, product and methanol tanks in their own stages. */
export async function listTankServices(db: Db, siteId: number): Promise<Map<number, string>> {
  const rows = await db.tank.findMany({ where: { siteId }, select: { holderId: true, service: true } });
  return new Map(rows.map((r) => [r.holderId, r.service]));
}
