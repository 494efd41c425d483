import "server-only";
import { splitIngredients } from "@/lib/trace/ingredients";
import type { IngredientShare, OriginGroup } from "@/lib/trace/ingredients";
import type { Db } from "@/lib/core/connect";
import type { HolderKind, MoveRole } from "@/lib/core/vocabulary";
import { listMovementsById } from "@/lib/ledger/movement.store";
import type { HolderRef, TraceLedger } from "@/lib/ledger/movement.store";
import type { ForwardTrace, HolderTrace } from "@/lib/trace/genealogy";
import type { LedgerIndex, TraceMove } from "@/lib/ledger/moves";

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

export interface FlowDestination {
  holder: HolderRef;
  /** Grams of the lot's material that moved in (trace), or the full mass of the moves in (time-ordered flow). */
  receivedG: number;
  /** Grams of the lot's material still there (trace only; null for the time-ordered flow). */
  heldG: number | null;
  firstAt: Date;
}

export interface FlowMove {
  id: number;
  at: Date;
  role: MoveRole;
  from: HolderRef | null;
  to: HolderRef;
  /** Grams of the lot's material the move carried (trace), or the whole move (time-ordered flow). */
  grams: number;
  moveMassG: number;
}

export interface LotFlow {
  /**
   * "trace": grams attributed by replaying the ledger in date order under each holder's mixing model.
   * "booking-order": the same replay in the order the movements were booked, used when their dates are
   * inconsistent (a draw dated before the stock it needs); book stock was checked in that order.
   * "time-ordered": every later move out of a holder the lot's material had reached (possible destinations).
   */
  method: "trace" | "booking-order" | "time-ordered";
  /** Why the date-ordered trace could not be used, when method is not "trace". */
  traceProblem: string | null;
  /** Grams that entered the lot. */
  enteredG: number;
  /** Grams of the lot's material still in the lot. */
  stillInLotG: number;
  destinations: FlowDestination[];
  /** The first MAX_FLOW_MOVES movements that carried the lot's material, in ledger order. */
  moves: FlowMove[];
  movesTotal: number;
  reversedPairsLeftOut: number;
}

export const MAX_FLOW_MOVES = 200;

const UPSTREAM_KINDS: ReadonlySet<HolderKind> = new Set(["PICKUP", "DELIVERY"]);

export type ReplayOrder = "dated" | "booked";

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
  const { back, fwd } = trace;
  const isDownstream = (holderId: number) => {
    const ref = ledger.refs.get(holderId);
    return ref !== undefined && holderId !== lotHolderId && !UPSTREAM_KINDS.has(ref.kind);
  };
  const carried = fwd.moves.filter((m) => {
    const move = moveAt(index, m.moveId);
    return move !== undefined && move.fromHolderId !== null && isDownstream(move.toHolderId);
  });
  const shown = carried.slice(0, MAX_FLOW_MOVES);
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
  // First arrival per holder, in the replay's order; the dates shown are the movements' own.
  const realAt = new Map(ledger.moves.map((m) => [m.id, m.at]));
  const first = new Map<number, { rank: number; at: Date }>();
  carried.forEach((m, rank) => {
    const move = moveAt(index, m.moveId);
    if (move && !first.has(move.toHolderId))
      first.set(move.toHolderId, { rank, at: new Date(realAt.get(m.moveId) ?? move.at) });
  });
  const destinations: Array<FlowDestination & { rank: number }> = [];
  for (const h of fwd.holders) {
    const ref = ledger.refs.get(h.holderId);
    const f = first.get(h.holderId);
    if (ref === undefined || f === undefined || !isDownstream(h.holderId)) continue;
    destinations.push({ holder: ref, receivedG: h.receivedG, heldG: h.heldG, firstAt: f.at, rank: f.rank });
  }
  destinations.sort((a, b) => a.rank - b.rank);
  const inLot = fwd.holders.find((h) => h.holderId === lotHolderId);
  return {
    method,
    traceProblem,
    enteredG: back.received.totalG,
    stillInLotG: inLot?.heldG ?? 0,
    destinations: destinations.map(({ rank: _rank, ...d }) => d),
    moves,
    movesTotal: carried.length,
    reversedPairsLeftOut: ledger.reversedPairsLeftOut,
  };
}

function moveAt(index: LedgerIndex, moveId: number) {
  const pos = index.positionOf.get(moveId);
  return pos === undefined ? undefined : index.moves[pos];
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
  const sorted = [...ledger.moves].sort((a, b) => a.at - b.at || a.id - b.id);
  const reachedAt = new Map<number, number>();
  let enteredG = 0;
  const picked: TraceMove[] = [];
  for (const m of sorted) {
    if (m.toHolderId === lotHolderId) {
      enteredG += m.massG;
      if (!reachedAt.has(lotHolderId)) reachedAt.set(lotHolderId, m.at);
      continue;
    }
    if (m.fromHolderId === null) continue;
    const since = reachedAt.get(m.fromHolderId);
    if (since === undefined || m.at < since) continue;
    picked.push(m);
    if (!reachedAt.has(m.toHolderId)) reachedAt.set(m.toHolderId, m.at);
  }
  const byHolder = new Map<number, FlowDestination>();
  for (const m of picked) {
    const to = ledger.refs.get(m.toHolderId);
    if (!to) continue;
    const d = byHolder.get(to.id) ?? { holder: to, receivedG: 0, heldG: null, firstAt: new Date(m.at) };
    d.receivedG += m.massG;
    byHolder.set(to.id, d);
  }
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
    destinations: [...byHolder.values()],
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
  const { ledger } = view;
  const entryHolder = new Map<number, number>();
  for (const o of back.received.origins) {
    const m = moveAt(view.index, o.originId);
    if (m) entryHolder.set(o.originId, m.toHolderId);
  }
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
  const groups = new Map<string, OriginGroup>();
  for (const o of back.received.origins) {
    const h = entryHolder.get(o.originId);
    const ref = h === undefined ? undefined : ledger.refs.get(h);
    const lotCode = h === undefined ? undefined : lotOfHolder.get(h);
    const reagent = h === undefined ? undefined : reagentOf.get(h);
    const share: OriginGroup =
      lotCode !== undefined
        ? { kind: "LOT", code: lotCode, grams: 0 }
        : ref?.kind === "REAGENT_LOT"
          ? { kind: "REAGENT_LOT", code: ref.code, grams: 0, ...(reagent ? { reagent } : {}) }
          : { kind: "OTHER", code: ref ? ref.code : `origin ${o.originId}`, grams: 0 };
    const key = `${share.kind}:${share.code}`;
    const g = groups.get(key) ?? share;
    g.grams += o.grams;
    groups.set(key, g);
  }
  const split = splitIngredients([...groups.values()]);
  return {
    totalG: back.received.totalG,
    shares: split.feedstock,
    feedstockG: split.feedstockG,
    reagents: split.reagents,
    order,
  };
}
