// Lab results and batch planning: the computations as JSON endpoints, their documentation and the
// pure answers the route handlers return. The handlers add only authorisation and parsing.
import { z } from "zod";
import type { EndpointDoc } from "@/lib/api/openapi";
import { ok } from "@/lib/core/result";
import type { Result } from "@/lib/core/result";
import { code } from "@/lib/core/fields";
import {
  FFA_BASES,
  acidValueFromFfa,
  calculateAcidValue,
  calculateFfaPercent,
  ffaFromAcidValue,
} from "@/lib/titration/titration";
import { suggestSampleSize } from "@/lib/titration/sample-size";
import type { AvFfaConversion, FfaBasis } from "@/lib/titration/titration";
import { TitrationEntrySchema } from "@/lib/titration/titration.schema";
import type { TitrationEntry } from "@/lib/titration/titration.schema";
import {
  DEFAULT_DENSITY_TABLE,
  REFERENCE_TEMPERATURE_C,
  applyMeasuredDensity,
  massFromObserved,
  observedVolumeFromMass,
  requireDensityEntry,
  standardVolume,
  rangeNotes,
} from "@/lib/quantity/density";
import { DensityObservationSchema, MAX_OBSERVED_TEMP_C, MIN_OBSERVED_TEMP_C } from "@/lib/quantity/density.schema";
import { MATERIAL_KINDS } from "@/lib/quantity/density";
import type { DensityEntry } from "@/lib/quantity/density";
import { BlendRequestSchema } from "@/lib/blend/blend.schema";
import type { BlendRequest } from "@/lib/blend/blend.schema";
import { optimiseBlend } from "@/lib/blend/optimise";
import type { BlendPlan } from "@/lib/blend/optimise";
import { BatchActualsSchema, PretreatmentInputSchema, RecipeInputSchema } from "@/lib/recipe/recipe.schema";
import type { PretreatmentInput, RecipeInput } from "@/lib/recipe/recipe.schema";
import { planRecipe } from "@/lib/recipe/recipe";
import type { RecipePlan } from "@/lib/recipe/recipe";
import { planPretreatment } from "@/lib/recipe/pretreatment";
import type { PretreatmentPlan } from "@/lib/recipe/pretreatment";
import { computeBatchYield } from "@/lib/recipe/yield";
import type { BatchYield } from "@/lib/recipe/yield";
import { BatchPlanRequestSchema } from "@/lib/batch/plan";
import { LabTestSchema, LotDecisionSchema } from "@/lib/feedstock/lot.schema";
import { BatchCompleteSchema, BatchStartSchema } from "@/lib/batch/batch.schema";
// eslint-disable-next-line no-restricted-imports -- LotTitrationSchema is defined in the service file; documentation needs the same schema (move it to a schema file)
import { LotTitrationSchema } from "@/lib/feedstock/titration.service";

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

const RecipePlanOutputSchema = z.looseObject({
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

const PretreatmentPlanOutputSchema = z.object({
  decision: z.looseObject({
    route: z.enum(["DIRECT_BASE", "BASE_WITH_EXTRA_CATALYST", "ACID_PRETREATMENT"]),
    reason: z.string(),
  }),
  acidStep: z.looseObject({ methanolKg: z.number(), acidProductKg: z.number(), residualFfaPct: z.number() }).nullable(),
  baseStep: RecipePlanOutputSchema,
  warnings: z.array(issueSchema),
});

const BlendPlanOutputSchema = z.object({
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

const BatchYieldOutputSchema = z.looseObject({
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

const RecipeCardOutputSchema = z.looseObject({
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

const ProposalOutputSchema = z.object({
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

// ---- pure answers ------------------------------------------------------------------------------

export type TitrationAnswer = z.infer<typeof TitrationAnswerSchema>;

/** FFA % (AOCS Ca 5a-40) and acid value (EN 14104 form) from one titration, as the lab form shows them. */
export function answerTitration(entry: TitrationEntry): Result<TitrationAnswer> {
  const ffa = calculateFfaPercent(entry, { basis: entry.basis });
  if (!ffa.ok) return ffa;
  const av = calculateAcidValue(entry);
  if (!av.ok) return av;
  return ok({
    ffaPct: ffa.value.ffaPct,
    basis: ffa.value.basis,
    factor: ffa.value.factor,
    netTitreMl: ffa.value.netTitreMl,
    acidValueMgKohG: av.value.acidValueMgKohG,
  });
}

export function answerAcidValueFfa(
  input: z.output<typeof AcidValueFfaRequestSchema>,
): Result<z.infer<typeof AcidValueFfaAnswerSchema>> {
  const options: { basis: FfaBasis; conversion: AvFfaConversion } = {
    basis: input.basis,
    conversion: input.conversion,
  };
  if (input.from === "FFA") {
    const av = acidValueFromFfa(input.value, options);
    return av.ok
      ? ok({ ffaPct: input.value, acidValueMgKohG: av.value, basis: input.basis, conversion: input.conversion })
      : av;
  }
  const ffa = ffaFromAcidValue(input.value, options);
  return ffa.ok
    ? ok({ ffaPct: ffa.value, acidValueMgKohG: input.value, basis: input.basis, conversion: input.conversion })
    : ffa;
}

export function answerSampleSize(
  input: z.output<typeof SampleSizeQuerySchema>,
): Result<z.infer<typeof SampleSizeAnswerSchema>> {
  const s = suggestSampleSize(input.expectedFfaPct);
  if (!s.ok) return s;
  const { row } = s.value;
  return ok({
    minPct: row.minPct,
    maxPct: row.maxPct,
    sampleMassG: row.sampleMassG,
    sampleToleranceG: row.sampleToleranceG,
    alcoholMl: row.alcoholMl,
    concentrationsMolL: [...row.concentrationsMolL],
    ffaPctPerMl: s.value.ffaPctPerMl,
    source: row.source,
  });
}

function referenceTempC(reference: (typeof REFERENCE_TEMPERATURES)[number]): number {
  return reference === "60F" ? REFERENCE_TEMPERATURE_C.F60 : REFERENCE_TEMPERATURE_C.C15;
}

/** Mass and standard volume from an observed volume, or the volumes a mass fills, with the density basis named. */
export function answerVolumeMass(
  input: z.output<typeof VolumeMassRequestSchema>,
): Result<z.infer<typeof VolumeMassAnswerSchema>> {
  const refC = referenceTempC(input.reference);
  let observedVolumeL: number;
  let observedTempC: number;
  let entry: DensityEntry;
  if (input.direction === "VOLUME_TO_MASS") {
    const o = input.observation;
    const base = requireDensityEntry(DEFAULT_DENSITY_TABLE, o.materialKind);
    entry =
      o.density === undefined ? base : applyMeasuredDensity(base, { ...o.density, source: "given with the request" });
    observedVolumeL = o.observedVolumeL;
    observedTempC = o.observedTempC;
  } else {
    const base = requireDensityEntry(DEFAULT_DENSITY_TABLE, input.materialKind);
    entry =
      input.densityKgM3At15 === undefined
        ? base
        : applyMeasuredDensity(base, {
            densityKgM3: input.densityKgM3At15,
            atTempC: 15,
            source: "given with the request",
          });
    const v = observedVolumeFromMass({ massKg: input.massKg, observedTempC: input.temperatureC, entry });
    if (!v.ok) return v;
    observedVolumeL = v.value.volumeL;
    observedTempC = input.temperatureC;
  }
  const mass = massFromObserved({ observedVolumeL, observedTempC, entry });
  if (!mass.ok) return mass;
  const std = standardVolume({ observedVolumeL, observedTempC, entry, referenceTempC: refC });
  if (!std.ok) return std;
  const warnings = [...mass.value.warnings];
  return ok({
    massKg: input.direction === "MASS_TO_VOLUME" ? input.massKg : mass.value.massKg,
    massG: input.direction === "MASS_TO_VOLUME" ? Math.round(input.massKg * 1000) : mass.value.massG,
    observedVolumeL,
    observedTempC,
    observedDensityKgM3: std.value.observedDensityKgM3,
    referenceTempC: std.value.referenceTempC,
    referenceDensityKgM3: std.value.referenceDensityKgM3,
    standardVolumeL: std.value.standardVolumeL,
    standardVolumeMl: std.value.standardVolumeMl,
    vcf: std.value.vcf,
    densitySource: entry.source,
    warnings,
    notes: rangeNotes(entry, observedTempC),
  });
}

export function answerRecipe(input: RecipeInput): Result<RecipePlan> {
  return planRecipe(input);
}

export function answerPretreatment(input: PretreatmentInput): Result<PretreatmentPlan> {
  return planPretreatment(input);
}

export function answerBlend(input: BlendRequest): Promise<Result<BlendPlan>> {
  return optimiseBlend(input);
}

/** Yield against a plan computed from the same recipe input. */
export function answerYield(input: z.output<typeof YieldRequestSchema>): Result<BatchYield> {
  const plan = planRecipe(input.recipe);
  if (!plan.ok) return plan;
  return computeBatchYield(plan.value, input.actuals);
}

// ---- documentation ------------------------------------------------------------------------------

const TAG_LAB = "Lab";
const TAG_COMPUTE = "Computations";
const TAG_BATCH = "Batches";

const WriteOk = z.object({ id: z.number().int() });

/** Lab results and batch planning endpoints. */
export const LAB_ENDPOINTS: EndpointDoc[] = [
  {
    method: "post",
    path: "/api/compute/titration",
    summary:
      "FFA % (AOCS Ca 5a-40) and acid value (EN 14104 form) from one titration; nothing is stored. Any signed-in user.",
    tag: TAG_COMPUTE,
    input: TitrationEntrySchema,
    output: TitrationAnswerSchema,
  },
  {
    method: "post",
    path: "/api/compute/acid-value-ffa",
    summary:
      "Acid value ↔ FFA % conversion (molar-mass ratio, or the Ca 5a-40 ×1.99 note for oleic). Any signed-in user.",
    tag: TAG_COMPUTE,
    input: AcidValueFfaRequestSchema,
    output: AcidValueFfaAnswerSchema,
  },
  {
    method: "get",
    path: "/api/compute/sample-size",
    summary:
      "Sample mass, alcohol volume and titrant strength for an expected FFA (AOCS Ca 5a-40 Table 1). Any signed-in user.",
    tag: TAG_COMPUTE,
    input: SampleSizeQuerySchema,
    output: SampleSizeAnswerSchema,
  },
  {
    method: "post",
    path: "/api/compute/volume-mass",
    summary:
      "Observed volume → mass and standard volume at 15 °C or 60 °F, or mass → volumes; density from the table or a measured value. Any signed-in user.",
    tag: TAG_COMPUTE,
    input: VolumeMassRequestSchema,
    output: VolumeMassAnswerSchema,
  },
  {
    method: "post",
    path: "/api/compute/recipe",
    summary:
      "Base-catalysed batch recipe for the lots to charge: methanol, catalyst corrected for purity, expected products. Any signed-in user.",
    tag: TAG_COMPUTE,
    input: RecipeInputSchema,
    output: RecipePlanOutputSchema,
  },
  {
    method: "post",
    path: "/api/compute/pretreatment",
    summary:
      "Route by blend FFA, and the acid esterification step plus base step when the FFA needs it. Any signed-in user.",
    tag: TAG_COMPUTE,
    input: PretreatmentInputSchema,
    output: PretreatmentPlanOutputSchema,
  },
  {
    method: "post",
    path: "/api/compute/blend",
    summary:
      "Draws from candidate lots that make the target within the FFA and water limits (HiGHS); when impossible, which limit fails and by how much. Any signed-in user.",
    tag: TAG_COMPUTE,
    input: BlendRequestSchema,
    output: BlendPlanOutputSchema,
  },
  {
    method: "post",
    path: "/api/compute/yield",
    summary:
      "Ester yield vs theory and per kg oil, glycerol phase per kg oil, catalyst and methanol used vs planned. Any signed-in user.",
    tag: TAG_COMPUTE,
    input: YieldRequestSchema,
    output: BatchYieldOutputSchema,
  },
  {
    method: "post",
    path: "/api/lab/titrations",
    summary: "Records a titration for a lot; FFA % and acid value are computed on the server. Production.",
    tag: TAG_LAB,
    input: LotTitrationSchema,
    output: z.object({ id: z.number().int(), ffaPct: z.number(), acidValue: z.number() }),
  },
  {
    method: "post",
    path: "/api/lab/tests",
    summary: "Records a water, insolubles or unsaponifiables result for a lot. Production.",
    tag: TAG_LAB,
    input: LabTestSchema,
    output: WriteOk,
  },
  {
    method: "post",
    path: "/api/lab/decisions",
    summary: "Accepts a lot for production (needs an FFA titration) or rejects it. Production.",
    tag: TAG_LAB,
    input: LotDecisionSchema,
    output: z.object({ code: z.string(), status: z.string() }),
  },
  {
    method: "post",
    path: "/api/batches/propose",
    summary:
      "Proposes draws from accepted lots and feedstock tanks and the recipe card; nothing is stored. Any signed-in user.",
    tag: TAG_BATCH,
    input: BatchPlanRequestSchema,
    output: ProposalOutputSchema,
  },
  {
    method: "post",
    path: "/api/batches/plan",
    summary:
      "Proposes as /api/batches/propose and records the batch as planned, storing the recipe card and draws (code required). Production.",
    tag: TAG_BATCH,
    input: BatchPlanRequestSchema,
    output: z.object({ code: z.string(), card: RecipeCardOutputSchema }),
  },
  {
    method: "post",
    path: "/api/batches/start",
    summary: "Records what went into the reactor; every draw is guarded against over-drawing. Production.",
    tag: TAG_BATCH,
    input: BatchStartSchema,
    output: z.object({ code: z.string(), chargedG: z.number().int() }),
  },
  {
    method: "post",
    path: "/api/batches/complete",
    summary:
      "Records what was weighed or gauged out; the remainder is booked as the batch's unmeasured difference (never typed). Water used for washing goes from its water lot to the wash-water stream. Production.",
    tag: TAG_BATCH,
    input: BatchCompleteSchema,
    output: z.object({ code: z.string(), productLots: z.array(z.string()), unmeasuredG: z.number().int() }),
  },
  {
    method: "get",
    path: "/api/batches/yield",
    summary: "Computed yield of a recorded batch against its plan. Any signed-in user.",
    tag: TAG_BATCH,
    input: BatchYieldQuerySchema,
    output: z.object({ basis: z.enum(["card", "legacy"]), notes: z.array(z.string()), yield: BatchYieldOutputSchema }),
  },
];
