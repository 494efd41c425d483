// The pure answers the lab and computation routes return; the handlers add only authorisation and parsing.
import type { z } from "zod";
import { ok } from "@/lib/core/result";
import type { Result } from "@/lib/core/result";
import { acidValueFromFfa, calculateAcidValue, calculateFfaPercent, ffaFromAcidValue } from "@/lib/titration/titration";
import { suggestSampleSize } from "@/lib/titration/sample-size";
import type { AvFfaConversion, FfaBasis } from "@/lib/titration/titration";
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
import type { DensityEntry } from "@/lib/quantity/density";
import type { BlendRequest } from "@/lib/blend/blend.schema";
import { optimiseBlend } from "@/lib/blend/optimise";
import type { BlendPlan } from "@/lib/blend/optimise";
import type { PretreatmentInput, RecipeInput } from "@/lib/recipe/recipe.schema";
import { planRecipe } from "@/lib/recipe/recipe";
import type { RecipePlan } from "@/lib/recipe/recipe";
import { planPretreatment } from "@/lib/recipe/pretreatment";
import type { PretreatmentPlan } from "@/lib/recipe/pretreatment";
import { computeBatchYield } from "@/lib/recipe/yield";
import type { BatchYield } from "@/lib/recipe/yield";
import type {
  AcidValueFfaAnswerSchema,
  AcidValueFfaRequestSchema,
  REFERENCE_TEMPERATURES,
  SampleSizeAnswerSchema,
  SampleSizeQuerySchema,
  TitrationAnswerSchema,
  VolumeMassAnswerSchema,
  VolumeMassRequestSchema,
  YieldRequestSchema,
} from "@/lib/api/endpoints/lab-schemas";

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
