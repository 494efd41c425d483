import { describe, it, expect } from "vitest";
import { computeAcidStep, decideRoute, planPretreatment } from "@/lib/recipe/pretreatment";
import type { PretreatmentPlan } from "@/lib/recipe/pretreatment";
import { planRecipe } from "@/lib/recipe/recipe";
import { defineSourced } from "@/lib/chemistry/sourced-value";
import type { PretreatmentInput } from "@/lib/recipe/recipe.schema";

// IUPAC 2021 atomic weights, computed (IUPAC 2021 column)
const M = { oleic: 282.468, methanol: 32.042, water: 18.015, methylOleate: 296.495, triolein: 885.453 };

describe("decideRoute", () => {
  // FFA < 0.5 % direct (Ma, Clements & Hanna 1998); < 3 % with extra catalyst (Kombe et al. 2013); literature as named
  it.each([
    [0, "DIRECT_BASE"],
    [0.49, "DIRECT_BASE"],
    [0.5, "BASE_WITH_EXTRA_CATALYST"],
    [2.99, "BASE_WITH_EXTRA_CATALYST"],
    [3, "ACID_PRETREATMENT"],
    [12, "ACID_PRETREATMENT"],
    [33, "ACID_PRETREATMENT"],
  ])("FFA %f pct → %s", (ffa, route) => {
    expect(decideRoute(ffa).route).toBe(route);
  });

  it("thresholds are configurable (e.g. ≤ 5 % with extra catalyst, Van Gerpen 2005, from memory)", () => {
    const limits = { baseCatalysisMaxFfaPct: defineSourced(5, "% FFA", "Van Gerpen 2005", "from memory") };
    expect(decideRoute(4, limits).route).toBe("BASE_WITH_EXTRA_CATALYST");
    expect(decideRoute(4, limits).reason).toContain("Van Gerpen 2005");
  });
});

describe("acid step, worked example 1 kg at 12 % FFA (Canakci & Van Gerpen 2001, computed)", () => {
  const step = computeAcidStep({ massKg: 1, ffaPct: 12, waterPct: 0 }, { residualFfaPct: 0 });
  const molFfa = 120 / M.oleic;

  it("hand arithmetic: 0.4248 mol FFA", () => {
    expect(step.ffaMol).toBeCloseTo(molFfa, 9);
    expect(molFfa).toBeCloseTo(0.4248, 4);
  });
  it("MeOH 272.2 g at 20:1 (Canakci & Van Gerpen 2001, from memory)", () => {
    expect(step.methanolKg * 1000).toBeCloseTo(20 * molFfa * M.methanol, 6);
    expect(Math.abs(step.methanolKg * 1000 - 272.2)).toBeLessThan(0.05);
  });
  it("H2SO4 6.0 g at 5 % of FFA mass (from memory)", () => {
    expect(step.acidPureKg * 1000).toBeCloseTo(0.05 * 120, 9);
  });
  it("water formed 7.65 g and FAME formed 126.0 g at full conversion", () => {
    expect(Math.abs(step.waterFormedKg * 1000 - 7.65)).toBeLessThan(0.005);
    expect(Math.abs(step.fameFormedKg * 1000 - 126.0)).toBeLessThan(0.05);
    expect(step.waterFormedKg * 1000).toBeCloseTo(molFfa * M.water, 6);
  });
  it("closes its mass balance", () => {
    expect(Math.abs(step.massBalance.residualKg)).toBeLessThan(1e-12);
    // oil phase = 880 g TG + 126.0 g FAME; alcohol phase = methanol left + water + acid
    expect(step.oilPhase.massKg * 1000).toBeCloseTo(880 + molFfa * M.methylOleate, 6);
  });
});

describe("acid step planned to the 1 % residual target (Canakci & Van Gerpen 2001: < 1 % FFA)", () => {
  const step = computeAcidStep({ massKg: 1000, ffaPct: 12, waterPct: 0 });
  it("converts just enough FFA to leave 1 % in the oil phase", () => {
    // n = (120 − 0.01 × 1000) / (M_FFA + 0.01 × (M_FAME − M_FFA)) kmol, solving FFA_res / oil phase = 1 %
    const nKmol = (120 - 0.01 * 1000) / (M.oleic + 0.01 * (M.methylOleate - M.oleic));
    expect(step.convertedFfaMol / 1000).toBeCloseTo(nKmol, 6);
    expect(step.oilPhase.ffaPct).toBeCloseTo(1, 9);
    expect(step.residualFfaPct).toBeCloseTo(1, 9);
  });
  it("still doses methanol on all FFA moles", () => {
    expect(step.methanolKg).toBeCloseTo((20 * (120_000 / M.oleic) * M.methanol) / 1000, 9);
  });
});

describe("planPretreatment", () => {
  const input = (ffaPct: number, waterPct = 0, acidStep?: PretreatmentInput["acidStep"]): PretreatmentInput => ({
    lots: [{ lotRef: "YG-7", massKg: 1000, ffaPct, waterPct }],
    settings: { catalyst: "NAOH", purityPct: 99, meanTgMolarMass: M.triolein },
    ...(acidStep === undefined ? {} : { acidStep }),
  });
  const require = (i: PretreatmentInput): PretreatmentPlan => {
    const r = planPretreatment(i);
    if (!r.ok) throw new Error(r.issues.map((x) => x.code).join());
    return r.value;
  };

  it("below the pretreatment threshold the base step is the plain recipe", () => {
    const plan = require(input(1.5));
    expect(plan.decision.route).toBe("BASE_WITH_EXTRA_CATALYST");
    expect(plan.acidStep).toBeNull();
    const direct = planRecipe({ lots: input(1.5).lots, settings: input(1.5).settings });
    expect(direct.ok && direct.value.catalyst.productKg).toBeCloseTo(plan.baseStep.catalyst.productKg, 12);
  });

  it("12 % FFA yellow grease: acid step, then base step on the pretreated oil at 1 % FFA", () => {
    const plan = require(input(12));
    expect(plan.decision.route).toBe("ACID_PRETREATMENT");
    expect(plan.acidStep).not.toBeNull();
    const base = plan.baseStep;
    expect(base.oil.ffaPct).toBeCloseTo(1, 9);
    // The triglyceride is untouched by the acid step: still 880 kg, so methanol is dosed on 880 kg, not on the oil phase.
    expect(base.oil.triglycerideKg).toBeCloseTo(880, 6);
    expect(base.methanol.chargeKg).toBeCloseTo((6 * (880_000 / M.triolein) * M.methanol) / 1000, 6);
    // Neutralisation only for the residual 1 % FFA: 1.416 g NaOH per kg per % (stoichiometry, computed)
    expect(base.catalyst.neutralisationKg / base.oil.massKg).toBeCloseTo(0.001416, 5);
    // Carried-in ester is part of the expected ester output.
    expect(base.products.fameKg).toBeGreaterThan(base.oil.fameInKg);
    expect(base.warnings.map((w) => w.code)).toContain("RECIPE.HIGH_FFA");
  });

  it("warns when the planned residual is above the target or the feed is wet", () => {
    // 0.5 % water in acid catalysis (Canakci & Van Gerpen 1999, from memory)
    const plan = require(input(12, 0.6, { residualFfaPct: 1.5 }));
    expect(plan.warnings.map((w) => w.code)).toEqual(["PRETREATMENT.HIGH_WATER", "PRETREATMENT.RESIDUAL_ABOVE_TARGET"]);
    expect(plan.baseStep.oil.ffaPct).toBeCloseTo(1.5, 9);
  });
});
