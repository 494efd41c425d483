import "server-only";
import { log } from "@/lib/log/log.service";
// Traceability answers for the pages and the JSON API: backward ("what is in this product lot, tank,
// shipment or batch?") and forward ("where did this source, pickup or lot go?"), by lot, pickup,
// source, material kind and certification, with a stage graph.
//
// Cost: a cold backward trace replays the target's ancestor subgraph (≈ the whole ledger once tanks
// pool); a forward trace replays from before the origins entered until none of them can move again.
// The server keeps, per site, one index of the ledger plus monthly replay snapshots (without the
// terminal holders), keyed by the ledger version (movement count and last id: movements are
// append-only, so any booking changes it, and the next index reads only the new rows). A trace resumes
// from the last snapshot before the moves it needs; answers are kept per version, so the page, its CSV,
// the API and the record pages share one computation.
import { BackwardTraceQuerySchema, ForwardTraceQuerySchema } from "@/lib/trace/trace-query.schema";
import type { BackwardKind, ForwardKind } from "@/lib/trace/trace-query.schema";
import type { Db } from "@/lib/core/connect";
import { fail, failMany, invariant, ok } from "@/lib/core/result";
import type { DomainIssue, Result } from "@/lib/core/result";
import { labelOf } from "@/lib/core/vocabulary";
import type { HolderKind } from "@/lib/core/vocabulary";
import { extendTraceLedger, loadTraceLedger } from "@/lib/ledger/movement.store";
import type { HolderRef, TraceLedger } from "@/lib/ledger/movement.store";
import { parseInput } from "@/lib/ledger/parse";
import { allocateByWeight } from "@/lib/quantity/allocate";
import { sumParts } from "@/lib/trace/composition";
import type { CompositionParts } from "@/lib/trace/composition";
import { findEntryOrigins, resumeReplay, traceForward, traceHolder } from "@/lib/trace/genealogy";
import type { ForwardTrace, HolderTrace, TraceComposition } from "@/lib/trace/genealogy";
import { findLastPositionAtOrBefore, indexLedger } from "@/lib/trace/ledger";
import type { LedgerIndex, TraceHolder, TraceMove } from "@/lib/trace/ledger";
import { groupOrigins, restrictToFeedstock } from "@/lib/trace/origin-groups";
import { createReplay } from "@/lib/trace/replay";
import { loadTraceSnapshots, saveTraceSnapshots } from "@/lib/trace/snapshot.store";
import { extendSnapshotsOffThread } from "@/lib/trace/snapshot-worker.service";
import type { Replay, ReplaySnapshot } from "@/lib/trace/replay";
import {
  getHolderSubject,
  getLedgerVersion,
  getSourceSubject,
  listEntryHolderFacts,
  listTankServices,
} from "@/lib/trace/trace.store";
import type { EntryHolderFacts, LedgerVersion, TraceSubject } from "@/lib/trace/trace.store";
import { attachCustomers } from "@/lib/trace/customers";
import type { CustomerShare, ShipmentCustomer } from "@/lib/trace/customers";
import { listShipmentCustomers } from "@/lib/shipment/shipment.store";

// ---- query shapes: lib/api/endpoints/trace.ts (shared by the page, the CSV route and the API) ----

// ---- answers -------------------------------------------------------------------------------------

/**
 * CERTIFIED: the lot is marked certified and its source held a certificate valid when the material
 * entered; LOT_ONLY / SOURCE_ONLY: only one of the two; NOT_FEEDSTOCK: reagents and other entries.
 */
export type CertificationStatus = "CERTIFIED" | "LOT_ONLY" | "SOURCE_ONLY" | "NOT_CERTIFIED" | "NOT_FEEDSTOCK";

export const CERTIFICATION_LABELS: Readonly<Record<CertificationStatus, string>> = {
  CERTIFIED: "Certified lot and valid source certificate",
  LOT_ONLY: "Lot marked certified, source without a valid certificate",
  SOURCE_ONLY: "Source certified, lot not marked certified",
  NOT_CERTIFIED: "Not certified",
  NOT_FEEDSTOCK: "Reagent or other (not feedstock)",
};

export interface ContributionRow {
  /** A lot, pickup or source code, a material kind or a certification status. */
  key: string;
  label: string;
  materialKind: string | null;
  /** Pickup and certification rows: the origin's status. */
  certification: CertificationStatus | null;
  /** Lot rows: whether the lot is marked certified. */
  lotCertified: boolean | null;
  /** Source and pickup rows: e.g. "Regional sustainable-waste scheme SC-QM-1003, valid to 2027-02-10". */
  certificate: string | null;
  lotCode: string | null;
  sourceCode: string | null;
  grams: number;
  /** Of the table's total; the grams, not the percents, add up exactly. */
  pct: number;
  origins: number;
}

export interface ContributionTables {
  totalG: number;
  byLot: ContributionRow[];
  byPickup: ContributionRow[];
  bySource: ContributionRow[];
  byMaterial: ContributionRow[];
  byCertification: ContributionRow[];
}

export interface OriginRow {
  /** The movement that booked the material in. */
  originId: number;
  enteredAt: Date;
  entryHolder: HolderRef | null;
  pickupCode: string | null;
  lotCode: string | null;
  sourceCode: string | null;
  sourceName: string | null;
  materialKind: string | null;
  certification: CertificationStatus;
  certificate: string | null;
  grams: number;
  pct: number;
}

export type GraphNodeKind = HolderKind | "SOURCE" | "OTHERS" | "ENTRY";

export interface GraphNode {
  id: string;
  stage: number;
  kind: GraphNodeKind;
  code: string;
  label: string;
  grams: number;
  /** Holders folded into an "others" box. */
  folded: number;
  target: boolean;
}

export interface GraphEdge {
  from: string;
  to: string;
  grams: number;
}

export interface TraceGraph {
  stages: string[];
  nodes: GraphNode[];
  edges: GraphEdge[];
  totalG: number;
  /** Boxes below this share of the total are folded into one "others" box per stage. */
  foldBelowPct: number;
  /** Upstream paths carrying fewer grams than this are not followed further. */
  pruneBelowG: number;
  note: string;
}

export interface LedgerFreshness {
  movements: number;
  lastMoveId: number | null;
  reversedPairsLeftOut: number;
  /** When this server process indexed this ledger version. */
  indexedAt: Date;
  indexMs: number;
  snapshots: number;
  latestSnapshotAt: Date | null;
  order: "dated" | "booked";
  orderProblem: string | null;
  /** Server time for this answer, including the ledger-version check. */
  computeMs: number;
  /** The answer was already computed for this ledger version. */
  fromCache: boolean;
}

export interface BackwardTraceReport {
  query: { kind: BackwardKind; code: string; at: Date | null };
  target: HolderRef;
  /** RECEIVED: everything that went into the holder; STOCK: what a tank held at the time. */
  basis: "RECEIVED" | "STOCK";
  asOf: { moveId: number; at: Date } | null;
  totalG: number;
  all: ContributionTables;
  /** Feedstock only, renormalised over the feedstock grams; reagents are listed separately. */
  feedstock: ContributionTables;
  reagentsG: number;
  /** % of the whole traced quantity. */
  reagents: ContributionRow[];
  /** Material that entered at holders that are neither feedstock nor reagent lots. */
  otherG: number;
  origins: OriginRow[];
  graph: TraceGraph | null;
  freshness: LedgerFreshness;
}

export interface ForwardHolderRow {
  holder: HolderRef;
  stage: number;
  stageLabel: string;
  /** Grams of the traced material that moved into the holder. */
  receivedG: number;
  /** Grams of it the holder still holds (for shipments, disposals and losses: what left the books there). */
  heldG: number;
  firstAt: Date | null;
  /** For a shipment: the customer it went to. */
  customer?: ShipmentCustomer;
}

export interface ForwardTraceReport {
  query: { kind: ForwardKind; code: string };
  subject: { kind: ForwardKind; code: string; label: string };
  origins: number;
  enteredG: number;
  asOf: { moveId: number; at: Date } | null;
  holders: ForwardHolderRow[];
  /** Where the material is now, by stage; adds up to enteredG. */
  heldByStage: Array<{ stage: number; label: string; grams: number; holders: number }>;
  /** Traced grams shipped, per customer (largest first). */
  byCustomer: CustomerShare[];
  movesCarried: number;
  graph: TraceGraph | null;
  freshness: LedgerFreshness;
}

// ---- stages --------------------------------------------------------------------------------------

export const STAGES = [
  "Source",
  "Pickup",
  "Lot or reagent",
  "Feedstock or methanol tank",
  "Batch",
  "Product lot",
  "Product tank",
  "Left the books",
  "Waste container",
] as const;

export function stageOf(ref: HolderRef, tankService: ReadonlyMap<number, string>): number {
  switch (ref.kind) {
    case "PICKUP":
      return 1;
    case "DELIVERY":
    case "LOT":
    case "REAGENT_LOT":
      return 2;
    case "TANK":
      return tankService.get(ref.id) === "PRODUCT" ? 6 : 3;
    case "BATCH":
      return 4;
    case "PRODUCT_LOT":
      return 5;
    case "SHIPMENT":
    case "DISPOSAL":
    case "LOSS":
    case "DIFFERENCE":
      return 7;
    case "WASTE_CONTAINER":
      return 8;
  }
}

const LEFT_BOOKS_LABEL: Partial<Record<HolderKind, string>> = {
  SHIPMENT: "Shipped",
  DISPOSAL: "Hauled away as waste",
  LOSS: "Recorded losses",
  DIFFERENCE: "Unmeasured batch differences",
};

export function stageLabelOf(ref: HolderRef, stage: number): string {
  return (stage === 7 ? LEFT_BOOKS_LABEL[ref.kind] : undefined) ?? STAGES[stage] ?? labelOf(ref.kind);
}

// ---- the per-site ledger cache --------------------------------------------------------------------

export { MAX_SNAPSHOTS } from "@/lib/trace/monthly-snapshots";
/** Answers kept per site and ledger version. */
const MAX_CACHED_ANSWERS = 64;

export interface LedgerState {
  siteId: number;
  version: LedgerVersion;
  ledger: TraceLedger;
  index: LedgerIndex;
  order: "dated" | "booked";
  orderProblem: string | null;
  /** Real booking time of each move (the booked-order index replaces times by ids). */
  realAt: Map<number, number>;
  snapshots: ReplaySnapshot[];
  indexedAt: Date;
  indexMs: number;
  answers: Map<string, Result<unknown>>;
  /** Per holder: what each of its outgoing moves carried, keyed by the holder's incoming move ids. */
  carriedByFeeder: Map<number, Map<number, CompositionParts>>;
  tankService: Map<number, string>;
  /** Lot, pickup, source and reagent facts, read once per ledger version (they are set when the material enters). */
  facts: Promise<Map<number, EntryHolderFacts>> | null;
}

const cacheHome = globalThis as unknown as {
  tracevatTraceCache?: Map<number, Promise<Result<LedgerState>>>;
  tracevatTraceWarming?: Set<number>;
};
const cache: Map<number, Promise<Result<LedgerState>>> = (cacheHome.tracevatTraceCache ??= new Map<
  number,
  Promise<Result<LedgerState>>
>());
/** Sites whose index is being built by warmTraceCache (set before the version query, so two pages start one build). */
const warming: Set<number> = (cacheHome.tracevatTraceWarming ??= new Set());
/** Per site with a save running: the latest snapshots still to store (null: none newer than the running save). */
const unsaved = new Map<number, { order: "dated" | "booked"; snapshots: readonly ReplaySnapshot[] } | null>();

function sameVersion(a: LedgerVersion, b: LedgerVersion): boolean {
  return a.count === b.count && a.lastId === b.lastId;
}

function indexInOrder(ledger: TraceLedger, order: "dated" | "booked"): Result<LedgerIndex> {
  return indexLedger(ledger.holders, order === "dated" ? ledger.moves : ledger.moves.map((m) => ({ ...m, at: m.id })));
}

/** Whether a snapshot still describes a prefix of this index (the check resumeReplay makes, without the copy). */
function snapshotFits(index: LedgerIndex, s: ReplaySnapshot): boolean {
  const { count, massSumG, last } = s.applied;
  if (last === null) return count === 0;
  const pos = index.positionOf.get(last.moveId);
  return pos === count - 1 && index.moves[pos]?.at === last.at && index.massPrefixG[count] === massSumG;
}

// The trace core names holders by id; say which tank or lot that is.
function describeIssues(ledger: TraceLedger, issues: readonly DomainIssue[]): string {
  return issues
    .slice(0, 3)
    .map((i) => i.message.replace(/\.$/, ""))
    .join("; ")
    .replace(/holder (-?\d+)/g, (whole, id: string) => {
      const ref = ledger.refs.get(Number(id));
      return ref ? `${labelOf(ref.kind).toLowerCase()} ${ref.code}` : whole;
    });
}

export function renameIssues(ledger: TraceLedger, issues: readonly DomainIssue[]): DomainIssue[] {
  return issues.map((i) => ({ ...i, message: describeIssues(ledger, [i]) }));
}

async function buildState(
  db: Db,
  siteId: number,
  version: LedgerVersion,
  previous: LedgerState | null,
  now: Date,
): Promise<Result<LedgerState>> {
  const started = performance.now();
  // After a booking, read only what is new (holders and movements are append-only); whole otherwise.
  const read =
    previous === null
      ? loadTraceLedger(db, siteId)
      : extendTraceLedger(db, siteId, previous.ledger, version.count).then((l) => l ?? loadTraceLedger(db, siteId));
  const [ledger, tankService] = await Promise.all([read, listTankServices(db, siteId)]);
  const realAt = new Map(ledger.moves.map((m) => [m.id, m.at]));
  let problem: string | null = null;
  for (const order of ["dated", "booked"] as const) {
    const indexed = indexInOrder(ledger, order);
    if (!indexed.ok) return failMany(renameIssues(ledger, indexed.issues));
    const index = indexed.value;
    // A fresh process resumes from the snapshots stored in the database, if they still fit this ledger.
    const kept =
      previous === null
        ? await loadTraceSnapshots(db, siteId, order)
        : previous.order === order
          ? previous.snapshots
          : [];
    const reusable = kept.filter((s) => snapshotFits(index, s));
    const snapshots = await extendSnapshotsOffThread(index, reusable, realAt);
    if (!snapshots.ok) {
      problem ??= describeIssues(ledger, snapshots.issues);
      continue;
    }
    storeSnapshots(db, siteId, order, snapshots.value);
    return ok({
      siteId,
      version,
      ledger,
      index,
      order,
      orderProblem: problem,
      realAt,
      snapshots: snapshots.value,
      indexedAt: now,
      indexMs: performance.now() - started,
      answers: new Map(),
      carriedByFeeder: new Map(),
      tankService,
      facts: null,
    });
  }
  return fail(
    "TRACE.LEDGER_NOT_REPLAYABLE",
    `The movement ledger cannot be replayed in date order or in booking order: ${problem ?? "unknown reason"}`,
  );
}

/**
 * Stores a site's snapshots in the background, one save per site at a time; a build that finishes while
 * a save runs leaves its list to be saved next. A failed save only costs the next start a replay.
 */
function storeSnapshots(db: Db, siteId: number, order: "dated" | "booked", snapshots: readonly ReplaySnapshot[]): void {
  const running = unsaved.has(siteId);
  unsaved.set(siteId, { order, snapshots });
  if (running) return;
  const next = async (): Promise<void> => {
    for (let job = unsaved.get(siteId); job !== undefined && job !== null; job = unsaved.get(siteId)) {
      unsaved.set(siteId, null);
      await saveTraceSnapshots(db, siteId, job.order, job.snapshots).catch((err: unknown) =>
        log.warn({ err, siteId }, "trace snapshots were not stored"),
      );
    }
    unsaved.delete(siteId);
  };
  savesRunning.add(next());
}

const savesRunning = new Set<Promise<void>>();

/** Resolves once every snapshot save started so far has finished (tests; an orderly shutdown). */
export async function flushTraceSnapshots(): Promise<void> {
  while (savesRunning.size > 0) {
    const running = [...savesRunning];
    await Promise.all(running);
    for (const p of running) savesRunning.delete(p);
  }
}

/** The site's indexed ledger for its current version: reused while no movement is booked. */
export async function requireLedgerState(db: Db, siteId: number, now: Date): Promise<Result<LedgerState>> {
  const version = await getLedgerVersion(db, siteId);
  const pending = cache.get(siteId);
  const current = pending === undefined ? null : await pending;
  if (current?.ok && sameVersion(current.value.version, version)) return current;
  const again = cache.get(siteId);
  if (again !== pending && again !== undefined) {
    const other = await again;
    if (other.ok && sameVersion(other.value.version, version)) return other;
  }
  const next = buildState(db, siteId, version, current?.ok ? current.value : null, now);
  cache.set(siteId, next);
  return next;
}

/** Forgets the cached index of every site (tests, or after a database file is replaced). */
export function clearTraceCache(): void {
  cache.clear();
}

function requireFacts(db: Db, state: LedgerState): Promise<Map<number, EntryHolderFacts>> {
  state.facts ??= listEntryHolderFacts(db, state.siteId);
  return state.facts;
}

function freshnessOf(state: LedgerState, computeMs: number, fromCache: boolean): LedgerFreshness {
  const latest = state.snapshots[state.snapshots.length - 1];
  const latestAt = latest?.applied.last ? state.realAt.get(latest.applied.last.moveId) : undefined;
  return {
    movements: state.version.count,
    lastMoveId: state.version.lastId,
    reversedPairsLeftOut: state.ledger.reversedPairsLeftOut,
    indexedAt: state.indexedAt,
    indexMs: state.indexMs,
    snapshots: state.snapshots.length,
    latestSnapshotAt: latestAt === undefined ? null : new Date(latestAt),
    order: state.order,
    orderProblem: state.orderProblem,
    computeMs,
    fromCache,
  };
}

/** The latest snapshot that has applied at most `count` moves. */
export function snapshotCovering(state: LedgerState, count: number): ReplaySnapshot | undefined {
  let best: ReplaySnapshot | undefined;
  for (const s of state.snapshots) if (s.applied.count <= count) best = s;
  return best;
}

async function answer<T>(
  db: Db,
  siteId: number,
  now: Date,
  key: string,
  compute: (state: LedgerState) => Promise<Result<Omit<T, "freshness">>>,
): Promise<Result<T>> {
  const started = performance.now();
  const stateR = await requireLedgerState(db, siteId, now);
  if (!stateR.ok) return stateR;
  const state = stateR.value;
  const cached = state.answers.get(key) as Result<Omit<T, "freshness">> | undefined;
  const result = cached ?? (await compute(state));
  if (cached === undefined) {
    state.answers.set(key, result);
    if (state.answers.size > MAX_CACHED_ANSWERS) {
      const oldest = state.answers.keys().next().value;
      if (oldest !== undefined) state.answers.delete(oldest);
    }
  }
  if (!result.ok) return result;
  return ok({ ...result.value, freshness: freshnessOf(state, performance.now() - started, cached !== undefined) } as T);
}

function realPosition(
  state: LedgerState,
  pos: { moveId: number; at: number } | null,
): { moveId: number; at: Date } | null {
  return pos === null ? null : { moveId: pos.moveId, at: new Date(state.realAt.get(pos.moveId) ?? pos.at) };
}

// ---- origins: who, what, certified ------------------------------------------------------------------

interface OriginFacts {
  originId: number;
  enteredAt: number;
  entry: EntryHolderFacts | null;
  entryRef: HolderRef | null;
  certification: CertificationStatus;
  certificate: string | null;
  feedstock: boolean;
}

function certificateOf(entry: EntryHolderFacts, enteredAt: number): { valid: boolean; text: string | null } {
  const s = entry.source;
  if (s === null || s.certificateNo === null || s.certificateScheme === null) return { valid: false, text: null };
  const expires = s.certificateExpires;
  const valid = expires === null || expires.getTime() >= enteredAt;
  const until = expires === null ? "" : `, ${valid ? "valid to" : "expired"} ${expires.toISOString().slice(0, 10)}`;
  return { valid, text: `${s.certificateScheme} ${s.certificateNo}${until}` };
}

function describeOrigin(
  state: LedgerState,
  facts: ReadonlyMap<number, EntryHolderFacts>,
  originId: number,
): OriginFacts {
  const pos = state.index.positionOf.get(originId);
  const move = pos === undefined ? undefined : state.index.moves[pos];
  const entryRef = move === undefined ? null : (state.ledger.refs.get(move.toHolderId) ?? null);
  const entry = move === undefined ? null : (facts.get(move.toHolderId) ?? null);
  const enteredAt = state.realAt.get(originId) ?? 0;
  const feedstock = entry !== null && (entry.kind === "PICKUP" || entry.kind === "LOT");
  if (entry === null || !feedstock)
    return {
      originId,
      enteredAt,
      entry,
      entryRef,
      certification: "NOT_FEEDSTOCK",
      certificate: null,
      feedstock: false,
    };
  const cert = certificateOf(entry, enteredAt);
  const lotCertified = entry.lot?.certified ?? false;
  const certification: CertificationStatus = lotCertified
    ? cert.valid
      ? "CERTIFIED"
      : "LOT_ONLY"
    : cert.valid
      ? "SOURCE_ONLY"
      : "NOT_CERTIFIED";
  return { originId, enteredAt, entry, entryRef, certification, certificate: cert.text, feedstock: true };
}

function originRow(o: OriginFacts, grams: number, totalG: number): OriginRow {
  const e = o.entry;
  return {
    originId: o.originId,
    enteredAt: new Date(o.enteredAt),
    entryHolder: o.entryRef,
    pickupCode: e?.pickup?.code ?? null,
    lotCode: e?.lot?.code ?? null,
    sourceCode: e?.source?.code ?? null,
    sourceName: e?.source?.name ?? null,
    materialKind: e?.material ?? null,
    certification: o.certification,
    certificate: o.certificate,
    grams,
    pct: totalG === 0 ? 0 : (grams * 100) / totalG,
  };
}

type RowFacts = Omit<ContributionRow, "key" | "grams" | "pct" | "origins">;
const NO_FACTS: RowFacts = {
  label: "",
  materialKind: null,
  certification: null,
  lotCertified: null,
  certificate: null,
  lotCode: null,
  sourceCode: null,
};

/** Groups a composition with groupOrigins; grams are sums of integer origin grams, so every table adds up to the total. */
function groupRows(
  composition: TraceComposition,
  info: ReadonlyMap<number, OriginFacts>,
  keyOf: (o: OriginFacts) => string,
  describe: (key: string, sample: OriginFacts) => Partial<RowFacts>,
): ContributionRow[] {
  const sample = new Map<string, OriginFacts>();
  const groups = groupOrigins(
    composition,
    () => undefined,
    (_info, originId) => {
      const o = info.get(originId);
      invariant(o !== undefined, `origin ${originId} is described`);
      const key = keyOf(o);
      if (!sample.has(key)) sample.set(key, o);
      return key;
    },
  );
  return groups.map((g) => {
    const key = String(g.key);
    const s = sample.get(key);
    invariant(s !== undefined, `group ${key} has a sample origin`);
    return { key, ...NO_FACTS, ...describe(key, s), grams: g.grams, pct: g.pct, origins: g.originIds.length };
  });
}

function buildTables(composition: TraceComposition, info: ReadonlyMap<number, OriginFacts>): ContributionTables {
  const entryLabel = (o: OriginFacts) =>
    o.entry ? `${labelOf(o.entry.kind)} ${o.entry.code}` : `origin ${o.originId}`;
  return {
    totalG: composition.totalG,
    byLot: groupRows(
      composition,
      info,
      (o) => o.entry?.lot?.code ?? entryLabel(o),
      (key, o) => {
        const lot = o.entry?.lot ?? null;
        return lot === null
          ? {
              label: o.entry?.reagent
                ? `${labelOf(o.entry.reagent.reagent)} (reagent lot)`
                : "Not received as a feedstock lot",
              materialKind: o.entry?.material ?? null,
            }
          : {
              label: `${labelOf(lot.material)}, ${lot.origin === "DELIVERY" ? "delivered" : "from pickups"}`,
              materialKind: lot.material,
              lotCertified: lot.certified,
              lotCode: key,
            };
      },
    ),
    byPickup: groupRows(
      composition,
      info,
      (o) =>
        o.entry?.pickup?.code ??
        (o.entry?.lot
          ? `${o.entry.lot.code}: ${o.entry.lot.origin === "DELIVERY" ? "delivery" : "receiving difference"}`
          : entryLabel(o)),
      (_key, o) => ({
        label: o.entry?.pickup
          ? (o.entry.source?.name ?? "")
          : o.entry?.lot?.origin === "DELIVERY"
            ? `Delivered by ${o.entry.source?.name ?? "a supplier"}`
            : o.entry?.lot
              ? "Measured at the plant above the pickups' estimate"
              : "Not a pickup",
        materialKind: o.entry?.material ?? null,
        certification: o.certification,
        certificate: o.certificate,
        lotCode: o.entry?.lot?.code ?? null,
        sourceCode: o.entry?.source?.code ?? null,
      }),
    ),
    bySource: groupRows(
      composition,
      info,
      (o) => o.entry?.source?.code ?? (o.entry?.lot ? "(receiving difference)" : entryLabel(o)),
      (_key, o) => ({
        label: o.entry?.source
          ? `${o.entry.source.name} (${labelOf(o.entry.source.kind).toLowerCase()})`
          : o.entry?.lot
            ? "Measured surplus at receiving, no source"
            : "Not from a source",
        materialKind: o.entry?.material ?? null,
        certificate: o.certificate,
        sourceCode: o.entry?.source?.code ?? null,
      }),
    ),
    byMaterial: groupRows(
      composition,
      info,
      (o) => o.entry?.material ?? "UNKNOWN",
      (key) => ({ label: labelOf(key), materialKind: key }),
    ),
    byCertification: groupRows(
      composition,
      info,
      (o) => o.certification,
      (key) => ({ label: CERTIFICATION_LABELS[key as CertificationStatus], certification: key as CertificationStatus }),
    ),
  };
}

// ---- backward --------------------------------------------------------------------------------------

/** What is in a product lot, a tank at a time, a shipment or a batch: by lot, pickup, source, material and certification. */
export async function traceBackwardReport(
  db: Db,
  siteId: number,
  input: unknown,
  now: Date,
): Promise<Result<BackwardTraceReport>> {
  const parsed = parseInput(BackwardTraceQuerySchema, input);
  if (!parsed.ok) return parsed;
  const q = parsed.value;
  const subject = await getHolderSubject(db, siteId, q.kind, q.code);
  if (subject === null) return fail("RECORD.NOT_FOUND", `${labelOf(q.kind)} ${q.code} does not exist`, "code");
  const at = q.kind === "TANK" ? (q.at ?? null) : null;
  return answer<BackwardTraceReport>(
    db,
    siteId,
    now,
    `B|${q.kind}|${subject.code}|${at?.getTime() ?? ""}`,
    async (state) => computeBackward(state, subject, q.kind, at, await requireFacts(db, state)),
  );
}

function computeBackward(
  state: LedgerState,
  subject: TraceSubject,
  kind: BackwardKind,
  at: Date | null,
  facts: ReadonlyMap<number, EntryHolderFacts>,
): Result<Omit<BackwardTraceReport, "freshness">> {
  const holderId = subject.holderIds[0];
  invariant(holderId !== undefined, "a holder subject has its holder id");
  const target = state.ledger.refs.get(holderId);
  if (target === undefined)
    return fail("RECORD.NOT_FOUND", `${labelOf(kind)} ${subject.code} is not in this site's ledger`, "code");
  const basis = kind === "TANK" ? "STOCK" : "RECEIVED";
  const atIndex =
    at === null
      ? Number.POSITIVE_INFINITY
      : state.order === "dated"
        ? at.getTime()
        : lastIdAtOrBefore(state, at.getTime());
  const targetPos = findLastPositionAtOrBefore(state.index, atIndex);
  const firstInto = state.index.into.get(holderId)?.[0] ?? Number.POSITIVE_INFINITY;
  // "received" must see every move into the holder: resume only from a snapshot taken before the first.
  const from = snapshotCovering(state, basis === "STOCK" ? targetPos + 1 : Math.min(firstInto, targetPos + 1));
  const traced = traceHolder(state.index, holderId, {
    ...(at === null ? {} : { at: atIndex }),
    ...(from === undefined ? {} : { from }),
  });
  if (!traced.ok) return failMany(renameIssues(state.ledger, traced.issues));
  const t = traced.value;
  const composition = basis === "STOCK" ? t.stock : t.received;
  const info = new Map<number, OriginFacts>();
  for (const o of composition.origins) info.set(o.originId, describeOrigin(state, facts, o.originId));

  const feedstock = restrictToFeedstock(composition, (id) => info.get(id)?.feedstock === true);
  const reagentOrigins = composition.origins.filter((o) => info.get(o.originId)?.entry?.kind === "REAGENT_LOT");
  const reagentsG = reagentOrigins.reduce((s, o) => s + o.grams, 0);
  const reagents = groupRows(
    { totalG: composition.totalG, origins: reagentOrigins },
    info,
    (o) => o.entry?.code ?? String(o.originId),
    (_key, o) => ({
      label: o.entry?.reagent ? `${labelOf(o.entry.reagent.reagent)} from ${o.entry.reagent.supplier}` : "Reagent",
      materialKind: o.entry?.material ?? null,
      certification: "NOT_FEEDSTOCK",
    }),
  );
  return ok({
    query: { kind, code: subject.code, at },
    target,
    basis,
    asOf: realPosition(state, t.asOf),
    totalG: composition.totalG,
    all: buildTables(composition, info),
    feedstock: buildTables(feedstock, info),
    reagentsG,
    reagents,
    otherG: composition.totalG - feedstock.totalG - reagentsG,
    origins: composition.origins.map((o) => {
      const f = info.get(o.originId);
      invariant(f !== undefined, `origin ${o.originId} was described above`);
      return originRow(f, o.grams, composition.totalG);
    }),
    graph: buildBackwardGraph(state, holderId, basis, targetPos, composition.totalG, facts),
  });
}

/** In booking order the index's time is the movement id: the last id booked at or before a real time. */
function lastIdAtOrBefore(state: LedgerState, atMs: number): number {
  let best = 0;
  for (const [id, real] of state.realAt) if (real <= atMs && id > best) best = id;
  return best;
}

// ---- the same traces for record pages --------------------------------------------------------------

/** The cached ledger and index a record page's trace ran on, to name its holders and moves. */
export interface CachedTraceView {
  ledger: TraceLedger;
  index: LedgerIndex;
  order: "dated" | "booked";
  /** Why the date order could not be replayed, when order is "booked". */
  orderProblem: string | null;
}

function receivedFromCache(state: LedgerState, holderId: number): Result<HolderTrace> {
  // "received" must see every move into the holder: resume from a snapshot taken before the first.
  const from = snapshotCovering(state, state.index.into.get(holderId)?.[0] ?? Number.POSITIVE_INFINITY);
  const back = traceHolder(state.index, holderId, from === undefined ? {} : { from });
  return back.ok ? back : failMany(renameIssues(state.ledger, back.issues));
}

/** Forward from a snapshot taken before the first origin entered, so the trace can stop once none of it can move. */
function forwardFromCache(state: LedgerState, originIds: readonly number[]): Result<ForwardTrace> {
  const firstPos = originIds.reduce(
    (m, id) => Math.min(m, state.index.positionOf.get(id) ?? Number.POSITIVE_INFINITY),
    Number.POSITIVE_INFINITY,
  );
  const from = snapshotCovering(state, firstPos);
  const fwd = traceForward(state.index, originIds, from === undefined ? {} : { from });
  return fwd.ok ? fwd : failMany(renameIssues(state.ledger, fwd.issues));
}

/** What one holder (a batch, a product lot, a shipment) received, through the site's cached index and snapshots. */
export async function traceReceived(
  db: Db,
  siteId: number,
  holderId: number,
  now: Date,
): Promise<Result<CachedTraceView & { back: HolderTrace }>> {
  const state = await requireLedgerState(db, siteId, now);
  if (!state.ok) return state;
  const s = state.value;
  const back = receivedFromCache(s, holderId);
  if (!back.ok) return back;
  return ok({ ledger: s.ledger, index: s.index, order: s.order, orderProblem: s.orderProblem, back: back.value });
}

/** A lot's own material (its backward trace) and where it went (forward from its origins), through the cache. */
export async function traceLotMaterial(
  db: Db,
  siteId: number,
  lotHolderId: number,
  now: Date,
): Promise<Result<CachedTraceView & { back: HolderTrace; fwd: ForwardTrace }>> {
  const state = await requireLedgerState(db, siteId, now);
  if (!state.ok) return state;
  const s = state.value;
  const back = receivedFromCache(s, lotHolderId);
  if (!back.ok) return back;
  const fwd = forwardFromCache(
    s,
    back.value.received.origins.map((o) => o.originId),
  );
  if (!fwd.ok) return fwd;
  return ok({
    ledger: s.ledger,
    index: s.index,
    order: s.order,
    orderProblem: s.orderProblem,
    back: back.value,
    fwd: fwd.value,
  });
}

/**
 * Starts building the site's trace index in the background if nothing is cached for it yet, so the
 * first trace after a server start does not wait for the whole-ledger replay. Never throws.
 */
export function warmTraceCache(db: Db, siteId: number, now: Date): void {
  if (cache.has(siteId) || warming.has(siteId)) return;
  warming.add(siteId);
  requireLedgerState(db, siteId, now)
    .then((state) => {
      if (!state.ok) log.warn({ siteId, issues: state.issues }, "the trace index could not be built");
    })
    .catch((err: unknown) => {
      log.error({ err, siteId }, "building the trace index failed");
      cache.delete(siteId);
    })
    .finally(() => warming.delete(siteId));
}

// ---- forward ---------------------------------------------------------------------------------------

/** Where the material of a source, a pickup or a lot went: every holder that received or holds part of it. */
export async function traceForwardReport(
  db: Db,
  siteId: number,
  input: unknown,
  now: Date,
  opts: { withCustomers: boolean } = { withCustomers: true },
): Promise<Result<ForwardTraceReport>> {
  const parsed = parseInput(ForwardTraceQuerySchema, input);
  if (!parsed.ok) return parsed;
  const q = parsed.value;
  const subject =
    q.kind === "SOURCE"
      ? await getSourceSubject(db, siteId, q.code)
      : await getHolderSubject(db, siteId, q.kind, q.code);
  if (subject === null)
    return fail(
      "RECORD.NOT_FOUND",
      `${q.kind === "SOURCE" ? "Source" : labelOf(q.kind)} ${q.code} does not exist`,
      "code",
    );
  const r = await answer<Omit<ForwardTraceReport, "byCustomer">>(
    db,
    siteId,
    now,
    `F|${q.kind}|${subject.code}`,
    async (state) => computeForward(state, subject, q.kind),
  );
  if (!r.ok) return r;
  // Customers are read after the cached answer (a shipment's customer name is fixed when it is recorded),
  // and only for readers who may see customers (the read matrix keeps them from production).
  if (!opts.withCustomers) return ok({ ...r.value, byCustomer: [] });
  const shipments = r.value.holders.filter((h) => h.holder.kind === "SHIPMENT").map((h) => h.holder.id);
  const { rows, byCustomer } = attachCustomers(r.value.holders, await listShipmentCustomers(db, siteId, shipments));
  return ok({ ...r.value, holders: rows, byCustomer });
}

function computeForward(
  state: LedgerState,
  subject: TraceSubject,
  kind: ForwardKind,
): Result<Omit<ForwardTraceReport, "freshness" | "byCustomer">> {
  const { index } = state;
  let originIds: number[];
  if (kind === "LOT") {
    const lotId = subject.holderIds[0];
    invariant(lotId !== undefined, "a lot subject has its holder id");
    const back = receivedFromCache(state, lotId);
    if (!back.ok) return back;
    originIds = back.value.received.origins.map((o) => o.originId);
  } else {
    originIds = findEntryOrigins(index, subject.holderIds);
  }
  const fwd = originIds.length === 0 ? null : forwardFromCache(state, originIds);
  if (fwd !== null && !fwd.ok) return fwd;
  const f = fwd?.value ?? null;
  const firstAt = new Map<number, number>();
  for (const m of f?.moves ?? []) {
    const pos = index.positionOf.get(m.moveId);
    const move = pos === undefined ? undefined : index.moves[pos];
    if (move !== undefined && !firstAt.has(move.toHolderId))
      firstAt.set(move.toHolderId, state.realAt.get(move.id) ?? move.at);
  }
  const holders: ForwardHolderRow[] = (f?.holders ?? []).flatMap((h) => {
    const ref = state.ledger.refs.get(h.holderId);
    if (ref === undefined) return [];
    const stage = stageOf(ref, state.tankService);
    const first = firstAt.get(h.holderId);
    return [
      {
        holder: ref,
        stage,
        stageLabel: stageLabelOf(ref, stage),
        receivedG: h.receivedG,
        heldG: h.heldG,
        firstAt: first === undefined ? null : new Date(first),
      },
    ];
  });
  holders.sort(
    (a, b) =>
      a.stage - b.stage ||
      (a.firstAt?.getTime() ?? 0) - (b.firstAt?.getTime() ?? 0) ||
      a.holder.code.localeCompare(b.holder.code),
  );
  const byStage = new Map<string, { stage: number; label: string; grams: number; holders: number }>();
  for (const h of holders) {
    if (h.heldG === 0) continue;
    const row = byStage.get(h.stageLabel) ?? { stage: h.stage, label: h.stageLabel, grams: 0, holders: 0 };
    row.grams += h.heldG;
    row.holders += 1;
    byStage.set(h.stageLabel, row);
  }
  return ok({
    query: { kind, code: subject.code },
    subject: { kind, code: subject.code, label: subject.label },
    origins: originIds.length,
    enteredG: f?.enteredG ?? 0,
    asOf: realPosition(state, f?.asOf ?? null),
    holders,
    heldByStage: [...byStage.values()].sort((a, b) => a.stage - b.stage || a.label.localeCompare(b.label)),
    movesCarried: f?.moves.length ?? 0,
    graph: f === null ? null : buildForwardGraph(state, subject, kind, f.moves, f.enteredG),
  });
}

// ---- graphs ----------------------------------------------------------------------------------------

/** Boxes below this share of the traced total are folded into one "others" box per stage. */
export const GRAPH_FOLD_BELOW_PCT = 1;
/** At most this many boxes per stage; the rest are folded. */
export const GRAPH_MAX_PER_STAGE = 9;
/** Backward graphs do not follow upstream paths carrying less than this share of the target. */
const GRAPH_PRUNE_BELOW_PCT = 0.2;

interface RawGraph {
  nodes: Map<string, { stage: number; kind: GraphNodeKind; code: string; label: string; target: boolean }>;
  edges: Map<string, GraphEdge>;
}

function addEdge(g: RawGraph, from: string, to: string, grams: number): void {
  if (grams <= 0 || from === to) return;
  const key = `${from}>${to}`;
  const e = g.edges.get(key);
  if (e === undefined) g.edges.set(key, { from, to, grams });
  else e.grams += grams;
}

function holderNode(g: RawGraph, state: LedgerState, holderId: number, target = false): string {
  const id = `h${holderId}`;
  if (!g.nodes.has(id)) {
    const ref = state.ledger.refs.get(holderId);
    g.nodes.set(id, {
      stage: ref === undefined ? 7 : stageOf(ref, state.tankService),
      kind: ref?.kind ?? "LOSS",
      code: ref?.code ?? String(holderId),
      label: ref ? labelOf(ref.kind) : "Holder",
      target,
    });
  }
  return id;
}

function sourceNode(g: RawGraph, code: string, name: string, target = false): string {
  const id = `s${code}`;
  if (!g.nodes.has(id)) g.nodes.set(id, { stage: 0, kind: "SOURCE", code, label: name, target });
  return id;
}

function entryNode(g: RawGraph, id: string, stage: number, label: string): string {
  if (!g.nodes.has(id)) g.nodes.set(id, { stage, kind: "ENTRY", code: "", label, target: false });
  return id;
}

/** A holder replayed alone under its own mixing model, its incoming moves standing in for origins. */
function replayAlone(
  state: LedgerState,
  holderId: number,
  lastPos: number,
  onOut: (moveId: number, parts: CompositionParts) => void,
): Replay {
  const { index } = state;
  const holder = index.holders.get(holderId);
  invariant(holder !== undefined, `holder ${holderId} is indexed`);
  const sink = -1;
  const replay = createReplay(
    new Map<number, TraceHolder>([
      [holderId, holder],
      [sink, { id: sink, kind: "LOSS", mixing: "MIXED" }],
    ]),
  );
  const positions = [...(index.into.get(holderId) ?? []), ...(index.outOf.get(holderId) ?? [])]
    .filter((p) => p <= lastPos)
    .sort((a, b) => a - b);
  for (const pos of positions) {
    const m = index.moves[pos];
    if (m === undefined) continue;
    const local: TraceMove = m.toHolderId === holderId ? { ...m, fromHolderId: null } : { ...m, toHolderId: sink };
    const applied = replay.apply(local);
    if (!applied.ok) break;
    if (m.fromHolderId === holderId) onOut(m.id, applied.value);
  }
  return replay;
}

/** What each move out of a holder carried, keyed by the holder's incoming moves; computed once per holder and version. */
function carriedByFeeder(state: LedgerState, holderId: number): Map<number, CompositionParts> {
  const cached = state.carriedByFeeder.get(holderId);
  if (cached !== undefined) return cached;
  const out = new Map<number, CompositionParts>();
  replayAlone(state, holderId, Number.POSITIVE_INFINITY, (moveId, parts) => out.set(moveId, parts));
  state.carriedByFeeder.set(holderId, out);
  return out;
}

/** Ledger positions, largest first: a move is split only after every later move has handed it its share. */
class MaxHeap {
  private readonly items: number[] = [];

  push(v: number): void {
    const a = this.items;
    a.push(v);
    let i = a.length - 1;
    while (i > 0) {
      const parent = (i - 1) >> 1;
      const pv = a[parent] ?? Number.POSITIVE_INFINITY;
      if (pv >= v) break;
      a[i] = pv;
      a[parent] = v;
      i = parent;
    }
  }

  pop(): number | undefined {
    const a = this.items;
    const top = a[0];
    const last = a.pop();
    if (a.length === 0 || last === undefined) return top;
    a[0] = last;
    let i = 0;
    for (;;) {
      const l = 2 * i + 1;
      const r = l + 1;
      let m = i;
      if (l < a.length && (a[l] ?? 0) > (a[m] ?? 0)) m = l;
      if (r < a.length && (a[r] ?? 0) > (a[m] ?? 0)) m = r;
      if (m === i) break;
      const tmp = a[i] ?? 0;
      a[i] = a[m] ?? 0;
      a[m] = tmp;
      i = m;
    }
    return top;
  }
}

/**
 * The traced material apportioned back along every step: a move's share of the target is split over
 * what that move carried from each feeder of its holder (allocateByWeight, whole grams). Moves are
 * settled latest first, so each is split once with everything downstream of it already added up.
 */
function buildBackwardGraph(
  state: LedgerState,
  holderId: number,
  basis: "RECEIVED" | "STOCK",
  targetPos: number,
  totalG: number,
  facts: ReadonlyMap<number, EntryHolderFacts>,
): TraceGraph | null {
  if (totalG === 0) return null;
  const { index } = state;
  const g: RawGraph = { nodes: new Map(), edges: new Map() };
  holderNode(g, state, holderId, true);
  const pruneBelowG = Math.max(1, Math.round((totalG * GRAPH_PRUNE_BELOW_PCT) / 100));
  /** Grams of the target carried by each move still to settle, by ledger position. */
  const pending = new Map<number, number>();
  const heap = new MaxHeap();
  const feed = (moveIds: readonly number[], grams: readonly number[]) => {
    moveIds.forEach((moveId, i) => {
      const pos = index.positionOf.get(moveId);
      const g0 = grams[i] ?? 0;
      if (pos === undefined || g0 <= 0) return;
      if (!pending.has(pos)) heap.push(pos);
      pending.set(pos, (pending.get(pos) ?? 0) + g0);
    });
  };
  if (basis === "STOCK") {
    const stock = replayAlone(state, holderId, targetPos, () => undefined).getComposition(holderId);
    feed(stock.originIds, stock.grams);
  } else {
    const positions = (index.into.get(holderId) ?? []).filter((p) => p <= targetPos);
    feed(
      positions.map((p) => index.moves[p]?.id ?? 0),
      positions.map((p) => index.moves[p]?.massG ?? 0),
    );
  }
  for (let pos = heap.pop(); pos !== undefined; pos = heap.pop()) {
    const grams = pending.get(pos) ?? 0;
    pending.delete(pos);
    const move = index.moves[pos];
    if (move === undefined) continue;
    const to = holderNode(g, state, move.toHolderId, move.toHolderId === holderId);
    if (move.fromHolderId === null) {
      // An entry into a lot: a delivery from its supplier, or a receiving surplus. Reagent lots are leaves.
      const entry = facts.get(move.toHolderId);
      if (entry?.kind === "REAGENT_LOT") continue;
      if (entry?.lot?.origin === "DELIVERY" && entry.source !== null)
        addEdge(g, sourceNode(g, entry.source.code, entry.source.name), to, grams);
      else addEdge(g, entryNode(g, "e-surplus", 0, "Receiving difference"), to, grams);
      continue;
    }
    // A pickup is drawn as its source's arrow into the lot: a plant has thousands of pickups.
    const pickup = facts.get(move.fromHolderId);
    if (pickup?.kind === "PICKUP" && pickup.source !== null) {
      addEdge(g, sourceNode(g, pickup.source.code, pickup.source.name), to, grams);
      continue;
    }
    addEdge(g, holderNode(g, state, move.fromHolderId), to, grams);
    if (grams < pruneBelowG) continue;
    const carried = carriedByFeeder(state, move.fromHolderId).get(move.id);
    if (carried === undefined || sumParts(carried) === 0) continue;
    const split = allocateByWeight(
      grams,
      carried.originIds.map((id, i) => [id, carried.grams[i] ?? 0] as const),
    );
    feed(
      split.map(([id]) => id),
      split.map(([, part]) => part),
    );
  }
  return foldGraph(
    g,
    totalG,
    "Each arrow carries the traced material apportioned back over each step (whole grams); arrows below the prune limit are not followed further upstream. The tables are the exact trace by origin; graph and tables can differ by a few grams of rounding.",
    pruneBelowG,
  );
}

function buildForwardGraph(
  state: LedgerState,
  subject: TraceSubject,
  kind: ForwardKind,
  moves: ReadonlyArray<{ moveId: number; grams: number }>,
  enteredG: number,
): TraceGraph | null {
  if (enteredG === 0) return null;
  const { index } = state;
  const g: RawGraph = { nodes: new Map(), edges: new Map() };
  const subjectIds = new Set(subject.holderIds);
  // A source's pickups are drawn as the source itself; a lot's pickups as one intake box.
  const nodeOf = (holderId: number): string => {
    const ref = state.ledger.refs.get(holderId);
    if (kind === "SOURCE" && subjectIds.has(holderId) && ref?.kind === "PICKUP")
      return sourceNode(g, subject.code, subject.label.slice(subject.code.length + 1) || "Source", true);
    if (kind === "LOT" && ref?.kind === "PICKUP") return entryNode(g, "e-pickups", 1, "Pickups");
    return holderNode(g, state, holderId, subjectIds.has(holderId));
  };
  for (const m of moves) {
    const pos = index.positionOf.get(m.moveId);
    const move = pos === undefined ? undefined : index.moves[pos];
    if (move === undefined || move.fromHolderId === null) continue;
    addEdge(g, nodeOf(move.fromHolderId), nodeOf(move.toHolderId), m.grams);
  }
  return foldGraph(
    g,
    enteredG,
    "Each arrow carries the traced material along one step, exactly as the forward trace attributes it (whole grams).",
    0,
  );
}

/** Box weights from the arrows; per stage the largest boxes are kept and the rest folded into one "others" box. */
function foldGraph(g: RawGraph, totalG: number, note: string, pruneBelowG: number): TraceGraph {
  const inflow = new Map<string, number>();
  const outflow = new Map<string, number>();
  for (const e of g.edges.values()) {
    inflow.set(e.to, (inflow.get(e.to) ?? 0) + e.grams);
    outflow.set(e.from, (outflow.get(e.from) ?? 0) + e.grams);
  }
  const weight = (id: string) => Math.max(inflow.get(id) ?? 0, outflow.get(id) ?? 0);
  const keepAtLeast = (totalG * GRAPH_FOLD_BELOW_PCT) / 100;
  const byStage = new Map<number, string[]>();
  for (const [id, n] of g.nodes) byStage.set(n.stage, [...(byStage.get(n.stage) ?? []), id]);
  const rename = new Map<string, string>();
  const nodes: GraphNode[] = [];
  for (const [stage, ids] of [...byStage].sort((a, b) => a[0] - b[0])) {
    ids.sort((a, b) => weight(b) - weight(a) || a.localeCompare(b));
    const kept: string[] = [];
    const folded: string[] = [];
    for (const id of ids) {
      const n = g.nodes.get(id);
      if (weight(id) === 0 && !n?.target) continue;
      if (n?.target || (weight(id) >= keepAtLeast && kept.length < GRAPH_MAX_PER_STAGE)) kept.push(id);
      else folded.push(id);
    }
    if (folded.length === 1) kept.push(...folded.splice(0));
    for (const id of kept) {
      const n = g.nodes.get(id);
      if (n)
        nodes.push({
          id,
          stage,
          kind: n.kind,
          code: n.code,
          label: n.label,
          grams: weight(id),
          folded: 0,
          target: n.target,
        });
    }
    if (folded.length > 1) {
      const id = `o${stage}`;
      for (const f of folded) rename.set(f, id);
      nodes.push({
        id,
        stage,
        kind: "OTHERS",
        code: "",
        label: `${folded.length} others`,
        grams: folded.reduce((s, f) => s + weight(f), 0),
        folded: folded.length,
        target: false,
      });
    }
  }
  const edges = new Map<string, GraphEdge>();
  for (const e of g.edges.values()) {
    const from = rename.get(e.from) ?? e.from;
    const to = rename.get(e.to) ?? e.to;
    if (from === to) continue;
    const key = `${from}>${to}`;
    const x = edges.get(key);
    if (x === undefined) edges.set(key, { from, to, grams: e.grams });
    else x.grams += e.grams;
  }
  return {
    stages: [...STAGES],
    nodes,
    edges: [...edges.values()].sort((a, b) => b.grams - a.grams),
    totalG,
    foldBelowPct: GRAPH_FOLD_BELOW_PCT,
    pruneBelowG,
    note,
  };
}

// ---- compositions for other features ----------------------------------------------------------------

export interface MoveCompositions {
  /** What each requested move carried, by origin (entry movement id). */
  carried: Map<number, CompositionParts>;
  freshness: LedgerFreshness;
}

/**
 * What the given moves carried, by origin, from one forward replay of the cached index (the chain of
 * custody uses it for the certified share of the oil charged to each batch). Reversed pairs are not in
 * the trace ledger, so a reversed move is absent from the answer.
 */
export async function getMoveCompositions(
  db: Db,
  siteId: number,
  moveIds: readonly number[],
  now: Date,
): Promise<Result<MoveCompositions>> {
  const wanted = [...new Set(moveIds)].sort((a, b) => a - b);
  return answer<MoveCompositions>(db, siteId, now, `M|${wanted.length}|${wanted.join(",")}`, async (state) => {
    const { index } = state;
    const positions = wanted.map((id) => index.positionOf.get(id)).filter((p): p is number => p !== undefined);
    const carried = new Map<number, CompositionParts>();
    const firstPos = positions.length === 0 ? index.moves.length : Math.min(...positions);
    const lastPos = positions.length === 0 ? -1 : Math.max(...positions);
    const from = snapshotCovering(state, firstPos);
    let replay: Replay = createReplay(index.holders);
    if (from !== undefined) {
      const resumed = resumeReplay(index, from);
      if (!resumed.ok) return resumed;
      replay = resumed.value;
    }
    const want = new Set(wanted);
    for (let pos = replay.appliedCount; pos <= lastPos; pos++) {
      const move = index.moves[pos];
      if (move === undefined) break;
      const applied = replay.apply(move);
      if (!applied.ok) return failMany(renameIssues(state.ledger, applied.issues));
      if (want.has(move.id))
        carried.set(move.id, { originIds: [...applied.value.originIds], grams: [...applied.value.grams] });
    }
    return ok({ carried });
  });
}
