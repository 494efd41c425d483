import { FEEDSTOCK_MOLAR_MASS_DEFAULTS } from "@/lib/chemistry/mean-molar-mass";
import { METHANOL_BOILING_POINT } from "@/lib/chemistry/physical-constants";
import { defineSourced } from "@/lib/chemistry/sourced-value";
import type { SourcedValue } from "@/lib/chemistry/sourced-value";

/** Settings a batch uses when the operator does not give them. */
export interface RecipeDefaults {
  molarRatio: SourcedValue;
  reactionTempC: SourcedValue;
  meanTgMolarMass: SourcedValue;
  washes: SourcedValue;
  waterPerWashPctOfEster: SourcedValue;
}

export const DEFAULT_RECIPE_SETTINGS: RecipeDefaults = {
  molarRatio: defineSourced(
    6,
    "mol MeOH / mol TG",
    "Alarcón et al. 2017, Chem. Eng. Trans. 57 (6:1) and many papers; Freedman et al. 1984 (6:1, from memory)",
    "verified",
    "stoichiometric ratio is 3:1; 6:1 is 100 % excess",
  ),
  reactionTempC: defineSourced(
    60,
    "°C",
    "review excerpt: 60 °C example; 50–65 °C range",
    "verified",
    "range is common practice",
  ),
  meanTgMolarMass: defineSourced(
    FEEDSTOCK_MOLAR_MASS_DEFAULTS.TRIOLEIN_MODEL.meanTgMolarMass,
    "g/mol",
    "triolein C57H104O6, IUPAC 2021 atomic weights",
    "computed",
    "model oil; give the lot's SV-based value when known",
  ),
  washes: defineSourced(
    3,
    "washes",
    "wet washing until neutral",
    "common practice",
    "set from the site's washing procedure",
  ),
  waterPerWashPctOfEster: defineSourced(
    30,
    "% of ester mass per wash",
    "no published figure found",
    "common practice",
    "placeholder; set from the site's washing procedure",
  ),
};

/** Thresholds behind the recipe warnings. */
export interface RecipeLimits {
  methanolBoilingPointC: SourcedValue;
  /** Warn when the reaction temperature is within this margin of the methanol boiling point (or above it). */
  boilingMarginK: SourcedValue;
  minReactionTempC: SourcedValue;
  /** Blend FFA at or above this: base catalysis needs extra catalyst and forms soap. */
  directBaseMaxFfaPct: SourcedValue;
  /** Blend FFA at or above this: acid pretreatment before the base step. */
  baseCatalysisMaxFfaPct: SourcedValue;
  /** Blend water above this warns. */
  maxWaterPct: SourcedValue;
  /** Relative tolerance of the recipe's own mass-balance check (float round-off only). */
  massBalanceRelTolerance: SourcedValue;
}

export const DEFAULT_RECIPE_LIMITS: RecipeLimits = {
  methanolBoilingPointC: METHANOL_BOILING_POINT,
  boilingMarginK: defineSourced(
    2,
    "K",
    "keep the reaction below the methanol boiling point",
    "common practice",
    "an unpressurised vessel at or near 64.7 °C boils methanol off",
  ),
  minReactionTempC: defineSourced(50, "°C", "reaction temperature 50–65 °C", "common practice"),
  directBaseMaxFfaPct: defineSourced(
    0.5,
    "% FFA as oleic",
    "Ma, Clements & Hanna 1998, Trans. ASAE 41(5):1261 (FFA < 0.5 % w/w); ≈ AV < 1 mg KOH/g (Wright et al. 1944 via Ma & Hanna 1999)",
    "verified",
  ),
  baseCatalysisMaxFfaPct: defineSourced(
    3,
    "% FFA as oleic",
    "Kombe et al. 2013 review: FFA should be lower than 3 % for base catalysis",
    "verified",
    "Van Gerpen 2005 allows ≤ ~5 % with extra catalyst (from memory)",
  ),
  maxWaterPct: defineSourced(
    0.06,
    "% w/w",
    "Ma, Clements & Hanna 1998, Trans. ASAE 41(5):1261 (beef tallow: water ≤ 0.06 % w/w)",
    "verified",
    "strict; water is more harmful than FFA",
  ),
  massBalanceRelTolerance: defineSourced(1e-9, "relative", "double-precision round-off allowance", "computed"),
};

export function mergeRecipeLimits(overrides: Partial<RecipeLimits> = {}): RecipeLimits {
  return { ...DEFAULT_RECIPE_LIMITS, ...overrides };
}

/**
 * The water limit of each reaction step, one setting each, used by the blend planner, the recipe warning
 * and the pretreatment warning alike (a blend is checked against the step it goes into first).
 */
export const WATER_LIMIT_BY_STEP: WaterLimits = {
  BASE_STEP: DEFAULT_RECIPE_LIMITS.maxWaterPct,
  ACID_STEP: defineSourced(
    0.5,
    "% w/w",
    "Canakci & Van Gerpen 1999, Trans. ASAE 42(5):1203 (conversion < 90 % when water ≥ 0.5 %)",
    "from memory",
  ),
};

/** The water limit of each step as a site works to it: the defaults above, or the site's own values. */
export type WaterLimits = Readonly<{ BASE_STEP: SourcedValue; ACID_STEP: SourcedValue }>;
