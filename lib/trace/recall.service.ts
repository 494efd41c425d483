import "server-only";
// Recall answers: from a source (pickups observed within a window), a pickup, a lot, a tank (what moved
// into it within a window), a batch or a product lot, every product lot, shipment and customer the
// material reached, with grams and share, and what is still on site to hold. Runs on the site's cached
// trace index (lib/trace/trace-cache.service) and its monthly snapshots; the seeding is lib/trace/recall.ts.
import type { Db } from "@/lib/core/connect";
import { fail, failMany, ok } from "@/lib/core/result";
import type { Result } from "@/lib/core/result";
import { labelOf } from "@/lib/core/vocabulary";
import { parseInput } from "@/lib/ledger/parse";
import { runInTransaction } from "@/lib/ledger/transaction.store";
import { applyProductDecision } from "@/lib/product/product.service";
import { listProductLotStandings } from "@/lib/product/product.store";
import { listShipmentCustomers } from "@/lib/shipment/shipment.store";
import type { Actor } from "@/lib/core/actor";
import type { ShipmentCustomer } from "@/lib/trace/customers";
import { traceForward } from "@/lib/trace/genealogy";
import { findSeedMoves, groupCustomers, seedLedger, shareOf } from "@/lib/trace/recall";
import type { RecallHolderRow, RecallReport } from "@/lib/trace/recall";
import { RecallHoldSchema, RecallQuerySchema } from "@/lib/trace/recall.schema";
import type { RecallKind } from "@/lib/trace/recall.schema";
import { getHolderSubject, getSourceSubject } from "@/lib/trace/trace.store";
import { renameIssues, snapshotCovering } from "@/lib/trace/ledger-state";
import type { LedgerState } from "@/lib/trace/ledger-state";
import { stageLabelOf, stageOf } from "@/lib/trace/trace-answers";
import { requireLedgerState, withSnapshotBodies } from "@/lib/trace/trace-cache.service";

const LEFT_THE_BOOKS = new Set(["SHIPMENT", "DISPOSAL", "LOSS"]);

async function resolveSubject(db: Db, siteId: number, kind: RecallKind, code: string) {
  return kind === "SOURCE" ? getSourceSubject(db, siteId, code) : getHolderSubject(db, siteId, kind, code);
}

/** The rows a recall reached, with each product lot's standing and, for readers who may see them, each shipment's customer. */
async function describeReached(db: Db, siteId: number, rows: readonly FlowRow[], withCustomers: boolean) {
  const ids = rows.map((r) => r.holder.id);
  const [standings, customers] = await Promise.all([
    listProductLotStandings(
      db,
      siteId,
      ids.filter((_, i) => rows[i]?.holder.kind === "PRODUCT_LOT"),
    ),
    withCustomers
      ? listShipmentCustomers(
          db,
          siteId,
          ids.filter((_, i) => rows[i]?.holder.kind === "SHIPMENT"),
        )
      : Promise.resolve(new Map<number, ShipmentCustomer>()),
  ]);
  const holders = rows.map((r) => {
    const s = standings.get(r.holder.id);
    return {
      ...r,
      customer: customers.get(r.holder.id) ?? null,
      standing: s ? { status: s.status, reason: s.decisionReason } : null,
    };
  });
  return { holders, customers };
}

/** Where the material went; customers only for readers who may see them (not production). */
export async function recallReport(
  db: Db,
  siteId: number,
  input: unknown,
  now: Date,
  opts: { withCustomers: boolean },
): Promise<Result<RecallReport>> {
  const parsed = parseInput(RecallQuerySchema, input);
  if (!parsed.ok) return parsed;
  const q = parsed.value;
  const subject = await resolveSubject(db, siteId, q.kind, q.code);
  if (subject === null)
    return fail(
      "RECORD.NOT_FOUND",
      `${q.kind === "SOURCE" ? "Source" : labelOf(q.kind)} ${q.code} does not exist`,
      "code",
    );
  const stateR = await requireLedgerState(db, siteId, now);
  if (!stateR.ok) return stateR;
  const state = stateR.value;
  const flow = await withSnapshotBodies(db, () =>
    followSeeds(state, subject.holderIds, q.from?.getTime() ?? null, q.to?.getTime() ?? null),
  );
  if (!flow.ok) return flow;
  const { holders, customers } = await describeReached(db, siteId, flow.value.rows, opts.withCustomers);
  const tracedG = flow.value.tracedG;
  const shipments = holders.filter((h) => h.holder.kind === "SHIPMENT");
  const onSite = holders.filter((h) => h.heldG > 0 && !LEFT_THE_BOOKS.has(h.holder.kind));
  const byCustomer = groupCustomers(
    shipments.map((s) => ({
      holderId: s.holder.id,
      grams: s.heldG,
      firstAt: s.firstAt?.getTime() ?? 0,
      lastAt: s.lastAt?.getTime() ?? 0,
    })),
    customers,
  );
  return ok({
    query: { kind: q.kind, code: subject.code, from: q.from ?? null, to: q.to ?? null },
    subject: { kind: q.kind, code: subject.code, label: subject.label },
    seedMoves: flow.value.seedMoves,
    tracedG,
    asOf: flow.value.asOf,
    ledger: { movements: state.version.count, lastMoveId: state.version.lastId },
    holders,
    productLots: holders.filter((h) => h.holder.kind === "PRODUCT_LOT"),
    shipments,
    customers: byCustomer.map((c) => ({
      customer: c.customer,
      grams: c.grams,
      pct: shareOf(c.grams, tracedG),
      shipments: c.shipments,
      firstAt: new Date(c.firstAt),
      lastAt: new Date(c.lastAt),
    })),
    onSite,
    toHold: onSite
      .filter((h) => h.holder.kind === "PRODUCT_LOT" && h.standing !== null && h.standing.status !== "REJECTED")
      .map((h) => h.holder.code),
    shippedG: shipments.reduce((s, h) => s + h.heldG, 0),
    onSiteG: onSite.reduce((s, h) => s + h.heldG, 0),
  });
}

type FlowRow = Omit<RecallHolderRow, "customer" | "standing">;

function followSeeds(
  state: LedgerState,
  holderIds: readonly number[],
  from: number | null,
  to: number | null,
): Result<{ rows: FlowRow[]; tracedG: number; seedMoves: number; asOf: { moveId: number; at: Date } | null }> {
  const realAt = (id: number) => state.realAt.get(id) ?? 0;
  const seeds = findSeedMoves(state.index, holderIds, { from, to, realAt });
  if (seeds.length === 0) return ok({ rows: [], tracedG: 0, seedMoves: 0, asOf: null });
  const seeded = seedLedger(state.index, seeds);
  if (!seeded.ok) return failMany(renameIssues(state.ledger, seeded.issues));
  const { index, originIds, seedOf } = seeded.value;
  const snapshot = snapshotCovering(state, seeded.value.firstPosition);
  const fwd = traceForward(index, originIds, snapshot === undefined ? {} : { from: snapshot });
  if (!fwd.ok) return failMany(renameIssues(state.ledger, fwd.issues));
  const f = fwd.value;
  const span = new Map<number, { first: number; last: number }>();
  for (const m of f.moves) {
    const pos = index.positionOf.get(m.moveId);
    const move = pos === undefined ? undefined : index.moves[pos];
    if (move === undefined) continue;
    const at = realAt(seedOf.get(move.id) ?? move.id);
    const s = span.get(move.toHolderId);
    span.set(
      move.toHolderId,
      s === undefined ? { first: at, last: at } : { first: Math.min(s.first, at), last: Math.max(s.last, at) },
    );
  }
  const rows: FlowRow[] = f.holders.flatMap((h) => {
    const ref = state.ledger.refs.get(h.holderId);
    if (ref === undefined) return [];
    const stage = stageOf(ref, state.tankService);
    const s = span.get(h.holderId);
    return [
      {
        holder: ref,
        stage,
        stageLabel: stageLabelOf(ref, stage),
        receivedG: h.receivedG,
        heldG: h.heldG,
        pct: shareOf(h.receivedG, f.enteredG),
        firstAt: s ? new Date(s.first) : null,
        lastAt: s ? new Date(s.last) : null,
      },
    ];
  });
  rows.sort(
    (a, b) =>
      a.stage - b.stage ||
      (a.firstAt?.getTime() ?? 0) - (b.firstAt?.getTime() ?? 0) ||
      a.holder.code.localeCompare(b.holder.code),
  );
  const last =
    f.asOf === null
      ? null
      : {
          moveId: seedOf.get(f.asOf.moveId) ?? f.asOf.moveId,
          at: new Date(realAt(seedOf.get(f.asOf.moveId) ?? f.asOf.moveId)),
        };
  return ok({ rows, tracedG: f.enteredG, seedMoves: seeds.length, asOf: last });
}

/**
 * Puts every product lot on site that the recall reaches on hold with the reason (compliance, checked
 * by the caller), through the product lots' own hold decision: each is audited, and all are held in one
 * transaction or none.
 */
export async function holdRecalledProductLots(
  db: Db,
  actor: Actor,
  input: unknown,
): Promise<Result<{ held: string[] }>> {
  const parsed = parseInput(RecallHoldSchema, input);
  if (!parsed.ok) return parsed;
  const { reason, ...query } = parsed.value;
  const r = await recallReport(db, actor.siteId, query, actor.now, { withCustomers: false });
  if (!r.ok) return r;
  const lots = r.value.toHold;
  if (lots.length === 0)
    return fail(
      "RECALL.NOTHING_TO_HOLD",
      "No product lot on site holds any of this material; nothing to put on hold",
      "reason",
    );
  return runInTransaction(db, async (tx) => {
    for (const code of lots) await applyProductDecision(tx, actor, { productLotCode: code, decision: "HOLD", reason });
    return { held: lots };
  });
}
