// FFA basis carried from the titration into the neutralising catalyst, and the lab's own inputs (acid
// value, saponification value) accepted by the recipe. Before this change the recipe divided every FFA
// mass by M(oleic), so the palmitic and lauric cases below failed (9 % and 29 % low).
import { describe, it, expect } from "vitest";
import { planRecipe } from "@/lib/recipe/recipe";
import type { RecipePlan } from "@/lib/recipe/recipe";
import { computeNeutralisationKg } from "@/lib/recipe/catalyst";
import { RecipeInputSchema } from "@/lib/recipe/recipe.schema";
import type { RecipeInput } from "@/lib/recipe/recipe.schema";
import { convertFfaBasis } from "@/lib/titration/titration";
import { combineFfaReadings } from "@/lib/titration/replicates";

// IUPAC/CIAAW 2021 standard atomic weights (conventional values): C 12.011, H 1.008, O 15.999, Na 22.98976928, K 39.0983.
// M(oleic C18H34O2)   = 18×12.011 + 34×1.008 + 2×15.999 = 216.198 + 34.272 + 31.998 = 282.468 g/mol
// M(palmitic C16H32O2) = 16×12.011 + 32×1.008 + 2×15.999 = 192.176 + 32.256 + 31.998 = 256.430 g/mol
// M(lauric C12H24O2)  = 12×12.011 + 24×1.008 + 2×15.999 = 144.132 + 24.192 + 31.998 = 200.322 g/mol
// M(NaOH) = 22.98976928 + 15.999 + 1.008 = 39.99676928 g/mol; M(KOH) = 39.0983 + 15.999 + 1.008 = 56.1053 g/mol

function requirePlan(input: RecipeInput): RecipePlan {
  const r = planRecipe(input);
  if (!r.ok) throw new Error(r.issues.map((i) => i.message).join("; "));
  return r.value;
}

describe("neutralising NaOH for 800 kg oil at 2 % FFA, by basis (stoichiometry 1 mol NaOH per mol acid; AOCS Ca 5a-40 bases)", () => {
  // 800 kg × 2 % = 16 kg = 16 000 g of free fatty acid, as the named acid.
  it.each([
    // oleic:    16 000 / 282.468 = 56.6436 mol × 39.99677 = 2265.56 g
    { basis: "OLEIC" as const, naohG: 2265.56 },
    // palmitic: 16 000 / 256.430 = 62.3952 mol × 39.99677 = 2495.61 g (oleic would be 9.2 % low)
    { basis: "PALMITIC" as const, naohG: 2495.61 },
    // lauric:   16 000 / 200.322 = 79.8714 mol × 39.99677 = 3194.60 g (oleic would be 29.1 % low)
    { basis: "LAURIC" as const, naohG: 3194.6 },
  ])("$basis → $naohG g NaOH", ({ basis, naohG }) => {
    expect(computeNeutralisationKg(16, "NAOH", basis) * 1000).toBeCloseTo(naohG, 1);
    const plan = requirePlan({
      lots: [{ lotRef: "L-1", massKg: 800, ffaPct: 2, ffaBasis: basis, waterPct: 0 }],
      settings: { catalyst: "NAOH", purityPct: 100, baseDosePctOfOil: 0, meanTgMolarMass: 885.453 },
    });
    expect(plan.catalyst.neutralisationKg * 1000).toBeCloseTo(naohG, 1);
    expect(plan.oil.ffaBasis).toBe(basis);
    expect(plan.oil.ffaPct).toBeCloseTo(2, 12);
  });

  it("the oleic shortfall is 9.2 % for palmitic and 29.1 % for lauric (ratio of molar masses)", () => {
    // 1 − 256.430/282.468 = 0.0922; 1 − 200.322/282.468 = 0.2908
    const oleic = computeNeutralisationKg(16, "NAOH", "OLEIC");
    expect(1 - oleic / computeNeutralisationKg(16, "NAOH", "PALMITIC")).toBeCloseTo(0.0922, 4);
    expect(1 - oleic / computeNeutralisationKg(16, "NAOH", "LAURIC")).toBeCloseTo(0.2908, 4);
  });
});

describe("averaging titrations of different bases (acid value definition, AOCS Cd 3d-63)", () => {
  it("converts to acid value before averaging", () => {
    // 2 % as palmitic → AV = 2 × 10 × 56.1053 / 256.430 = 4.37588 mg KOH/g
    // 2 % as lauric   → AV = 2 × 10 × 56.1053 / 200.322 = 5.60151 mg KOH/g
    // mean AV = 4.98869; as oleic = 4.98869 × 282.468 / 561.053 = 2.51161 %
    const r = combineFfaReadings([
      { ffaPct: 2, basis: "PALMITIC" },
      { ffaPct: 2, basis: "LAURIC" },
    ]);
    expect(r.ok && r.value.acidValueMgKohG).toBeCloseTo(4.98869, 4);
    expect(r.ok && r.value.basis).toBe("OLEIC");
    // the old plain mean said 2 %, as oleic: 20 % too few moles of acid
    expect(r.ok && r.value.ffaPct).toBeCloseTo(2.51161, 4);
  });

  it("keeps a shared basis and its plain mean", () => {
    const r = combineFfaReadings([
      { ffaPct: 1.9, basis: "LAURIC" },
      { ffaPct: 2.1, basis: "LAURIC" },
    ]);
    expect(r.ok && r.value.basis).toBe("LAURIC");
    expect(r.ok && r.value.ffaPct).toBeCloseTo(2, 12);
    expect(r.ok && r.value.acidValueMgKohG).toBeCloseTo(5.60151, 4);
  });

  it("uses the acid value stored with a titration when there is one (EN 14104 form: 56.1 × V × c / m)", () => {
    // 56.1 × 5.20 mL × 0.25 mol/L / 7.05 g = 10.3447 mg KOH/g; FFA 5.20 % as oleic by the Ca 5a-40 factor 28.2
    const r = combineFfaReadings([{ ffaPct: 5.2, basis: "OLEIC", acidValueMgKohG: (56.1 * 5.2 * 0.25) / 7.05 }]);
    expect(r.ok && r.value.acidValueMgKohG).toBeCloseTo(10.3447, 4);
    expect(r.ok && r.value.ffaPct).toBe(5.2);
  });

  it("refuses no readings and names a bad reading", () => {
    expect(combineFfaReadings([]).ok).toBe(false);
    const bad = combineFfaReadings([
      { ffaPct: 1, basis: "OLEIC" },
      { ffaPct: -1, basis: "OLEIC" },
    ]);
    expect(bad.ok ? [] : bad.issues.map((i) => i.field)).toEqual(["replicates.1"]);
  });

  it("converts between bases keeping the moles", () => {
    // 2 % as lauric = 2 × 282.468 / 200.322 = 2.82014 % as oleic
    expect(convertFfaBasis(2, "LAURIC", "OLEIC")).toBeCloseTo(2.82014, 5);
    expect(convertFfaBasis(convertFfaBasis(2, "PALMITIC", "LAURIC"), "LAURIC", "PALMITIC")).toBeCloseTo(2, 12);
  });

  it("a blend of lots on different bases neutralises the sum of their moles", () => {
    // 400 kg at 2 % palmitic (8 000 g / 256.430 = 31.1976 mol) + 400 kg at 2 % lauric (8 000 / 200.322 = 39.9357 mol)
    // = 71.1333 mol × 39.99677 g/mol = 2845.10 g NaOH
    const plan = requirePlan({
      lots: [
        { lotRef: "P", massKg: 400, ffaPct: 2, ffaBasis: "PALMITIC", waterPct: 0 },
        { lotRef: "L", massKg: 400, ffaPct: 2, ffaBasis: "LAURIC", waterPct: 0 },
      ],
      settings: { catalyst: "NAOH", purityPct: 100, baseDosePctOfOil: 0, meanTgMolarMass: 885.453 },
    });
    expect(plan.catalyst.neutralisationKg * 1000).toBeCloseTo(2845.1, 1);
    expect(plan.oil.ffaBasis).toBe("OLEIC");
    // 71.1333 mol × 282.468 g/mol / 800 000 g × 100 = 2.51161 % as oleic
    expect(plan.oil.ffaPct).toBeCloseTo(2.51161, 4);
  });
});

describe("the recipe takes the lab's acid and saponification values", () => {
  const settings = { catalyst: "KOH" as const, purityPct: 100, baseDosePctOfOil: 0 };

  it("acid value 4.0 mg KOH/g neutralises 4.0 g KOH per kg oil (definition of the acid value, AOCS Cd 3d-63 / ISO 660)", () => {
    const parsed = RecipeInputSchema.parse({
      lots: [{ lotRef: "A", massKg: 1000, acidValueMgKohG: 4, waterPct: 0 }],
      settings: { ...settings, meanTgMolarMass: 885.453 },
    });
    // FFA as oleic = 4.0 × 282.468 / 561.053 = 2.01384 %
    expect(parsed.lots[0]?.ffaPct).toBeCloseTo(2.01384, 5);
    const plan = requirePlan(parsed);
    // 1000 kg × 4.0 mg/g = 4.0 kg KOH
    expect(plan.catalyst.neutralisationKg).toBeCloseTo(4.0, 6);
    expect(plan.oil.acidValueMgKohG).toBeCloseTo(4.0, 6);
  });

  it("saponification value gives the mean oil molar mass, less the acid value (definition of SV, AOCS Cd 3-25 / ISO 3657)", () => {
    // M = 3 × 56.1 × 1000 / (SV − AV) = 168 300 / (192 − 4) = 895.213 g/mol
    const parsed = RecipeInputSchema.parse({
      lots: [{ lotRef: "A", massKg: 1000, acidValueMgKohG: 4, waterPct: 0 }],
      settings: { ...settings, saponificationValueMgKohG: 192 },
    });
    const plan = requirePlan(parsed);
    expect(plan.oil.meanTgMolarMass).toBeCloseTo(895.213, 2);
    expect(plan.oil.molarMassFromSv).toEqual({
      saponificationValueMgKohG: 192,
      acidValueMgKohG: expect.closeTo(4, 6) as unknown as number,
    });
    expect(plan.warnings.map((w) => w.code)).not.toContain("RECIPE.DEFAULT_MOLAR_MASS_USED");
  });

  it.each([
    [
      { lotRef: "A", massKg: 1, waterPct: 0 },
      "lots.0.ffaPct",
      "Give either FFA (%) or the acid value (mg KOH/g) for the lot, not both",
    ],
    [
      { lotRef: "A", massKg: 1, ffaPct: 1, acidValueMgKohG: 2, waterPct: 0 },
      "lots.0.ffaPct",
      "Give either FFA (%) or the acid value (mg KOH/g) for the lot, not both",
    ],
    [
      { lotRef: "A", massKg: 1, acidValueMgKohG: 301, waterPct: 0 },
      "lots.0.acidValueMgKohG",
      "Acid value must be at most 300 mg KOH/g",
    ],
  ])("refuses a lot without exactly one FFA figure (%j)", (lot, path, message) => {
    const r = RecipeInputSchema.safeParse({ lots: [lot], settings });
    expect(r.success ? [] : r.error.issues.map((i) => [i.path.join("."), i.message])).toContainEqual([path, message]);
  });

  it("refuses both a molar mass and a saponification value", () => {
    const r = RecipeInputSchema.safeParse({
      lots: [{ lotRef: "A", massKg: 1, ffaPct: 1, waterPct: 0 }],
      settings: { ...settings, meanTgMolarMass: 880, saponificationValueMgKohG: 190 },
    });
    expect(r.success ? [] : r.error.issues.map((i) => i.path.join("."))).toEqual([
      "settings.saponificationValueMgKohG",
    ]);
  });
});
