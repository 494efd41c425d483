// Units at the grid's edge: rows carry kg, L and °C; people see and type their own system's units.
import type { MassUnit, TemperatureUnit, UnitSystem, VolumeUnit } from "@/lib/quantity/units";
import { convertMass, convertTemperature, convertVolume, UNIT_KIND, UNIT_SYMBOL } from "@/lib/quantity/units";
import type { CanonicalUnit } from "@/lib/quantity/units";

export type Quantity = "mass" | "volume" | "temperature";
export type GridUnit = MassUnit | VolumeUnit | TemperatureUnit;

export const CANONICAL: Readonly<Record<Quantity, GridUnit>> = { mass: "kg", volume: "L", temperature: "°C" };

export function displayUnit(q: Quantity, system: UnitSystem): GridUnit {
  if (system === "metric") return CANONICAL[q];
  return q === "mass" ? "lb" : q === "volume" ? "gal" : "°F";
}

export function unitSymbol(u: GridUnit): string {
  return UNIT_SYMBOL[u];
}

export function quantityOf(u: CanonicalUnit): Quantity {
  return UNIT_KIND[u];
}

/** Converts between units of the same quantity. */
export function convertQuantity(value: number, q: Quantity, from: GridUnit, to: GridUnit): number {
  if (from === to) return value;
  if (q === "mass") return convertMass(value, from as MassUnit, to as MassUnit);
  if (q === "volume") return convertVolume(value, from as VolumeUnit, to as VolumeUnit);
  return convertTemperature(value, from as TemperatureUnit, to as TemperatureUnit);
}

export const toDisplay = (canonical: number, q: Quantity, system: UnitSystem) =>
  convertQuantity(canonical, q, CANONICAL[q], displayUnit(q, system));
export const fromUnit = (value: number, q: Quantity, unit: GridUnit) => convertQuantity(value, q, unit, CANONICAL[q]);

/**
 * Decimals shown and exported per unit, chosen so that an exported figure converts back to the same
 * stored integer gram or millilitre (kg/L: 3 decimals = 1 g/1 mL; lb/gal: 4 decimals < 0.05 g or mL).
 */
export function decimalsFor(u: GridUnit): number {
  return u === "kg" || u === "L" || u === "g" || u === "mL" ? 3 : u === "lb" || u === "gal" || u === "bbl" ? 4 : 2;
}
