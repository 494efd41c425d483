import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { allocateByWeight, allocateWholeGrams, splitWholeGrams } from "@/lib/quantity/allocate";

describe("largest-remainder split", () => {
  // Hamilton's (largest remainder) method, worked by hand: 10 seats over 47,000 / 16,000 / 15,800 /
  // 12,000 / 6,100 / 3,100 votes. Quotas 4.70, 1.60, 1.58, 1.20, 0.61, 0.31 give 4+1+1+1+0+0 = 7
  // seats; the 3 spare go to the largest remainders .70, .61, .60 → 5, 2, 1, 1, 1, 0.
  const votes = [47_000, 16_000, 15_800, 12_000, 6_100, 3_100];
  const hamilton = [5, 2, 1, 1, 1, 0];

  it("Hamilton's method worked example (largest remainder, by hand)", () => {
    expect(
      allocateByWeight(
        10,
        votes.map((v, i) => [i, v] as const),
      ).map(([, p]) => p),
    ).toEqual(hamilton);
    expect(allocateWholeGrams(10, votes, 100_000)).toEqual(hamilton);
  });

  it("equal remainders go to the lower index (our tie rule: the origin that entered first)", () => {
    expect(allocateWholeGrams(1, [5, 5, 5], 15)).toEqual([1, 0, 0]);
    expect(allocateWholeGrams(2, [5, 5, 5], 15)).toEqual([1, 1, 0]);
    expect(allocateWholeGrams(15, [5, 5, 5], 15)).toEqual([5, 5, 5]);
    expect(allocateWholeGrams(0, [5, 5, 5], 15)).toEqual([0, 0, 0]);
  });

  it("invariant: the fast split gives allocateByWeight's parts, which add up to the total", () => {
    fc.assert(
      fc.property(
        fc.array(fc.integer({ min: 1, max: 5_000_000 }), { minLength: 1, maxLength: 300 }),
        fc.double({ min: 0, max: 1, noNaN: true }),
        (weights, share) => {
          const sum = weights.reduce((s, w) => s + w, 0);
          const total = Math.floor(sum * share);
          const fast = allocateWholeGrams(total, weights, sum);
          expect(fast).toEqual(
            allocateByWeight(
              total,
              weights.map((w, i) => [i, w] as const),
            ).map(([, p]) => p),
          );
          expect(fast.reduce((s, p) => s + p, 0)).toBe(total);
        },
      ),
      { numRuns: 500 },
    );
  });

  it("invariant: many equal small weights (a tank's tail of 1 g origins) split like the reference", () => {
    fc.assert(
      fc.property(
        fc.array(fc.integer({ min: 1, max: 3 }), { minLength: 50, maxLength: 2000 }),
        fc.nat(),
        (weights, pick) => {
          const sum = weights.reduce((s, w) => s + w, 0);
          const total = pick % (sum + 1);
          expect(allocateWholeGrams(total, weights, sum)).toEqual(
            allocateByWeight(
              total,
              weights.map((w, i) => [i, w] as const),
            ).map(([, p]) => p),
          );
        },
      ),
      { numRuns: 300 },
    );
  });

  it("invariant: floors plus the spare grams splitWholeGrams names (above the threshold, then ties in index order) are allocateByWeight's parts", () => {
    fc.assert(
      fc.property(
        fc.array(fc.integer({ min: 1, max: 40 }), { minLength: 1, maxLength: 400 }),
        fc.nat(),
        (weights, pick) => {
          const sum = weights.reduce((s, w) => s + w, 0);
          const total = pick % (sum + 1);
          const floors = new Float64Array(weights.length);
          const rems = new Float64Array(weights.length);
          const spare = splitWholeGrams(total, weights, sum, floors, rems);
          let ties = spare.ties;
          const parts = weights.map((_, i) => {
            const rem = rems[i] ?? 0;
            const one = rem > spare.threshold || (rem === spare.threshold && ties-- > 0);
            return (floors[i] ?? 0) + (one ? 1 : 0);
          });
          expect(parts).toEqual(
            allocateByWeight(
              total,
              weights.map((w, i) => [i, w] as const),
            ).map(([, p]) => p),
          );
        },
      ),
      { numRuns: 300 },
    );
  });
});
