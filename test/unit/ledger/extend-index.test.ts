import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { extendIndex, MAX_SHIFTED } from "@/lib/ledger/extend-index";
import { indexLedger } from "@/lib/ledger/moves";
import type { LedgerIndex, TraceHolder, TraceMove } from "@/lib/ledger/moves";

// Carrying an index past appended bookings must give exactly the index of the whole ledger, so that a
// trace asked after a booking answers as one asked after a restart would.

function plain(ix: LedgerIndex) {
  const sorted = <T>(m: ReadonlyMap<number, T>) => [...m.entries()].sort((a, b) => a[0] - b[0]);
  return {
    moves: ix.moves,
    holders: sorted(ix.holders),
    positionOf: sorted(ix.positionOf),
    into: sorted(ix.into),
    outOf: sorted(ix.outOf),
    massPrefixG: ix.massPrefixG,
  };
}

function unwrap(r: ReturnType<typeof indexLedger>): LedgerIndex {
  if (!r.ok) throw new Error(r.issues.map((i) => i.message).join("; "));
  return r.value;
}

/** A valid ledger in booking order: ids ascending, times never going back, holders spread (sometimes sparse). */
const ledgerArb = fc
  .record({
    holderCount: fc.integer({ min: 2, max: 12 }),
    idStep: fc.constantFrom(1, 1, 7),
    steps: fc.array(
      fc.record({
        from: fc.option(fc.nat(), { nil: null }),
        to: fc.nat(),
        massG: fc.integer({ min: 1, max: 5_000 }),
        dt: fc.integer({ min: 0, max: 3 }),
      }),
      { minLength: 1, maxLength: 40 },
    ),
    split: fc.double({ min: 0, max: 1, noNaN: true }),
    /** Minutes each new move is dated before the last indexed one (0: after it), as a late pickup is. */
    backDates: fc.array(fc.integer({ min: -1, max: 30 }), { minLength: 40, maxLength: 40 }),
    holderSplit: fc.double({ min: 0, max: 1, noNaN: true }),
  })
  .map(({ holderCount, idStep, steps, split, holderSplit, backDates }) => {
    const holders: TraceHolder[] = Array.from({ length: holderCount }, (_, i) => ({
      id: 100 + i * idStep,
      kind: i % 3 === 0 ? "TANK" : "LOT",
      mixing: "MIXED",
    }));
    const moves: TraceMove[] = [];
    let at = 1_700_000_000_000;
    steps.forEach((s, i) => {
      const to = holders[s.to % holderCount] as TraceHolder;
      let from = s.from === null ? null : (holders[s.from % holderCount] as TraceHolder).id;
      if (from === to.id) from = null;
      at += s.dt * 60_000;
      moves.push({ id: 1 + i, at, fromHolderId: from, toHolderId: to.id, massG: s.massG });
    });
    const cut = Math.floor(split * moves.length);
    // Holders not used by the first part may arrive with the second, as a booking's new lot does.
    const used = new Set(moves.slice(0, cut).flatMap((m) => [m.toHolderId, m.fromHolderId ?? m.toHolderId]));
    const late = holders.filter((h, i) => !used.has(h.id) && i >= Math.floor(holderSplit * holderCount));
    const early = holders.filter((h) => !late.includes(h));
    const lastAt = moves[cut - 1]?.at ?? at;
    const after = moves.slice(cut).map((m, i) => {
      const back = backDates[i] ?? -1;
      return back < 0 ? m : { ...m, at: lastAt - back * 60_000 };
    });
    return { early, late, before: moves.slice(0, cut), after };
  });

describe("extendIndex", () => {
  it("gives the whole ledger's index when bookings are added, dated now or back-dated", () => {
    fc.assert(
      fc.property(ledgerArb, ({ early, late, before, after }) => {
        const start = unwrap(indexLedger(early, before));
        const carried = extendIndex(start, late, after);
        const whole = unwrap(indexLedger([...early, ...late], [...before, ...after]));
        expect(carried).not.toBeNull();
        expect(plain(carried as LedgerIndex)).toEqual(plain(whole));
        // The index it started from is left as it was.
        expect(plain(start)).toEqual(plain(unwrap(indexLedger(early, before))));
      }),
      { numRuns: 400 },
    );
  });

  it("declines a repeated id, an unknown holder, a holder listed again or a booking dated too far back", () => {
    const holders: TraceHolder[] = [
      { id: 1, kind: "LOT", mixing: "MIXED" },
      { id: 2, kind: "TANK", mixing: "MIXED" },
    ];
    const moves: TraceMove[] = [
      { id: 1, at: 1000, fromHolderId: null, toHolderId: 1, massG: 500 },
      { id: 2, at: 2000, fromHolderId: 1, toHolderId: 2, massG: 200 },
    ];
    const start = unwrap(indexLedger(holders, moves));
    const late = { id: 3, at: 1500, fromHolderId: 1, toHolderId: 2, massG: 10 };
    expect(extendIndex(start, [], [{ ...late, id: 2 }])).toBeNull();
    expect(extendIndex(start, [], [{ ...late, toHolderId: 9 }])).toBeNull();
    expect(extendIndex(start, [{ id: 2, kind: "LOT", mixing: "MIXED" }], [])).toBeNull();
    // A booking dated between the two moves takes the second one's place.
    const between = extendIndex(start, [], [late]);
    expect(between?.positionOf.get(3)).toBe(1);
    expect(between?.positionOf.get(2)).toBe(2);
    expect(between?.outOf.get(1)).toEqual([1, 2]);
    expect(start.outOf.get(1)).toEqual([1]);

    const long: TraceMove[] = Array.from({ length: MAX_SHIFTED + 2 }, (_, i) => ({
      id: i + 1,
      at: 1000 + i,
      fromHolderId: i === 0 ? null : 1,
      toHolderId: i === 0 ? 1 : 2,
      massG: i === 0 ? 10_000_000 : 1,
    }));
    const big = unwrap(indexLedger(holders, long));
    const shifted = (at: number) => ({ id: MAX_SHIFTED + 10, at, fromHolderId: 1, toHolderId: 2, massG: 1 });
    expect(extendIndex(big, [], [shifted(1000)])).toBeNull();
    expect(extendIndex(big, [], [shifted(1001)])?.positionOf.get(MAX_SHIFTED + 10)).toBe(2);
  });
});
