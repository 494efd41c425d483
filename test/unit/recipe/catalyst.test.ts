import { describe, it, expect } from "vitest";
import { CATALYSTS, computeNeutralisationKg } from "@/lib/recipe/catalyst";
import { MOLAR_MASS } from "@/lib/chemistry/molar-mass";

// 1 % FFA (as oleic) in 1 kg oil = 10 g FFA.
const FFA_KG_PER_PCT_PER_KG = 0.01;

describe("neutralisation per 1 % FFA per kg oil (stoichiometry, computed)", () => {
  it.each([
    ["NAOH", 1.416],
    ["KOH", 1.986],
    ["NAOME_SOLUTION", 1.913],
    ["KOME_SOLUTION", 2.483],
  ] as const)("%s: %f g pure catalyst", (type, grams) => {
    // stoichiometry, computed: 0.03540 mol → NaOH 1.416 g; KOH 1.986 g; NaOMe 1.913 g; KOMe 2.483 g
    expect(Math.abs(computeNeutralisationKg(FFA_KG_PER_PCT_PER_KG, type) * 1000 - grams)).toBeLessThan(0.0006);
  });

  it("0.03540 mol FFA and 0.638 g water formed by a hydroxide", () => {
    // stoichiometry, computed: per 1 % FFA per kg oil, 0.03540 mol, water formed 0.638 g
    const mol = 10 / MOLAR_MASS.oleicAcid;
    expect(mol).toBeCloseTo(0.0354, 4);
    expect(mol * MOLAR_MASS.water).toBeCloseTo(0.638, 3);
  });

  it("molar equivalence 1 g NaOH ≡ 1.4027 g KOH ≡ 1.3507 g NaOMe ≡ 1.7534 g KOMe", () => {
    // stoichiometry, computed (computed)
    const naoh = computeNeutralisationKg(1, "NAOH");
    expect(computeNeutralisationKg(1, "KOH") / naoh).toBeCloseTo(1.4027, 4);
    expect(computeNeutralisationKg(1, "NAOME_SOLUTION") / naoh).toBeCloseTo(1.3507, 4);
    expect(computeNeutralisationKg(1, "KOME_SOLUTION") / naoh).toBeCloseTo(1.7534, 4);
  });

  it("KOH needed in g/kg oil equals the acid value", () => {
    // stoichiometry, computed: pure KOH needed (g per kg oil) = AV (mg KOH/g), by the AV definition; NaOH = 0.7129 × AV
    const av = 4.0;
    const ffaPct = (av * 282.468) / (10 * 56.1053);
    expect(computeNeutralisationKg(ffaPct / 100, "KOH") * 1000).toBeCloseTo(av, 4);
    expect(computeNeutralisationKg(ffaPct / 100, "NAOH") * 1000).toBeCloseTo(0.7129 * av, 3);
  });
});

describe("catalyst defaults carry a source", () => {
  it.each(Object.values(CATALYSTS))("$type", (profile) => {
    expect(profile.defaultBaseDosePctOfOil.source.length).toBeGreaterThan(10);
    expect(profile.defaultAssayPct.source.length).toBeGreaterThan(10);
    expect(profile.defaultAssayPct.value).toBeLessThanOrEqual(100);
  });

  it("NaOMe 0.5 % and NaOH 0.5 % are verified values; KOMe is their molar equivalent", () => {
    // Ma, Clements & Hanna 1998 (NaOMe 0.5 %); review excerpt 0.5 % NaOH (common practice); KOMe = 0.5 × 70.132/54.024
    expect(CATALYSTS.NAOME_SOLUTION.defaultBaseDosePctOfOil.value).toBe(0.5);
    expect(CATALYSTS.NAOH.defaultBaseDosePctOfOil.value).toBe(0.5);
    expect(CATALYSTS.KOME_SOLUTION.defaultBaseDosePctOfOil.value).toBeCloseTo((0.5 * 70.132) / 54.024, 3);
    expect(CATALYSTS.KOME_SOLUTION.defaultBaseDosePctOfOil.status).toBe("computed");
  });
});
