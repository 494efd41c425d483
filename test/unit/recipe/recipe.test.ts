import { describe, it, expect } from "vitest";
import fc from "fast-check";
import { planRecipe } from "@/lib/recipe/recipe";
import type { RecipePlan } from "@/lib/recipe/recipe";
import { DEFAULT_RECIPE_LIMITS } from "@/lib/recipe/recipe-defaults";
import { defineSourced } from "@/lib/chemistry/sourced-value";
import { CATALYST_TYPES } from "@/lib/recipe/catalyst";
import type { RecipeInput, RecipeSettings } from "@/lib/recipe/recipe.schema";

// Molar masses below are IUPAC 2021 atomic weights, computed (IUPAC 2021 column), typed in by hand.
const M = {
  triolein: 885.453,
  oleic: 282.468,
  methanol: 32.042,
  naome: 54.024,
  glycerol: 92.094,
  methylOleate: 296.495,
};

function requirePlan(input: RecipeInput, limits = {}): RecipePlan {
  const r = planRecipe(input, limits);
  if (!r.ok) throw new Error(r.issues.map((i) => i.code).join(","));
  return r.value;
}

const codes = (plan: RecipePlan) => plan.warnings.map((w) => w.code);

// AV 4.0 mg KOH/g → FFA % as oleic = AV × M(oleic) / (10 × M(KOH)) (AV definition, acid value definition, computed)
const UCO_AV4_FFA_PCT = (4.0 * 282.468) / (10 * 56.1053);
const ucoLot = { lotRef: "UCO-1", massKg: 1000, ffaPct: UCO_AV4_FFA_PCT, waterPct: 0 };

describe("worked batch, 1000 kg UCO at AV 4.0 (stoichiometry, computed)", () => {
  it.each([
    [90, 15.56],
    [85, 16.47],
  ])("KOH 1.0 pct base + neutralisation, flake at %d pct → %f kg flake", (purityPct, flakeKg) => {
    const plan = requirePlan({
      lots: [ucoLot],
      settings: { catalyst: "KOH", purityPct, baseDosePctOfOil: 1.0, meanTgMolarMass: M.triolein },
    });
    // stoichiometry, computed: neutralisation 4.0 kg + base 10.0 kg = 14.0 kg pure
    expect(plan.catalyst.neutralisationKg).toBeCloseTo(4.0, 3);
    expect(plan.catalyst.baseKg).toBeCloseTo(10.0, 9);
    expect(plan.catalyst.pureKg).toBeCloseTo(14.0, 3);
    expect(Math.abs(plan.catalyst.productKg - flakeKg)).toBeLessThan(0.005);
  });

  it("NaOH route neutralisation 2.85 kg", () => {
    const plan = requirePlan({
      lots: [ucoLot],
      settings: { catalyst: "NAOH", purityPct: 100, baseDosePctOfOil: 0, meanTgMolarMass: M.triolein },
    });
    // stoichiometry, computed: NaOH route neutralisation 2.85 kg
    expect(Math.abs(plan.catalyst.neutralisationKg - 2.85)).toBeLessThan(0.005);
  });

  it("NaOMe route 3.85 kg NaOMe = 12.84 kg of 30 % solution", () => {
    const plan = requirePlan({
      lots: [ucoLot],
      settings: {
        catalyst: "NAOME_SOLUTION",
        solutionStrengthPct: 30,
        baseDosePctOfOil: 0,
        meanTgMolarMass: M.triolein,
      },
    });
    // stoichiometry, computed
    expect(Math.abs(plan.catalyst.pureKg - 3.85)).toBeLessThan(0.005);
    expect(Math.abs(plan.catalyst.productKg - 12.84)).toBeLessThan(0.005);
  });
});

describe("triolein model, 1 kg at 6:1 (triolein model, IUPAC 2021 atomic weights, computed)", () => {
  const plan = requirePlan({
    lots: [{ lotRef: "T", massKg: 1, ffaPct: 0, waterPct: 0 }],
    settings: { catalyst: "NAOH", purityPct: 100, baseDosePctOfOil: 0, meanTgMolarMass: M.triolein, molarRatio: 6 },
  });
  it("methanol 217.12 g ≈ 274 mL at 20 °C", () => {
    // triolein model, IUPAC 2021 atomic weights, computed: methanol charged at 6:1 217.12 g (≈ 274 mL at 0.7915 g/mL, Merck d20/4)
    expect(plan.methanol.chargeKg * 1000).toBeCloseTo(217.12, 2);
    expect(Math.round(plan.methanol.chargeL20C * 1000)).toBe(274);
    expect(plan.methanol.toAddMl20C).toBe(274);
    expect(plan.methanol.toAddG).toBe(217);
  });
  it("FAME 1004.55 g, glycerol 104.01 g, excess methanol 108.56 g", () => {
    // triolein model, IUPAC 2021 atomic weights, computed
    expect(plan.products.fameKg * 1000).toBeCloseTo(1004.55, 2);
    expect(plan.products.glycerolKg * 1000).toBeCloseTo(104.01, 2);
    expect(plan.products.excessMethanolKg * 1000).toBeCloseTo(108.56, 2);
    expect(plan.methanol.effectiveMolarRatio).toBeCloseTo(6, 9);
  });
  it("wash water from the default practice (3 × 30 % of ester, common practice)", () => {
    expect(plan.washWater.totalKg).toBeCloseTo(3 * 0.3 * 1.00455, 5);
  });
});

describe("methoxide solution brings methanol toward the charge", () => {
  // 1000 kg oil, 1 % FFA, NaOMe 30 %, base 0.5 % NaOMe, 6:1 on the triglyceride (990 kg)
  const plan = requirePlan({
    lots: [{ lotRef: "A", massKg: 1000, ffaPct: 1, waterPct: 0 }],
    settings: {
      catalyst: "NAOME_SOLUTION",
      solutionStrengthPct: 30,
      baseDosePctOfOil: 0.5,
      meanTgMolarMass: M.triolein,
    },
  });
  const molTg = 990_000 / M.triolein;
  const chargeKg = (6 * molTg * M.methanol) / 1000;
  const pureKg = 5 + (10 / M.oleic) * M.naome;
  const solutionKg = pureKg / 0.3;
  const fromSolutionKg = solutionKg - pureKg;

  it("charge, solution methanol and methanol to add", () => {
    expect(plan.methanol.chargeKg).toBeCloseTo(chargeKg, 2);
    expect(plan.catalyst.productKg).toBeCloseTo(solutionKg, 3);
    expect(plan.methanol.fromCatalystSolutionKg).toBeCloseTo(fromSolutionKg, 3);
    expect(plan.methanol.toAddKg).toBeCloseTo(chargeKg - fromSolutionKg, 2);
  });

  it("methoxide forms methanol, not water, when it neutralises FFA (stoichiometry, computed reactions)", () => {
    expect(plan.products.waterFormedKg).toBe(0);
    const formedKg = (10 / M.oleic) * M.methanol;
    expect(plan.products.excessMethanolKg).toBeCloseTo(chargeKg - (3 * molTg * M.methanol) / 1000 + formedKg, 2);
    // Na oleate 304.450 g/mol (stoichiometry, computed)
    expect(plan.products.soapKg).toBeCloseTo((10 / M.oleic) * 304.45, 3);
  });

  it("warns when the solution brings more methanol than the charge", () => {
    const heavy = requirePlan({
      lots: [{ lotRef: "A", massKg: 100, ffaPct: 0, waterPct: 0 }],
      settings: {
        catalyst: "NAOME_SOLUTION",
        solutionStrengthPct: 10,
        baseDosePctOfOil: 5,
        meanTgMolarMass: M.triolein,
      },
    });
    expect(heavy.methanol.toAddKg).toBe(0);
    expect(codes(heavy)).toContain("RECIPE.CATALYST_SOLUTION_EXCEEDS_METHANOL_CHARGE");
    expect(heavy.methanol.effectiveMolarRatio).toBeGreaterThan(6);
  });
});

describe("blend of lots", () => {
  it("mass-weights FFA and water", () => {
    const plan = requirePlan({
      lots: [
        { lotRef: "A", massKg: 300, ffaPct: 0.2, waterPct: 0.01 },
        { lotRef: "B", massKg: 700, ffaPct: 1.2, waterPct: 0.05 },
      ],
      settings: { catalyst: "KOH", purityPct: 90 },
    });
    expect(plan.oil.massKg).toBe(1000);
    expect(plan.oil.ffaPct).toBeCloseTo((300 * 0.2 + 700 * 1.2) / 1000, 12);
    expect(plan.oil.waterPct).toBeCloseTo((300 * 0.01 + 700 * 0.05) / 1000, 12);
    expect(plan.oil.lots.map((l) => l.massG)).toEqual([300_000, 700_000]);
  });
});

const baseSettings: RecipeSettings = { catalyst: "NAOH", purityPct: 99, meanTgMolarMass: M.triolein };
const oneLot = (ffaPct: number, waterPct: number) => [{ lotRef: "L", massKg: 500, ffaPct, waterPct }];

describe("warnings", () => {
  it.each([
    [60, [], "none at 60 °C"],
    [62.6, [], "none just outside the 2 K margin"],
    [62.7, ["RECIPE.NEAR_METHANOL_BOILING"], "at 64.7 − 2 °C"],
    [65, ["RECIPE.NEAR_METHANOL_BOILING"], "above the boiling point"],
    [45, ["RECIPE.LOW_REACTION_TEMPERATURE"], "below 50 °C"],
  ])("reaction at %f °C → %j (%s)", (reactionTempC, expected) => {
    // methanol b.p. 64.7 °C (Merck Index, common practice); margin 2 K and 50 °C floor (common practice)
    const plan = requirePlan({ lots: oneLot(0.1, 0.01), settings: { ...baseSettings, reactionTempC } });
    expect(codes(plan).filter((c) => c.includes("TEMPERATURE") || c.includes("BOILING"))).toEqual(expected);
  });

  it("boiling margin is configurable", () => {
    const plan = requirePlan(
      { lots: oneLot(0.1, 0.01), settings: { ...baseSettings, reactionTempC: 60 } },
      { boilingMarginK: defineSourced(5, "K", "site SOP", "common practice") },
    );
    expect(codes(plan)).toContain("RECIPE.NEAR_METHANOL_BOILING");
  });

  it.each([
    [0.4, 0.05, []],
    [0.5, 0.05, ["RECIPE.HIGH_FFA"]],
    [2.99, 0.05, ["RECIPE.HIGH_FFA"]],
    [3, 0.05, ["RECIPE.FFA_REQUIRES_PRETREATMENT"]],
    [0.4, 0.061, ["RECIPE.HIGH_WATER"]],
    [12, 0.3, ["RECIPE.FFA_REQUIRES_PRETREATMENT", "RECIPE.HIGH_WATER"]],
  ])("FFA %f pct, water %f pct → %j", (ffa, water, expected) => {
    // FFA 0.5 % (Ma, Clements & Hanna 1998), 3 % (Kombe et al. 2013), water 0.06 % (Ma 1998) — literature as named
    const plan = requirePlan({ lots: oneLot(ffa, water), settings: baseSettings });
    expect(codes(plan).filter((c) => c.includes("FFA") || c.includes("WATER"))).toEqual(expected);
  });

  it("flags defaulted purity and molar mass, each with its field", () => {
    const plan = requirePlan({ lots: oneLot(0.1, 0.01), settings: { catalyst: "KOH" } });
    expect(plan.catalyst.assayPct).toBe(90);
    expect(plan.warnings.find((w) => w.code === "RECIPE.DEFAULT_PURITY_USED")?.field).toBe("settings.purityPct");
    expect(plan.warnings.find((w) => w.code === "RECIPE.DEFAULT_MOLAR_MASS_USED")?.field).toBe(
      "settings.meanTgMolarMass",
    );
    const given = requirePlan({ lots: oneLot(0.1, 0.01), settings: baseSettings });
    expect(codes(given)).not.toContain("RECIPE.DEFAULT_PURITY_USED");
    expect(codes(given)).not.toContain("RECIPE.DEFAULT_MOLAR_MASS_USED");
  });

  it("every default threshold carries a source and status", () => {
    for (const limit of Object.values(DEFAULT_RECIPE_LIMITS)) {
      expect(limit.source.length).toBeGreaterThan(10);
      expect(["verified", "computed", "from memory", "common practice"]).toContain(limit.status);
    }
  });
});

describe("mass balance", () => {
  it("inputs equal outputs, and the whole-gram booking closes exactly", () => {
    const plan = requirePlan({
      lots: [
        { lotRef: "A", massKg: 812.345, ffaPct: 1.7, waterPct: 0.2 },
        { lotRef: "B", massKg: 190.5, ffaPct: 0.3, waterPct: 0.02 },
      ],
      settings: { catalyst: "KOH", purityPct: 88, baseDosePctOfOil: 1.2, meanTgMolarMass: 876.6, molarRatio: 6.5 },
    });
    const { massBalance: mb } = plan;
    const inputKg = 812.345 + 190.5 + plan.methanol.toAddKg + plan.catalyst.productKg;
    const outputKg = Object.values(plan.products).reduce((s, v) => s + v, 0);
    expect(Math.abs(inputKg - outputKg)).toBeLessThan(1e-9 * inputKg);
    expect(mb.inputsG.oil).toBe(812_345 + 190_500);
    const gIn = mb.inputsG.oil + mb.inputsG.methanol + mb.inputsG.catalyst;
    expect(Object.values(mb.outputsG).reduce((s, v) => s + v, 0)).toBe(gIn);
  });
});

const lotArb = fc
  .record({
    massKg: fc.double({ min: 0.05, max: 20_000, noNaN: true }),
    ffaPct: fc.double({ min: 0, max: 25, noNaN: true }),
    waterPct: fc.double({ min: 0, max: 3, noNaN: true }),
    famePct: fc.double({ min: 0, max: 20, noNaN: true }),
  })
  .map((l) => ({ lotRef: "L", ...l }));

const settingsArb = fc.record({
  catalyst: fc.constantFrom(...CATALYST_TYPES),
  assay: fc.double({ min: 20, max: 100, noNaN: true }),
  baseDosePctOfOil: fc.double({ min: 0, max: 2, noNaN: true }),
  molarRatio: fc.double({ min: 3, max: 15, noNaN: true }),
  meanTgMolarMass: fc.double({ min: 700, max: 1000, noNaN: true }),
});

function toSettings(s: {
  catalyst: (typeof CATALYST_TYPES)[number];
  assay: number;
  baseDosePctOfOil: number;
  molarRatio: number;
  meanTgMolarMass: number;
}): RecipeSettings {
  const assay =
    s.catalyst === "NAOH" || s.catalyst === "KOH" ? { purityPct: s.assay } : { solutionStrengthPct: s.assay };
  return {
    catalyst: s.catalyst,
    baseDosePctOfOil: s.baseDosePctOfOil,
    molarRatio: s.molarRatio,
    meanTgMolarMass: s.meanTgMolarMass,
    ...assay,
  };
}

describe("properties", () => {
  it("mass is conserved (kg within round-off, grams exactly)", () => {
    fc.assert(
      fc.property(fc.array(lotArb, { minLength: 1, maxLength: 5 }), settingsArb, (lots, s) => {
        const named = lots.map((l, i) => ({ ...l, lotRef: `L${i}` }));
        const plan = requirePlan({ lots: named, settings: toSettings(s) });
        const oilKg = named.reduce((sum, l) => sum + l.massKg, 0);
        const inputKg = oilKg + plan.methanol.toAddKg + plan.catalyst.productKg;
        const outputKg = Object.values(plan.products).reduce((sum, v) => sum + v, 0);
        expect(Math.abs(inputKg - outputKg)).toBeLessThanOrEqual(1e-9 * inputKg);
        const mb = plan.massBalance;
        expect(Object.values(mb.outputsG).reduce((sum, v) => sum + v, 0)).toBe(
          mb.inputsG.oil + mb.inputsG.methanol + mb.inputsG.catalyst,
        );
        for (const v of Object.values(plan.products)) expect(v).toBeGreaterThanOrEqual(-1e-9);
      }),
      { numRuns: 300 },
    );
  });

  it("catalyst never decreases as FFA rises", () => {
    fc.assert(
      fc.property(
        fc.double({ min: 0.05, max: 20_000, noNaN: true }),
        fc.double({ min: 0, max: 40, noNaN: true }),
        fc.double({ min: 0, max: 40, noNaN: true }),
        fc.double({ min: 0, max: 3, noNaN: true }),
        settingsArb,
        (massKg, f1, f2, waterPct, s) => {
          const [lo, hi] = f1 <= f2 ? [f1, f2] : [f2, f1];
          const settings = toSettings(s);
          const low = requirePlan({ lots: [{ lotRef: "L", massKg, ffaPct: lo, waterPct }], settings });
          const high = requirePlan({ lots: [{ lotRef: "L", massKg, ffaPct: hi, waterPct }], settings });
          expect(high.catalyst.productKg).toBeGreaterThanOrEqual(
            low.catalyst.productKg - 1e-12 * low.catalyst.productKg,
          );
          expect(high.catalyst.neutralisationKg).toBeGreaterThanOrEqual(low.catalyst.neutralisationKg);
        },
      ),
      { numRuns: 300 },
    );
  });
});
