import { describe, expect, it } from "vitest";
import { splitIngredients } from "@/lib/trace/ingredients";

// A product lot's "made of": feedstock lots carry the shares; methanol, catalyst (and water still routed
// through a batch by old bookings) are reagents, listed apart with no share. Our own consistency checks.
describe("splitIngredients", () => {
  // A walk found wash water as 41.9 % of a product lot's ingredients: 2 lots of oil, methanol, KOH and water.
  const groups = [
    { kind: "LOT" as const, code: "L-1", grams: 600_000 },
    { kind: "LOT" as const, code: "L-2", grams: 400_000 },
    { kind: "REAGENT_LOT" as const, code: "MEOH-1", grams: 120_000, reagent: "METHANOL" },
    { kind: "REAGENT_LOT" as const, code: "KOH-1", grams: 10_000, reagent: "KOH" },
    { kind: "REAGENT_LOT" as const, code: "WATER-1", grams: 815_000, reagent: "WATER" },
  ];

  it("shares are of the feedstock only and add up to 100 %", () => {
    const s = splitIngredients(groups);
    expect(s.feedstockG).toBe(1_000_000);
    expect(s.feedstock.map((f) => [f.code, f.pct])).toEqual([
      ["L-1", 60],
      ["L-2", 40],
    ]);
    expect(s.feedstock.reduce((a, f) => a + f.pct, 0)).toBe(100);
  });

  it("water is never a share of the product: it is listed with the reagents at 0 %", () => {
    const s = splitIngredients(groups);
    expect(s.feedstock.some((f) => f.code === "WATER-1")).toBe(false);
    expect(s.reagents.find((r) => r.code === "WATER-1")).toMatchObject({ pct: 0, reagent: "WATER" });
    expect(s.reagents.map((r) => r.code)).toEqual(["WATER-1", "MEOH-1", "KOH-1"]);
  });

  it("keeps the grams the mixing replay gave (nothing is rescaled)", () => {
    const s = splitIngredients(groups);
    const total = s.feedstockG + s.reagents.reduce((a, r) => a + r.grams, 0);
    expect(total).toBe(groups.reduce((a, g) => a + g.grams, 0));
  });
});
