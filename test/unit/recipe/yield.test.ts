import { describe, it, expect } from "vitest";
import { planRecipe } from "@/lib/recipe/recipe";
import type { RecipePlan } from "@/lib/recipe/recipe";
import { computeBatchYield } from "@/lib/recipe/yield";
import type { BatchYield } from "@/lib/recipe/yield";
import type { BatchActuals } from "@/lib/recipe/recipe.schema";

// Triolein model, 1000 kg, no FFA: theoretical FAME 1004.55 kg, glycerol 104.01 kg (triolein model, IUPAC 2021 atomic weights, computed).
function trioleinPlan(): RecipePlan {
  const r = planRecipe({
    lots: [{ lotRef: "T", massKg: 1000, ffaPct: 0, waterPct: 0 }],
    settings: { catalyst: "NAOH", purityPct: 100, baseDosePctOfOil: 0.5, meanTgMolarMass: 885.453, molarRatio: 6 },
  });
  if (!r.ok) throw new Error("plan failed");
  return r.value;
}

function requireYield(actuals: BatchActuals): BatchYield {
  const r = computeBatchYield(trioleinPlan(), actuals);
  if (!r.ok) throw new Error(r.issues.map((i) => i.code).join());
  return r.value;
}

// Planned: NaOH 0.5 % of 1000 kg = 5 kg; methanol 6:1 = 217.12 kg (triolein model, IUPAC 2021 atomic weights, computed scaled ×1000).
const onPlan: BatchActuals = {
  esterKg: 954.3225,
  glycerolPhaseKg: 180,
  catalystProductUsedKg: 5,
  methanolAddedKg: 217.12,
};

describe("computeBatchYield", () => {
  it("ester yield vs theory and per kg oil", () => {
    const y = requireYield(onPlan);
    // 954.3225 / 1004.55 = 0.95 (theory from triolein model, IUPAC 2021 atomic weights, computed)
    expect(y.esterYieldVsTheory).toBeCloseTo(954.3225 / 1004.55, 4);
    expect(y.esterPerKgOil).toBeCloseTo(0.9543225, 9);
    expect(y.glycerolPhasePerKgOil).toBeCloseTo(0.18, 9);
    expect(y.theoreticalGlycerolPerKgOil).toBeCloseTo(0.10401, 5);
    expect(y.warnings).toEqual([]);
  });

  it("catalyst and methanol vs plan", () => {
    const y = requireYield({ ...onPlan, catalystProductUsedKg: 5.5, methanolAddedKg: 200 });
    expect(y.catalyst.plannedKg).toBeCloseTo(5, 9);
    expect(y.catalyst.deltaKg).toBeCloseTo(0.5, 9);
    expect(y.catalyst.ratio).toBeCloseTo(1.1, 9);
    expect(y.methanol.deltaKg).toBeCloseTo(200 - 217.12, 2);
    expect(y.methanol.ratio).toBeCloseTo(200 / 217.12, 4);
    expect(y.warnings.map((w) => [w.code, w.field])).toEqual([
      ["YIELD.USAGE_OFF_PLAN", "catalystProductUsedKg"],
      ["YIELD.USAGE_OFF_PLAN", "methanolAddedKg"],
    ]);
  });

  it("scales theory and plan to the oil actually charged", () => {
    const y = requireYield({
      ...onPlan,
      oilChargedKg: 900,
      esterKg: 900,
      catalystProductUsedKg: 4.5,
      methanolAddedKg: 195.408,
    });
    expect(y.theoreticalEsterKg).toBeCloseTo(0.9 * 1004.55, 2);
    expect(y.esterYieldVsTheory).toBeCloseTo(900 / (0.9 * 1004.55), 4);
    expect(y.catalyst.ratio).toBeCloseTo(1, 9);
    expect(y.warnings).toEqual([]);
  });

  it("flags ester above theory", () => {
    const y = requireYield({ ...onPlan, esterKg: 1020 });
    expect(y.warnings.map((w) => w.code)).toEqual(["YIELD.ABOVE_THEORY"]);
  });
});
