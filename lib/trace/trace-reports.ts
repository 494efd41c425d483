// The backward and forward trace answers computed on a site's ledger state: the contribution tables,
// the holders reached and the stage graph (everything but the freshness the cache adds).
import { fail, failMany, invariant, ok } from "@/lib/core/result";
import type { Result } from "@/lib/core/result";
import { labelOf } from "@/lib/core/vocabulary";
import { buildTables, describeOrigin, groupRows, originRow } from "@/lib/trace/contribution-tables";
import type { OriginFacts } from "@/lib/trace/contribution-tables";
import { findEntryOrigins, traceHolder } from "@/lib/trace/genealogy";
import { findLastPositionAtOrBefore } from "@/lib/ledger/moves";
import {
  forwardFromCache,
  lastIdAtOrBefore,
  realPosition,
  receivedFromCache,
  renameIssues,
  snapshotCovering,
} from "@/lib/trace/ledger-state";
import type { LedgerState } from "@/lib/trace/ledger-state";
import { restrictToFeedstock } from "@/lib/trace/origin-groups";
import { stageLabelOf, stageOf } from "@/lib/trace/trace-answers";
import type { BackwardTraceReport, ForwardHolderRow, ForwardTraceReport } from "@/lib/trace/trace-answers";
import { buildBackwardGraph, buildForwardGraph } from "@/lib/trace/trace-graph";
import type { BackwardKind, ForwardKind } from "@/lib/trace/trace-query.schema";
import type { EntryHolderFacts, TraceSubject } from "@/lib/trace/trace-facts";

export function computeBackward(
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

export function computeForward(
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
