import { describe, it, expect } from "vitest";
import {
  DENSITY_RANGE_MESSAGE,
  DensityObservationSchema,
  MAX_DENSITY_KG_M3,
  MAX_OBSERVED_TEMP_C,
  MAX_OBSERVED_VOLUME_L,
  MIN_DENSITY_KG_M3,
  MIN_OBSERVED_TEMP_C,
} from "@/lib/quantity/density.schema";

function issuesOf(input: unknown): Array<{ path: string; message: string }> {
  const r = DensityObservationSchema.safeParse(input);
  return r.success ? [] : r.error.issues.map((i) => ({ path: i.path.join("."), message: i.message }));
}

const base = { materialKind: "SOYBEAN", volume: 1000, temperature: 20 };

describe("DensityObservationSchema", () => {
  it("exports the limits the brief fixes", () => {
    expect([
      MAX_OBSERVED_VOLUME_L,
      MIN_OBSERVED_TEMP_C,
      MAX_OBSERVED_TEMP_C,
      MIN_DENSITY_KG_M3,
      MAX_DENSITY_KG_M3,
    ]).toEqual([100_000, -40, 150, 500, 1500]);
  });

  it("defaults to litres and °C", () => {
    expect(DensityObservationSchema.parse(base)).toEqual({
      materialKind: "SOYBEAN",
      observedVolumeL: 1000,
      observedTempC: 20,
    });
  });

  it("converts US gallons and °F", () => {
    const out = DensityObservationSchema.parse({
      ...base,
      volume: 1000,
      volumeUnit: "US gal",
      temperature: 60,
      temperatureUnit: "F",
    });
    expect(out.observedVolumeL).toBeCloseTo(3785.411784, 9); // NIST HB 44 App. C
    expect(out.observedTempC).toBeCloseTo(15.5556, 4); // 60 °F, NIST SP 811
  });

  it("converts a density in kg/L to kg/m³, at 15 °C unless told", () => {
    const out = DensityObservationSchema.parse({ ...base, density: 0.921, densityUnit: "kg/L" });
    expect(out.density?.densityKgM3).toBeCloseTo(921, 9);
    expect(out.density?.atTempC).toBe(15);
    const at68F = DensityObservationSchema.parse({
      ...base,
      temperatureUnit: "°F",
      temperature: 68,
      density: 918,
      densityTemperature: 68,
    });
    expect(at68F.density?.atTempC).toBeCloseTo(20, 9); // 68 °F = 20 °C
  });

  it.each([
    { name: "lower temperature limit in °F", input: { ...base, temperature: -40, temperatureUnit: "°F" } }, // −40 °F = −40 °C
    { name: "upper temperature limit in °F", input: { ...base, temperature: 302, temperatureUnit: "degF" } }, // 302 °F = 150 °C
    { name: "volume limit typed in US gal", input: { ...base, volume: 100_000 / 3.785411784, volumeUnit: "gal" } },
    { name: "density limit 1.5 kg/L", input: { ...base, density: 1.5, densityUnit: "g/mL" } },
    { name: "density limit 500 kg/m³", input: { ...base, density: 500 } },
    { name: "volume 100 000 L", input: { ...base, volume: 100_000 } },
  ])("accepts the boundary: $name", ({ input }) => {
    expect(issuesOf(input)).toEqual([]);
  });

  const bad: Array<{ name: string; input: unknown; path: string; message: RegExp }> = [
    { name: "zero volume", input: { ...base, volume: 0 }, path: "volume", message: /greater than 0 L/ },
    { name: "negative volume", input: { ...base, volume: -5 }, path: "volume", message: /greater than 0 L/ },
    { name: "volume over 100 000 L", input: { ...base, volume: 100_001 }, path: "volume", message: /at most 100000 L/ },
    {
      name: "volume over the limit in bbl",
      input: { ...base, volume: 700, volumeUnit: "bbl" },
      path: "volume",
      message: /at most 100000 L/,
    }, // 700 bbl = 111 291 L
    {
      name: "volume not a number",
      input: { ...base, volume: "12" },
      path: "volume",
      message: /volume must be a number/,
    },
    {
      name: "temperature below −40 °C",
      input: { ...base, temperature: -41 },
      path: "temperature",
      message: /between -40 °C and 150 °C/,
    },
    {
      name: "temperature above 302 °F",
      input: { ...base, temperature: 303, temperatureUnit: "F" },
      path: "temperature",
      message: /302 °F/,
    },
    {
      name: "density 1.6 kg/L",
      input: { ...base, density: 1.6, densityUnit: "kg/L" },
      path: "density",
      message: /^density must be between 0\.5 and 1\.5 kg\/L$/,
    },
    {
      name: "density 400 kg/m³",
      input: { ...base, density: 400 },
      path: "density",
      message: /^density must be between 0\.5 and 1\.5 kg\/L$/,
    },
    {
      name: "unknown volume unit",
      input: { ...base, volumeUnit: "imp gal" },
      path: "volumeUnit",
      message: /volumeUnit.*imperial/,
    },
    {
      name: "mass unit as volume unit",
      input: { ...base, volumeUnit: "kg" },
      path: "volumeUnit",
      message: /volumeUnit.*mass unit/,
    },
    {
      name: "unknown temperature unit",
      input: { ...base, temperatureUnit: "Rankine" },
      path: "temperatureUnit",
      message: /temperatureUnit/,
    },
    {
      name: "unknown density unit",
      input: { ...base, density: 900, densityUnit: "lb/gal" },
      path: "densityUnit",
      message: /densityUnit/,
    },
    {
      name: "density temperature without density",
      input: { ...base, densityTemperature: 20 },
      path: "densityTemperature",
      message: /density is missing/,
    },
    {
      name: "density temperature out of range",
      input: { ...base, density: 900, densityTemperature: 200 },
      path: "densityTemperature",
      message: /densityTemperature must be between/,
    },
    {
      name: "unknown material",
      input: { ...base, materialKind: "CRUDE" },
      path: "materialKind",
      message: /materialKind must be one of/,
    },
  ];
  it.each(bad)("rejects $name with a message on $path", ({ input, path, message }) => {
    const issues = issuesOf(input);
    expect(issues.length).toBeGreaterThan(0);
    expect(issues.find((i) => i.path === path)?.message).toMatch(message);
  });

  it("uses the exact density message", () => {
    expect(DENSITY_RANGE_MESSAGE).toBe("density must be between 0.5 and 1.5 kg/L");
  });

  it("reports volume, temperature and density problems together", () => {
    const paths = issuesOf({ ...base, volume: 0, temperature: 500, density: 2000 }).map((i) => i.path);
    expect(paths.sort()).toEqual(["density", "temperature", "volume"]);
  });
});
