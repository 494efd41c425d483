import { allocateByWeight } from "@/lib/quantity/allocate";
import { ok, fail } from "@/lib/core/result";
import type { DomainIssue, Result } from "@/lib/core/result";
import { MOLAR_MASS } from "@/lib/chemistry/molar-mass";
import type { CompoundName } from "@/lib/chemistry/molar-mass";
import { computeFameMolarMassFromTg } from "@/lib/chemistry/mean-molar-mass";
import { METHANOL_DENSITY_20C } from "@/lib/chemistry/physical-constants";
import { CATALYSTS, computeFfaMol } from "@/lib/recipe/catalyst";
import { computeMeanTgMolarMassFromSv } from "@/lib/chemistry/mean-molar-mass";
import { FFA_FACTORS, KOH_MOLAR_MASS_G_MOL } from "@/lib/titration/titration";
import type { FfaBasis } from "@/lib/titration/titration";
import type { CatalystType } from "@/lib/recipe/catalyst";
import { DEFAULT_RECIPE_SETTINGS, mergeRecipeLimits } from "@/lib/recipe/recipe-defaults";
import type { RecipeLimits } from "@/lib/recipe/recipe-defaults";
import type { RecipeInput } from "@/lib/recipe/recipe.schema";

// Model: every lot is triglyceride + FFA (as its lab basis: oleic, palmitic or lauric) + water + ester already present; 100 % conversion of
// the triglyceride; FFA neutralised 1 mol catalyst per mol; unsaponifiables are counted as triglyceride.

export interface RecipeProducts {
  /** Ester from the triglyceride plus ester carried in. */
  fameKg: number;
  glycerolKg: number;
  soapKg: number;
  /** From FFA neutralisation by a hydroxide. */
  waterFormedKg: number;
  waterFromOilKg: number;
  /** Charged methanol not consumed, plus methanol formed when a methoxide neutralises FFA. */
  excessMethanolKg: number;
  /** Base-dose catalyst, not consumed by FFA; ends up in the glycerol phase and wash water. */
  catalystResidueKg: number;
  /** The non-catalyst part of a solid catalyst (water, carbonate). */
  catalystImpurityKg: number;
}

export type RecipeProductKey = keyof RecipeProducts;

export interface RecipePlan {
  oil: {
    lots: Array<{ lotRef: string; massKg: number; massG: number }>;
    massKg: number;
    /** Blend FFA expressed as ffaBasis: the lots' shared basis, or oleic when they differ. */
    ffaPct: number;
    ffaBasis: FfaBasis;
    /** The same FFA as oleic, which the warning thresholds use. */
    ffaPctAsOleic: number;
    /** Blend acid value from the FFA moles (mg KOH/g of oil). */
    acidValueMgKohG: number;
    /** Present when the mean oil molar mass came from a saponification value: M = 3 × 56.1 × 1000 / (SV − AV). */
    molarMassFromSv: { saponificationValueMgKohG: number; acidValueMgKohG: number } | null;
    waterPct: number;
    famePct: number;
    ffaKg: number;
    waterKg: number;
    fameInKg: number;
    triglycerideKg: number;
    triglycerideMol: number;
    ffaMol: number;
    meanTgMolarMass: number;
    meanFameMolarMass: number;
  };
  methanol: {
    molarRatio: number;
    /** Methanol the ratio asks for (kg), whether it comes from the drum or from a methoxide solution. */
    chargeKg: number;
    chargeL20C: number;
    fromCatalystSolutionKg: number;
    toAddKg: number;
    toAddL20C: number;
    toAddG: number;
    toAddMl20C: number;
    /** Methanol actually in the reactor: what is added plus what the solution brings (≥ chargeKg). */
    totalKg: number;
    /** Total methanol over triglyceride moles; null when there is no triglyceride. */
    effectiveMolarRatio: number | null;
    consumedKg: number;
  };
  catalyst: {
    type: CatalystType;
    compound: CompoundName;
    baseDosePctOfOil: number;
    baseKg: number;
    neutralisationKg: number;
    pureKg: number;
    /** Mass of the product as bought (flakes, pellets or solution). */
    productKg: number;
    productG: number;
    assayPct: number;
    assayKind: "PURITY" | "SOLUTION_STRENGTH";
  };
  products: RecipeProducts;
  washWater: { washes: number; waterPerWashPctOfEster: number; perWashKg: number; totalKg: number };
  reactionTempC: number;
  massBalance: {
    inputKg: number;
    outputKg: number;
    residualKg: number;
    toleranceKg: number;
    /** Integer-gram view for booking: inputs as weighed, outputs split from the same total (exact). */
    inputsG: { oil: number; methanol: number; catalyst: number };
    outputsG: Record<RecipeProductKey, number>;
  };
  warnings: DomainIssue[];
}

const PRODUCT_KEYS: readonly RecipeProductKey[] = [
  "fameKg",
  "glycerolKg",
  "soapKg",
  "waterFormedKg",
  "waterFromOilKg",
  "excessMethanolKg",
  "catalystResidueKg",
  "catalystImpurityKg",
];

function toGrams(kg: number): number {
  return Math.round(kg * 1000);
}

function fmt(n: number, digits = 2): string {
  return n.toFixed(digits);
}

/** Plans a base-catalysed batch from the lots to be charged. Input is expected to have passed RecipeInputSchema. */
export function planRecipe(input: RecipeInput, limitOverrides: Partial<RecipeLimits> = {}): Result<RecipePlan> {
  const limits = mergeRecipeLimits(limitOverrides);
  const { settings } = input;
  const warnings: DomainIssue[] = [];
  const profile = CATALYSTS[settings.catalyst];

  const lots = input.lots.map((lot) => ({ lotRef: lot.lotRef, massKg: lot.massKg, massG: toGrams(lot.massKg) }));
  let oilKg = 0;
  let ffaKg = 0;
  let ffaMol = 0;
  let waterKg = 0;
  let fameInKg = 0;
  for (const lot of input.lots) {
    const lotFfaKg = (lot.massKg * lot.ffaPct) / 100;
    oilKg += lot.massKg;
    ffaKg += lotFfaKg;
    // Moles by the basis the lab reported: 2 % as lauric is 41 % more acid than 2 % as oleic (AOCS Ca 5a-40).
    ffaMol += computeFfaMol(lotFfaKg, lot.ffaBasis ?? "OLEIC");
    waterKg += (lot.massKg * lot.waterPct) / 100;
    fameInKg += (lot.massKg * (lot.famePct ?? 0)) / 100;
  }
  if (!(oilKg > 0)) return fail("RECIPE.NO_OIL", "The lots to charge add up to 0 kg.", "lots");
  const triglycerideKg = Math.max(0, oilKg - ffaKg - waterKg - fameInKg);
  const firstBasis = input.lots[0]?.ffaBasis ?? "OLEIC";
  const sharedBasis = input.lots.every((l) => (l.ffaBasis ?? "OLEIC") === firstBasis);
  const ffaBasis: FfaBasis = sharedBasis ? firstBasis : "OLEIC";
  // mg KOH per g of oil: mol × M(KOH) g/mol × 1000 mg/g ÷ (kg × 1000 g/kg).
  const acidValueMgKohG = (ffaMol * KOH_MOLAR_MASS_G_MOL) / oilKg;

  const molarRatio = settings.molarRatio ?? DEFAULT_RECIPE_SETTINGS.molarRatio.value;
  const sv = settings.saponificationValueMgKohG;
  let meanTgMolarMass = settings.meanTgMolarMass ?? DEFAULT_RECIPE_SETTINGS.meanTgMolarMass.value;
  if (sv !== undefined) {
    const fromSv = computeMeanTgMolarMassFromSv(sv, { acidValueMgKohPerG: acidValueMgKohG });
    if (!fromSv.ok)
      return fail(
        fromSv.issues[0]?.code ?? "CHEMISTRY.BAD_SAPONIFICATION_VALUE",
        fromSv.issues[0]?.message ?? "Bad saponification value",
        "settings.saponificationValueMgKohG",
      );
    meanTgMolarMass = fromSv.value;
  } else if (settings.meanTgMolarMass === undefined) {
    warnings.push({
      code: "RECIPE.DEFAULT_MOLAR_MASS_USED",
      message: `No mean oil molar mass given; using ${fmt(meanTgMolarMass, 1)} g/mol (${DEFAULT_RECIPE_SETTINGS.meanTgMolarMass.source}). A measured saponification value gives a better methanol charge.`,
      field: "settings.meanTgMolarMass",
    });
  }
  const meanFameMolarMass = computeFameMolarMassFromTg(meanTgMolarMass);
  const reactionTempC = settings.reactionTempC ?? DEFAULT_RECIPE_SETTINGS.reactionTempC.value;

  // Moles in mol, masses in kg: kg × 1000 / (g/mol) = mol.
  const triglycerideMol = (triglycerideKg * 1000) / meanTgMolarMass;
  const chargeKg = (molarRatio * triglycerideMol * MOLAR_MASS.methanol) / 1000;
  const consumedKg = (3 * triglycerideMol * MOLAR_MASS.methanol) / 1000;

  const baseDosePctOfOil = settings.baseDosePctOfOil ?? profile.defaultBaseDosePctOfOil.value;
  const baseKg = (oilKg * baseDosePctOfOil) / 100;
  const neutralisationKg = (ffaMol * MOLAR_MASS[profile.compound]) / 1000;
  const pureKg = baseKg + neutralisationKg;
  const givenAssay = profile.form === "SOLID" ? settings.purityPct : settings.solutionStrengthPct;
  const assayPct = givenAssay ?? profile.defaultAssayPct.value;
  if (givenAssay === undefined) {
    warnings.push({
      code: "RECIPE.DEFAULT_PURITY_USED",
      message: `No ${profile.form === "SOLID" ? "purity" : "solution strength"} given for ${settings.catalyst}; using ${assayPct} % (${profile.defaultAssayPct.source}, ${profile.defaultAssayPct.status}). Enter the value from the supplier's certificate of analysis.`,
      field: profile.form === "SOLID" ? "settings.purityPct" : "settings.solutionStrengthPct",
    });
  }
  const productKg = pureKg / (assayPct / 100);
  const fromCatalystSolutionKg = profile.form === "METHANOL_SOLUTION" ? productKg - pureKg : 0;
  const catalystImpurityKg = profile.form === "SOLID" ? productKg - pureKg : 0;
  const toAddKg = Math.max(0, chargeKg - fromCatalystSolutionKg);
  const totalMethanolKg = toAddKg + fromCatalystSolutionKg;
  if (fromCatalystSolutionKg > chargeKg) {
    warnings.push({
      code: "RECIPE.CATALYST_SOLUTION_EXCEEDS_METHANOL_CHARGE",
      message: `The methoxide solution brings ${fmt(fromCatalystSolutionKg, 3)} kg methanol, more than the ${fmt(chargeKg, 3)} kg the ${molarRatio}:1 ratio asks for; no methanol is added and the ratio rises to ${fmt((totalMethanolKg * 1000) / MOLAR_MASS.methanol / Math.max(triglycerideMol, Number.MIN_VALUE), 2)}:1.`,
      field: "settings.solutionStrengthPct",
    });
  }

  const byWater = profile.neutralisationByproduct === "WATER";
  const products: RecipeProducts = {
    fameKg: fameInKg + (3 * triglycerideMol * meanFameMolarMass) / 1000,
    glycerolKg: (triglycerideMol * MOLAR_MASS.glycerol) / 1000,
    // RCOOH + MOH → RCOOM + H2O (or + MOCH3 → RCOOM + CH3OH): soap = acid + catalyst − by-product, per mole,
    // so the soap of a palmitic or lauric FFA weighs what its own acid brings.
    soapKg: ffaKg + (ffaMol * (MOLAR_MASS[profile.compound] - MOLAR_MASS[byWater ? "water" : "methanol"])) / 1000,
    waterFormedKg: byWater ? (ffaMol * MOLAR_MASS.water) / 1000 : 0,
    waterFromOilKg: waterKg,
    excessMethanolKg: totalMethanolKg - consumedKg + (byWater ? 0 : (ffaMol * MOLAR_MASS.methanol) / 1000),
    catalystResidueKg: baseKg,
    catalystImpurityKg,
  };

  const washes = settings.washPractice?.washes ?? DEFAULT_RECIPE_SETTINGS.washes.value;
  const waterPerWashPctOfEster =
    settings.washPractice?.waterPerWashPctOfEster ?? DEFAULT_RECIPE_SETTINGS.waterPerWashPctOfEster.value;
  const perWashKg = (products.fameKg * waterPerWashPctOfEster) / 100;

  const inputKg = oilKg + toAddKg + productKg;
  const outputKg = PRODUCT_KEYS.reduce((s, k) => s + products[k], 0);
  const residualKg = inputKg - outputKg;
  const toleranceKg = limits.massBalanceRelTolerance.value * inputKg;
  if (!(Math.abs(residualKg) <= toleranceKg)) {
    return fail(
      "RECIPE.MASS_BALANCE_OPEN",
      `Recipe mass balance does not close: inputs ${fmt(inputKg, 6)} kg, outputs ${fmt(outputKg, 6)} kg.`,
    );
  }
  const inputsG = {
    oil: lots.reduce((s, l) => s + l.massG, 0),
    methanol: toGrams(toAddKg),
    catalyst: toGrams(productKg),
  };
  const split = allocateByWeight(
    inputsG.oil + inputsG.methanol + inputsG.catalyst,
    PRODUCT_KEYS.map((k) => [k, products[k]] as const),
  );
  const outputsG = Object.fromEntries(PRODUCT_KEYS.map((k) => [k, 0])) as Record<RecipeProductKey, number>;
  for (const [k, g] of split) outputsG[k] = g;

  // kg FFA as the basis acid over kg oil, in %: mol × M g/mol ÷ 1000 ÷ kg × 100.
  const ffaPct = sharedBasis ? (ffaKg / oilKg) * 100 : (ffaMol * FFA_FACTORS.OLEIC.molarMassGMol) / 10 / oilKg;
  const ffaPctAsOleic = (ffaMol * FFA_FACTORS.OLEIC.molarMassGMol) / 10 / oilKg;
  const waterPct = (waterKg / oilKg) * 100;
  pushProcessWarnings(warnings, limits, { reactionTempC, ffaPct: ffaPctAsOleic, waterPct });

  const densityGPerMl = METHANOL_DENSITY_20C.value;
  return ok({
    oil: {
      lots,
      massKg: oilKg,
      ffaPct,
      ffaBasis,
      ffaPctAsOleic,
      acidValueMgKohG,
      molarMassFromSv: sv === undefined ? null : { saponificationValueMgKohG: sv, acidValueMgKohG },
      waterPct,
      famePct: (fameInKg / oilKg) * 100,
      ffaKg,
      waterKg,
      fameInKg,
      triglycerideKg,
      triglycerideMol,
      ffaMol,
      meanTgMolarMass,
      meanFameMolarMass,
    },
    methanol: {
      molarRatio,
      chargeKg,
      chargeL20C: chargeKg / densityGPerMl,
      fromCatalystSolutionKg,
      toAddKg,
      toAddL20C: toAddKg / densityGPerMl,
      toAddG: inputsG.methanol,
      toAddMl20C: Math.round((toAddKg * 1000) / densityGPerMl),
      totalKg: totalMethanolKg,
      effectiveMolarRatio:
        triglycerideMol > 0 ? (totalMethanolKg * 1000) / MOLAR_MASS.methanol / triglycerideMol : null,
      consumedKg,
    },
    catalyst: {
      type: settings.catalyst,
      compound: profile.compound,
      baseDosePctOfOil,
      baseKg,
      neutralisationKg,
      pureKg,
      productKg,
      productG: inputsG.catalyst,
      assayPct,
      assayKind: profile.form === "SOLID" ? "PURITY" : "SOLUTION_STRENGTH",
    },
    products,
    washWater: { washes, waterPerWashPctOfEster, perWashKg, totalKg: perWashKg * washes },
    reactionTempC,
    massBalance: { inputKg, outputKg, residualKg, toleranceKg, inputsG, outputsG },
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
