import { failMany, invariant, ok } from "@/lib/core/result";
import type { DomainIssue, Result } from "@/lib/core/result";
import { ABSOLUTE_ZERO_C, fahrenheitToCelsius, toGrams, toMillilitres } from "@/lib/quantity/units";
import type { DensityEntry, LinearDensityEntry, MaterialKind } from "@/lib/quantity/density-entry";

export { MATERIAL_KINDS } from "@/lib/quantity/density-entry";
export type {
  DensityEntry,
  DensityTable,
  LinearDensityEntry,
  MaterialKind,
  SourceStatus,
  TemperatureRangeC,
  WaterDensityEntry,
} from "@/lib/quantity/density-entry";
export { DEFAULT_DENSITY_TABLE } from "@/lib/quantity/density.data";

/**
 * Volume ↔ mass at a reference temperature.
 *
 * Model (common practice, no source): density is linear in temperature,
 * ρ(t) = ρ15 + s·(t − 15 °C), with s the entry's slope in kg/m³ per K (negative: liquids expand).
 * The volume correction factor to a reference temperature is VCF = ρ(t_obs)/ρ(t_ref), which is
 * mass conservation (V_obs·ρ_obs = V_ref·ρ_ref). Water uses the Tanaka et al. 2001 formula instead.
 * This is not the ASTM D1250 / API MPMS 11.1 petroleum table procedure.
 */

/**
 * Reference temperatures for standard volumes: 15 °C (EN 14214, ASTM D1250) or 60 °F. Both go through the
 * table's linear density rule (common practice); 60 °F here is NOT the volume-correction equation of the US
 * renewable fuel regulations, which is not implemented.
 */
export const REFERENCE_TEMPERATURE_C = {
  C15: 15,
  F60: fahrenheitToCelsius(60),
} as const;
export type ReferenceTemperatureKey = keyof typeof REFERENCE_TEMPERATURE_C;
export const DEFAULT_REFERENCE_TEMP_C: number = REFERENCE_TEMPERATURE_C.C15;

export function getDensityEntry(
  table: Partial<Record<MaterialKind, DensityEntry>>,
  kind: MaterialKind,
): DensityEntry | null {
  return table[kind] ?? null;
}

export function requireDensityEntry(
  table: Partial<Record<MaterialKind, DensityEntry>>,
  kind: MaterialKind,
): DensityEntry {
  const entry = table[kind];
  invariant(entry !== undefined, `density table has no entry for ${kind}`);
  return entry;
}

// Tanaka et al. 2001, Metrologia 38:301, eq. (1): ρ = a5·[1 − (t + a1)²(t + a2) / (a3·(t + a4))].
const TANAKA = { a1: -3.983035, a2: 301.797, a3: 522528.9, a4: 69.34881, a5: 999.97495 } as const;

function waterDensityTanaka(tC: number): number {
  const { a1, a2, a3, a4, a5 } = TANAKA;
  return a5 * (1 - ((tC + a1) ** 2 * (tC + a2)) / (a3 * (tC + a4)));
}

/** Density in kg/m³ at tC (°C). May be ≤ 0 far outside the model range; callers check. */
export function densityAt(entry: DensityEntry, tC: number): number {
  invariant(Number.isFinite(tC), `temperature must be finite, got ${tC}`);
  if (entry.model === "water-tanaka-2001") return waterDensityTanaka(tC);
  return entry.densityAt15KgM3 + entry.slopeKgM3PerK * (tC - 15);
}

/**
 * Replaces the table's density level with a measured one (e.g. a CoA density or a lab hydrometer reading),
 * keeping the entry's temperature slope. For water the local slope of the Tanaka curve is used.
 */
export function applyMeasuredDensity(
  entry: DensityEntry,
  measured: { densityKgM3: number; atTempC: number; source: string },
): LinearDensityEntry {
  invariant(Number.isFinite(measured.densityKgM3) && measured.densityKgM3 > 0, "measured density must be positive");
  invariant(Number.isFinite(measured.atTempC), "measured density temperature must be finite");
  const slope =
    entry.model === "linear"
      ? entry.slopeKgM3PerK
      : densityAt(entry, measured.atTempC + 0.5) - densityAt(entry, measured.atTempC - 0.5);
  return {
    model: "linear",
    densityAt15KgM3: measured.densityKgM3 - slope * (measured.atTempC - 15),
    slopeKgM3PerK: slope,
    status: "sourced",
    source: `measured ${measured.densityKgM3} kg/m³ at ${measured.atTempC} °C (${measured.source}); slope from: ${entry.source}`,
    ...(entry.validRangeC ? { validRangeC: entry.validRangeC } : {}),
  };
}

interface TemperatureCheck {
  value: number;
  field: string;
}

function checkTemperatures(temps: readonly TemperatureCheck[]): DomainIssue[] {
  return temps.flatMap(({ value, field }): DomainIssue[] => {
    if (!Number.isFinite(value))
      return [{ code: "QUANTITY.NOT_A_NUMBER", message: `${field} must be a number (°C)`, field }];
    if (value < ABSOLUTE_ZERO_C) {
      return [{ code: "QUANTITY.BELOW_ABSOLUTE_ZERO", message: `${field} must be above −273.15 °C`, field }];
    }
    return [];
  });
}

function checkNonNegative(value: number, field: string, unit: string): DomainIssue[] {
  if (!Number.isFinite(value))
    return [{ code: "QUANTITY.NOT_A_NUMBER", message: `${field} must be a number (${unit})`, field }];
  if (value < 0) return [{ code: "QUANTITY.NEGATIVE", message: `${field} must not be negative (${unit})`, field }];
  return [];
}

function densityOrIssue(entry: DensityEntry, tC: number, field: string): number | DomainIssue {
  const rho = densityAt(entry, tC);
  if (!(rho > 0)) {
    return { code: "DENSITY.NOT_POSITIVE", message: `the density model gives no positive density at ${tC} °C`, field };
  }
  return rho;
}

/**
 * A reading outside the range the model is backed for warns, except between the table's 15 °C anchor density
 * and the bottom of the slope's range (15–24 °C for the oils): there the line runs between two backed
 * points, an ordinary ambient reading, and only a note is given (see rangeNotes).
 */
function rangeWarnings(entry: DensityEntry, tC: number, field: string): DomainIssue[] {
  const range = entry.validRangeC;
  if (range === undefined || (tC >= range.minC && tC <= range.maxC) || isBetweenAnchorAndRange(entry, tC)) return [];
  return [
    {
      code: "DENSITY.OUTSIDE_MODEL_RANGE",
      message: `${field} ${tC} °C is outside ${range.minC}–${range.maxC} °C, where the density model is backed; the value is extrapolated`,
      field,
    },
  ];
}

function isBetweenAnchorAndRange(entry: DensityEntry, tC: number): boolean {
  const range = entry.validRangeC;
  return range !== undefined && entry.ambientNoteFromC !== undefined && tC >= entry.ambientNoteFromC && tC < range.minC;
}

/** The note for an ambient reading between the 15 °C anchor and the slope's backed range. */
export function rangeNotes(entry: DensityEntry, tC: number): string[] {
  const range = entry.validRangeC;
  if (range === undefined || !isBetweenAnchorAndRange(entry, tC)) return [];
  return [
    `At ${tC} °C the density is read on the straight line between the 15 °C table density and the ${range.minC}–${range.maxC} °C range its slope was measured over (common practice).`,
  ];
}

export interface StandardVolumeInput {
  observedVolumeL: number;
  observedTempC: number;
  entry: DensityEntry;
  /** Defaults to 15 °C; pass REFERENCE_TEMPERATURE_C.F60 for 60 °F. */
  referenceTempC?: number;
}

export interface StandardVolume {
  standardVolumeL: number;
  standardVolumeMl: number;
  /** ρ(t_obs)/ρ(t_ref). */
  vcf: number;
  observedDensityKgM3: number;
  referenceDensityKgM3: number;
  referenceTempC: number;
  /** Non-blocking: e.g. DENSITY.OUTSIDE_MODEL_RANGE. */
  warnings: DomainIssue[];
}

/** Observed volume → volume at the reference temperature with VCF = ρ(t_obs)/ρ(t_ref) (linear model, common practice). */
export function standardVolume(input: StandardVolumeInput): Result<StandardVolume> {
  const referenceTempC = input.referenceTempC ?? DEFAULT_REFERENCE_TEMP_C;
  const issues = [
    ...checkNonNegative(input.observedVolumeL, "observedVolumeL", "L"),
    ...checkTemperatures([
      { value: input.observedTempC, field: "observedTempC" },
      { value: referenceTempC, field: "referenceTempC" },
    ]),
  ];
  if (issues.length > 0) return failMany(issues);
  const obs = densityOrIssue(input.entry, input.observedTempC, "observedTempC");
  const ref = densityOrIssue(input.entry, referenceTempC, "referenceTempC");
  const densityIssues = [obs, ref].filter((d): d is DomainIssue => typeof d !== "number");
  if (typeof obs !== "number" || typeof ref !== "number") return failMany(densityIssues);
  const vcf = obs / ref;
  const standardVolumeL = input.observedVolumeL * vcf;
  return ok({
    standardVolumeL,
    standardVolumeMl: toMillilitres(standardVolumeL),
    vcf,
    observedDensityKgM3: obs,
    referenceDensityKgM3: ref,
    referenceTempC,
    warnings: rangeWarnings(input.entry, input.observedTempC, "observedTempC"),
  });
}

export interface MassFromObservedInput {
  observedVolumeL: number;
  observedTempC: number;
  entry: DensityEntry;
}

export interface MassFromVolume {
  massKg: number;
  /** Integer grams, rounded half away from zero. */
  massG: number;
  densityKgM3: number;
  warnings: DomainIssue[];
}

/** m = V_obs · ρ(t_obs); equals V_ref · ρ(t_ref) for any reference temperature. */
export function massFromObserved(input: MassFromObservedInput): Result<MassFromVolume> {
  const issues = [
    ...checkNonNegative(input.observedVolumeL, "observedVolumeL", "L"),
    ...checkTemperatures([{ value: input.observedTempC, field: "observedTempC" }]),
  ];
  if (issues.length > 0) return failMany(issues);
  const rho = densityOrIssue(input.entry, input.observedTempC, "observedTempC");
  if (typeof rho !== "number") return failMany([rho]);
  // L × kg/m³ = 10⁻³ m³ × kg/m³.
  const massKg = (input.observedVolumeL * rho) / 1000;
  return ok({
    massKg,
    massG: toGrams(massKg),
    densityKgM3: rho,
    warnings: rangeWarnings(input.entry, input.observedTempC, "observedTempC"),
  });
}

export interface ObservedVolumeFromMassInput {
  massKg: number;
  observedTempC: number;
  entry: DensityEntry;
}

export interface VolumeFromMass {
  volumeL: number;
  /** Integer millilitres, rounded half away from zero. */
  volumeMl: number;
  densityKgM3: number;
  warnings: DomainIssue[];
}

/** Inverse of massFromObserved: the volume a mass occupies at tC. */
export function observedVolumeFromMass(input: ObservedVolumeFromMassInput): Result<VolumeFromMass> {
  const issues = [
    ...checkNonNegative(input.massKg, "massKg", "kg"),
    ...checkTemperatures([{ value: input.observedTempC, field: "observedTempC" }]),
  ];
  if (issues.length > 0) return failMany(issues);
  const rho = densityOrIssue(input.entry, input.observedTempC, "observedTempC");
  if (typeof rho !== "number") return failMany([rho]);
  const volumeL = (input.massKg * 1000) / rho;
  return ok({
    volumeL,
    volumeMl: toMillilitres(volumeL),
    densityKgM3: rho,
    warnings: rangeWarnings(input.entry, input.observedTempC, "observedTempC"),
  });
}
