// What a density table holds: the material kinds, and per material a linear model in temperature (or
// water's own formula) with its source and how well that source is known.
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
