import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { addToLayer, copyToLayer, settleLayer, takeFromLayer, tallyToParts } from "@/lib/trace/composition";
import type { CompositionParts } from "@/lib/trace/composition";

// Our own consistency checks: a layer built by deposits (appended, inserted in place or merged, by
// size) holds exactly the sum per origin that a plain tally gives, sorted by origin id.
const partsArb: fc.Arbitrary<CompositionParts> = fc
  .uniqueArray(fc.integer({ min: 1, max: 5_000 }), { minLength: 1, maxLength: 60 })
  .chain((ids) =>
    fc.array(fc.integer({ min: 1, max: 10_000 }), { minLength: ids.length, maxLength: ids.length }).map((grams) => {
      const sorted = [...ids].sort((a, b) => a - b);
      return { originIds: sorted, grams };
    }),
  );

describe("layer deposits", () => {
  it("invariant: any sequence of deposits and draws keeps the per-origin sums of a plain tally", () => {
    fc.assert(
      fc.property(
        partsArb,
        fc.array(fc.tuple(partsArb, fc.double({ min: 0, max: 0.9, noNaN: true })), { maxLength: 40 }),
        (first, steps) => {
          const layer = copyToLayer(first);
          const tally = new Map<number, number>();
          const add = (p: CompositionParts, sign: 1 | -1) =>
            p.originIds.forEach((id, i) => {
              const g = (tally.get(id) ?? 0) + sign * (p.grams[i] ?? 0);
              if (g === 0) tally.delete(id);
              else tally.set(id, g);
            });
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
});
