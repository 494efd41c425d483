// A tank's book stock as a fill level: the capacity it would hold of its service's nominal material at
// the reference temperature (the default density table), and the book stock as a share of it. An
// estimate from the books, not a gauge.
import {
  DEFAULT_DENSITY_TABLE,
  DEFAULT_REFERENCE_TEMP_C,
  densityAt,
  requireDensityEntry,
} from "@/lib/quantity/density";
import type { MaterialKind } from "@/lib/quantity/density";

/** The material a tank's service is assumed to hold when its book mass is turned into a level. */
export const SERVICE_MATERIAL: Readonly<Record<string, MaterialKind>> = {
  FEEDSTOCK: "USED_COOKING_OIL",
  PRODUCT: "FAME",
  GLYCEROL_PHASE: "GLYCEROL",
  WASH_WATER: "WATER",
  METHANOL: "METHANOL",
};

export interface FillLevel {
  nominalMaterial: MaterialKind;
  /** Density of the nominal material at the reference temperature, kg/m³ (the default table's value). */
  nominalDensityKgM3: number;
  nominalDensityStatus: string;
  /** Book mass the tank would hold when full of its nominal material, grams. */
  capacityG: number;
  /** Book stock ÷ capacityG × 100; an estimate, not a gauge. */
  fillPct: number;
}

export function toTankLevel<T extends { service: string; capacityMl: number; stockG: number }>(t: T): T & FillLevel {
  const material = SERVICE_MATERIAL[t.service] ?? "OTHER_OIL";
  const entry = requireDensityEntry(DEFAULT_DENSITY_TABLE, material);
  const rho = densityAt(entry, DEFAULT_REFERENCE_TEMP_C);
  // kg/m³ equals g/L, so grams = millilitres × ρ / 1000.
  const capacityG = (t.capacityMl * rho) / 1000;
  return {
    ...t,
    nominalMaterial: material,
    nominalDensityKgM3: rho,
    nominalDensityStatus: entry.status,
    capacityG,
    fillPct: capacityG > 0 ? (t.stockG * 100) / capacityG : 0,
  };
}
