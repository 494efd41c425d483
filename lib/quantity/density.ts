import { failMany, invariant, ok } from "@/lib/core/result";
import type { DomainIssue, Result } from "@/lib/core/result";
import { ABSOLUTE_ZERO_C, fahrenheitToCelsius, toGrams, toMillilitres } from "@/lib/quantity/units";

/**
 * Volume ↔ mass at a reference temperature.
 *
 * Model (common practice, no source): density is linear in temperature,
 * ρ(t) = ρ15 + s·(t − 15 °C), with s the entry's slope in kg/m³ per K (negative: liquids expand).
 * The volume correction factor to a reference temperature is VCF = ρ(t_obs)/ρ(t_ref), which is
 * mass conservation (V_obs·ρ_obs = V_ref·ρ_ref). Water uses the Tanaka et al. 2001 formula instead.
 * This is not the ASTM D1250 / API MPMS 11.1 petroleum table procedure.
 */

export const MATERIAL_KINDS = [
  "USED_COOKING_OIL",
  "YELLOW_GREASE",
  "TRAP_GREASE",
  "TALLOW",
  "SOYBEAN",
  "CANOLA",
  "OTHER_OIL",
  "FAME",
  "METHANOL",
  "GLYCEROL",
  "WATER",
] as const;
export type MaterialKind = (typeof MATERIAL_KINDS)[number];

/** "sourced": value seen in a named source; "from memory": recalled, unverified; "common practice": trade rule of thumb. */
export type SourceStatus = "sourced" | "from memory" | "common practice";

export interface TemperatureRangeC {
  minC: number;
  maxC: number;
}

interface DensityEntryBase {
  /** Where the numbers come from, including how they were derived. */
  source: string;
  /** Status of the weakest number in the entry. */
  status: SourceStatus;
  /** Temperatures the model is backed for; an observation outside it gets a warning, not an error. */
  validRangeC?: TemperatureRangeC;
  /** Readings from here up to validRangeC.minC get a note, not a warning (an oil still liquid there). */
  ambientNoteFromC?: number;
  note?: string;
}

export interface LinearDensityEntry extends DensityEntryBase {
  model: "linear";
  /** Density at 15 °C, kg/m³. */
  densityAt15KgM3: number;
  /** dρ/dT in kg/m³ per K; negative for every liquid in the table. */
  slopeKgM3PerK: number;
}

/** Air-free water, Tanaka et al. 2001 (CIPM formula), valid 0–40 °C. */
export interface WaterDensityEntry extends DensityEntryBase {
  model: "water-tanaka-2001";
}

export type DensityEntry = LinearDensityEntry | WaterDensityEntry;
export type DensityTable = Readonly<Record<MaterialKind, DensityEntry>>;

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

const VEG_OIL_SLOPE = -0.64;
const VEG_OIL_SLOPE_SOURCE =
  "slope −0.64 kg/m³/K: JAOCS 76:1415–1419 (1999), linear 24–110 °C, citing Noureddini, Teoh & Clements 1992 (JAOCS 69)";
const UCO_NOTE = "no published standard density; measure each lot and override";

// ρ15 values derived from 20 °C / 40 °C relative densities: ρ = d × ρ_water(20 °C) (998.2067 kg/m³,
// Tanaka 2001), then shifted to 15 °C with the vegetable-oil slope.
export const DEFAULT_DENSITY_TABLE: DensityTable = {
  USED_COOKING_OIL: {
    model: "linear",
    densityAt15KgM3: 918.2,
    slopeKgM3PerK: VEG_OIL_SLOPE,
    status: "from memory",
    source: `ρ: ≈0.91–0.92 g/cm³ at 20 °C (from memory, unverified), midpoint 915 + 5 K × 0.64; ${VEG_OIL_SLOPE_SOURCE}`,
    validRangeC: { minC: 24, maxC: 110 },
    ambientNoteFromC: 15,
    note: UCO_NOTE,
  },
  YELLOW_GREASE: {
    model: "linear",
    densityAt15KgM3: 918.2,
    slopeKgM3PerK: VEG_OIL_SLOPE,
    status: "from memory",
    source: `placeholder: same as used cooking oil (rendered UCO); ${VEG_OIL_SLOPE_SOURCE}`,
    validRangeC: { minC: 24, maxC: 110 },
    ambientNoteFromC: 15,
    note: UCO_NOTE,
  },
  TRAP_GREASE: {
    model: "linear",
    densityAt15KgM3: 918.2,
    slopeKgM3PerK: VEG_OIL_SLOPE,
    status: "from memory",
    source: `placeholder: same as used cooking oil; no sourced value for trap/brown grease; ${VEG_OIL_SLOPE_SOURCE}`,
    validRangeC: { minC: 24, maxC: 110 },
    ambientNoteFromC: 15,
    note: "contains water and solids; density varies widely — measure each lot and override",
  },
  TALLOW: {
    model: "linear",
    densityAt15KgM3: 912.9,
    slopeKgM3PerK: VEG_OIL_SLOPE,
    status: "common practice",
    source:
      "ρ: relative density 0.893–0.904 at 40 °C / water 20 °C, Bockisch, Fats and Oils Handbook (1998); midpoint 0.8985 × 998.2067 + 25 K × 0.64; slope: vegetable-oil value applied to animal fat (common practice)",
    validRangeC: { minC: 40, maxC: 110 },
    note: "ρ15 is a liquid-phase extrapolation; tallow is solid at 15 °C — measure it molten",
  },
  SOYBEAN: {
    model: "linear",
    densityAt15KgM3: 923.5,
    slopeKgM3PerK: VEG_OIL_SLOPE,
    status: "sourced",
    source: `ρ: relative density 0.919–0.925 at 20 °C / water 20 °C, Codex CXS 210-1999; midpoint 0.922 × 998.2067 + 5 K × 0.64; ${VEG_OIL_SLOPE_SOURCE}`,
    validRangeC: { minC: 24, maxC: 110 },
    ambientNoteFromC: 15,
  },
  CANOLA: {
    model: "linear",
    densityAt15KgM3: 918.6,
    slopeKgM3PerK: VEG_OIL_SLOPE,
    status: "sourced",
    source: `ρ: relative density 0.914–0.920 at 20 °C, Codex CXS 210-1999 (rapeseed, low erucic); midpoint 0.917 × 998.2067 + 5 K × 0.64; ${VEG_OIL_SLOPE_SOURCE}`,
    validRangeC: { minC: 24, maxC: 110 },
    ambientNoteFromC: 15,
  },
  OTHER_OIL: {
    model: "linear",
    densityAt15KgM3: 920.0,
    slopeKgM3PerK: VEG_OIL_SLOPE,
    status: "common practice",
    source: `placeholder for an unlisted vegetable oil (≈0.92 g/cm³, common practice); ${VEG_OIL_SLOPE_SOURCE}`,
    validRangeC: { minC: 24, maxC: 110 },
    ambientNoteFromC: 15,
    note: "override with the supplier's or the lab's density",
  },
  FAME: {
    model: "linear",
    densityAt15KgM3: 880.0,
    slopeKgM3PerK: -0.7,
    status: "from memory",
    source:
      "ρ15: typical 880 kg/m³ (EN 14214 Table 1 range 860–900 at 15 °C; NREL handling guide value via corrosionpedia); slope ≈0.70 kg/m³/K from ASTM D1250 fuel-oil constants K0 = 186.9696, K1 = 0.4862 (from memory, unverified); Tat & Van Gerpen 2000 (JAOCS 77:115) found biodiesel density linear in T",
    validRangeC: { minC: 0, maxC: 80 },
  },
  METHANOL: {
    model: "linear",
    densityAt15KgM3: 796.0,
    slopeKgM3PerK: -0.94,
    status: "sourced",
    source: "Merck Index: d(15/4) 0.7960, d(20/4) 0.7915, d(25/4) 0.7866 g/cm³; slope (0.7866 − 0.7960)/10 K",
    validRangeC: { minC: 0, maxC: 25 },
  },
  GLYCEROL: {
    model: "linear",
    densityAt15KgM3: 1263.82,
    slopeKgM3PerK: -0.612,
    status: "from memory",
    source:
      "ρ = 1273 − 0.612·t(°C) kg/m³, fit attributed to Volk & Kähler 2018 (Exp. Fluids 59:75) (from memory, unverified); ≈1260 kg/m³ at room temperature [sourced, same paper]",
    note: "pure glycerol; crude glycerol from a plant contains methanol, water and soap and is lighter",
  },
  WATER: {
    model: "water-tanaka-2001",
    status: "sourced",
    source:
      "Tanaka et al. 2001, Metrologia 38:301 (CIPM formula for air-free SMOW); constants from memory, checked against the paper's tabulated 999.1026 (15 °C) and 998.2067 (20 °C) kg/m³",
    validRangeC: { minC: 0, maxC: 40 },
  },
};

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
