import "server-only";
// Traceability answers for the pages and the JSON API: backward ("what is in this product lot, tank,
// shipment or batch?") and forward ("where did this source, pickup or lot go?"), by lot, pickup,
// source, material kind and certification, with a stage graph.
//
// Cost: a cold backward trace replays the target's ancestor subgraph (≈ the whole ledger once tanks
// pool); a forward trace replays from before the origins entered until none of them can move again.
// The per-site index, snapshots and answers are kept by trace-cache.service.ts; the answers are
// computed by trace-reports.ts (rows: contribution-tables.ts; graph: trace-graph.ts).
import { BackwardTraceQuerySchema, ForwardTraceQuerySchema } from "@/lib/trace/trace-query.schema";
import type { Db } from "@/lib/core/connect";
import { fail, ok } from "@/lib/core/result";
import type { Result } from "@/lib/core/result";
import { labelOf } from "@/lib/core/vocabulary";
import type { TraceLedger } from "@/lib/ledger/holder-ref";
import { parseInput } from "@/lib/ledger/parse";
import type { CompositionParts } from "@/lib/trace/composition";
import type { ForwardTrace, HolderTrace } from "@/lib/trace/genealogy";
import type { LedgerIndex } from "@/lib/ledger/moves";
import { forwardFromCache, moveCompositions, receivedFromCache } from "@/lib/trace/ledger-state";
import type { BackwardTraceReport, ForwardTraceReport, LedgerFreshness } from "@/lib/trace/trace-answers";
import { answer, requireFacts, requireLedgerState, withSnapshotBodies } from "@/lib/trace/trace-cache.service";
import { computeBackward, computeForward } from "@/lib/trace/trace-reports";
import { getHolderSubject, getSourceSubject, listEntryHolderFacts } from "@/lib/trace/trace.store";
import type { EntryHolderFacts } from "@/lib/trace/trace-facts";
import { attachCustomers } from "@/lib/trace/customers";
import { listShipmentCustomers } from "@/lib/shipment/shipment.store";

export * from "@/lib/trace/trace-answers";
export type { LedgerState } from "@/lib/trace/ledger-state";
export { MAX_SNAPSHOTS, renameIssues, snapshotCovering } from "@/lib/trace/ledger-state";
export { GRAPH_FOLD_BELOW_PCT, GRAPH_MAX_PER_STAGE } from "@/lib/trace/trace-graph";
export {
  clearTraceCache,
  flushTraceSnapshots,
  requireLedgerState,
  warmTraceCache,
} from "@/lib/trace/trace-cache.service";

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

// ---- the same traces for record pages --------------------------------------------------------------

/** The cached ledger and index a record page's trace ran on, to name its holders and moves. */
export interface CachedTraceView {
  ledger: TraceLedger;
  index: LedgerIndex;
  order: "dated" | "booked";
  /** Why the date order could not be replayed, when order is "booked". */
  orderProblem: string | null;
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
  const back = await withSnapshotBodies(db, () => receivedFromCache(s, holderId));
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
  const back = await withSnapshotBodies(db, () => receivedFromCache(s, lotHolderId));
  if (!back.ok) return back;
  const originIds = back.value.received.origins.map((o) => o.originId);
  const fwd = await withSnapshotBodies(db, () => forwardFromCache(s, originIds));
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
  return answer<MoveCompositions>(db, siteId, now, `M|${wanted.length}|${wanted.join(",")}`, async (state) =>
    moveCompositions(state, wanted),
  );
}

/** What is known about every holder material enters the books at (pickups, delivered lots, reagent lots), by holder id. */
export function getEntryHolderFacts(db: Db, siteId: number): Promise<Map<number, EntryHolderFacts>> {
  return listEntryHolderFacts(db, siteId);
}
