import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { getOriginGrams } from "@/lib/trace/composition";
import type { CompositionParts } from "@/lib/trace/composition";
import { getCycleThrough } from "@/lib/ledger/cycle";
import {
  describeComposition,
  replayLedger,
  resumeReplay,
  traceForward,
  traceHolder,
  traceMove,
} from "@/lib/trace/genealogy";
import type { TraceComposition } from "@/lib/trace/genealogy";
import { ReplaySnapshotSchema } from "@/lib/trace/genealogy.schema";
import { compareMoves, indexLedger, mapHolders } from "@/lib/ledger/moves";
import type { LedgerIndex, TraceHolder, TraceMove } from "@/lib/ledger/moves";
import { createReplay } from "@/lib/trace/replay";
import { emptiedBeforeRefillArb, historyArb } from "./arbitraries";
import type { History } from "./arbitraries";

// Our own consistency checks (invariants of the trace model); no external source is needed for
// conservation of mass. The regulatory frame they serve: mass-balance chain of custody, where the
// sum withdrawn carries the same characteristics, in the same quantities, as the sum added
// (RED 2009/28 Art. 18(1)(a)–(c)).

const RUNS = { numRuns: 200 };

function requireIndex(holders: readonly TraceHolder[], moves: readonly TraceMove[]): LedgerIndex {
  const index = indexLedger(holders, moves);
  if (!index.ok) throw new Error(JSON.stringify(index.issues));
  return index.value;
}

/** Σ in − Σ out per holder from the raw moves, independent of the replay. */
function plainStock(
  moves: readonly TraceMove[],
  upTo = Number.POSITIVE_INFINITY,
): Map<number, { stock: number; received: number }> {
  const out = new Map<number, { stock: number; received: number }>();
  const get = (h: number) => out.get(h) ?? out.set(h, { stock: 0, received: 0 }).get(h) ?? { stock: 0, received: 0 };
  for (const m of moves) {
    if (m.at > upTo) continue;
    const to = get(m.toHolderId);
    to.stock += m.massG;
    to.received += m.massG;
    if (m.fromHolderId !== null) get(m.fromHolderId).stock -= m.massG;
  }
  return out;
}

function gramsOf(trace: TraceComposition, originId: number): number {
  return trace.origins.find((o) => o.originId === originId)?.grams ?? 0;
}

/** A time to trace at: one of the moves' times, or before all of them. */
function pickTime(history: History, pick: number): number {
  const m = history.moves[pick % (history.moves.length + 1)];
  return m === undefined ? -1 : m.at;
}

const shuffled = (h: History): TraceMove[] => [...h.moves].reverse();

/** The ledger indexed, and replayed up to the time of its k-th move (k picked from `cut`). */
function replayUpToCut(history: History, cut: number) {
  const index = requireIndex(history.holders, shuffled(history));
  const k = cut % (index.moves.length + 1);
  const head = replayLedger(index, { until: index.moves[k - 1]?.at ?? Number.NEGATIVE_INFINITY });
  if (!head.ok) throw new Error(JSON.stringify(head.issues));
  return { index, k, head: head.value };
}

describe("trace invariants over random ledgers (our own consistency checks)", () => {
  it("invariant: mass is conserved — every origin's entered grams are all somewhere at the end", () => {
    fc.assert(
      fc.property(historyArb, (history) => {
        const index = requireIndex(history.holders, shuffled(history));
        const replay = replayLedger(index);
        if (!replay.ok) throw new Error(JSON.stringify(replay.issues));
        const entered = history.moves.filter((m) => m.fromHolderId === null);
        const held = history.holders.map((h) => replay.value.getComposition(h.id));
        for (const origin of entered) {
          expect(held.reduce((s, parts) => s + getOriginGrams(parts, origin.id), 0)).toBe(origin.massG);
        }
        const plain = plainStock(history.moves);
        for (const h of history.holders) expect(replay.value.getStockG(h.id)).toBe(plain.get(h.id)?.stock ?? 0);
      }),
      RUNS,
    );
  });

  it("invariant: stock never goes negative and compositions stay positive whole grams", () => {
    fc.assert(
      fc.property(historyArb, (history) => {
        const map = mapHolders(history.holders);
        if (!map.ok) throw new Error("holders");
        const replay = createReplay(map.value);
        const check = (holderId: number) => {
          const parts = replay.getComposition(holderId);
          expect(parts.grams.every((g) => Number.isSafeInteger(g) && g > 0)).toBe(true);
          expect(parts.originIds.every((id, i) => i === 0 || id > (parts.originIds[i - 1] ?? id))).toBe(true);
          expect(parts.grams.reduce((s, g) => s + g, 0)).toBe(replay.getStockG(holderId));
          expect(replay.getStockG(holderId)).toBeGreaterThanOrEqual(0);
        };
        for (const m of history.moves) {
          const applied = replay.apply(m);
          expect(applied.ok).toBe(true);
          if (applied.ok) expect(applied.value.grams.reduce((s, g) => s + g, 0)).toBe(m.massG);
          check(m.toHolderId);
          if (m.fromHolderId !== null) check(m.fromHolderId);
        }
      }),
      RUNS,
    );
  });

  it("invariant: backward contributions sum exactly to the traced quantity", () => {
    fc.assert(
      fc.property(historyArb, fc.nat(), (history, pick) => {
        const index = requireIndex(history.holders, shuffled(history));
        const t = pickTime(history, pick);
        const plain = plainStock(history.moves, t);
        for (const h of history.holders) {
          const trace = traceHolder(index, h.id, { at: t });
          if (!trace.ok) throw new Error(JSON.stringify(trace.issues));
          const { stock, received } = trace.value;
          expect(stock.totalG).toBe(plain.get(h.id)?.stock ?? 0);
          expect(stock.origins.reduce((s, o) => s + o.grams, 0)).toBe(stock.totalG);
          expect(received.totalG).toBe(plain.get(h.id)?.received ?? 0);
          expect(received.origins.reduce((s, o) => s + o.grams, 0)).toBe(received.totalG);
          if (stock.totalG > 0) expect(stock.origins.reduce((s, o) => s + o.pct, 0)).toBeCloseTo(100, 9);
        }
        for (const m of history.moves) {
          const carried = traceMove(index, m.id);
          expect(carried.ok && carried.value.totalG).toBe(m.massG);
          expect(carried.ok && carried.value.origins.reduce((s, o) => s + o.grams, 0)).toBe(m.massG);
        }
      }),
      RUNS,
    );
  });

  it("invariant: forward and backward traces agree for every holder and origin", () => {
    fc.assert(
      fc.property(historyArb, fc.nat(), (history, pick) => {
        const index = requireIndex(history.holders, shuffled(history));
        const t = pickTime(history, pick);
        const backward = new Map(
          history.holders.map((h) => {
            const trace = traceHolder(index, h.id, { at: t });
            if (!trace.ok) throw new Error(JSON.stringify(trace.issues));
            return [h.id, trace.value] as const;
          }),
        );
        for (const origin of history.moves.filter((m) => m.fromHolderId === null)) {
          const forward = traceForward(index, [origin.id], { at: t });
          if (!forward.ok) throw new Error(JSON.stringify(forward.issues));
          for (const h of history.holders) {
            const reach = forward.value.holders.find((r) => r.holderId === h.id);
            const back = backward.get(h.id);
            expect(reach?.heldG ?? 0).toBe(back === undefined ? -1 : gramsOf(back.stock, origin.id));
            expect(reach?.receivedG ?? 0).toBe(back === undefined ? -1 : gramsOf(back.received, origin.id));
          }
        }
      }),
      RUNS,
    );
  });

  it("invariant: a forward trace that stops early lists every carrying move and holding of an exhaustive replay", () => {
    fc.assert(
      fc.property(
        historyArb,
        fc.nat(),
        fc.array(fc.boolean(), { minLength: 8, maxLength: 8 }),
        (history, pick, chosen) => {
          const index = requireIndex(history.holders, shuffled(history));
          const t = pickTime(history, pick);
          const entered = history.moves.filter((m) => m.fromHolderId === null);
          const set = entered.filter((_m, i) => chosen[i % chosen.length] === true).map((m) => m.id);
          if (set.length === 0) return;
          const wanted = new Set(set);
          // Independent: replay every move up to t and read the set's grams off each carried composition.
          const carried: Array<{ moveId: number; grams: number }> = [];
          const full = replayLedger(index, {
            until: t,
            onMove: (m, parts) => {
              const grams = parts.originIds.reduce((s, id, i) => s + (wanted.has(id) ? (parts.grams[i] ?? 0) : 0), 0);
              if (grams > 0) carried.push({ moveId: m.id, grams });
            },
          });
          if (!full.ok) throw new Error(JSON.stringify(full.issues));
          const forward = traceForward(index, set, { at: t });
          if (!forward.ok) throw new Error(JSON.stringify(forward.issues));
          expect(forward.value.moves).toEqual(carried);
          for (const h of history.holders) {
            const parts = full.value.getComposition(h.id);
            const heldG = set.reduce((s, id) => s + getOriginGrams(parts, id), 0);
            expect(forward.value.holders.find((r) => r.holderId === h.id)?.heldG ?? 0).toBe(heldG);
          }
        },
      ),
      RUNS,
    );
  });

  it("invariant: FIFO and MIXED agree when every holder is emptied before it is refilled", () => {
    fc.assert(
      fc.property(emptiedBeforeRefillArb, (history) => {
        const asMixed = requireIndex(history.holders, history.moves);
        const asFifo = requireIndex(
          history.holders.map((h) => ({ ...h, mixing: "FIFO" as const })),
          history.moves,
        );
        const carried = (index: LedgerIndex) => {
          const parts: CompositionParts[] = [];
          const replay = replayLedger(index, { onMove: (_m, p) => parts.push(p) });
          if (!replay.ok) throw new Error(JSON.stringify(replay.issues));
          return { parts, held: history.holders.map((h) => replay.value.getComposition(h.id)) };
        };
        expect(carried(asFifo)).toEqual(carried(asMixed));
      }),
      RUNS,
    );
  });

  it("invariant: the ancestor-only trace equals the full forward replay", () => {
    fc.assert(
      fc.property(historyArb, fc.nat(), (history, pick) => {
        const index = requireIndex(history.holders, shuffled(history));
        const t = pickTime(history, pick);
        const carried = new Map<number, CompositionParts>();
        const full = replayLedger(index, { until: t, onMove: (m, p) => carried.set(m.id, p) });
        if (!full.ok) throw new Error(JSON.stringify(full.issues));
        for (const h of history.holders) {
          const trace = traceHolder(index, h.id, { at: t });
          expect(trace.ok && trace.value.stock).toEqual(describeComposition(full.value.getComposition(h.id)));
        }
        for (const [moveId, parts] of carried) {
          const trace = traceMove(index, moveId);
          expect(trace.ok && trace.value).toEqual(describeComposition(parts));
        }
      }),
      RUNS,
    );
  });

  it("invariant: resuming from a stored snapshot equals replaying from the start", () => {
    fc.assert(
      fc.property(historyArb, fc.nat(), (history, cut) => {
        const index = requireIndex(history.holders, shuffled(history));
        const k = cut % (index.moves.length + 1);
        const head = createReplay(index.holders);
        for (const m of index.moves.slice(0, k)) expect(head.apply(m).ok).toBe(true);
        const stored = ReplaySnapshotSchema.parse(JSON.parse(JSON.stringify(head.snapshot())));
        const resumed = resumeReplay(index, stored);
        if (!resumed.ok) throw new Error(JSON.stringify(resumed.issues));
        for (const m of index.moves.slice(k)) expect(resumed.value.apply(m).ok).toBe(true);
        const full = replayLedger(index);
        if (!full.ok) throw new Error(JSON.stringify(full.issues));
        for (const h of history.holders) {
          expect(resumed.value.getComposition(h.id)).toEqual(full.value.getComposition(h.id));
        }
      }),
      RUNS,
    );
  });

  it("invariant: a backward trace resumed from a snapshot (restoring only its ancestors) equals the cold trace", () => {
    fc.assert(
      fc.property(historyArb, fc.nat(), (history, cut) => {
        const { index, k, head } = replayUpToCut(history, cut);
        const stored = ReplaySnapshotSchema.parse(JSON.parse(JSON.stringify(head.snapshot())));
        for (const h of history.holders) {
          const cold = traceHolder(index, h.id);
          const warm = traceHolder(index, h.id, { from: stored });
          if (!cold.ok || !warm.ok) throw new Error(JSON.stringify([cold, warm]));
          expect(warm.value.stock).toEqual(cold.value.stock);
        }
        for (const m of index.moves.slice(k)) {
          const cold = traceMove(index, m.id);
          const warm = traceMove(index, m.id, { from: stored });
          expect(warm).toEqual(cold);
        }
      }),
      RUNS,
    );
  });

  it("invariant: a snapshot that leaves out never-drawn holders answers every other trace as a full one does", () => {
    fc.assert(
      fc.property(historyArb, fc.nat(), (history, cut) => {
        const { index, k, head } = replayUpToCut(history, cut);
        const neverDrawn = new Set(history.holders.filter((h) => !index.outOf.has(h.id)).map((h) => h.id));
        const full = head.snapshot();
        const lean = ReplaySnapshotSchema.parse(JSON.parse(JSON.stringify(head.snapshot((id) => neverDrawn.has(id)))));
        expect(lean.holders.every((x) => !neverDrawn.has(x.holderId))).toBe(true);
        expect(lean.leftOut ?? []).toEqual(
          full.holders.filter((x) => neverDrawn.has(x.holderId)).map((x) => x.holderId),
        );
        for (const h of history.holders) {
          const warm = traceHolder(index, h.id, { from: lean });
          if ((lean.leftOut ?? []).includes(h.id)) {
            // Its mixture is not in the snapshot: refused, never answered as if it were empty.
            expect(!warm.ok && warm.issues[0]?.code).toBe("TRACE.SNAPSHOT_INVALID");
            continue;
          }
          const cold = traceHolder(index, h.id, { from: full });
          if (!cold.ok || !warm.ok) throw new Error(JSON.stringify([cold, warm]));
          expect(warm.value.stock).toEqual(cold.value.stock);
          expect(warm.value.received).toEqual(cold.value.received);
        }
        for (const m of index.moves.slice(k))
          expect(traceMove(index, m.id, { from: lean })).toEqual(traceMove(index, m.id, { from: full }));
        // Resumed whole, the replay carries on for every other holder, and refuses to describe a left-out one.
        const resumed = resumeReplay(index, lean);
        if (!resumed.ok) throw new Error(JSON.stringify(resumed.issues));
        for (const m of index.moves.slice(lean.applied.count)) expect(resumed.value.apply(m).ok).toBe(true);
        const end = replayLedger(index);
        if (!end.ok) throw new Error(JSON.stringify(end.issues));
        for (const h of history.holders) {
          if ((lean.leftOut ?? []).includes(h.id)) expect(() => resumed.value.getComposition(h.id)).toThrow(/left out/);
          else expect(resumed.value.getComposition(h.id)).toEqual(end.value.getComposition(h.id));
        }
        expect(resumed.value.snapshot((id) => neverDrawn.has(id)).leftOut ?? []).toEqual(
          expect.arrayContaining(lean.leftOut ?? []),
        );
      }),
      RUNS,
    );
  });
});

// ---- cycle search against a brute-force enumeration of time-ordered chains ----

const CYCLE_HOLDERS: TraceHolder[] = [
  { id: 1, kind: "TANK", mixing: "MIXED" },
  { id: 2, kind: "TANK", mixing: "MIXED" },
  { id: 3, kind: "LOT", mixing: "MIXED" },
  { id: 4, kind: "BATCH", mixing: "MIXED" },
  { id: 5, kind: "PRODUCT_LOT", mixing: "MIXED" },
];
const cycleHolderMap = new Map(CYCLE_HOLDERS.map((h) => [h.id, h]));

const rawMoveArb = fc.record({ from: fc.nat({ max: 5 }), to: fc.nat({ max: 4 }), at: fc.nat({ max: 6 }) });

const cycleCaseArb = fc
  .record({ moves: fc.array(rawMoveArb, { maxLength: 9 }), next: rawMoveArb, nextId: fc.nat({ max: 9 }) })
  .map(({ moves, next, nextId }) => {
    const toMove = (r: { from: number; to: number; at: number }, id: number, allowSelf: boolean): TraceMove => {
      const from = r.from === 5 ? null : r.from + 1;
      const to = !allowSelf && from === r.to + 1 ? ((r.to + 1) % 5) + 1 : r.to + 1;
      return { id, at: r.at, fromHolderId: from, toHolderId: to, massG: 1 };
    };
    return { moves: moves.map((r, i) => toMove(r, 2 * (i + 1), false)), newMove: toMove(next, 2 * nextId + 1, true) };
  });

/** Is there a time-ordered chain X → … → X through newMove, for a non-tank X? Exhaustive search. */
function hasCycleByEnumeration(moves: readonly TraceMove[], newMove: TraceMove): boolean {
  const all = [...moves, newMove].sort(compareMoves);
  const extend = (start: number, holder: number, last: number, usedNew: boolean): boolean =>
    all.some((m, q) => {
      if (q <= last || m.fromHolderId !== holder) return false;
      const withNew = usedNew || m === newMove;
      if (m.toHolderId === start && withNew) return true;
      return extend(start, m.toHolderId, q, withNew);
    });
  return CYCLE_HOLDERS.filter((h) => h.kind !== "TANK").some((x) => extend(x.id, x.id, -1, false));
}

describe("cycle search (our own definition, checked against brute force)", () => {
  it("invariant: getCycleThrough finds a cycle exactly when an exhaustive search does, and the chain it gives is valid", () => {
    fc.assert(
      fc.property(cycleCaseArb, ({ moves, newMove }) => {
        const cycle = getCycleThrough(moves, newMove, cycleHolderMap);
        expect(cycle !== null).toBe(hasCycleByEnumeration(moves, newMove));
        if (cycle === null) return;
        const byId = new Map([...moves, newMove].map((m) => [m.id, m]));
        const chain = cycle.moveIds.map((id) => byId.get(id));
        expect(chain.every((m) => m !== undefined)).toBe(true);
        expect(cycle.moveIds).toContain(newMove.id);
        expect(chain[0]?.fromHolderId).toBe(cycle.holderId);
        expect(chain[chain.length - 1]?.toHolderId).toBe(cycle.holderId);
        expect(cycleHolderMap.get(cycle.holderId)?.kind).not.toBe("TANK");
        chain.forEach((m, i) => {
          const before = chain[i - 1];
          if (m === undefined || before === undefined) return;
          expect(m.fromHolderId).toBe(before.toHolderId);
          expect(compareMoves(before, m)).toBeLessThan(0);
        });
      }),
      { numRuns: 1000 },
    );
  });
});
