import { z } from "zod";
import { WASTE_STREAMS } from "@/lib/core/vocabulary";
import { code, oneOf, text, when } from "@/lib/core/fields";

export const MIN_PH = 0;
export const MAX_PH = 14;
export const MIN_METHANOL_PCT = 0;
export const MAX_METHANOL_PCT = 100;
export const MIN_WATER_PCT = 0;
export const MAX_WATER_PCT = 100;
export const MIN_FLASH_POINT_C = -50;
export const MAX_FLASH_POINT_C = 300;
/** One container; masses are stored as integer grams, volumes as integer millilitres. */
export const MAX_CONTAINER_MASS_KG = 100_000;
export const MAX_CONTAINER_VOLUME_L = 100_000;
export const MAX_TSDF_DISTANCE_MILES = 10_000;
export const MAX_DUE_HORIZON_DAYS = 3650;

export const PHYSICAL_STATES = ["LIQUID", "SOLID"] as const;
export const GENERATOR_CATEGORIES = ["LQG", "SQG", "VSQG"] as const;

const optionalNumber = (what: string, unit: string, min: number, max: number) =>
  z
    .number({ error: `${what} (${unit}) must be a number` })
    .min(min, `${what} must be at least ${min} ${unit}`)
    .max(max, `${what} must be at most ${max} ${unit}`)
    .nullable()
    .optional();

/** What is known about a container's contents. Leave a value out when it was not measured: it is never assumed. */
export const WasteCharacterisationSchema = z.object({
  /** Alcohol content in % by volume (v/v), the basis of 40 CFR 261.21(a)(1); include other alcohols if present. */
  methanolPct: optionalNumber("Methanol", "% v/v", MIN_METHANOL_PCT, MAX_METHANOL_PCT),
  pH: optionalNumber("pH", "pH units", MIN_PH, MAX_PH),
  /** Closed-cup flash point (ASTM D93 or D3278). */
  flashPointC: optionalNumber("Flash point", "°C", MIN_FLASH_POINT_C, MAX_FLASH_POINT_C),
  /** Water content in % by weight. */
  waterPct: optionalNumber("Water", "% by weight", MIN_WATER_PCT, MAX_WATER_PCT),
  /** An explicit determination that the waste is (or is not) aqueous; overrides the water content. */
  aqueous: z.boolean({ error: "Aqueous must be yes or no" }).nullable().optional(),
  physicalState: oneOf("Physical state", PHYSICAL_STATES).nullable().optional(),
  /** For non-liquids: the generator's determination under 40 CFR 261.21(a)(2). */
  solidIgnitable: z.boolean({ error: "Solid ignitable must be yes or no" }).nullable().optional(),
  /** Listed waste codes that apply (e.g. from a supplier's or lab's determination). */
  listedCodes: z
    .array(
      z
        .string()
        .trim()
        .toUpperCase()
        .regex(/^[DFKPU]\d{3}$/, "Listed waste code: a letter D, F, K, P or U and three digits, e.g. U154"),
    )
    .max(20, "Listed waste codes: at most 20")
    .default([]),
});
export type WasteCharacterisationInput = z.input<typeof WasteCharacterisationSchema>;

export const WasteDueContainerSchema = z.object({
  code: code("Container code"),
  stream: oneOf("Waste stream", WASTE_STREAMS),
  massKg: z
    .number({ error: "Mass (kg) must be a number" })
    .min(0, "Mass must be at least 0 kg")
    .max(MAX_CONTAINER_MASS_KG, `Mass must be at most ${MAX_CONTAINER_MASS_KG.toLocaleString("en")} kg`),
  volumeL: z
    .number({ error: "Volume (L) must be a number" })
    .min(0, "Volume must be at least 0 L")
    .max(MAX_CONTAINER_VOLUME_L, `Volume must be at most ${MAX_CONTAINER_VOLUME_L.toLocaleString("en")} L`),
  accumulationStart: when("Accumulation start"),
  /** Set when the container stands in a satellite accumulation area (40 CFR 262.15). */
  satelliteAreaCode: code("Satellite area").nullable().default(null),
  /** The date written on the container when the satellite area went over its volume limit. */
  satelliteExcessSince: when("Satellite limit exceeded on").nullable().default(null),
  characterisation: WasteCharacterisationSchema.nullable().default(null),
  notes: text("Notes", 500).default(""),
});
export type WasteDueContainerInput = z.input<typeof WasteDueContainerSchema>;

export const WasteSiteSettingsSchema = z.object({
  generatorCategory: oneOf("Generator category", GENERATOR_CATEGORIES),
  /** Road distance to the treatment, storage or disposal facility; only used for the SQG long-haul period. */
  tsdfDistanceMiles: z
    .number({ error: "Distance to the treatment facility (miles) must be a number" })
    .min(0, "Distance to the treatment facility must be at least 0 miles")
    .max(MAX_TSDF_DISTANCE_MILES, `Distance to the treatment facility must be at most ${MAX_TSDF_DISTANCE_MILES} miles`)
    .nullable()
    .default(null),
});
export type WasteSiteSettingsInput = z.input<typeof WasteSiteSettingsSchema>;

export const WasteDueQuerySchema = z.object({
  withinDays: z
    .number({ error: "Days ahead must be a number" })
    .int("Days ahead must be a whole number")
    .min(0, "Days ahead must be at least 0")
    .max(MAX_DUE_HORIZON_DAYS, `Days ahead must be at most ${MAX_DUE_HORIZON_DAYS}`),
});
