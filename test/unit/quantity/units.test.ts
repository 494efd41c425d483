import { describe, it, expect } from "vitest";
import fc from "fast-check";
import {
  celsiusToKelvin,
  convertMass,
  convertTemperature,
  convertVolume,
  fahrenheitToCelsius,
  celsiusToFahrenheit,
  formatMass,
  formatVolume,
  gramsToKg,
  KG_PER_POUND,
  LITRES_PER_BARREL,
  LITRES_PER_US_GALLON,
  MASS_UNITS,
  millilitresToLitres,
  parseMassUnit,
  parseTemperatureUnit,
  parseUnit,
  parseUnitFromHeader,
  parseVolumeUnit,
  roundHalfAwayFromZero,
  TEMPERATURE_UNITS,
  toGrams,
  toMillilitres,
  VOLUME_UNITS,
} from "@/lib/quantity/units";
import type { CanonicalUnit, MassUnit, TemperatureUnit, VolumeUnit } from "@/lib/quantity/units";

const RUNS = { numRuns: 300 };

describe("exact constants", () => {
  it("derives the US gallon from 231 in³ and the 0.0254 m inch", () => {
    // NIST HB 44 App. C: gallon = 231 in³; NIST SP 811: inch = 0.0254 m exactly → 231 × 2.54³ cm³
    expect(LITRES_PER_US_GALLON).toBeCloseTo((231 * 2.54 ** 3) / 1000, 12);
    expect(LITRES_PER_US_GALLON).toBe(3.785411784); // NIST HB 44 App. C (exact decimal)
  });

  it("defines the barrel as 42 US gallons", () => {
    // NIST HB 44 App. C footnote: 42 gal petroleum barrel = 158.987 294 928 L
    expect(LITRES_PER_BARREL).toBeCloseTo(42 * 3.785411784, 9);
    expect(LITRES_PER_BARREL).toBe(158.987294928);
  });

  it("uses the 1959 avoirdupois pound", () => {
    expect(KG_PER_POUND).toBe(0.45359237); // international pound, 1959 definition (NIST SP 811 / NIST HB 44 App. C, from memory)
  });
});

describe("convertVolume / convertMass", () => {
  const cases: Array<{
    name: string;
    value: number;
    from: VolumeUnit;
    to: VolumeUnit;
    expected: number;
    digits: number;
    source: string;
  }> = [
    {
      name: "1 US gal in L",
      value: 1,
      from: "gal",
      to: "L",
      expected: 3.785411784,
      digits: 12,
      source: "NIST HB 44 App. C",
    },
    {
      name: "1 bbl in L",
      value: 1,
      from: "bbl",
      to: "L",
      expected: 158.987294928,
      digits: 9,
      source: "NIST HB 44 App. C footnote",
    },
    {
      name: "1 bbl in gal",
      value: 1,
      from: "bbl",
      to: "gal",
      expected: 42,
      digits: 12,
      source: "NIST HB 44 App. C footnote",
    },
    {
      name: "1 L in US gal",
      value: 1,
      from: "L",
      to: "gal",
      expected: 0.264172052358148,
      digits: 14,
      source: "NIST SP 811 / NIST HB 44 App. C (computed 1/3.785411784)",
    },
    { name: "2500 mL in L", value: 2500, from: "mL", to: "L", expected: 2.5, digits: 14, source: "SI prefix" },
    {
      name: "1 US gal in mL",
      value: 1,
      from: "gal",
      to: "mL",
      expected: 3785.411784,
      digits: 9,
      source: "NIST HB 44 App. C",
    },
  ];
  it.each(cases)("$name ($source)", ({ value, from, to, expected, digits }) => {
    expect(convertVolume(value, from, to)).toBeCloseTo(expected, digits);
  });

  const massCases: Array<{
    name: string;
    value: number;
    from: MassUnit;
    to: MassUnit;
    expected: number;
    digits: number;
    source: string;
  }> = [
    {
      name: "1 lb in kg",
      value: 1,
      from: "lb",
      to: "kg",
      expected: 0.45359237,
      digits: 14,
      source: "1959 pound definition",
    },
    {
      name: "1 kg in lb",
      value: 1,
      from: "kg",
      to: "lb",
      expected: 2.204622621848776,
      digits: 12,
      source: "NIST SP 811 / NIST HB 44 App. C (computed)",
    },
    {
      name: "2000 lb (short ton) in kg",
      value: 2000,
      from: "lb",
      to: "kg",
      expected: 907.18474,
      digits: 9,
      source: "NIST SP 811 / NIST HB 44 App. C short ton",
    },
    {
      name: "1 lb in g",
      value: 1,
      from: "lb",
      to: "g",
      expected: 453.59237,
      digits: 10,
      source: "1959 pound definition",
    },
    { name: "1500 g in kg", value: 1500, from: "g", to: "kg", expected: 1.5, digits: 14, source: "SI prefix" },
  ];
  it.each(massCases)("$name ($source)", ({ value, from, to, expected, digits }) => {
    expect(convertMass(value, from, to)).toBeCloseTo(expected, digits);
  });

  it("is invertible for every volume unit pair", () => {
    fc.assert(
      fc.property(
        fc.double({ min: -1e9, max: 1e9, noNaN: true }),
        fc.constantFrom(...VOLUME_UNITS),
        fc.constantFrom(...VOLUME_UNITS),
        (v, a, b) => {
          const back = convertVolume(convertVolume(v, a, b), b, a);
          expect(Math.abs(back - v)).toBeLessThanOrEqual(1e-12 * Math.max(1, Math.abs(v)));
        },
      ),
      RUNS,
    );
  });

  it("is invertible for every mass unit pair", () => {
    fc.assert(
      fc.property(
        fc.double({ min: -1e9, max: 1e9, noNaN: true }),
        fc.constantFrom(...MASS_UNITS),
        fc.constantFrom(...MASS_UNITS),
        (m, a, b) => {
          const back = convertMass(convertMass(m, a, b), b, a);
          expect(Math.abs(back - m)).toBeLessThanOrEqual(1e-12 * Math.max(1, Math.abs(m)));
        },
      ),
      RUNS,
    );
  });
});

describe("temperature", () => {
  const cases: Array<{ value: number; from: TemperatureUnit; to: TemperatureUnit; expected: number; digits: number }> =
    [
      // NIST SP 811 / NIST HB 44 App. C check values (computed from NIST SP 811 t/°C = (t/°F − 32)/1.8)
      { value: 32, from: "°F", to: "°C", expected: 0, digits: 12 },
      { value: 60, from: "°F", to: "°C", expected: 15.5556, digits: 4 },
      { value: 68, from: "°F", to: "°C", expected: 20, digits: 12 },
      { value: 100, from: "°F", to: "°C", expected: 37.778, digits: 3 },
      { value: 140, from: "°F", to: "°C", expected: 60, digits: 12 },
      { value: 200, from: "°F", to: "°C", expected: 93.333, digits: 3 },
      { value: 15, from: "°C", to: "°F", expected: 59, digits: 12 },
      { value: 93, from: "°C", to: "°F", expected: 199.4, digits: 10 },
      { value: 101, from: "°C", to: "°F", expected: 213.8, digits: 10 },
      { value: 130, from: "°C", to: "°F", expected: 266, digits: 10 },
      // NIST SP 811: T/K = t/°C + 273.15
      { value: 0, from: "°C", to: "K", expected: 273.15, digits: 12 },
      { value: 288.15, from: "K", to: "°C", expected: 15, digits: 10 },
      { value: 0, from: "K", to: "°F", expected: -459.67, digits: 10 }, // −459.67 °F = 0 K (Rankine offset)
    ];
  it.each(cases)(
    "$value $from → $expected $to (NIST SP 811 / NIST HB 44 App. C / NIST SP 811)",
    ({ value, from, to, expected, digits }) => {
      expect(convertTemperature(value, from, to)).toBeCloseTo(expected, digits);
    },
  );

  it("named helpers agree with the SP 811 formulas", () => {
    expect(fahrenheitToCelsius(-40)).toBeCloseTo(-40, 12); // −40 °F = −40 °C
    expect(celsiusToFahrenheit(100)).toBeCloseTo(212, 12); // water boils at 212 °F (1 atm)
    expect(celsiusToKelvin(25)).toBeCloseTo(298.15, 12);
  });

  it("is invertible for every temperature unit pair", () => {
    fc.assert(
      fc.property(
        fc.double({ min: -1e5, max: 1e5, noNaN: true }),
        fc.constantFrom(...TEMPERATURE_UNITS),
        fc.constantFrom(...TEMPERATURE_UNITS),
        (t, a, b) => {
          const back = convertTemperature(convertTemperature(t, a, b), b, a);
          expect(Math.abs(back - t)).toBeLessThanOrEqual(1e-9 * Math.max(1, Math.abs(t)));
        },
      ),
      RUNS,
    );
  });
});

describe("integer rounding (half away from zero)", () => {
  const cases = [
    { kg: 1.2345, grams: 1235, why: "1234.5 g → up" },
    { kg: -1.2345, grams: -1235, why: "−1234.5 g → away from zero" },
    { kg: 0.0025, grams: 3, why: "2.5 g → 3" },
    { kg: -0.0025, grams: -3, why: "−2.5 g → −3" },
    { kg: 0.0024, grams: 2, why: "below half → down" },
    { kg: 4.0005, grams: 4001, why: "binary product 4000.4999999999995 still rounds as the decimal 4000.5" },
    { kg: 16.0005, grams: 16001, why: "binary product 16000.499999999998" },
    { kg: 0, grams: 0, why: "zero" },
    { kg: -0.0001, grams: 0, why: "tiny negative → 0, not −0" },
  ];
  it.each(cases)("toGrams($kg) = $grams: $why", ({ kg, grams }) => {
    expect(Object.is(toGrams(kg), grams)).toBe(true);
  });

  it.each([
    { litres: 3.785411784, ml: 3785, why: "1 US gal → 3785 mL (3785.411784)" },
    { litres: 0.0005, ml: 1, why: "0.5 mL → 1" },
    { litres: -0.0015, ml: -2, why: "−1.5 mL → −2" },
  ])("toMillilitres($litres) = $ml: $why", ({ litres, ml }) => {
    expect(toMillilitres(litres)).toBe(ml);
  });

  it("rounds ties away from zero on both sides", () => {
    expect(roundHalfAwayFromZero(2.5)).toBe(3);
    expect(roundHalfAwayFromZero(-2.5)).toBe(-3);
    expect(roundHalfAwayFromZero(2.4999)).toBe(2);
  });

  it("never moves a value by more than half a gram", () => {
    fc.assert(
      fc.property(fc.double({ min: -1e9, max: 1e9, noNaN: true }), (kg) => {
        const g = toGrams(kg);
        expect(Number.isSafeInteger(g)).toBe(true);
        expect(Math.abs(g - kg * 1000)).toBeLessThanOrEqual(0.5 + 1e-6 * Math.max(1, Math.abs(kg)));
      }),
      RUNS,
    );
  });

  it("throws on non-finite input (programming error)", () => {
    expect(() => toGrams(Number.NaN)).toThrow();
    expect(() => toMillilitres(Number.POSITIVE_INFINITY)).toThrow();
  });
});

describe("display helpers", () => {
  it("gramsToKg / millilitresToLitres divide by 1000", () => {
    expect(gramsToKg(1234567)).toBe(1234.567);
    expect(millilitresToLitres(2500)).toBe(2.5);
  });

  it.each([
    { grams: 1234567, system: "metric" as const, text: "1234.567 kg" },
    { grams: -1500, system: "metric" as const, text: "-1.500 kg" },
    { grams: 7, system: "metric" as const, text: "0.007 kg" },
    // 1 000 000 g / 453.59237 g/lb = 2204.6226 lb (1959 pound)
    { grams: 1_000_000, system: "us" as const, text: "2204.62 lb" },
    // 453 592 g = 999.99918 lb
    { grams: 453_592, system: "us" as const, text: "1000.00 lb" },
  ])("formatMass($grams, $system) = $text", ({ grams, system, text }) => {
    expect(formatMass(grams, system)).toBe(text);
  });

  it.each([
    { ml: 1500, system: "metric" as const, text: "1.500 L" },
    { ml: 3_785_412, system: "us" as const, text: "1000.00 US gal" }, // 3 785 412 mL / 3785.411784 mL/gal = 1000.00006
    { ml: 158_987, system: "us" as const, text: "42.00 US gal" }, // 1 bbl ≈ 158 987 mL
  ])("formatVolume($ml, $system) = $text", ({ ml, system, text }) => {
    expect(formatVolume(ml, system)).toBe(text);
  });

  it("honours the decimals option", () => {
    expect(formatMass(1234567, "metric", { decimals: 1 })).toBe("1234.6 kg");
    expect(formatVolume(3_785_412, "us", { decimals: 0 })).toBe("1000 US gal");
  });
});

describe("unit parsing", () => {
  const good: Array<[string, CanonicalUnit]> = [
    ["L", "L"],
    ["l", "L"],
    ["litre", "L"],
    ["Liters", "L"],
    ["mL", "mL"],
    ["gal", "gal"],
    ["US gal", "gal"],
    ["  us   Gallons ", "gal"],
    ["bbl", "bbl"],
    ["barrels", "bbl"],
    ["kg", "kg"],
    ["KG", "kg"],
    ["g", "g"],
    ["lb", "lb"],
    ["lbs", "lb"],
    ["°C", "°C"],
    ["C", "°C"],
    ["degC", "°C"],
    ["deg C", "°C"],
    ["ºC", "°C"], // ordinal indicator typed instead of the degree sign
    ["℃", "°C"],
    ["°F", "°F"],
    ["F", "°F"],
    ["degF", "°F"],
    ["Fahrenheit", "°F"],
    ["K", "K"],
  ];
  it.each(good)("parseUnit(%j) → %s", (token, unit) => {
    expect(parseUnit(token)).toEqual({ ok: true, value: unit });
  });

  it.each(["", "furlong", "imp gal", "UK gallon", "t", "kgf", "°X"])(
    "parseUnit(%j) → UNIT.UNKNOWN naming the field",
    (token) => {
      const r = parseUnit(token, "volumeUnit");
      expect(r.ok).toBe(false);
      if (!r.ok) {
        expect(r.issues[0]?.code).toBe("UNIT.UNKNOWN");
        expect(r.issues[0]?.field).toBe("volumeUnit");
      }
    },
  );

  it("explains why imperial gallons are refused", () => {
    const r = parseUnit("imp gal");
    expect(!r.ok && r.issues[0]?.message).toMatch(/imperial/);
  });

  it("restricts the kind of unit", () => {
    expect(parseVolumeUnit("US gal")).toEqual({ ok: true, value: "gal" });
    expect(parseMassUnit("lbs")).toEqual({ ok: true, value: "lb" });
    expect(parseTemperatureUnit("F")).toEqual({ ok: true, value: "°F" });
    const wrong = parseVolumeUnit("kg", "volumeUnit");
    expect(wrong).toEqual({
      ok: false,
      issues: [expect.objectContaining({ code: "UNIT.WRONG_KIND", field: "volumeUnit" })],
    });
    const unknown = parseMassUnit("stone", "massUnit");
    expect(unknown).toEqual({
      ok: false,
      issues: [expect.objectContaining({ code: "UNIT.UNKNOWN", field: "massUnit" })],
    });
  });

  const headers: Array<[string, CanonicalUnit]> = [
    ["Volume (US gal)", "gal"],
    ["Gross weight (lbs)", "lb"],
    ["Temp [°F]", "°F"],
    ["Temperature degC", "°C"],
    ["mass kg", "kg"],
    ["net_volume_L", "L"],
    ["Volume - US gal", "gal"],
  ];
  it.each(headers)("parseUnitFromHeader(%j) → %s", (header, unit) => {
    expect(parseUnitFromHeader(header)).toEqual({ ok: true, value: unit });
  });

  it.each(["Comment", "Volume (imp gal)", "Lot number"])("parseUnitFromHeader(%j) → UNIT.UNKNOWN", (header) => {
    const r = parseUnitFromHeader(header, "header");
    expect(r).toEqual({ ok: false, issues: [expect.objectContaining({ code: "UNIT.UNKNOWN", field: "header" })] });
  });
});
