// Every built-in default the sources page lists, read from the modules that use them: specification
// limits (lib/spec), waste rule defaults (lib/waste/waste-due.ts) and recipe defaults
// (lib/recipe/recipe-defaults.ts, lib/chemistry/physical-constants.ts). Nothing is copied here; only the
// plain names of the settings are ours.
import { DEFAULT_SCREENING_SETTINGS, SCREENING_SETTING_LABELS } from "@/lib/screening/screening-defaults";
import type { ScreeningSettings } from "@/lib/screening/screening-defaults";
import type { SourcedValue } from "@/lib/chemistry/sourced-value";
import { KOH_EQUIVALENT_MASS_IN_STANDARDS, METHANOL_DENSITY_20C } from "@/lib/chemistry/physical-constants";
import { DEFAULT_RECIPE_LIMITS, DEFAULT_RECIPE_SETTINGS, WATER_LIMIT_BY_STEP } from "@/lib/recipe/recipe-defaults";
import type { RecipeDefaults, RecipeLimits } from "@/lib/recipe/recipe-defaults";
import { RULESET_US_FEDERAL_RCRA } from "@/lib/waste/waste-due";
import type { RuleValue, WasteRuleSet } from "@/lib/waste/waste-due";
import { levelOf, screenText } from "@/lib/spec/source-text";
import { DEFAULT_CLOSURE_TOLERANCE } from "@/lib/mass-balance/period-balance";
import type { SourceLevel } from "@/lib/spec/source-text";

export type { SourceLevel } from "@/lib/spec/source-text";
export { levelOf, screenText } from "@/lib/spec/source-text";

export interface DefaultSource {
  anchor: string;
  label: string;
  value: string;
  source: string;
  level: SourceLevel;
}

export interface DefaultGroup {
  key: string;
  title: string;
  edition?: string;
  entries: DefaultSource[];
}

function valueText(value: number, unit: string): string {
  return `${value} ${unit}`.trim();
}

const WASTE_LABELS: Readonly<
  Record<Exclude<keyof WasteRuleSet, "id" | "name" | "edition" | "localRulesNote">, string>
> = {
  lqgMaxDays: "Large quantity generator: longest accumulation",
  sqgMaxDays: "Small quantity generator: longest accumulation",
  sqgLongHaulMaxDays: "Small quantity generator, distant facility: longest accumulation",
  sqgLongHaulMinMiles: "Distance that counts as a distant facility",
  sqgMaxOnSiteKg: "Small quantity generator: most waste on site",
  vsqgMaxOnSiteKg: "Very small quantity generator: most waste on site",
  satelliteMaxUsGal: "Satellite accumulation: most waste at the point of generation",
  satelliteExcessDays: "Satellite accumulation: days to move an excess",
  ignitableFlashPointBelowC: "Ignitable liquid: flash point below",
  ignitableAqueousAlcoholBelowPctVol: "Aqueous alcohol exclusion: alcohol below",
  aqueousMinWaterPctMass: "Counts as aqueous: water at least",
  corrosivePhAtMost: "Corrosive: pH at most",
  corrosivePhAtLeast: "Corrosive: pH at least",
  nonHazardousMaxStorageDays: "Non-hazardous streams: longest storage",
};

const RECIPE_LABELS: Readonly<Record<keyof RecipeDefaults | keyof RecipeLimits, string>> = {
  molarRatio: "Methanol to oil molar ratio",
  reactionTempC: "Reaction temperature",
  meanTgMolarMass: "Mean molar mass of the oil (model oil)",
  washes: "Number of washes",
  waterPerWashPctOfEster: "Wash water per wash",
  methanolBoilingPointC: "Methanol boiling point",
  boilingMarginK: "Margin below the methanol boiling point",
  minReactionTempC: "Lowest reaction temperature",
  directBaseMaxFfaPct: "Highest FFA for direct base catalysis",
  baseCatalysisMaxFfaPct: "FFA above which acid pretreatment comes first",
  maxWaterPct: "Highest water in the oil for the base step",
  massBalanceRelTolerance: "Recipe mass-balance tolerance",
};

export function wasteDefaults(rules: WasteRuleSet = RULESET_US_FEDERAL_RCRA): DefaultGroup {
  const entries = (Object.keys(WASTE_LABELS) as Array<keyof typeof WASTE_LABELS>).map((k) => {
    const v: RuleValue = rules[k];
    return {
      anchor: `waste-${k}`,
      label: WASTE_LABELS[k],
      value: valueText(v.value, v.unit),
      source: screenText(v.source),
      level: levelOf(v.status),
    };
  });
  return { key: "waste", title: rules.name, edition: rules.edition, entries };
}

function sourced(prefix: string, key: string, label: string, v: SourcedValue): DefaultSource {
  return {
    anchor: `${prefix}-${key}`,
    label,
    value: valueText(v.value, v.unit),
    source: screenText(v.source),
    level: levelOf(v.status),
  };
}

export function screeningDefaults(): DefaultGroup {
  const entries = Object.entries(DEFAULT_SCREENING_SETTINGS) as Array<[keyof ScreeningSettings, SourcedValue]>;
  return {
    key: "screening",
    title: "Source check thresholds",
    entries: entries.map(([k, v]) => {
      const e = sourced("screening", k, SCREENING_SETTING_LABELS[k], v);
      return v.note === undefined ? e : { ...e, source: `${e.source}; ${screenText(v.note)}` };
    }),
  };
}

export function recipeDefaults(): DefaultGroup {
  const settings = Object.entries(DEFAULT_RECIPE_SETTINGS) as Array<[keyof RecipeDefaults, SourcedValue]>;
  const limits = Object.entries(DEFAULT_RECIPE_LIMITS) as Array<[keyof RecipeLimits, SourcedValue]>;
  return {
    key: "recipe",
    title: "Batch recipe defaults and warning thresholds",
    entries: [
      ...settings.map(([k, v]) => sourced("recipe", k, RECIPE_LABELS[k], v)),
      ...limits.map(([k, v]) => sourced("recipe", k, RECIPE_LABELS[k], v)),
      sourced(
        "recipe",
        "acidStepMaxWaterPct",
        "Highest water in the oil for the acid step",
        WATER_LIMIT_BY_STEP.ACID_STEP,
      ),
      sourced("chemistry", "methanolDensity20C", "Methanol density at 20 °C", METHANOL_DENSITY_20C),
      sourced(
        "chemistry",
        "kohEquivalentMass",
        "KOH equivalent mass used in acid value formulas",
        KOH_EQUIVALENT_MASS_IN_STANDARDS,
      ),
    ],
  };
}

/** The mass-balance closure tolerance a site starts from (a site changes it on its limits page). */
export function balanceDefaults(): DefaultGroup {
  const t = DEFAULT_CLOSURE_TOLERANCE;
  const level = levelOf(t.source);
  const source = "common practice: what schemes and auditors commonly accept; set the site's own";
  return {
    key: "balance",
    title: "Mass-balance closure tolerance",
    entries: [
      { anchor: "balance-warnPct", label: "Warn above", value: `${t.warnPct} % of inputs`, source, level },
      { anchor: "balance-failPct", label: "Fail above", value: `${t.failPct} % of inputs`, source, level },
    ],
  };
}
