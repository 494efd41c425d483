import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { replayLedger, traceForward } from "@/lib/trace/genealogy";
import { indexLedger } from "@/lib/ledger/moves";
import type { LedgerIndex, TraceHolder, TraceMove } from "@/lib/ledger/moves";
import type { ReplaySnapshot } from "@/lib/trace/replay";
import { historyArb } from "./arbitraries";
import type { History } from "./arbitraries";
import { forwardOracle } from "./forward-oracle";
import { plantHistoryArb } from "./plant-arbitrary";

// Our own consistency checks: the forward trace must give, to the gram, what a plain replay of every
// move gives (proportional mixing, whole grams by largest remainder, ties to the lower origin id).

function requireIndex(holders: readonly TraceHolder[], moves: readonly TraceMove[]): LedgerIndex {
  const index = indexLedger(holders, moves);
  if (!index.ok) throw new Error(JSON.stringify(index.issues));
  return index.value;
}

interface Case {
  history: History;
  chosen: boolean[];
  /** Index into the moves (or past them) for the time to trace at; negative: the whole ledger. */
  atPick: number;
  /** Where to take a snapshot to resume from; negative: none. */
  snapPick: number;
  leaveOutSinks: boolean;
}

const caseArb = (histories: fc.Arbitrary<History>): fc.Arbitrary<Case> =>
  fc.record({
    history: histories,
    chosen: fc.array(fc.boolean(), { minLength: 1, maxLength: 12 }),
    atPick: fc.integer({ min: -40, max: 200 }),
    snapPick: fc.integer({ min: -60, max: 200 }),
    leaveOutSinks: fc.boolean(),
  });

function snapshotAt(index: LedgerIndex, count: number, leaveOutSinks: boolean): ReplaySnapshot {
  const until = count === 0 ? Number.NEGATIVE_INFINITY : (index.moves[count - 1]?.at ?? 0);
  const replay = replayLedger(index, { until });
  if (!replay.ok) throw new Error(JSON.stringify(replay.issues));
  // As the trace cache stores them: without the holders nothing is ever drawn from.
  return replay.value.snapshot(leaveOutSinks ? (h) => !index.outOf.has(h) : undefined);
}

function checkCase(c: Case): void {
  const index = requireIndex(c.history.holders, c.history.moves);
  const entries = index.moves.filter((m) => m.fromHolderId === null);
  const set = entries.filter((_m, i) => c.chosen[i % c.chosen.length] === true).map((m) => m.id);
  if (set.length === 0) return;
  const atMove = c.atPick < 0 ? undefined : index.moves[c.atPick % (index.moves.length + 1)];
  const at = c.atPick < 0 ? undefined : (atMove?.at ?? -1);
  // A snapshot at a move boundary whose time is not shared with the next move (replayLedger's `until`
  // stops after every move of an instant).
  let from: ReplaySnapshot | undefined;
  if (c.snapPick >= 0) {
    let count = c.snapPick % (index.moves.length + 1);
    while (count > 0 && count < index.moves.length && index.moves[count]?.at === index.moves[count - 1]?.at) count--;
    // A snapshot without sinks cannot say what they hold of a set that entered before it (traceForward
    // then stops on an invariant); the trace cache only resumes forward traces from before the entry.
    const firstEntry = Math.min(...set.map((id) => index.positionOf.get(id) ?? 0));
    from = snapshotAt(index, count, c.leaveOutSinks && count <= firstEntry);
  }
  const options = { ...(at === undefined ? {} : { at }), ...(from === undefined ? {} : { from }) };
  const fast = traceForward(index, set, options);
  if (!fast.ok) throw new Error(JSON.stringify(fast.issues));
  const { movesReplayed, ...answer } = fast.value;
  expect(answer).toEqual(forwardOracle(index, set, options));
  expect(movesReplayed).toBeGreaterThanOrEqual(0);
}

describe("forward trace equals a plain replay of every move (our own consistency checks)", () => {
  it("invariant: on random plant ledgers (mixing tanks, FIFO and MIXED, partial draws, drains to zero)", () => {
    fc.assert(fc.property(caseArb(plantHistoryArb), checkCase), { numRuns: 300 });
  });

  it("invariant: on random ledgers with equal times and id tiebreaks", () => {
    fc.assert(fc.property(caseArb(historyArb), checkCase), { numRuns: 200 });
  });

  it("the lot's share of a draw depends on the other origins in the holder, not only on its grams and the stock", () => {
    // Two tanks each hold 1 g of the traced origin in 3 g; 1 g is drawn from each. Largest remainder
    // (allocateByWeight): in tank 5 the other origin holds 2 g, its remainder 2/3 beats 1/3 and the
    // traced origin gives nothing; in tank 6 three origins of 1 g tie at 1/3 and the lowest id, the
    // traced one, gives the gram. So a trace that follows only the traced grams and the holders'
    // totals cannot give these answers; the mixtures are needed.
    const holders: TraceHolder[] = [5, 6, 7, 8].map((id) => ({ id, kind: "TANK", mixing: "MIXED" }));
    const moves: TraceMove[] = [
      { id: 1, at: 1, fromHolderId: null, toHolderId: 5, massG: 1 },
      { id: 2, at: 2, fromHolderId: null, toHolderId: 5, massG: 2 },
      { id: 3, at: 3, fromHolderId: null, toHolderId: 6, massG: 1 },
      { id: 4, at: 4, fromHolderId: null, toHolderId: 6, massG: 1 },
      { id: 5, at: 5, fromHolderId: null, toHolderId: 6, massG: 1 },
      { id: 6, at: 6, fromHolderId: 5, toHolderId: 7, massG: 1 },
      { id: 7, at: 7, fromHolderId: 6, toHolderId: 8, massG: 1 },
    ];
    const index = requireIndex(holders, moves);
    const fromTank5 = traceForward(index, [1]);
    const fromTank6 = traceForward(index, [3]);
    expect(fromTank5.ok && fromTank5.value.moves).toEqual([{ moveId: 1, grams: 1 }]);
    expect(fromTank6.ok && fromTank6.value.moves).toEqual([
      { moveId: 3, grams: 1 },
      { moveId: 7, grams: 1 },
    ]);
  });
});
