import { describe, it, expect } from "vitest";
import {
  MAX_FFA_PCT,
  MAX_PURITY_PCT,
  MAX_REACTION_TEMP_C,
  MIN_REACTION_TEMP_C,
  BatchActualsSchema,
  PretreatmentInputSchema,
  RecipeInputSchema,
} from "@/lib/recipe/recipe.schema";

const valid = {
  lots: [{ lotRef: "UCO-12", massKg: 800, ffaPct: 1.2, waterPct: 0.05 }],
  settings: { catalyst: "KOH", purityPct: 90, reactionTempC: 60 },
};

function issuesOf(input: unknown) {
  const r = RecipeInputSchema.safeParse(input);
  return r.success ? [] : r.error.issues.map((i) => ({ path: i.path.join("."), message: i.message }));
}

describe("RecipeInputSchema", () => {
  it("accepts a plain batch", () => {
    expect(RecipeInputSchema.safeParse(valid).success).toBe(true);
  });

  it.each([
    [{ ...valid, lots: [{ ...valid.lots[0], ffaPct: MAX_FFA_PCT + 1 }] }, "lots.0.ffaPct", "FFA must be at most 100 %"],
    [{ ...valid, lots: [{ ...valid.lots[0], ffaPct: -0.1 }] }, "lots.0.ffaPct", "FFA must be at least 0 %"],
    [{ ...valid, lots: [{ ...valid.lots[0], massKg: 0 }] }, "lots.0.massKg", "Mass must be above 0 kg"],
    [
      { ...valid, lots: [{ ...valid.lots[0], ffaPct: 60, waterPct: 40 }] },
      "lots.0.ffaPct",
      "FFA + water + ester must be below 100 %",
    ],
    [
      { ...valid, settings: { ...valid.settings, purityPct: MAX_PURITY_PCT + 0.5 } },
      "settings.purityPct",
      "Catalyst purity must be at most 100 %",
    ],
    [
      { ...valid, settings: { ...valid.settings, reactionTempC: MAX_REACTION_TEMP_C + 1 } },
      "settings.reactionTempC",
      "at most 150 °C",
    ],
    [
      { ...valid, settings: { ...valid.settings, reactionTempC: MIN_REACTION_TEMP_C - 1 } },
      "settings.reactionTempC",
      "at least -20 °C",
    ],
    [{ ...valid, settings: { ...valid.settings, molarRatio: 2.5 } }, "settings.molarRatio", "at least 3:1"],
    [
      { ...valid, settings: { ...valid.settings, solutionStrengthPct: 30 } },
      "settings.solutionStrengthPct",
      "methoxide solutions",
    ],
    [{ ...valid, settings: { catalyst: "NAOME_SOLUTION", purityPct: 30 } }, "settings.purityPct", "solid catalysts"],
    [{ ...valid, settings: { catalyst: "CAO" } }, "settings.catalyst", "Catalyst must be one of"],
    [{ ...valid, lots: [valid.lots[0], valid.lots[0]] }, "lots.1.lotRef", "listed twice"],
    [{ ...valid, lots: [] }, "lots", "At least one lot"],
  ])("rejects %# at %s", (input, path, message) => {
    const issues = issuesOf(input);
    expect(issues.some((i) => i.path === path && i.message.includes(message))).toBe(true);
  });
});

describe("PretreatmentInputSchema and BatchActualsSchema", () => {
  it("bounds the acid-step settings", () => {
    const r = PretreatmentInputSchema.safeParse({ ...valid, acidStep: { acidPurityPct: 120 } });
    expect(r.success).toBe(false);
    if (r.success) return;
    expect(r.error.issues[0]?.path.join(".")).toBe("acidStep.acidPurityPct");
  });
  it("rejects negative actuals with a kg message", () => {
    const r = BatchActualsSchema.safeParse({
      esterKg: -1,
      glycerolPhaseKg: 0,
      catalystProductUsedKg: 0,
      methanolAddedKg: 0,
    });
    expect(r.success).toBe(false);
    if (r.success) return;
    expect(r.error.issues[0]?.message).toBe("Ester produced must be 0 kg or more");
  });
});
