import "server-only";
import { splitIngredients } from "@/lib/trace/ingredients";
import type { IngredientShare } from "@/lib/trace/ingredients";
import type { Db } from "@/lib/core/connect";
import { listMovementsById } from "@/lib/ledger/movement.store";
import type { TraceLedger } from "@/lib/ledger/movement.store";
import type { ForwardTrace, HolderTrace } from "@/lib/trace/genealogy";
import type { LedgerIndex } from "@/lib/ledger/moves";
import type { FlowMove, LotFlow, ReplayOrder } from "@/lib/feedstock/lot-flow";
import { carriedFlow, groupOrigins, MAX_FLOW_MOVES, timeOrderedMoves } from "@/lib/feedstock/lot-flow";

export type { FlowDestination, FlowMove, LotFlow, ReplayOrder } from "@/lib/feedstock/lot-flow";
export { MAX_FLOW_MOVES } from "@/lib/feedstock/lot-flow";

export interface TitrationView {
  id: number;
  testedAt: Date;
  analyst: string;
  sampleMassG: number;
  titrant: string;
  concentrationMolL: number;
  titreMl: number;
  blankMl: number;
  basis: string;
  ffaPct: number;
  acidValue: number;
  voided: boolean;
}

export interface LabTestView {
  id: number;
  testedAt: Date;
  analyst: string;
  kind: string;
  method: string;
  valuePct: number;
  voided: boolean;
}

export interface LotPickupView {
  code: string;
  sourceCode: string;
  sourceName: string;
  observedAt: Date;
  volumeMl: number;
  massG: number;
}

export interface LotDetail {
  id: number;
  holderId: number;
  code: string;
  material: string;
  origin: string;
  supplier: { code: string; name: string } | null;
  deliveryDocument: string | null;
  receivedAt: Date;
  observedVolumeMl: number;
  observedTempC: number;
  densityKgM3: number;
  referenceTempC: number;
  densitySource: string;
  standardVolumeMl: number;
  massG: number;
  stockG: number;
  status: string;
  certified: boolean;
  notes: string;
  titrations: TitrationView[];
  labTests: LabTestView[];
  pickups: LotPickupView[];
}

export async function getLotDetail(db: Db, siteId: number, code: string): Promise<LotDetail | null> {
  const r = await db.feedstockLot.findUnique({
    where: { siteId_code: { siteId, code } },
    include: {
      holder: { select: { stockG: true } },
      supplier: { select: { code: true, name: true } },
      titrations: {
        orderBy: [{ testedAt: "asc" }, { id: "asc" }],
        include: { analyst: { select: { fullName: true } } },
      },
      labTests: { orderBy: [{ testedAt: "asc" }, { id: "asc" }], include: { analyst: { select: { fullName: true } } } },
      pickups: {
        orderBy: [{ observedAt: "asc" }, { id: "asc" }],
        include: { source: { select: { code: true, name: true } } },
      },
    },
  });
  if (!r) return null;
  return {
    id: r.id,
    holderId: r.holderId,
    code: r.code,
    material: r.material,
    origin: r.origin,
    supplier: r.supplier,
    deliveryDocument: r.deliveryDocument,
    receivedAt: r.receivedAt,
    observedVolumeMl: r.observedVolumeMl,
    observedTempC: r.observedTempC,
    densityKgM3: r.densityKgM3,
    referenceTempC: r.referenceTempC,
    densitySource: r.densitySource,
    standardVolumeMl: r.standardVolumeMl,
    massG: r.massG,
    stockG: r.holder.stockG,
    status: r.status,
    certified: r.certified,
    notes: r.notes,
    titrations: r.titrations.map((t) => ({
      id: t.id,
      testedAt: t.testedAt,
      analyst: t.analyst.fullName,
      sampleMassG: t.sampleMassG,
      titrant: t.titrant,
      concentrationMolL: t.concentrationMolL,
      titreMl: t.titreMl,
      blankMl: t.blankMl,
      basis: t.basis,
      ffaPct: t.ffaPct,
      acidValue: t.acidValue,
      voided: t.voided,
    })),
    labTests: r.labTests.map((t) => ({
      id: t.id,
      testedAt: t.testedAt,
      analyst: t.analyst.fullName,
      kind: t.kind,
      method: t.method,
      valuePct: t.valuePct,
      voided: t.voided,
    })),
    pickups: r.pickups.map((p) => ({
      code: p.code,
      sourceCode: p.source.code,
      sourceName: p.source.name,
      observedAt: p.observedAt,
      volumeMl: p.volumeMl,
      massG: p.massG,
    })),
  };
}

export interface PickupDetail {
  code: string;
  source: { code: string; name: string; kind: string };
  collector: string;
  material: string;
  observedAt: Date;
  receivedAt: Date;
  containers: number;
  containerTags: string[];
  volumeMl: number;
  tempC: number;
  massG: number;
  stockG: number;
  waterLook: string;
  solidsLook: string;
  notes: string;
  lot: { code: string; status: string; receivedAt: Date } | null;
}

export async function getPickupDetail(db: Db, siteId: number, code: string): Promise<PickupDetail | null> {
  const r = await db.pickup.findUnique({
    where: { siteId_code: { siteId, code } },
    include: {
      source: { select: { code: true, name: true, kind: true } },
      collector: { select: { fullName: true } },
      lot: { select: { code: true, status: true, receivedAt: true } },
      holder: { select: { stockG: true } },
    },
  });
  if (!r) return null;
  return {
    code: r.code,
    source: r.source,
    collector: r.collector.fullName,
    material: r.material,
    observedAt: r.observedAt,
    receivedAt: r.receivedAt,
    containers: r.containers,
    containerTags: r.containerTags.split(",").filter(Boolean),
    volumeMl: r.volumeMl,
    tempC: r.tempC,
    massG: r.massG,
    stockG: r.holder.stockG,
    waterLook: r.waterLook,
    solidsLook: r.solidsLook,
    notes: r.notes,
    lot: r.lot,
  };
}

/**
 * Where a lot's material went (lot → tank → batch → product lot → shipment, and waste or losses), from
 * its backward trace and the forward trace of its origins (lot-flow.service.ts runs them on the cache).
 */
export async function describeLotFlow(
  db: Db,
  siteId: number,
  ledger: TraceLedger,
  lotHolderId: number,
  index: LedgerIndex,
  trace: { back: HolderTrace; fwd: ForwardTrace },
  method: "trace" | "booking-order",
  traceProblem: string | null,
): Promise<LotFlow> {
  const flow = carriedFlow(ledger, index, trace.fwd, lotHolderId);
  const shown = flow.carried.slice(0, MAX_FLOW_MOVES);
  const views = await listMovementsById(
    db,
    siteId,
    shown.map((m) => m.moveId),
  );
  const moves: FlowMove[] = [];
  for (const m of shown) {
    const v = views.get(m.moveId);
    if (v) moves.push({ id: v.id, at: v.at, role: v.role, from: v.from, to: v.to, grams: m.grams, moveMassG: v.massG });
  }
  return {
    method,
    traceProblem,
    enteredG: trace.back.received.totalG,
    stillInLotG: flow.stillInLotG,
    destinations: flow.destinations,
    moves,
    movesTotal: flow.carried.length,
    reversedPairsLeftOut: ledger.reversedPairsLeftOut,
  };
}

/**
 * Fallback when the ledger cannot be replayed: a move out of holder H counts when it is later than the
 * first arrival of the lot's material in H. It over-states (a tank may have been emptied in between).
 */
export async function timeOrderedFlow(
  db: Db,
  siteId: number,
  ledger: TraceLedger,
  lotHolderId: number,
  traceProblem: string,
): Promise<LotFlow> {
  const { picked, enteredG, destinations } = timeOrderedMoves(ledger, lotHolderId);
  const views = await listMovementsById(
    db,
    siteId,
    picked.slice(0, MAX_FLOW_MOVES).map((m) => m.id),
  );
  const moves: FlowMove[] = [];
  for (const m of picked.slice(0, MAX_FLOW_MOVES)) {
    const v = views.get(m.id);
    if (v) moves.push({ id: v.id, at: v.at, role: v.role, from: v.from, to: v.to, grams: v.massG, moveMassG: v.massG });
  }
  const lotStock = await db.holder.findUnique({ where: { id: lotHolderId }, select: { stockG: true } });
  return {
    method: "time-ordered",
    traceProblem,
    enteredG,
    stillInLotG: lotStock?.stockG ?? 0,
    destinations,
    moves,
    movesTotal: picked.length,
    reversedPairsLeftOut: ledger.reversedPairsLeftOut,
  };
}

export type FeedstockShare = IngredientShare;

export interface MadeOf {
  totalG: number;
  /** Feedstock lots with their share of the feedstock (the base of the shares is feedstockG). */
  shares: FeedstockShare[];
  feedstockG: number;
  /** Reagent lots (methanol, catalyst, acid; water only from batches booked before washing was recorded apart): listed, never a share. */
  reagents: FeedstockShare[];
  /** "booked" when the movements' dates are inconsistent and the ledger was replayed in booking order. */
  order: ReplayOrder;
}

/** Groups a backward trace's origins by the feedstock lot (or reagent lot) each entered through. */
export async function describeMadeOf(
  db: Db,
  siteId: number,
  view: { ledger: TraceLedger; index: LedgerIndex },
  back: HolderTrace,
  order: ReplayOrder,
): Promise<MadeOf> {
  // The whole site's pickups and lots: a batch from a pooled tank can go back to thousands of pickups,
  // more than SQLite binds in one IN list.
  const [pickups, lots, reagentLots] = await Promise.all([
    db.pickup.findMany({
      where: { siteId, lotId: { not: null } },
      select: { holderId: true, lot: { select: { code: true } } },
    }),
    db.feedstockLot.findMany({ where: { siteId }, select: { holderId: true, code: true } }),
    db.reagentLot.findMany({ where: { siteId }, select: { holderId: true, reagent: true } }),
  ]);
  const reagentOf = new Map(reagentLots.map((r) => [r.holderId, r.reagent]));
  const lotOfHolder = new Map<number, string>();
  for (const p of pickups) if (p.lot) lotOfHolder.set(p.holderId, p.lot.code);
  for (const l of lots) lotOfHolder.set(l.holderId, l.code);
  const split = splitIngredients(groupOrigins(view.ledger, view.index, back, lotOfHolder, reagentOf));
  return {
    totalG: back.received.totalG,
    shares: split.feedstock,
    feedstockG: split.feedstockG,
    reagents: split.reagents,
    order,
  };
}
