// The planner's request: what a planner asks for and the defaults it starts from. Pure.
import { z } from "zod";
import { CATALYSTS } from "@/lib/core/vocabulary";
import { code, oneOf, text, when } from "@/lib/core/fields";
import { BLEND_OBJECTIVES, MAX_BLEND_CANDIDATES, MAX_COST_PER_KG } from "@/lib/blend/blend.schema";
import type { BlendObjective } from "@/lib/blend/blend.schema";
import { defineSourced } from "@/lib/chemistry/sourced-value";
import type { SourcedValue } from "@/lib/chemistry/sourced-value";
import { DEFAULT_RECIPE_LIMITS, DEFAULT_RECIPE_SETTINGS, WATER_LIMIT_BY_STEP } from "@/lib/recipe/recipe-defaults";
import {
  MAX_ACID_PCT_OF_FFA,
  MAX_BASE_DOSE_PCT_OF_OIL,
  MAX_METHANOL_TO_FFA_RATIO,
  MAX_REACTION_TEMP_C,
  MAX_TG_MOLAR_MASS,
  MAX_WASHES,
  MAX_WATER_PER_WASH_PCT_OF_ESTER,
  MIN_REACTION_TEMP_C,
  MIN_TG_MOLAR_MASS,
  MAX_SAPONIFICATION_VALUE,
  MIN_SAPONIFICATION_VALUE,
} from "@/lib/recipe/recipe.schema";
import { MAX_MOLAR_RATIO, MIN_MOLAR_RATIO } from "@/lib/batch/batch.schema";

// ---- defaults ---------------------------------------------------------------------------------

/** Blend limits the planner starts from; a planner may tighten or relax them per batch. */
export const DEFAULT_BLEND_LIMITS: { maxFfaPct: SourcedValue; maxWaterPct: SourcedValue } = {
  maxFfaPct: DEFAULT_RECIPE_LIMITS.baseCatalysisMaxFfaPct,
  maxWaterPct: WATER_LIMIT_BY_STEP.ACID_STEP,
};

/** The books hold no feedstock prices; every candidate costs this unless a cost is entered. */
export const DEFAULT_COST_PER_KG: SourcedValue = defineSourced(
  0,
  "per kg",
  "site default: no feedstock prices are recorded",
  "common practice",
  "with every cost at 0 the lowest-cost objective accepts any blend within the limits",
);

export const PLAN_OBJECTIVE_LABELS: Readonly<Record<BlendObjective, string>> = {
  MIN_COST: "Lowest cost",
  OLDEST_FIRST: "Oldest stock first",
  HIGHEST_FFA_FIRST: "Highest FFA first (use up difficult stock)",
};

export const MS_PER_DAY = 86_400_000;

// ---- request ----------------------------------------------------------------------------------

const num = (what: string, unit: string) => z.number({ error: `${what} must be a number (${unit})` });

/** What a planner asks for: the batch, the blend limits, the objective and the recipe settings. */
export const BatchPlanRequestSchema = z
  .object({
    /** Needed only when the plan is recorded. */
    code: code("Batch number").optional(),
    plannedAt: when("Planned time").optional(),
    targetOilKg: num("Oil to charge", "kg")
      .positive("Oil to charge must be more than 0 kg")
      .max(2_000_000, "Oil to charge must be at most 2,000,000 kg"),
    maxFfaPct: num("Blend FFA limit", "%")
      .min(0, "Blend FFA limit must be at least 0 %")
      .max(100, "Blend FFA limit must be at most 100 %")
      .default(DEFAULT_BLEND_LIMITS.maxFfaPct.value),
    /** Empty: the water limit of the step the blend goes into first (see blendWaterLimit). */
    maxWaterPct: num("Blend water limit", "%")
      .min(0, "Blend water limit must be at least 0 %")
      .max(100, "Blend water limit must be at most 100 %")
      .optional(),
    objective: z
      .enum(BLEND_OBJECTIVES, { error: `Objective must be one of ${BLEND_OBJECTIVES.join(", ")}` })
      .default("OLDEST_FIRST"),
    minDrawKg: num("Smallest draw", "kg")
      .positive("Smallest draw must be more than 0 kg")
      .max(2_000_000, "Smallest draw must be at most 2,000,000 kg")
      .optional(),
    catalyst: oneOf("Catalyst", CATALYSTS).default("KOH"),
    /** Purity of a solid catalyst, or strength of a methoxide solution; from the supplier's certificate. */
    assayPct: num("Catalyst purity or strength", "%")
      .gt(0, "Catalyst purity or strength must be more than 0 %")
      .max(100, "Catalyst purity or strength must be at most 100 %")
      .optional(),
    molarRatio: num("Methanol : oil molar ratio", "mol/mol")
      .min(
        MIN_MOLAR_RATIO,
        `Methanol : oil molar ratio must be at least ${MIN_MOLAR_RATIO}:1 (the stoichiometric minimum)`,
      )
      .max(MAX_MOLAR_RATIO, `Methanol : oil molar ratio must be at most ${MAX_MOLAR_RATIO}:1`)
      .default(DEFAULT_RECIPE_SETTINGS.molarRatio.value),
    reactionTempC: num("Reaction temperature", "°C")
      .min(MIN_REACTION_TEMP_C, `Reaction temperature must be at least ${MIN_REACTION_TEMP_C} °C`)
      .max(MAX_REACTION_TEMP_C, `Reaction temperature must be at most ${MAX_REACTION_TEMP_C} °C`)
      .default(DEFAULT_RECIPE_SETTINGS.reactionTempC.value),
    baseDosePctOfOil: num("Base catalyst dose", "% of oil")
      .min(0, "Base catalyst dose must be at least 0 %")
      .max(MAX_BASE_DOSE_PCT_OF_OIL, `Base catalyst dose must be at most ${MAX_BASE_DOSE_PCT_OF_OIL} % of the oil`)
      .optional(),
    meanTgMolarMass: num("Mean oil molar mass", "g/mol")
      .min(MIN_TG_MOLAR_MASS, `Mean oil molar mass must be at least ${MIN_TG_MOLAR_MASS} g/mol`)
      .max(MAX_TG_MOLAR_MASS, `Mean oil molar mass must be at most ${MAX_TG_MOLAR_MASS} g/mol`)
      .optional(),
    /** The lab's saponification value (AOCS Cd 3-25 / ISO 3657); the recipe turns it into the mean oil molar mass. */
    saponificationValueMgKohG: num("Saponification value", "mg KOH/g")
      .min(MIN_SAPONIFICATION_VALUE, `Saponification value must be at least ${MIN_SAPONIFICATION_VALUE} mg KOH/g`)
      .max(MAX_SAPONIFICATION_VALUE, `Saponification value must be at most ${MAX_SAPONIFICATION_VALUE} mg KOH/g`)
      .optional(),
    washes: num("Number of washes", "washes")
      .int("Number of washes must be a whole number")
      .min(0, "Number of washes must be 0 or more")
      .max(MAX_WASHES, `Number of washes must be at most ${MAX_WASHES}`)
      .optional(),
    waterPerWashPctOfEster: num("Water per wash", "% of ester")
      .min(0, "Water per wash must be at least 0 %")
      .max(
        MAX_WATER_PER_WASH_PCT_OF_ESTER,
        `Water per wash must be at most ${MAX_WATER_PER_WASH_PCT_OF_ESTER} % of the ester`,
      )
      .optional(),
    acidMethanolToFfaRatio: num("Acid step methanol : FFA ratio", "mol/mol")
      .positive("Acid step methanol : FFA ratio must be more than 0")
      .max(MAX_METHANOL_TO_FFA_RATIO, `Acid step methanol : FFA ratio must be at most ${MAX_METHANOL_TO_FFA_RATIO}:1`)
      .optional(),
    acidPctOfFfa: num("Sulfuric acid dose", "% of FFA mass")
      .min(0, "Sulfuric acid dose must be at least 0 %")
      .max(MAX_ACID_PCT_OF_FFA, `Sulfuric acid dose must be at most ${MAX_ACID_PCT_OF_FFA} % of the FFA mass`)
      .optional(),
    acidPurityPct: num("Sulfuric acid assay", "%")
      .gt(0, "Sulfuric acid assay must be more than 0 %")
      .max(100, "Sulfuric acid assay must be at most 100 %")
      .optional(),
    residualFfaPct: num("FFA left after the acid step", "%")
      .min(0, "FFA left after the acid step must be at least 0 %")
      .max(100, "FFA left after the acid step must be at most 100 %")
      .optional(),
    defaultCostPerKg: num("Default cost", "per kg")
      .min(0, "Default cost must be 0 or more per kg")
      .max(MAX_COST_PER_KG, `Default cost must be at most ${MAX_COST_PER_KG} per kg`)
      .default(DEFAULT_COST_PER_KG.value),
    /** Cost per kg by candidate reference (e.g. "lot:L-0191"). */
    costs: z
      .record(
        z.string(),
        num("Cost", "per kg")
          .min(0, "Cost must be 0 or more per kg")
          .max(MAX_COST_PER_KG, `Cost must be at most ${MAX_COST_PER_KG} per kg`),
      )
      .default({}),
    /** Candidate references the planner leaves out. */
    exclude: z
      .array(z.string())
      .max(MAX_BLEND_CANDIDATES * 5, "Too many left-out candidates")
      .default([]),
    notes: text("Notes", 1000).default(""),
  })
  .refine((r) => r.meanTgMolarMass === undefined || r.saponificationValueMgKohG === undefined, {
    message: "Give either the mean oil molar mass or the saponification value, not both",
    path: ["saponificationValueMgKohG"],
  });
export type BatchPlanRequestInput = z.input<typeof BatchPlanRequestSchema>;
export type BatchPlanRequest = z.output<typeof BatchPlanRequestSchema>;
