import { fail, invariant, ok } from "@/lib/core/result";
import type { Result } from "@/lib/core/result";

/**
 * Units, exact conversions and the integer rounding policy.
 *
 * Storage rule: summed masses are integer grams, summed volumes integer millilitres.
 * Conversions to those integers round half away from zero (see `roundHalfAwayFromZero`).
 */

export type UnitSystem = "metric" | "us";

/** "gal" is always the US liquid gallon (231 in³); "bbl" is the 42-gallon petroleum barrel. */
export const VOLUME_UNITS = ["L", "mL", "gal", "bbl"] as const;
export const MASS_UNITS = ["kg", "g", "lb"] as const;
export const TEMPERATURE_UNITS = ["°C", "°F", "K"] as const;

export type VolumeUnit = (typeof VOLUME_UNITS)[number];
export type MassUnit = (typeof MASS_UNITS)[number];
export type TemperatureUnit = (typeof TEMPERATURE_UNITS)[number];
export type CanonicalUnit = VolumeUnit | MassUnit | TemperatureUnit;
export type UnitKind = "volume" | "mass" | "temperature";

/** NIST HB 44 App. C: US gallon = 231 in³ exactly; with the inch = 0.0254 m exactly this is 3.785 411 784 L. */
export const LITRES_PER_US_GALLON = 3.785411784;
/** NIST HB 44 App. C footnote: by custom 42 US gallons make a barrel of crude oil or petroleum products. */
export const US_GALLONS_PER_BARREL = 42;
/** 42 × 3.785 411 784 L, written out so the constant carries no floating-point product error. */
export const LITRES_PER_BARREL = 158.987294928;
/** International avoirdupois pound (1959 definition): 0.453 592 37 kg exactly. */
export const KG_PER_POUND = 0.45359237;
/** NIST SP 811: T/K = t/°C + 273.15. */
export const KELVIN_AT_ZERO_CELSIUS = 273.15;
/** Absolute zero in °C; temperatures below it are not physical. */
export const ABSOLUTE_ZERO_C = -KELVIN_AT_ZERO_CELSIUS;

export const UNIT_KIND: Readonly<Record<CanonicalUnit, UnitKind>> = {
  L: "volume",
  mL: "volume",
  gal: "volume",
  bbl: "volume",
  kg: "mass",
  g: "mass",
  lb: "mass",
  "°C": "temperature",
  "°F": "temperature",
  K: "temperature",
};

/** Symbol shown to users; "gal" is displayed as "US gal" so it cannot be read as an imperial gallon. */
export const UNIT_SYMBOL: Readonly<Record<CanonicalUnit, string>> = {
  L: "L",
  mL: "mL",
  gal: "US gal",
  bbl: "bbl",
  kg: "kg",
  g: "g",
  lb: "lb",
  "°C": "°C",
  "°F": "°F",
  K: "K",
};

// Divide by the "per unit" count where the unit is a decimal sub-multiple, so mL → L is an exact /1000.
const LITRES_PER: Readonly<Record<VolumeUnit, number>> = {
  L: 1,
  mL: 1 / 1000,
  gal: LITRES_PER_US_GALLON,
  bbl: LITRES_PER_BARREL,
};
const KG_PER: Readonly<Record<MassUnit, number>> = { kg: 1, g: 1 / 1000, lb: KG_PER_POUND };

function requireFinite(value: number, what: string): void {
  invariant(Number.isFinite(value), `${what} must be a finite number, got ${value}`);
}

function toLitres(value: number, unit: VolumeUnit): number {
  return unit === "mL" ? value / 1000 : value * LITRES_PER[unit];
}

function fromLitres(litres: number, unit: VolumeUnit): number {
  return unit === "mL" ? litres * 1000 : litres / LITRES_PER[unit];
}

function toKilograms(value: number, unit: MassUnit): number {
  return unit === "g" ? value / 1000 : value * KG_PER[unit];
}

function fromKilograms(kg: number, unit: MassUnit): number {
  return unit === "g" ? kg * 1000 : kg / KG_PER[unit];
}

export function convertVolume(value: number, from: VolumeUnit, to: VolumeUnit): number {
  requireFinite(value, "volume");
  if (from === to) return value;
  return fromLitres(toLitres(value, from), to);
}

export function convertMass(value: number, from: MassUnit, to: MassUnit): number {
  requireFinite(value, "mass");
  if (from === to) return value;
  return fromKilograms(toKilograms(value, from), to);
}

/** NIST SP 811: t/°C = (t/°F − 32)/1.8. */
export function fahrenheitToCelsius(tF: number): number {
  requireFinite(tF, "temperature");
  return (tF - 32) / 1.8;
}

export function celsiusToFahrenheit(tC: number): number {
  requireFinite(tC, "temperature");
  return tC * 1.8 + 32;
}

export function celsiusToKelvin(tC: number): number {
  requireFinite(tC, "temperature");
  return tC + KELVIN_AT_ZERO_CELSIUS;
}

export function kelvinToCelsius(tK: number): number {
  requireFinite(tK, "temperature");
  return tK - KELVIN_AT_ZERO_CELSIUS;
}

export function convertTemperature(value: number, from: TemperatureUnit, to: TemperatureUnit): number {
  requireFinite(value, "temperature");
  if (from === to) return value;
  const tC = from === "°C" ? value : from === "°F" ? fahrenheitToCelsius(value) : kelvinToCelsius(value);
  return to === "°C" ? tC : to === "°F" ? celsiusToFahrenheit(tC) : celsiusToKelvin(tC);
}

/**
 * Rounds to the nearest integer, halves away from zero (2.5 → 3, −2.5 → −3).
 * The value is first snapped to 15 significant digits so a decimal input whose binary product lands
 * a hair below a half (4.0005 kg × 1000 = 4000.4999999999995) still rounds as written.
 */
export function roundHalfAwayFromZero(value: number): number {
  requireFinite(value, "value");
  const snapped = Number(value.toPrecision(15));
  const rounded = Math.sign(snapped) * Math.round(Math.abs(snapped));
  return rounded === 0 ? 0 : rounded;
}

/** Kilograms → integer grams, rounding half away from zero. */
export function toGrams(kg: number): number {
  const grams = roundHalfAwayFromZero(kg * 1000);
  invariant(Number.isSafeInteger(grams), `mass ${kg} kg is too large to store as integer grams`);
  return grams;
}

/** Litres → integer millilitres, rounding half away from zero. */
export function toMillilitres(litres: number): number {
  const ml = roundHalfAwayFromZero(litres * 1000);
  invariant(Number.isSafeInteger(ml), `volume ${litres} L is too large to store as integer millilitres`);
  return ml;
}

export function gramsToKg(grams: number): number {
  requireFinite(grams, "mass");
  return grams / 1000;
}

export function millilitresToLitres(ml: number): number {
  requireFinite(ml, "volume");
  return ml / 1000;
}

/** Fixed-decimal text without locale grouping; rounding half away from zero like the storage rule. */
export function formatFixed(value: number, decimals: number): string {
  invariant(Number.isInteger(decimals) && decimals >= 0 && decimals <= 9, `decimals must be 0…9, got ${decimals}`);
  const scale = 10 ** decimals;
  const scaled = roundHalfAwayFromZero(value * scale);
  const negative = scaled < 0;
  const abs = Math.abs(scaled);
  const whole = Math.floor(abs / scale);
  const frac = abs - whole * scale;
  const text = decimals === 0 ? String(whole) : `${whole}.${String(frac).padStart(decimals, "0")}`;
  return negative ? `-${text}` : text;
}

export interface FormatOptions {
  decimals?: number;
}

/** Integer grams → "1234.567 kg" (metric, 3 decimals) or "2721.55 lb" (us, 2 decimals). */
export function formatMass(grams: number, system: UnitSystem, options: FormatOptions = {}): string {
  requireFinite(grams, "mass");
  if (system === "metric") return `${formatFixed(grams / 1000, options.decimals ?? 3)} ${UNIT_SYMBOL.kg}`;
  return `${formatFixed(convertMass(grams, "g", "lb"), options.decimals ?? 2)} ${UNIT_SYMBOL.lb}`;
}

/** Integer millilitres → "1234.567 L" (metric, 3 decimals) or "326.01 US gal" (us, 2 decimals). */
export function formatVolume(ml: number, system: UnitSystem, options: FormatOptions = {}): string {
  requireFinite(ml, "volume");
  if (system === "metric") return `${formatFixed(ml / 1000, options.decimals ?? 3)} ${UNIT_SYMBOL.L}`;
  return `${formatFixed(convertVolume(ml, "mL", "gal"), options.decimals ?? 2)} ${UNIT_SYMBOL.gal}`;
}

const UNIT_ALIASES: ReadonlyArray<readonly [CanonicalUnit, readonly string[]]> = [
  ["L", ["l", "lt", "ltr", "ltrs", "litre", "litres", "liter", "liters"]],
  ["mL", ["ml", "millilitre", "millilitres", "milliliter", "milliliters", "cm3", "cm³", "cc"]],
  [
    "gal",
    [
      "gal",
      "gals",
      "gallon",
      "gallons",
      "us gal",
      "usgal",
      "us gals",
      "us gallon",
      "us gallons",
      "gal us",
      "gal (us)",
      "usg",
    ],
  ],
  ["bbl", ["bbl", "bbls", "barrel", "barrels", "oil barrel", "oil barrels", "us bbl", "petroleum barrel"]],
  ["kg", ["kg", "kgs", "kilogram", "kilograms", "kilo", "kilos"]],
  ["g", ["g", "gr", "gram", "grams", "gramme", "grammes"]],
  ["lb", ["lb", "lbs", "lbm", "pound", "pounds", "lb av", "lb avdp"]],
  ["°C", ["°c", "c", "degc", "deg c", "deg. c", "celsius", "degrees c", "degrees celsius", "℃"]],
  ["°F", ["°f", "f", "degf", "deg f", "deg. f", "fahrenheit", "degrees f", "degrees fahrenheit", "℉"]],
  ["K", ["k", "kelvin", "kelvins", "°k"]],
];

const ALIAS_TO_UNIT: ReadonlyMap<string, CanonicalUnit> = new Map(
  UNIT_ALIASES.flatMap(([unit, aliases]) => aliases.map((alias) => [alias, unit] as const)),
);

// Tokens that look like units we deliberately do not convert, so the message can say why.
const UNSUPPORTED_HINTS: ReadonlyArray<readonly [RegExp, string]> = [
  [/^(imp|uk|imperial)\.? ?gal/, "imperial gallons are not supported; use US gal or L"],
  [/^gal ?\((imp|uk)\)$/, "imperial gallons are not supported; use US gal or L"],
  [/^(t|tonne|tonnes|ton|tons|mt)$/, "tonnes/tons are not accepted; use kg or lb"],
];

function normaliseToken(token: string): string {
  // The ordinal "º" must become "°" before NFKC, which would turn it into a letter "o".
  return token.replace(/[º˚]/g, "°").normalize("NFKC").trim().toLowerCase().replace(/\s+/g, " ").replace(/\.$/, "");
}

/** Parses a unit token ("litre", "US gal", "degF", "°C" …) to its canonical unit, or returns UNIT.UNKNOWN. */
export function parseUnit(token: string, field?: string): Result<CanonicalUnit> {
  const key = normaliseToken(token);
  const unit = ALIAS_TO_UNIT.get(key);
  if (unit !== undefined) return ok(unit);
  const hint = UNSUPPORTED_HINTS.find(([pattern]) => pattern.test(key));
  const detail = hint ? `: ${hint[1]}` : "";
  return fail("UNIT.UNKNOWN", `unknown unit "${token.trim()}"${detail}`, field);
}

function parseUnitOfKind<U extends CanonicalUnit>(token: string, kind: UnitKind, field: string | undefined): Result<U> {
  const parsed = parseUnit(token, field);
  if (!parsed.ok) return parsed;
  if (UNIT_KIND[parsed.value] !== kind) {
    return fail(
      "UNIT.WRONG_KIND",
      `"${token.trim()}" is a ${UNIT_KIND[parsed.value]} unit, expected a ${kind} unit`,
      field,
    );
  }
  return ok(parsed.value as U);
}

export function parseVolumeUnit(token: string, field?: string): Result<VolumeUnit> {
  return parseUnitOfKind<VolumeUnit>(token, "volume", field);
}

export function parseMassUnit(token: string, field?: string): Result<MassUnit> {
  return parseUnitOfKind<MassUnit>(token, "mass", field);
}

export function parseTemperatureUnit(token: string, field?: string): Result<TemperatureUnit> {
  return parseUnitOfKind<TemperatureUnit>(token, "temperature", field);
}

/**
 * Finds the unit in a column header: the text in the last (...) or [...] if present ("Volume (US gal)"),
 * otherwise the last two words, then the last word ("Temp degF", "mass kg").
 */
export function parseUnitFromHeader(header: string, field?: string): Result<CanonicalUnit> {
  const bracketed = [...header.matchAll(/[([]([^()[\]]+)[)\]]/g)].at(-1)?.[1];
  if (bracketed !== undefined) return parseUnit(bracketed, field);
  const words = header
    .trim()
    .split(/[\s_/,;:-]+/)
    .filter((w) => w.length > 0);
  const candidates = [words.slice(-2).join(" "), words.at(-1) ?? ""].filter((c) => c.length > 0);
  for (const candidate of candidates) {
    const parsed = parseUnit(candidate, field);
    if (parsed.ok) return parsed;
  }
  return fail("UNIT.UNKNOWN", `no known unit found in header "${header.trim()}"`, field);
}
