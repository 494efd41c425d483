// The stage graph of a trace: boxes per stage joined by arrows carrying whole grams, the backward one
// apportioned back over every step, the forward one as the trace attributes it; small boxes folded.
import { invariant } from "@/lib/core/result";
import { labelOf } from "@/lib/core/vocabulary";
import { allocateByWeight } from "@/lib/quantity/allocate";
import { sumParts } from "@/lib/trace/composition";
import type { CompositionParts } from "@/lib/trace/composition";
import type { TraceHolder, TraceMove } from "@/lib/ledger/moves";
import type { LedgerState } from "@/lib/trace/ledger-state";
import { createReplay } from "@/lib/trace/replay";
import type { Replay } from "@/lib/trace/replay";
import { STAGES, stageOf } from "@/lib/trace/trace-answers";
import type { GraphEdge, GraphNode, GraphNodeKind, TraceGraph } from "@/lib/trace/trace-answers";
import type { ForwardKind } from "@/lib/trace/trace-query.schema";
import type { EntryHolderFacts, TraceSubject } from "@/lib/trace/trace-facts";

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
export function replayAlone(
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
export function buildBackwardGraph(
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

export function buildForwardGraph(
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
export function foldGraph(g: RawGraph, totalG: number, note: string, pruneBelowG: number): TraceGraph {
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
