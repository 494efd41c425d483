// The lab and computation endpoints: request schemas that exist only for the API, and the documented answers.
import { z } from "zod";
import { code } from "@/lib/core/fields";
import { FFA_BASES } from "@/lib/titration/titration";
import { DensityObservationSchema, MAX_OBSERVED_TEMP_C, MIN_OBSERVED_TEMP_C } from "@/lib/quantity/density.schema";
import { MATERIAL_KINDS } from "@/lib/quantity/density";
import { BatchActualsSchema, RecipeInputSchema } from "@/lib/recipe/recipe.schema";

// ---- request schemas that exist only for the API ----------------------------------------------------

export const AcidValueFfaRequestSchema = z.object({
  from: z.enum(["ACID_VALUE", "FFA"], { error: "from must be ACID_VALUE (give mg KOH/g) or FFA (give %)" }),
  value: z.number({ error: "value must be a number (mg KOH/g or %)" }).min(0, "value must be at least 0"),
  basis: z.enum(FFA_BASES, { error: "basis must be OLEIC, PALMITIC or LAURIC" }).default("OLEIC"),
  conversion: z
    .enum(["molar-mass", "ca5a40-note"], { error: "conversion must be molar-mass or ca5a40-note" })
    .default("molar-mass"),
});

export const SampleSizeQuerySchema = z.object({
  expectedFfaPct: z.coerce
    .number({ error: "expectedFfaPct must be a number (%)" })
    .min(0, "expectedFfaPct must be at least 0 %")
    .max(100, "expectedFfaPct must be at most 100 %"),
});

export const REFERENCE_TEMPERATURES = ["15C", "60F"] as const;
const referenceField = z
  .enum(REFERENCE_TEMPERATURES, {
    error:
      "reference must be 15C (EN 14214, ASTM D1250) or 60F (60 °F by the same linear density rule, common practice)",
  })
  .default("15C");

export const VolumeMassRequestSchema = z.discriminatedUnion(
  "direction",
  [
    z.object({
      direction: z.literal("VOLUME_TO_MASS"),
      observation: DensityObservationSchema,
      reference: referenceField,
    }),
    z.object({
      direction: z.literal("MASS_TO_VOLUME"),
      materialKind: z.enum(MATERIAL_KINDS, { error: `materialKind must be one of ${MATERIAL_KINDS.join(", ")}` }),
      massKg: z
        .number({ error: "massKg must be a number (kg)" })
        .positive("massKg must be more than 0 kg")
        .max(2_000_000, "massKg must be at most 2,000,000 kg"),
      temperatureC: z
        .number({ error: "temperatureC must be a number (°C)" })
        .min(MIN_OBSERVED_TEMP_C, `temperatureC must be at least ${MIN_OBSERVED_TEMP_C} °C`)
        .max(MAX_OBSERVED_TEMP_C, `temperatureC must be at most ${MAX_OBSERVED_TEMP_C} °C`),
      /** Measured density at 15 °C; the material's table value when absent. */
      densityKgM3At15: z
        .number({ error: "densityKgM3At15 must be a number (kg/m³)" })
        .min(500, "density must be between 0.5 and 1.5 kg/L")
        .max(1500, "density must be between 0.5 and 1.5 kg/L")
        .optional(),
      reference: referenceField,
    }),
  ],
  { error: "direction must be VOLUME_TO_MASS or MASS_TO_VOLUME" },
);

export const YieldRequestSchema = z.object({ recipe: RecipeInputSchema, actuals: BatchActualsSchema });

export const BatchYieldQuerySchema = z.object({ code: code("Batch number") });

// ---- output schemas (documentation of `value`) ---------------------------------------------------

const issueSchema = z.object({ code: z.string(), message: z.string(), field: z.string().optional() });

export const TitrationAnswerSchema = z.object({
  ffaPct: z.number().describe("AOCS Ca 5a-40, % FFA as the basis acid"),
  basis: z.enum(FFA_BASES),
  factor: z.number(),
  netTitreMl: z.number(),
  acidValueMgKohG: z.number().describe("EN 14104 / ISO 660, mg KOH/g"),
});

export const AcidValueFfaAnswerSchema = z.object({
  ffaPct: z.number(),
  acidValueMgKohG: z.number(),
  basis: z.enum(FFA_BASES),
  conversion: z.string(),
});

export const SampleSizeAnswerSchema = z.object({
  minPct: z.number(),
  maxPct: z.number(),
  sampleMassG: z.number(),
  sampleToleranceG: z.number(),
  alcoholMl: z.number(),
  concentrationsMolL: z.array(z.number()),
  ffaPctPerMl: z.array(z.number()),
  source: z.string(),
});

export const VolumeMassAnswerSchema = z.object({
  massKg: z.number(),
  massG: z.number().int(),
  observedVolumeL: z.number(),
  observedTempC: z.number(),
  observedDensityKgM3: z.number(),
  referenceTempC: z.number(),
  referenceDensityKgM3: z.number(),
  standardVolumeL: z.number(),
  standardVolumeMl: z.number().int(),
  vcf: z.number(),
  densitySource: z.string(),
  warnings: z.array(issueSchema),
  /** Plain notes, e.g. an ordinary ambient reading read on the straight line below the slope's range. */
  notes: z.array(z.string()),
});

export const RecipePlanOutputSchema = z.looseObject({
  oil: z.looseObject({ massKg: z.number(), ffaPct: z.number(), waterPct: z.number() }),
  methanol: z.looseObject({
    chargeKg: z.number(),
    toAddKg: z.number(),
    toAddL20C: z.number(),
    fromCatalystSolutionKg: z.number(),
  }),
  catalyst: z.looseObject({ type: z.string(), productKg: z.number(), pureKg: z.number(), assayPct: z.number() }),
  products: z.looseObject({ fameKg: z.number(), glycerolKg: z.number(), soapKg: z.number() }),
  washWater: z.looseObject({ totalKg: z.number() }),
  warnings: z.array(issueSchema),
});

export const PretreatmentPlanOutputSchema = z.object({
  decision: z.looseObject({
    route: z.enum(["DIRECT_BASE", "BASE_WITH_EXTRA_CATALYST", "ACID_PRETREATMENT"]),
    reason: z.string(),
  }),
  acidStep: z.looseObject({ methanolKg: z.number(), acidProductKg: z.number(), residualFfaPct: z.number() }).nullable(),
  baseStep: RecipePlanOutputSchema,
  warnings: z.array(issueSchema),
});

export const BlendPlanOutputSchema = z.object({
  objective: z.string(),
  draws: z.array(z.object({ ref: z.string(), massKg: z.number(), massG: z.number().int() })),
  totalG: z.number().int(),
  blendFfaPct: z.number(),
  blendWaterPct: z.number(),
  costTotal: z.number().nullable(),
  meanAgeDays: z.number(),
  warnings: z.array(issueSchema),
});

const UsageSchema = z.object({
  plannedKg: z.number(),
  actualKg: z.number(),
  deltaKg: z.number(),
  ratio: z.number().nullable(),
});

export const BatchYieldOutputSchema = z.looseObject({
  oilChargedKg: z.number(),
  theoreticalEsterKg: z.number(),
  esterKg: z.number(),
  esterYieldVsTheory: z.number(),
  esterPerKgOil: z.number(),
  glycerolPhasePerKgOil: z.number(),
  theoreticalGlycerolPerKgOil: z.number(),
  catalyst: UsageSchema,
  methanol: UsageSchema,
  warnings: z.array(issueSchema),
});

export const RecipeCardOutputSchema = z.looseObject({
  draws: z.array(
    z.object({
      ref: z.string(),
      kind: z.enum(["LOT", "TANK"]),
      code: z.string(),
      massG: z.number().int(),
      ffaPct: z.number(),
      waterPct: z.number(),
    }),
  ),
  blend: z.looseObject({ massG: z.number().int(), ffaPct: z.number(), waterPct: z.number() }),
  route: z.object({ route: z.string(), reason: z.string() }),
  methanolTotal: z.object({ kg: z.number(), l20C: z.number() }),
  warnings: z.array(issueSchema),
  cautions: z.array(z.object({ step: z.string(), text: z.string() })),
});

export const ProposalOutputSchema = z.object({
  candidates: z.array(
    z.looseObject({
      ref: z.string(),
      kind: z.enum(["LOT", "TANK"]),
      code: z.string(),
      availableG: z.number().int(),
      ffaPct: z.number().nullable(),
      waterPct: z.number().nullable(),
      leftOutBecause: z.string().nullable(),
    }),
  ),
  card: RecipeCardOutputSchema,
});
