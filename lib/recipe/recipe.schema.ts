import { z } from "zod";
import { CATALYST_TYPES, CATALYSTS } from "@/lib/recipe/catalyst";
import { FFA_BASES, ffaFromAcidValue } from "@/lib/titration/titration";

export const MAX_LOT_MASS_KG = 1_000_000;
export const MAX_LOTS_PER_BATCH = 200;
export const MIN_FFA_PCT = 0;
export const MAX_FFA_PCT = 100;
export const MIN_WATER_PCT = 0;
export const MAX_WATER_PCT = 100;
export const MAX_FAME_PCT = 100;
/** Below 3:1 there is not enough methanol for full conversion. */
export const MIN_MOLAR_RATIO = 3;
export const MAX_MOLAR_RATIO = 60;
export const MAX_PURITY_PCT = 100;
export const MAX_BASE_DOSE_PCT_OF_OIL = 5;
export const MIN_REACTION_TEMP_C = -20;
export const MAX_REACTION_TEMP_C = 150;
/** Tricaprylin (C8) is ≈ 470.7 g/mol, trierucin (C22:1) ≈ 1052 g/mol. */
export const MIN_TG_MOLAR_MASS = 400;
export const MAX_TG_MOLAR_MASS = 1200;
export const MAX_WASHES = 10;
/** Acid value of 100 % FFA as lauric acid (the lightest basis) is ≈ 280 mg KOH/g; 300 is a typo guard. */
export const MAX_ACID_VALUE = 300;
/** SV of the lightest oils (coconut ≈ 250–264 mg KOH/g, Codex CXS 210-1999); 400 is a typo guard. */
export const MIN_SAPONIFICATION_VALUE = 100;
export const MAX_SAPONIFICATION_VALUE = 400;
export const MAX_WATER_PER_WASH_PCT_OF_ESTER = 200;
export const MAX_METHANOL_TO_FFA_RATIO = 100;
export const MAX_ACID_PCT_OF_FFA = 50;

const pct = (field: string, min: number, max: number) =>
  z
    .number({ error: `${field} must be a number (%)` })
    .min(min, `${field} must be at least ${min} %`)
    .max(max, `${field} must be at most ${max} %`);

/**
 * A lot to charge, with FFA as the lab reports it: FFA % on a named basis (AOCS Ca 5a-40), or the acid
 * value (AOCS Cd 3d-63 / ISO 660), which is converted to FFA % on the basis given (oleic when none).
 */
export const RecipeLotSchema = z
  .object({
    lotRef: z.string({ error: "Lot reference is required" }).trim().min(1, "Lot reference is required"),
    massKg: z
      .number({ error: "Mass must be a number (kg)" })
      .positive("Mass must be above 0 kg")
      .max(MAX_LOT_MASS_KG, `Mass must be at most ${MAX_LOT_MASS_KG} kg`),
    ffaPct: pct("FFA", MIN_FFA_PCT, MAX_FFA_PCT).optional(),
    /** The fatty acid the FFA % is expressed as; oleic when not given. */
    ffaBasis: z.enum(FFA_BASES, { error: "FFA basis must be OLEIC, PALMITIC or LAURIC" }).optional(),
    acidValueMgKohG: z
      .number({ error: "Acid value must be a number (mg KOH/g)" })
      .min(0, "Acid value must be at least 0 mg KOH/g")
      .max(MAX_ACID_VALUE, `Acid value must be at most ${MAX_ACID_VALUE} mg KOH/g`)
      .optional(),
    waterPct: pct("Water", MIN_WATER_PCT, MAX_WATER_PCT),
    /** Ester already in the oil (pretreated oil); 0 for raw feedstock. */
    famePct: pct("Ester content", 0, MAX_FAME_PCT).optional(),
  })
  .superRefine((lot, ctx) => {
    if ((lot.ffaPct === undefined) === (lot.acidValueMgKohG === undefined)) {
      ctx.addIssue({
        code: "custom",
        message: "Give either FFA (%) or the acid value (mg KOH/g) for the lot, not both",
        path: ["ffaPct"],
      });
    }
  })
  .transform((lot) => {
    const { acidValueMgKohG, ...rest } = lot;
    if (acidValueMgKohG === undefined) return { ...rest, ffaPct: lot.ffaPct ?? 0 };
    const ffa = ffaFromAcidValue(acidValueMgKohG, { basis: lot.ffaBasis ?? "OLEIC" });
    return { ...rest, ffaPct: ffa.ok ? ffa.value : 0, acidValueMgKohG };
  })
  .refine((lot) => lot.ffaPct + lot.waterPct + (lot.famePct ?? 0) < 100, {
    message: "FFA + water + ester must be below 100 % of the lot (the rest is the oil that reacts)",
    path: ["ffaPct"],
  });

export const WashPracticeSchema = z.object({
  washes: z
    .number({ error: "Number of washes must be a number" })
    .int("Number of washes must be a whole number")
    .min(0, "Number of washes must be 0 or more")
    .max(MAX_WASHES, `Number of washes must be at most ${MAX_WASHES}`),
  waterPerWashPctOfEster: pct("Water per wash", 0, MAX_WATER_PER_WASH_PCT_OF_ESTER),
});

export const RecipeSettingsSchema = z
  .object({
    molarRatio: z
      .number({ error: "Molar ratio must be a number (mol methanol per mol oil)" })
      .min(MIN_MOLAR_RATIO, `Molar ratio must be at least ${MIN_MOLAR_RATIO}:1 (stoichiometric)`)
      .max(MAX_MOLAR_RATIO, `Molar ratio must be at most ${MAX_MOLAR_RATIO}:1`)
      .optional(),
    catalyst: z.enum(CATALYST_TYPES, { error: `Catalyst must be one of ${CATALYST_TYPES.join(", ")}` }),
    purityPct: z
      .number({ error: "Catalyst purity must be a number (%)" })
      .positive("Catalyst purity must be above 0 %")
      .max(MAX_PURITY_PCT, `Catalyst purity must be at most ${MAX_PURITY_PCT} %`)
      .optional(),
    solutionStrengthPct: z
      .number({ error: "Methoxide solution strength must be a number (%)" })
      .positive("Methoxide solution strength must be above 0 %")
      .max(MAX_PURITY_PCT, `Methoxide solution strength must be at most ${MAX_PURITY_PCT} %`)
      .optional(),
    baseDosePctOfOil: pct("Base catalyst dose", 0, MAX_BASE_DOSE_PCT_OF_OIL).optional(),
    reactionTempC: z
      .number({ error: "Reaction temperature must be a number (°C)" })
      .min(MIN_REACTION_TEMP_C, `Reaction temperature must be at least ${MIN_REACTION_TEMP_C} °C`)
      .max(MAX_REACTION_TEMP_C, `Reaction temperature must be at most ${MAX_REACTION_TEMP_C} °C`)
      .optional(),
    meanTgMolarMass: z
      .number({ error: "Mean oil molar mass must be a number (g/mol)" })
      .min(MIN_TG_MOLAR_MASS, `Mean oil molar mass must be at least ${MIN_TG_MOLAR_MASS} g/mol`)
      .max(MAX_TG_MOLAR_MASS, `Mean oil molar mass must be at most ${MAX_TG_MOLAR_MASS} g/mol`)
      .optional(),
    /** Saponification value of the oil (AOCS Cd 3-25 / ISO 3657); gives the mean oil molar mass. */
    saponificationValueMgKohG: z
      .number({ error: "Saponification value must be a number (mg KOH/g)" })
      .min(MIN_SAPONIFICATION_VALUE, `Saponification value must be at least ${MIN_SAPONIFICATION_VALUE} mg KOH/g`)
      .max(MAX_SAPONIFICATION_VALUE, `Saponification value must be at most ${MAX_SAPONIFICATION_VALUE} mg KOH/g`)
      .optional(),
    washPractice: WashPracticeSchema.optional(),
  })
  .superRefine((s, ctx) => {
    if (s.meanTgMolarMass !== undefined && s.saponificationValueMgKohG !== undefined) {
      ctx.addIssue({
        code: "custom",
        message: "Give either the mean oil molar mass or the saponification value, not both",
        path: ["saponificationValueMgKohG"],
      });
    }
    const form = CATALYSTS[s.catalyst].form;
    if (form === "SOLID" && s.solutionStrengthPct !== undefined) {
      ctx.addIssue({
        code: "custom",
        message: `Solution strength (%) applies to methoxide solutions; give purityPct for ${s.catalyst}`,
        path: ["solutionStrengthPct"],
      });
    }
    if (form === "METHANOL_SOLUTION" && s.purityPct !== undefined) {
      ctx.addIssue({
        code: "custom",
        message: `Purity (%) applies to solid catalysts; give solutionStrengthPct for ${s.catalyst}`,
        path: ["purityPct"],
      });
    }
  });

function refineUniqueLots(lots: ReadonlyArray<{ lotRef: string }>, ctx: z.RefinementCtx, path: string): void {
  const seen = new Set<string>();
  lots.forEach((lot, i) => {
    if (seen.has(lot.lotRef)) {
      ctx.addIssue({
        code: "custom",
        message: `Lot ${lot.lotRef} is listed twice; combine its masses`,
        path: [path, i, "lotRef"],
      });
    }
    seen.add(lot.lotRef);
  });
}

export const RecipeInputSchema = z
  .object({
    lots: z
      .array(RecipeLotSchema)
      .min(1, "At least one lot must be charged")
      .max(MAX_LOTS_PER_BATCH, `At most ${MAX_LOTS_PER_BATCH} lots per batch`),
    settings: RecipeSettingsSchema,
  })
  .superRefine((input, ctx) => refineUniqueLots(input.lots, ctx, "lots"));

export const AcidStepSettingsSchema = z.object({
  methanolToFfaMolarRatio: z
    .number({ error: "Methanol:FFA molar ratio must be a number" })
    .positive("Methanol:FFA molar ratio must be above 0")
    .max(MAX_METHANOL_TO_FFA_RATIO, `Methanol:FFA molar ratio must be at most ${MAX_METHANOL_TO_FFA_RATIO}:1`)
    .optional(),
  acidPctOfFfa: pct("Sulfuric acid dose (of FFA mass)", 0, MAX_ACID_PCT_OF_FFA).optional(),
  acidPurityPct: z
    .number({ error: "Sulfuric acid assay must be a number (%)" })
    .positive("Sulfuric acid assay must be above 0 %")
    .max(MAX_PURITY_PCT, `Sulfuric acid assay must be at most ${MAX_PURITY_PCT} %`)
    .optional(),
  /** FFA the acid step is planned to leave in the oil (measured value once known). */
  residualFfaPct: pct("Residual FFA", 0, MAX_FFA_PCT).optional(),
  /** Water left in the oil after the alcohol/water phase is drawn off and the oil dried. */
  pretreatedWaterPct: pct("Water after pretreatment", 0, MAX_WATER_PCT).optional(),
});

export const PretreatmentInputSchema = z
  .object({
    lots: RecipeInputSchema.shape.lots,
    settings: RecipeSettingsSchema,
    acidStep: AcidStepSettingsSchema.optional(),
  })
  .superRefine((input, ctx) => refineUniqueLots(input.lots, ctx, "lots"));

const kg = (field: string) =>
  z
    .number({ error: `${field} must be a number (kg)` })
    .min(0, `${field} must be 0 kg or more`)
    .max(MAX_LOT_MASS_KG * MAX_LOTS_PER_BATCH, `${field} is implausibly large (kg)`);

export const BatchActualsSchema = z.object({
  oilChargedKg: kg("Oil charged").positive("Oil charged must be above 0 kg").optional(),
  esterKg: kg("Ester produced"),
  glycerolPhaseKg: kg("Glycerol phase"),
  catalystProductUsedKg: kg("Catalyst used"),
  methanolAddedKg: kg("Methanol added"),
});

export type RecipeLotInput = z.infer<typeof RecipeLotSchema>;
export type WashPractice = z.infer<typeof WashPracticeSchema>;
export type RecipeSettings = z.infer<typeof RecipeSettingsSchema>;
export type RecipeInput = z.infer<typeof RecipeInputSchema>;
export type AcidStepSettings = z.infer<typeof AcidStepSettingsSchema>;
export type PretreatmentInput = z.infer<typeof PretreatmentInputSchema>;
export type BatchActuals = z.infer<typeof BatchActualsSchema>;
