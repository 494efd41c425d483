import { z } from "zod";
import { MATERIAL_KINDS } from "@/lib/quantity/density";
import {
  convertTemperature,
  convertVolume,
  parseTemperatureUnit,
  parseVolumeUnit,
  UNIT_SYMBOL,
} from "@/lib/quantity/units";
import type { TemperatureUnit, VolumeUnit } from "@/lib/quantity/units";

/** Plausibility bounds for a tank or drum reading at a small plant (common practice, no source); editable. */
export const OBSERVATION_LIMITS_SOURCE =
  "plausibility bounds for small-plant tank readings (common practice, no source)";
/** Exclusive lower bound: a reading must be greater than 0 L. */
export const MIN_OBSERVED_VOLUME_L = 0;
export const MAX_OBSERVED_VOLUME_L = 100_000;
export const MIN_OBSERVED_TEMP_C = -40;
export const MAX_OBSERVED_TEMP_C = 150;
export const MIN_DENSITY_KG_M3 = 500;
export const MAX_DENSITY_KG_M3 = 1500;
export const DENSITY_RANGE_MESSAGE = "density must be between 0.5 and 1.5 kg/L";
/** Relative slack on the limits so that a limit typed in another unit (302 °F, 26 417.205 US gal) is not rejected by float noise. */
const LIMIT_SLACK = 1e-9;

export const DENSITY_UNITS = ["kg/m3", "kg/L", "g/mL"] as const;
export type DensityUnit = (typeof DENSITY_UNITS)[number];

const DENSITY_UNIT_ALIASES: ReadonlyMap<string, DensityUnit> = new Map([
  ["kg/m3", "kg/m3"],
  ["kg/m³", "kg/m3"],
  ["kg m-3", "kg/m3"],
  ["kg/l", "kg/L"],
  ["g/ml", "g/mL"],
  ["g/cm3", "g/mL"],
  ["g/cm³", "g/mL"],
]);

const KG_M3_PER_DENSITY_UNIT: Readonly<Record<DensityUnit, number>> = { "kg/m3": 1, "kg/L": 1000, "g/mL": 1000 };

const volumeUnitField = z
  .string({ error: "volumeUnit must be a unit text such as L, mL, US gal or bbl" })
  .transform((token, ctx): VolumeUnit => {
    const parsed = parseVolumeUnit(token, "volumeUnit");
    if (parsed.ok) return parsed.value;
    ctx.addIssue({
      code: "custom",
      message: `volumeUnit: ${parsed.issues[0]?.message ?? "unknown unit"} (use L, mL, US gal or bbl)`,
    });
    return z.NEVER;
  });

const temperatureUnitField = z
  .string({ error: "temperatureUnit must be a unit text such as °C, °F or K" })
  .transform((token, ctx): TemperatureUnit => {
    const parsed = parseTemperatureUnit(token, "temperatureUnit");
    if (parsed.ok) return parsed.value;
    ctx.addIssue({
      code: "custom",
      message: `temperatureUnit: ${parsed.issues[0]?.message ?? "unknown unit"} (use °C, °F or K)`,
    });
    return z.NEVER;
  });

const densityUnitField = z
  .string({ error: "densityUnit must be kg/m3, kg/L or g/mL" })
  .transform((token, ctx): DensityUnit => {
    const unit = DENSITY_UNIT_ALIASES.get(token.trim().toLowerCase());
    if (unit !== undefined) return unit;
    ctx.addIssue({ code: "custom", message: `densityUnit: unknown unit "${token.trim()}" (use kg/m3, kg/L or g/mL)` });
    return z.NEVER;
  });

function withinLimits(value: number, min: number, max: number): boolean {
  const slack = LIMIT_SLACK * Math.max(1, Math.abs(min), Math.abs(max));
  return value >= min - slack && value <= max + slack;
}

/**
 * One tank/drum reading. Units are converted: the output is always litres, °C and kg/m³.
 * An optional measured density (at `densityTemperature`, default 15 °C, in the reading's temperature unit)
 * overrides the table's density level.
 */
export const DensityObservationSchema = z
  .object({
    materialKind: z.enum(MATERIAL_KINDS, { error: `materialKind must be one of ${MATERIAL_KINDS.join(", ")}` }),
    volume: z.number({ error: "volume must be a number" }),
    volumeUnit: volumeUnitField.default("L"),
    temperature: z.number({ error: "temperature must be a number" }),
    temperatureUnit: temperatureUnitField.default("°C"),
    density: z.number({ error: "density must be a number" }).optional(),
    densityUnit: densityUnitField.default("kg/m3"),
    densityTemperature: z.number({ error: "densityTemperature must be a number" }).optional(),
  })
  .transform((input, rawCtx) => {
    let issueCount = 0;
    const ctx = {
      addIssue(issue: { code: "custom"; path: string[]; message: string }): void {
        issueCount += 1;
        rawCtx.addIssue(issue);
      },
    };
    const observedVolumeL = convertVolume(input.volume, input.volumeUnit, "L");
    const observedTempC = convertTemperature(input.temperature, input.temperatureUnit, "°C");
    const unitText = (tC: number): string =>
      input.temperatureUnit === "°C"
        ? `${tC} °C`
        : `${tC} °C (${Number(convertTemperature(tC, "°C", input.temperatureUnit).toFixed(2))} ${UNIT_SYMBOL[input.temperatureUnit]})`;

    if (!(observedVolumeL > MIN_OBSERVED_VOLUME_L)) {
      ctx.addIssue({
        code: "custom",
        path: ["volume"],
        message: `volume must be greater than ${MIN_OBSERVED_VOLUME_L} L`,
      });
    } else if (!withinLimits(observedVolumeL, MIN_OBSERVED_VOLUME_L, MAX_OBSERVED_VOLUME_L)) {
      const inGal = Number(convertVolume(MAX_OBSERVED_VOLUME_L, "L", "gal").toFixed(1));
      ctx.addIssue({
        code: "custom",
        path: ["volume"],
        message: `volume must be at most ${MAX_OBSERVED_VOLUME_L} L (${inGal} US gal)`,
      });
    }
    if (!withinLimits(observedTempC, MIN_OBSERVED_TEMP_C, MAX_OBSERVED_TEMP_C)) {
      ctx.addIssue({
        code: "custom",
        path: ["temperature"],
        message: `temperature must be between ${unitText(MIN_OBSERVED_TEMP_C)} and ${unitText(MAX_OBSERVED_TEMP_C)}`,
      });
    }
    let density: { densityKgM3: number; atTempC: number } | undefined;
    if (input.density !== undefined) {
      const densityKgM3 = input.density * KG_M3_PER_DENSITY_UNIT[input.densityUnit];
      if (!withinLimits(densityKgM3, MIN_DENSITY_KG_M3, MAX_DENSITY_KG_M3)) {
        ctx.addIssue({ code: "custom", path: ["density"], message: DENSITY_RANGE_MESSAGE });
      }
      const atTempC =
        input.densityTemperature === undefined
          ? 15
          : convertTemperature(input.densityTemperature, input.temperatureUnit, "°C");
      if (!withinLimits(atTempC, MIN_OBSERVED_TEMP_C, MAX_OBSERVED_TEMP_C)) {
        ctx.addIssue({
          code: "custom",
          path: ["densityTemperature"],
          message: `densityTemperature must be between ${unitText(MIN_OBSERVED_TEMP_C)} and ${unitText(MAX_OBSERVED_TEMP_C)}`,
        });
      }
      density = { densityKgM3, atTempC };
    } else if (input.densityTemperature !== undefined) {
      ctx.addIssue({
        code: "custom",
        path: ["densityTemperature"],
        message: "densityTemperature is given but density is missing",
      });
    }
    if (issueCount > 0) return z.NEVER;
    return {
      materialKind: input.materialKind,
      observedVolumeL,
      observedTempC,
      ...(density === undefined ? {} : { density }),
    };
  });

export type DensityObservationInput = z.input<typeof DensityObservationSchema>;
export type DensityObservation = z.output<typeof DensityObservationSchema>;
