import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { addToLayer, copyToLayer, settleLayer, takeFromLayer, tallyToParts } from "@/lib/trace/composition";
import type { CompositionParts } from "@/lib/trace/composition";

// Our own consistency checks: a layer built by deposits (appended, inserted in place or merged, by
// size) holds exactly the sum per origin that a plain tally gives, sorted by origin id.
const partsOver = (maxId: number): fc.Arbitrary<CompositionParts> =>
  fc.uniqueArray(fc.integer({ min: 1, max: maxId }), { minLength: 1, maxLength: 60 }).chain((ids) =>
    fc.array(fc.integer({ min: 1, max: 10_000 }), { minLength: ids.length, maxLength: ids.length }).map((grams) => {
      const sorted = [...ids].sort((a, b) => a - b);
      return { originIds: sorted, grams };
    }),
  );
const partsArb = partsOver(5_000);

function tallyOf(): { tally: Map<number, number>; add: (p: CompositionParts, sign: 1 | -1) => void } {
  const tally = new Map<number, number>();
  const add = (p: CompositionParts, sign: 1 | -1) =>
    p.originIds.forEach((id, i) => {
      const g = (tally.get(id) ?? 0) + sign * (p.grams[i] ?? 0);
      if (g === 0) tally.delete(id);
      else tally.set(id, g);
    });
  return { tally, add };
}

describe("layer deposits", () => {
  it("invariant: any sequence of deposits and draws keeps the per-origin sums of a plain tally", () => {
    fc.assert(
      fc.property(
        partsArb,
        fc.array(fc.tuple(partsArb, fc.double({ min: 0, max: 0.9, noNaN: true })), { maxLength: 40 }),
        (first, steps) => {
          const layer = copyToLayer(first);
          const { tally, add } = tallyOf();
          add(first, 1);
          for (const [deposit, share] of steps) {
            addToLayer(layer, deposit);
            add(deposit, 1);
            const take = Math.floor(layer.totalG * share);
            if (take > 0) add(takeFromLayer(layer, take), -1);
          }
          settleLayer(layer);
          expect({ originIds: layer.originIds, grams: layer.grams }).toEqual(tallyToParts(tally));
          expect(layer.grams.reduce((s, g) => s + g, 0)).toBe(layer.totalG);
        },
      ),
      { numRuns: 300 },
    );
  });

  it("invariant: several overlapping deposits in a row, merged into the pool's own arrays at the next draw, sum as a tally does", () => {
    fc.assert(
      fc.property(
        partsOver(300),
        fc.array(fc.tuple(fc.array(partsOver(300), { minLength: 1, maxLength: 6 }), fc.integer({ min: 0, max: 9 })), {
          maxLength: 12,
        }),
        (first, rounds) => {
          const layer = copyToLayer(first);
          const { tally, add } = tallyOf();
          add(first, 1);
          for (const [deposits, tenths] of rounds) {
            for (const d of deposits) {
              addToLayer(layer, d);
              add(d, 1);
            }
            const take = Math.floor((layer.totalG * tenths) / 10);
            if (take > 0) add(takeFromLayer(layer, take), -1);
            else settleLayer(layer);
            expect({ originIds: layer.originIds, grams: layer.grams }).toEqual(tallyToParts(tally));
          }
          expect(layer.grams.reduce((s, g) => s + g, 0)).toBe(layer.totalG);
        },
      ),
      { numRuns: 300 },
    );
  });
});
