// The steps of a recipe plan: the oil's totals, its molar mass, the catalyst and methanol charges, the
// products, the mass balance, and the plan's oil and methanol views.
import { allocateByWeight } from "@/lib/quantity/allocate";
import { ok, fail } from "@/lib/core/result";
import type { DomainIssue, Result } from "@/lib/core/result";
import { MOLAR_MASS } from "@/lib/chemistry/molar-mass";
import { METHANOL_DENSITY_20C } from "@/lib/chemistry/physical-constants";
import { computeFfaMol } from "@/lib/recipe/catalyst";
import { computeMeanTgMolarMassFromSv } from "@/lib/chemistry/mean-molar-mass";
import { KOH_MOLAR_MASS_G_MOL } from "@/lib/titration/titration";
import type { FfaBasis } from "@/lib/titration/titration";
import type { CatalystType, CATALYSTS } from "@/lib/recipe/catalyst";
import { DEFAULT_RECIPE_SETTINGS } from "@/lib/recipe/recipe-defaults";
import type { RecipeLimits } from "@/lib/recipe/recipe-defaults";
import type { RecipeInput } from "@/lib/recipe/recipe.schema";
import { fmt, PRODUCT_KEYS, toGrams } from "@/lib/recipe/recipe-plan";
import type { RecipePlan, RecipeProductKey, RecipeProducts } from "@/lib/recipe/recipe-plan";

type Profile = (typeof CATALYSTS)[CatalystType];

/** The charged oil's totals, with its FFA in moles by the basis each lot was titrated on. */
export function sumOil(input: RecipeInput) {
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
  const triglycerideKg = Math.max(0, oilKg - ffaKg - waterKg - fameInKg);
  const firstBasis = input.lots[0]?.ffaBasis ?? "OLEIC";
  const sharedBasis = input.lots.every((l) => (l.ffaBasis ?? "OLEIC") === firstBasis);
  const ffaBasis: FfaBasis = sharedBasis ? firstBasis : "OLEIC";
  // mg KOH per g of oil: mol × M(KOH) g/mol × 1000 mg/g ÷ (kg × 1000 g/kg).
  const acidValueMgKohG = oilKg > 0 ? (ffaMol * KOH_MOLAR_MASS_G_MOL) / oilKg : 0;
  return { oilKg, ffaKg, ffaMol, waterKg, fameInKg, triglycerideKg, sharedBasis, ffaBasis, acidValueMgKohG };
}
export type OilTotals = ReturnType<typeof sumOil>;

/** The oil's mean molar mass: from a saponification value when the lab gave one, else the setting or default. */
export function oilMolarMass(
  settings: RecipeInput["settings"],
  acidValueMgKohG: number,
  warnings: DomainIssue[],
): Result<number> {
  const sv = settings.saponificationValueMgKohG;
  const given = settings.meanTgMolarMass ?? DEFAULT_RECIPE_SETTINGS.meanTgMolarMass.value;
  if (sv !== undefined) {
    const fromSv = computeMeanTgMolarMassFromSv(sv, { acidValueMgKohPerG: acidValueMgKohG });
    if (!fromSv.ok)
      return fail(
        fromSv.issues[0]?.code ?? "CHEMISTRY.BAD_SAPONIFICATION_VALUE",
        fromSv.issues[0]?.message ?? "Bad saponification value",
        "settings.saponificationValueMgKohG",
      );
    return ok(fromSv.value);
  }
  if (settings.meanTgMolarMass === undefined)
    warnings.push({
      code: "RECIPE.DEFAULT_MOLAR_MASS_USED",
      message: `No mean oil molar mass given; using ${fmt(given, 1)} g/mol (${DEFAULT_RECIPE_SETTINGS.meanTgMolarMass.source}). A measured saponification value gives a better methanol charge.`,
      field: "settings.meanTgMolarMass",
    });
  return ok(given);
}

/** Catalyst: the base dose plus what neutralises the FFA, as the product bought (purity or solution strength). */
export function catalystCharge(
  settings: RecipeInput["settings"],
  profile: Profile,
  oil: OilTotals,
  warnings: DomainIssue[],
) {
  const baseDosePctOfOil = settings.baseDosePctOfOil ?? profile.defaultBaseDosePctOfOil.value;
  const baseKg = (oil.oilKg * baseDosePctOfOil) / 100;
  const neutralisationKg = (oil.ffaMol * MOLAR_MASS[profile.compound]) / 1000;
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
  return {
    baseDosePctOfOil,
    baseKg,
    neutralisationKg,
    pureKg,
    assayPct,
    productKg,
    fromCatalystSolutionKg: profile.form === "METHANOL_SOLUTION" ? productKg - pureKg : 0,
    catalystImpurityKg: profile.form === "SOLID" ? productKg - pureKg : 0,
  };
}
export type CatalystCharge = ReturnType<typeof catalystCharge>;

/** Methanol: the molar ratio's charge, less what a methoxide solution already brings. */
export function methanolCharge(
  molarRatio: number,
  triglycerideMol: number,
  catalyst: CatalystCharge,
  warnings: DomainIssue[],
) {
  const chargeKg = (molarRatio * triglycerideMol * MOLAR_MASS.methanol) / 1000;
  const consumedKg = (3 * triglycerideMol * MOLAR_MASS.methanol) / 1000;
  const fromSolutionKg = catalyst.fromCatalystSolutionKg;
  const toAddKg = Math.max(0, chargeKg - fromSolutionKg);
  const totalKg = toAddKg + fromSolutionKg;
  if (fromSolutionKg > chargeKg) {
    warnings.push({
      code: "RECIPE.CATALYST_SOLUTION_EXCEEDS_METHANOL_CHARGE",
      message: `The methoxide solution brings ${fmt(fromSolutionKg, 3)} kg methanol, more than the ${fmt(chargeKg, 3)} kg the ${molarRatio}:1 ratio asks for; no methanol is added and the ratio rises to ${fmt((totalKg * 1000) / MOLAR_MASS.methanol / Math.max(triglycerideMol, Number.MIN_VALUE), 2)}:1.`,
      field: "settings.solutionStrengthPct",
    });
  }
  return { chargeKg, consumedKg, toAddKg, totalKg };
}

export function productsOf(
  oil: OilTotals,
  triglycerideMol: number,
  meanFameMolarMass: number,
  profile: Profile,
  catalyst: CatalystCharge,
  excessMethanolKg: number,
): RecipeProducts {
  const byWater = profile.neutralisationByproduct === "WATER";
  return {
    fameKg: oil.fameInKg + (3 * triglycerideMol * meanFameMolarMass) / 1000,
    glycerolKg: (triglycerideMol * MOLAR_MASS.glycerol) / 1000,
    // RCOOH + MOH → RCOOM + H2O (or + MOCH3 → RCOOM + CH3OH): soap = acid + catalyst − by-product, per mole,
    // so the soap of a palmitic or lauric FFA weighs what its own acid brings.
    soapKg:
      oil.ffaKg + (oil.ffaMol * (MOLAR_MASS[profile.compound] - MOLAR_MASS[byWater ? "water" : "methanol"])) / 1000,
    waterFormedKg: byWater ? (oil.ffaMol * MOLAR_MASS.water) / 1000 : 0,
    waterFromOilKg: oil.waterKg,
    excessMethanolKg: excessMethanolKg + (byWater ? 0 : (oil.ffaMol * MOLAR_MASS.methanol) / 1000),
    catalystResidueKg: catalyst.baseKg,
    catalystImpurityKg: catalyst.catalystImpurityKg,
  };
}

/** Inputs against outputs, failing when they do not close; the whole grams split over the products. */
export function closeMassBalance(
  input: RecipeInput,
  products: RecipeProducts,
  charged: { oilKg: number; methanolKg: number; catalystKg: number },
  limits: RecipeLimits,
): Result<RecipePlan["massBalance"]> {
  const inputKg = charged.oilKg + charged.methanolKg + charged.catalystKg;
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
    oil: input.lots.reduce((s, l) => s + toGrams(l.massKg), 0),
    methanol: toGrams(charged.methanolKg),
    catalyst: toGrams(charged.catalystKg),
  };
  const split = allocateByWeight(
    inputsG.oil + inputsG.methanol + inputsG.catalyst,
    PRODUCT_KEYS.map((k) => [k, products[k]] as const),
  );
  const outputsG = Object.fromEntries(PRODUCT_KEYS.map((k) => [k, 0])) as Record<RecipeProductKey, number>;
  for (const [k, g] of split) outputsG[k] = g;
  return ok({ inputKg, outputKg, residualKg, toleranceKg, inputsG, outputsG });
}

export function oilView(
  input: RecipeInput,
  oil: OilTotals,
  v: {
    ffaPct: number;
    ffaPctAsOleic: number;
    waterPct: number;
    triglycerideMol: number;
    meanTgMolarMass: number;
    meanFameMolarMass: number;
    sv: number | undefined;
  },
): RecipePlan["oil"] {
  return {
    lots: input.lots.map((lot) => ({ lotRef: lot.lotRef, massKg: lot.massKg, massG: toGrams(lot.massKg) })),
    massKg: oil.oilKg,
    ffaPct: v.ffaPct,
    ffaBasis: oil.ffaBasis,
    ffaPctAsOleic: v.ffaPctAsOleic,
    acidValueMgKohG: oil.acidValueMgKohG,
    molarMassFromSv:
      v.sv === undefined ? null : { saponificationValueMgKohG: v.sv, acidValueMgKohG: oil.acidValueMgKohG },
    waterPct: v.waterPct,
    famePct: (oil.fameInKg / oil.oilKg) * 100,
    ffaKg: oil.ffaKg,
    waterKg: oil.waterKg,
    fameInKg: oil.fameInKg,
    triglycerideKg: oil.triglycerideKg,
    triglycerideMol: v.triglycerideMol,
    ffaMol: oil.ffaMol,
    meanTgMolarMass: v.meanTgMolarMass,
    meanFameMolarMass: v.meanFameMolarMass,
  };
}

export function methanolView(
  molarRatio: number,
  triglycerideMol: number,
  catalyst: CatalystCharge,
  m: ReturnType<typeof methanolCharge>,
  toAddG: number,
): RecipePlan["methanol"] {
  const densityGPerMl = METHANOL_DENSITY_20C.value;
  return {
    molarRatio,
    chargeKg: m.chargeKg,
    chargeL20C: m.chargeKg / densityGPerMl,
    fromCatalystSolutionKg: catalyst.fromCatalystSolutionKg,
    toAddKg: m.toAddKg,
    toAddL20C: m.toAddKg / densityGPerMl,
    toAddG,
    toAddMl20C: Math.round((m.toAddKg * 1000) / densityGPerMl),
    totalKg: m.totalKg,
    effectiveMolarRatio: triglycerideMol > 0 ? (m.totalKg * 1000) / MOLAR_MASS.methanol / triglycerideMol : null,
    consumedKg: m.consumedKg,
  };
}
