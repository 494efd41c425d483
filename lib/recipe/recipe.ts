import { ok, fail } from "@/lib/core/result";
import type { DomainIssue, Result } from "@/lib/core/result";
import { computeFameMolarMassFromTg } from "@/lib/chemistry/mean-molar-mass";
import { CATALYSTS } from "@/lib/recipe/catalyst";
import { FFA_FACTORS } from "@/lib/titration/titration";
import { DEFAULT_RECIPE_SETTINGS, mergeRecipeLimits } from "@/lib/recipe/recipe-defaults";
import type { RecipeLimits } from "@/lib/recipe/recipe-defaults";
import type { RecipeInput } from "@/lib/recipe/recipe.schema";
import { fmt } from "@/lib/recipe/recipe-plan";
import type { RecipePlan } from "@/lib/recipe/recipe-plan";
import {
  catalystCharge,
  closeMassBalance,
  methanolCharge,
  methanolView,
  oilMolarMass,
  oilView,
  productsOf,
  sumOil,
} from "@/lib/recipe/recipe-steps";

export type { RecipePlan, RecipeProductKey, RecipeProducts } from "@/lib/recipe/recipe-plan";

/** Plans a base-catalysed batch from the lots to be charged. Input is expected to have passed RecipeInputSchema. */
export function planRecipe(input: RecipeInput, limitOverrides: Partial<RecipeLimits> = {}): Result<RecipePlan> {
  const limits = mergeRecipeLimits(limitOverrides);
  const { settings } = input;
  const warnings: DomainIssue[] = [];
  const profile = CATALYSTS[settings.catalyst];
  const oil = sumOil(input);
  if (!(oil.oilKg > 0)) return fail("RECIPE.NO_OIL", "The lots to charge add up to 0 kg.", "lots");
  const molarRatio = settings.molarRatio ?? DEFAULT_RECIPE_SETTINGS.molarRatio.value;
  const molarMass = oilMolarMass(settings, oil.acidValueMgKohG, warnings);
  if (!molarMass.ok) return molarMass;
  const meanTgMolarMass = molarMass.value;
  const meanFameMolarMass = computeFameMolarMassFromTg(meanTgMolarMass);
  const reactionTempC = settings.reactionTempC ?? DEFAULT_RECIPE_SETTINGS.reactionTempC.value;
  // Moles in mol, masses in kg: kg × 1000 / (g/mol) = mol.
  const triglycerideMol = (oil.triglycerideKg * 1000) / meanTgMolarMass;
  const catalyst = catalystCharge(settings, profile, oil, warnings);
  const methanol = methanolCharge(molarRatio, triglycerideMol, catalyst, warnings);
  const products = productsOf(
    oil,
    triglycerideMol,
    meanFameMolarMass,
    profile,
    catalyst,
    methanol.totalKg - methanol.consumedKg,
  );
  const washes = settings.washPractice?.washes ?? DEFAULT_RECIPE_SETTINGS.washes.value;
  const waterPerWashPctOfEster =
    settings.washPractice?.waterPerWashPctOfEster ?? DEFAULT_RECIPE_SETTINGS.waterPerWashPctOfEster.value;
  const perWashKg = (products.fameKg * waterPerWashPctOfEster) / 100;
  const massBalance = closeMassBalance(
    input,
    products,
    { oilKg: oil.oilKg, methanolKg: methanol.toAddKg, catalystKg: catalyst.productKg },
    limits,
  );
  if (!massBalance.ok) return massBalance;
  // kg FFA as the basis acid over kg oil, in %: mol × M g/mol ÷ 1000 ÷ kg × 100.
  const ffaPctAsOleic = (oil.ffaMol * FFA_FACTORS.OLEIC.molarMassGMol) / 10 / oil.oilKg;
  const ffaPct = oil.sharedBasis ? (oil.ffaKg / oil.oilKg) * 100 : ffaPctAsOleic;
  const waterPct = (oil.waterKg / oil.oilKg) * 100;
  pushProcessWarnings(warnings, limits, { reactionTempC, ffaPct: ffaPctAsOleic, waterPct });
  const sv = settings.saponificationValueMgKohG;
  return ok({
    oil: oilView(input, oil, {
      ffaPct,
      ffaPctAsOleic,
      waterPct,
      triglycerideMol,
      meanTgMolarMass,
      meanFameMolarMass,
      sv,
    }),
    methanol: methanolView(molarRatio, triglycerideMol, catalyst, methanol, massBalance.value.inputsG.methanol),
    catalyst: {
      type: settings.catalyst,
      compound: profile.compound,
      baseDosePctOfOil: catalyst.baseDosePctOfOil,
      baseKg: catalyst.baseKg,
      neutralisationKg: catalyst.neutralisationKg,
      pureKg: catalyst.pureKg,
      productKg: catalyst.productKg,
      productG: massBalance.value.inputsG.catalyst,
      assayPct: catalyst.assayPct,
      assayKind: profile.form === "SOLID" ? "PURITY" : "SOLUTION_STRENGTH",
    },
    products,
    washWater: { washes, waterPerWashPctOfEster, perWashKg, totalKg: perWashKg * washes },
    reactionTempC,
    massBalance: massBalance.value,
    warnings,
  });
}

function pushProcessWarnings(
  warnings: DomainIssue[],
  limits: RecipeLimits,
  at: { reactionTempC: number; ffaPct: number; waterPct: number },
): void {
  const bp = limits.methanolBoilingPointC.value;
  const margin = limits.boilingMarginK.value;
  if (at.reactionTempC >= bp - margin) {
    warnings.push({
      code: "RECIPE.NEAR_METHANOL_BOILING",
      message: `Reaction temperature ${at.reactionTempC} °C is ${at.reactionTempC >= bp ? "at or above" : `within ${margin} K of`} the methanol boiling point ${bp} °C (${limits.methanolBoilingPointC.source}); methanol boils off unless the vessel is under reflux or pressure.`,
      field: "settings.reactionTempC",
    });
  }
  if (at.reactionTempC < limits.minReactionTempC.value) {
    warnings.push({
      code: "RECIPE.LOW_REACTION_TEMPERATURE",
      message: `Reaction temperature ${at.reactionTempC} °C is below ${limits.minReactionTempC.value} °C (${limits.minReactionTempC.source}); expect a slow reaction.`,
      field: "settings.reactionTempC",
    });
  }
  if (at.ffaPct >= limits.baseCatalysisMaxFfaPct.value) {
    warnings.push({
      code: "RECIPE.FFA_REQUIRES_PRETREATMENT",
      message: `Blend FFA ${fmt(at.ffaPct)} % is at or above ${limits.baseCatalysisMaxFfaPct.value} % (${limits.baseCatalysisMaxFfaPct.source}); soap will hinder glycerol separation. Plan an acid pretreatment.`,
      field: "lots",
    });
  } else if (at.ffaPct >= limits.directBaseMaxFfaPct.value) {
    warnings.push({
      code: "RECIPE.HIGH_FFA",
      message: `Blend FFA ${fmt(at.ffaPct)} % is at or above ${limits.directBaseMaxFfaPct.value} % (${limits.directBaseMaxFfaPct.source}); the recipe adds catalyst to neutralise it and soap forms.`,
      field: "lots",
    });
  }
  if (at.waterPct > limits.maxWaterPct.value) {
    warnings.push({
      code: "RECIPE.HIGH_WATER",
      message: `Blend water ${fmt(at.waterPct, 3)} % is above ${limits.maxWaterPct.value} % (${limits.maxWaterPct.source}); water forms soap and hinders separation. Dry the oil first.`,
      field: "lots",
    });
  }
}
