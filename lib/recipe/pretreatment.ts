import { convertFfaBasis } from "@/lib/titration/titration";
import { ok, fail } from "@/lib/core/result";
import type { DomainIssue, Result } from "@/lib/core/result";
import { MOLAR_MASS } from "@/lib/chemistry/molar-mass";
import { METHANOL_DENSITY_20C } from "@/lib/chemistry/physical-constants";
import { defineSourced } from "@/lib/chemistry/sourced-value";
import type { SourcedValue } from "@/lib/chemistry/sourced-value";
import { DEFAULT_RECIPE_LIMITS, WATER_LIMIT_BY_STEP } from "@/lib/recipe/recipe-defaults";
import type { RecipeLimits } from "@/lib/recipe/recipe-defaults";
import { planRecipe } from "@/lib/recipe/recipe";
import type { RecipePlan } from "@/lib/recipe/recipe";
import type { AcidStepSettings, PretreatmentInput } from "@/lib/recipe/recipe.schema";

// Two-step process for high-FFA feedstocks: acid-catalysed esterification of the FFA
// (RCOOH + CH3OH → RCOOCH3 + H2O), settle and draw off the water-containing alcohol phase, then the
// base step on the pretreated oil. Canakci & Van Gerpen 2001, Trans. ASAE 44(6):1429.

export type PretreatmentRoute = "DIRECT_BASE" | "BASE_WITH_EXTRA_CATALYST" | "ACID_PRETREATMENT";

export interface PretreatmentLimits {
  /** FFA below this: direct base catalysis. */
  directBaseMaxFfaPct: SourcedValue;
  /** FFA below this (and at or above the direct limit): base catalysis with extra catalyst; at or above: acid step. */
  baseCatalysisMaxFfaPct: SourcedValue;
  /** FFA the pretreated oil must be below before the base step. */
  residualFfaTargetPct: SourcedValue;
  /** Feed water at or above this hinders the acid step. */
  acidStepMaxWaterPct: SourcedValue;
}

export const DEFAULT_PRETREATMENT_LIMITS: PretreatmentLimits = {
  directBaseMaxFfaPct: DEFAULT_RECIPE_LIMITS.directBaseMaxFfaPct,
  baseCatalysisMaxFfaPct: DEFAULT_RECIPE_LIMITS.baseCatalysisMaxFfaPct,
  residualFfaTargetPct: defineSourced(
    1,
    "% FFA as oleic",
    "Canakci & Van Gerpen 2001, Trans. ASAE 44(6):1429 (acid level reduced to < 1 % FFA); review: AV < 2 mg KOH/g",
    "verified",
  ),
  acidStepMaxWaterPct: WATER_LIMIT_BY_STEP.ACID_STEP,
};

export interface AcidStepDefaults {
  methanolToFfaMolarRatio: SourcedValue;
  acidPctOfFfa: SourcedValue;
  acidPurityPct: SourcedValue;
  pretreatedWaterPct: SourcedValue;
}

export const DEFAULT_ACID_STEP_SETTINGS: AcidStepDefaults = {
  methanolToFfaMolarRatio: defineSourced(
    20,
    "mol MeOH / mol FFA",
    "Canakci & Van Gerpen 2001, Trans. ASAE 44(6):1429",
    "from memory",
  ),
  acidPctOfFfa: defineSourced(
    5,
    "% H2SO4 of FFA mass",
    "Canakci & Van Gerpen 2001, Trans. ASAE 44(6):1429",
    "from memory",
    "the basis of the 5 % (FFA or oil mass) is not verified",
  ),
  acidPurityPct: defineSourced(
    100,
    "% H2SO4",
    "amounts as pure H2SO4",
    "common practice",
    "enter the CoA assay of the acid",
  ),
  pretreatedWaterPct: defineSourced(
    0,
    "% w/w",
    "alcohol/water phase drawn off and oil dried before the base step",
    "common practice",
    "assumption; enter the measured water of the pretreated oil",
  ),
};

export interface RouteDecision {
  route: PretreatmentRoute;
  ffaPct: number;
  directBaseMaxFfaPct: number;
  baseCatalysisMaxFfaPct: number;
  reason: string;
}

export function decideRoute(ffaPct: number, overrides: Partial<PretreatmentLimits> = {}): RouteDecision {
  const limits = { ...DEFAULT_PRETREATMENT_LIMITS, ...overrides };
  const direct = limits.directBaseMaxFfaPct.value;
  const base = limits.baseCatalysisMaxFfaPct.value;
  const common = { ffaPct, directBaseMaxFfaPct: direct, baseCatalysisMaxFfaPct: base };
  if (ffaPct < direct) {
    return {
      ...common,
      route: "DIRECT_BASE",
      reason: `FFA ${ffaPct} % < ${direct} % (${limits.directBaseMaxFfaPct.source})`,
    };
  }
  if (ffaPct < base) {
    return {
      ...common,
      route: "BASE_WITH_EXTRA_CATALYST",
      reason: `${direct} % ≤ FFA ${ffaPct} % < ${base} % (${limits.baseCatalysisMaxFfaPct.source})`,
    };
  }
  return {
    ...common,
    route: "ACID_PRETREATMENT",
    reason: `FFA ${ffaPct} % ≥ ${base} % (${limits.baseCatalysisMaxFfaPct.source})`,
  };
}

export interface AcidStepFeed {
  massKg: number;
  ffaPct: number;
  waterPct: number;
  famePct?: number;
}

export interface AcidStepPlan {
  feedKg: number;
  ffaKg: number;
  ffaMol: number;
  methanolToFfaMolarRatio: number;
  methanolKg: number;
  methanolL20C: number;
  acidPctOfFfa: number;
  /** As pure H2SO4. */
  acidPureKg: number;
  acidProductKg: number;
  residualFfaPct: number;
  convertedFfaMol: number;
  convertedFfaKg: number;
  waterFormedKg: number;
  fameFormedKg: number;
  oilPhase: { massKg: number; ffaPct: number; waterPct: number; famePct: number; triglycerideKg: number };
  /** Drawn off after settling (and drying): unreacted methanol, water, acid. */
  alcoholPhase: { methanolKg: number; waterKg: number; acidKg: number; totalKg: number };
  massBalance: { inputKg: number; outputKg: number; residualKg: number };
}

/**
 * One acid esterification step planned to leave `residualFfaPct` in the pretreated oil. Methanol is dosed on
 * all FFA moles; triglyceride is assumed not to react in this step.
 */
export function computeAcidStep(feed: AcidStepFeed, settings: AcidStepSettings = {}): AcidStepPlan {
  const ratio = settings.methanolToFfaMolarRatio ?? DEFAULT_ACID_STEP_SETTINGS.methanolToFfaMolarRatio.value;
  const acidPct = settings.acidPctOfFfa ?? DEFAULT_ACID_STEP_SETTINGS.acidPctOfFfa.value;
  const acidPurity = settings.acidPurityPct ?? DEFAULT_ACID_STEP_SETTINGS.acidPurityPct.value;
  const residualFfaPct = settings.residualFfaPct ?? DEFAULT_PRETREATMENT_LIMITS.residualFfaTargetPct.value;
  const outWaterPct = settings.pretreatedWaterPct ?? DEFAULT_ACID_STEP_SETTINGS.pretreatedWaterPct.value;

  const ffaKg = (feed.massKg * feed.ffaPct) / 100;
  const feedWaterKg = (feed.massKg * feed.waterPct) / 100;
  const fameInKg = (feed.massKg * (feed.famePct ?? 0)) / 100;
  const triglycerideKg = Math.max(0, feed.massKg - ffaKg - feedWaterKg - fameInKg);
  const ffaMol = (ffaKg * 1000) / MOLAR_MASS.oleicAcid;
  const methanolKg = (ratio * ffaMol * MOLAR_MASS.methanol) / 1000;
  const acidPureKg = (ffaKg * acidPct) / 100;
  const acidProductKg = acidPureKg / (acidPurity / 100);

  // Solve FFA_res / P = r for the converted moles n, where P is the oil phase and each converted mole
  // adds M(FAME) − M(FFA) = M(MeOH) − M(H2O) to it. With retained water w, FFA_res = r/(1−w) × dry phase.
  const r = residualFfaPct / 100 / (1 - outWaterPct / 100);
  const dryBefore = triglycerideKg + fameInKg + ffaKg;
  const gainPerMolKg = (MOLAR_MASS.methylOleate - MOLAR_MASS.oleicAcid) / 1000;
  const nRaw = (ffaKg - r * dryBefore) / (MOLAR_MASS.oleicAcid / 1000 + r * gainPerMolKg);
  const convertedFfaMol = Math.min(ffaMol, Math.max(0, nRaw));
  const convertedFfaKg = (convertedFfaMol * MOLAR_MASS.oleicAcid) / 1000;
  const fameFormedKg = (convertedFfaMol * MOLAR_MASS.methylOleate) / 1000;
  const waterFormedKg = (convertedFfaMol * MOLAR_MASS.water) / 1000;
  const methanolLeftKg = methanolKg - (convertedFfaMol * MOLAR_MASS.methanol) / 1000;

  const residualFfaKg = ffaKg - convertedFfaKg;
  const dryAfter = triglycerideKg + fameInKg + fameFormedKg + residualFfaKg;
  const waterPool = feedWaterKg + waterFormedKg;
  const waterInOilKg = Math.min(waterPool, (dryAfter * outWaterPct) / (100 - outWaterPct));
  const oilKg = dryAfter + waterInOilKg;
  const alcoholPhase = {
    methanolKg: methanolLeftKg,
    waterKg: waterPool - waterInOilKg,
    acidKg: acidProductKg,
    totalKg: methanolLeftKg + waterPool - waterInOilKg + acidProductKg,
  };
  const inputKg = feed.massKg + methanolKg + acidProductKg;
  const outputKg = oilKg + alcoholPhase.totalKg;
  return {
    feedKg: feed.massKg,
    ffaKg,
    ffaMol,
    methanolToFfaMolarRatio: ratio,
    methanolKg,
    methanolL20C: methanolKg / METHANOL_DENSITY_20C.value,
    acidPctOfFfa: acidPct,
    acidPureKg,
    acidProductKg,
    residualFfaPct: oilKg > 0 ? (residualFfaKg / oilKg) * 100 : 0,
    convertedFfaMol,
    convertedFfaKg,
    waterFormedKg,
    fameFormedKg,
    oilPhase: {
      massKg: oilKg,
      ffaPct: oilKg > 0 ? (residualFfaKg / oilKg) * 100 : 0,
      waterPct: oilKg > 0 ? (waterInOilKg / oilKg) * 100 : 0,
      famePct: oilKg > 0 ? ((fameInKg + fameFormedKg) / oilKg) * 100 : 0,
      triglycerideKg,
    },
    alcoholPhase,
    massBalance: { inputKg, outputKg, residualKg: inputKg - outputKg },
  };
}

export interface PretreatmentPlan {
  decision: RouteDecision;
  /** Null unless the route is ACID_PRETREATMENT. */
  acidStep: AcidStepPlan | null;
  /** Base step: on the lots as charged, or on the pretreated oil. */
  baseStep: RecipePlan;
  warnings: DomainIssue[];
}

const MASS_BALANCE_REL_TOLERANCE = DEFAULT_RECIPE_LIMITS.massBalanceRelTolerance;

export function planPretreatment(
  input: PretreatmentInput,
  limitOverrides: Partial<PretreatmentLimits> = {},
  recipeLimitOverrides: Partial<RecipeLimits> = {},
): Result<PretreatmentPlan> {
  const limits = { ...DEFAULT_PRETREATMENT_LIMITS, ...limitOverrides };
  const recipeLimits: Partial<RecipeLimits> = {
    directBaseMaxFfaPct: limits.directBaseMaxFfaPct,
    baseCatalysisMaxFfaPct: limits.baseCatalysisMaxFfaPct,
    ...recipeLimitOverrides,
  };
  let massKg = 0;
  let ffaKg = 0;
  let waterKg = 0;
  let fameKg = 0;
  for (const lot of input.lots) {
    massKg += lot.massKg;
    // As oleic, the basis of the route thresholds and of the acid-step model (moles kept, AOCS Ca 5a-40 bases).
    ffaKg += (lot.massKg * convertFfaBasis(lot.ffaPct, lot.ffaBasis ?? "OLEIC", "OLEIC")) / 100;
    waterKg += (lot.massKg * lot.waterPct) / 100;
    fameKg += (lot.massKg * (lot.famePct ?? 0)) / 100;
  }
  if (!(massKg > 0)) return fail("PRETREATMENT.NO_OIL", "The lots to charge add up to 0 kg.", "lots");
  const feed = {
    massKg,
    ffaPct: (ffaKg / massKg) * 100,
    waterPct: (waterKg / massKg) * 100,
    famePct: (fameKg / massKg) * 100,
  };
  const decision = decideRoute(feed.ffaPct, limits);
  const warnings: DomainIssue[] = [];

  if (decision.route !== "ACID_PRETREATMENT") {
    const baseStep = planRecipe({ lots: input.lots, settings: input.settings }, recipeLimits);
    return baseStep.ok ? ok({ decision, acidStep: null, baseStep: baseStep.value, warnings }) : baseStep;
  }

  if (feed.waterPct >= limits.acidStepMaxWaterPct.value) {
    warnings.push({
      code: "PRETREATMENT.HIGH_WATER",
      message: `Feed water ${feed.waterPct.toFixed(2)} % is at or above ${limits.acidStepMaxWaterPct.value} % (${limits.acidStepMaxWaterPct.source}); dry the feed before the acid step.`,
      field: "lots",
    });
  }
  const planned = input.acidStep?.residualFfaPct ?? limits.residualFfaTargetPct.value;
  if (planned > limits.residualFfaTargetPct.value) {
    warnings.push({
      code: "PRETREATMENT.RESIDUAL_ABOVE_TARGET",
      message: `Residual FFA ${planned} % is above the target ${limits.residualFfaTargetPct.value} % (${limits.residualFfaTargetPct.source}); repeat the acid step before the base step.`,
      field: "acidStep.residualFfaPct",
    });
  }
  const acidStep = computeAcidStep(feed, { ...input.acidStep, residualFfaPct: planned });
  if (!(Math.abs(acidStep.massBalance.residualKg) <= MASS_BALANCE_REL_TOLERANCE.value * acidStep.massBalance.inputKg)) {
    return fail("PRETREATMENT.MASS_BALANCE_OPEN", "Acid-step mass balance does not close.");
  }
  const pretreatedRef = `pretreated:${input.lots.map((l) => l.lotRef).join("+")}`;
  const baseStep = planRecipe(
    {
      lots: [
        {
          lotRef: pretreatedRef,
          massKg: acidStep.oilPhase.massKg,
          ffaPct: acidStep.oilPhase.ffaPct,
          waterPct: acidStep.oilPhase.waterPct,
          famePct: acidStep.oilPhase.famePct,
        },
      ],
      settings: input.settings,
    },
    recipeLimits,
  );
  return baseStep.ok ? ok({ decision, acidStep, baseStep: baseStep.value, warnings }) : baseStep;
}
