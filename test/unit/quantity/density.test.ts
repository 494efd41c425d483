import { describe, it, expect } from "vitest";
import fc from "fast-check";
import {
  rangeNotes,
  applyMeasuredDensity,
  DEFAULT_DENSITY_TABLE,
  densityAt,
  getDensityEntry,
  massFromObserved,
  MATERIAL_KINDS,
  observedVolumeFromMass,
  REFERENCE_TEMPERATURE_C,
  requireDensityEntry,
  standardVolume,
} from "@/lib/quantity/density";
import type { DensityEntry, LinearDensityEntry } from "@/lib/quantity/density";
import type { Result } from "@/lib/core/result";

const RUNS = { numRuns: 300 };
/** Water at 20 °C, Tanaka et al. 2001 tabulated value: converts relative densities d(20/20) to kg/m³. */
const WATER_20C = 998.2067;

// Independent fixture entries built from common practice numbers, so the tests do not depend on the default table.
const FAME_FIXTURE: LinearDensityEntry = {
  model: "linear",
  densityAt15KgM3: 880, // typical FAME at 15 °C (common practice)
  slopeKgM3PerK: -0.7, // ≈0.70 kg/m³/K (from memory)
  source: "test fixture",
  status: "from memory",
};
const SOY_FIXTURE: LinearDensityEntry = {
  model: "linear",
  densityAt15KgM3: 923.5,
  slopeKgM3PerK: -0.64, // JAOCS 76:1415 (1999), vegetable oils
  source: "test fixture",
  status: "sourced",
};

function issueFields<T>(r: Result<T>): Array<string | undefined> {
  return r.ok ? [] : r.issues.map((i) => i.field);
}

function issueCodes<T>(r: Result<T>): string[] {
  return r.ok ? [] : r.issues.map((i) => i.code);
}

function requireOk<T>(r: Result<T>): T {
  if (!r.ok) throw new Error(`expected ok, got ${JSON.stringify(r.issues)}`);
  return r.value;
}

describe("DEFAULT_DENSITY_TABLE", () => {
  it("has a sourced-or-flagged entry for every material kind", () => {
    for (const kind of MATERIAL_KINDS) {
      const entry = DEFAULT_DENSITY_TABLE[kind];
      expect(entry.source.length).toBeGreaterThan(10);
      expect(["sourced", "from memory", "common practice"]).toContain(entry.status);
    }
  });

  // Each row checks the table against a published range, converted by hand; not against the table itself.
  const rangeChecks: Array<{
    kind: (typeof MATERIAL_KINDS)[number];
    tC: number;
    min: number;
    max: number;
    source: string;
  }> = [
    {
      kind: "SOYBEAN",
      tC: 20,
      min: 0.919 * WATER_20C,
      max: 0.925 * WATER_20C,
      source: "Codex CXS 210-1999, d(20/20) 0.919–0.925",
    },
    {
      kind: "CANOLA",
      tC: 20,
      min: 0.914 * WATER_20C,
      max: 0.92 * WATER_20C,
      source: "Codex CXS 210-1999, low-erucic rapeseed 0.914–0.920",
    },
    {
      kind: "TALLOW",
      tC: 40,
      min: 0.893 * WATER_20C,
      max: 0.904 * WATER_20C,
      source: "Bockisch 1998, d(40/20) 0.893–0.904",
    },
    { kind: "FAME", tC: 15, min: 860, max: 900, source: "EN 14214 Table 1, 860–900 kg/m³ at 15 °C" },
    { kind: "USED_COOKING_OIL", tC: 20, min: 910, max: 920, source: "common practice ≈0.91–0.92 g/cm³ (from memory)" },
  ];
  it.each(rangeChecks)("$kind at $tC °C lies in $source", ({ kind, tC, min, max }) => {
    const rho = densityAt(DEFAULT_DENSITY_TABLE[kind], tC);
    expect(rho).toBeGreaterThanOrEqual(min);
    expect(rho).toBeLessThanOrEqual(max);
  });

  it.each([
    { tC: 15, expected: 796.0 }, // Merck Index d(15/4) 0.7960
    { tC: 20, expected: 791.5 }, // Merck Index d(20/4) 0.7915
    { tC: 25, expected: 786.6 }, // Merck Index d(25/4) 0.7866
  ])("methanol at $tC °C ≈ $expected kg/m³ (Merck Index)", ({ tC, expected }) => {
    expect(Math.abs(densityAt(DEFAULT_DENSITY_TABLE.METHANOL, tC) - expected)).toBeLessThanOrEqual(0.5);
  });

  it.each([
    { tC: 15, expected: 1263.8 },
    { tC: 20, expected: 1260.8 },
    { tC: 25, expected: 1257.7 },
    { tC: 40, expected: 1248.5 },
  ])("glycerol at $tC °C ≈ $expected kg/m³ (Volk & Kähler 2018 fit, from memory)", ({ tC, expected }) => {
    expect(Math.abs(densityAt(DEFAULT_DENSITY_TABLE.GLYCEROL, tC) - expected)).toBeLessThanOrEqual(0.06);
  });

  it.each([
    { tC: 4, expected: 999.9749 },
    { tC: 10, expected: 999.7027 },
    { tC: 15, expected: 999.1026 },
    { tC: 15.556, expected: 999.017 }, // 60 °F
    { tC: 20, expected: 998.2067 },
    { tC: 25, expected: 997.047 },
    { tC: 30, expected: 995.6488 },
    { tC: 40, expected: 992.2152 },
  ])("water at $tC °C = $expected kg/m³ (Tanaka et al. 2001, Metrologia 38:301)", ({ tC, expected }) => {
    expect(Math.abs(densityAt(DEFAULT_DENSITY_TABLE.WATER, tC) - expected)).toBeLessThanOrEqual(0.001);
  });

  it("getDensityEntry returns null for a missing kind; requireDensityEntry throws", () => {
    expect(getDensityEntry({}, "FAME")).toBeNull();
    expect(getDensityEntry(DEFAULT_DENSITY_TABLE, "FAME")).toBe(DEFAULT_DENSITY_TABLE.FAME);
    expect(() => requireDensityEntry({}, "FAME")).toThrow();
  });
});

describe("densityAt (linear model)", () => {
  it("soybean oil loses 0.64 kg/m³ per K from 15 °C to 40 °C", () => {
    // JAOCS 76:1415 (1999): −0.00064 g/cm³ per °C → 25 K × −0.64 = −16.0 kg/m³
    const rho15 = densityAt(DEFAULT_DENSITY_TABLE.SOYBEAN, 15);
    const rho40 = densityAt(DEFAULT_DENSITY_TABLE.SOYBEAN, 40);
    expect(rho40 - rho15).toBeCloseTo(-16.0, 9);
    expect(densityAt(SOY_FIXTURE, 40)).toBeCloseTo(923.5 - 16.0, 9);
  });

  it("returns ρ15 at 15 °C", () => {
    expect(densityAt(FAME_FIXTURE, 15)).toBe(880);
  });
});

describe("standardVolume", () => {
  it("corrects 1000 L of FAME at 25 °C to 15 °C", () => {
    // VCF = ρ(25)/ρ(15) = (880 − 0.7 × 10)/880 = 873/880 (linear model, common practice)
    const v = requireOk(standardVolume({ observedVolumeL: 1000, observedTempC: 25, entry: FAME_FIXTURE }));
    expect(v.vcf).toBeCloseTo(873 / 880, 12);
    expect(v.standardVolumeL).toBeCloseTo(992.0454545, 6);
    expect(v.standardVolumeMl).toBe(992045);
    expect(v.referenceTempC).toBe(15);
  });

  it("corrects to 60 °F when selected", () => {
    // 60 °F = 15.5556 °C (NIST SP 811); ρ(60 °F) = 880 − 0.7 × (15.5556 − 15) = 879.6111 kg/m³
    const v = requireOk(
      standardVolume({
        observedVolumeL: 1000,
        observedTempC: 25,
        entry: FAME_FIXTURE,
        referenceTempC: REFERENCE_TEMPERATURE_C.F60,
      }),
    );
    expect(v.referenceDensityKgM3).toBeCloseTo(879.6111, 4);
    expect(v.standardVolumeL).toBeCloseTo((1000 * 873) / 879.611111, 4);
  });

  it("gives VCF = 1 at the reference temperature", () => {
    const v = requireOk(standardVolume({ observedVolumeL: 500, observedTempC: 15, entry: SOY_FIXTURE }));
    expect(v.vcf).toBe(1);
    expect(v.standardVolumeL).toBe(500);
  });

  it("warns, without failing, when the observation is outside the model's backed range", () => {
    const v = requireOk(
      standardVolume({ observedVolumeL: 100, observedTempC: 20, entry: DEFAULT_DENSITY_TABLE.TALLOW }),
    );
    expect(v.warnings.map((w) => w.code)).toEqual(["DENSITY.OUTSIDE_MODEL_RANGE"]);
    const inside = requireOk(
      standardVolume({ observedVolumeL: 100, observedTempC: 60, entry: DEFAULT_DENSITY_TABLE.TALLOW }),
    );
    expect(inside.warnings).toEqual([]);
  });

  it("keeps the mass: V_std × ρ_ref = V_obs × ρ_obs", () => {
    fc.assert(
      fc.property(
        fc.double({ min: 0.001, max: 100_000, noNaN: true }),
        fc.double({ min: -40, max: 150, noNaN: true }),
        fc.constantFrom(...MATERIAL_KINDS.filter((k) => k !== "WATER")),
        fc.constantFrom(REFERENCE_TEMPERATURE_C.C15, REFERENCE_TEMPERATURE_C.F60, 20),
        (volumeL, tC, kind, refC) => {
          const entry = DEFAULT_DENSITY_TABLE[kind];
          const v = requireOk(
            standardVolume({ observedVolumeL: volumeL, observedTempC: tC, entry, referenceTempC: refC }),
          );
          const m = requireOk(massFromObserved({ observedVolumeL: volumeL, observedTempC: tC, entry }));
          expect(Math.abs((v.standardVolumeL * v.referenceDensityKgM3) / 1000 - m.massKg)).toBeLessThanOrEqual(
            1e-9 * m.massKg,
          );
        },
      ),
      RUNS,
    );
  });
});

describe("massFromObserved / observedVolumeFromMass", () => {
  it("one US gallon of 880 kg/m³ FAME at 15 °C weighs 3.3312 kg / 7.344 lb", () => {
    // computed: 3.785411784 L × 0.880 kg/L = 3.33116 kg; / 0.45359237 = 7.344 lb
    const m = requireOk(massFromObserved({ observedVolumeL: 3.785411784, observedTempC: 15, entry: FAME_FIXTURE }));
    expect(m.massKg).toBeCloseTo(3.3312, 4);
    expect(m.massG).toBe(3331);
    expect(m.massKg / 0.45359237).toBeCloseTo(7.344, 3);
  });

  it("1000 L of soybean oil at 40 °C weighs 907.5 kg", () => {
    // ρ40 = 923.5 − 0.64 × 25 = 907.5 kg/m³ (JAOCS 76:1415 slope) → 1 m³ × 907.5 kg/m³
    const m = requireOk(massFromObserved({ observedVolumeL: 1000, observedTempC: 40, entry: SOY_FIXTURE }));
    expect(m.massKg).toBeCloseTo(907.5, 9);
    expect(m.massG).toBe(907500);
  });

  it("inverts: 907.5 kg of soybean oil at 40 °C is 1000 L", () => {
    const v = requireOk(observedVolumeFromMass({ massKg: 907.5, observedTempC: 40, entry: SOY_FIXTURE }));
    expect(v.volumeL).toBeCloseTo(1000, 9);
    expect(v.volumeMl).toBe(1_000_000);
  });

  it("round-trips volume → mass → volume", () => {
    fc.assert(
      fc.property(
        fc.double({ min: 0, max: 100_000, noNaN: true }),
        fc.double({ min: 0, max: 40, noNaN: true }),
        fc.constantFrom(...MATERIAL_KINDS),
        (volumeL, tC, kind) => {
          const entry = DEFAULT_DENSITY_TABLE[kind];
          const m = requireOk(massFromObserved({ observedVolumeL: volumeL, observedTempC: tC, entry }));
          const back = requireOk(observedVolumeFromMass({ massKg: m.massKg, observedTempC: tC, entry }));
          expect(Math.abs(back.volumeL - volumeL)).toBeLessThanOrEqual(1e-12 * Math.max(1, volumeL));
          // Through stored integer grams the error is at most 0.5 g of material.
          const fromGrams = requireOk(observedVolumeFromMass({ massKg: m.massG / 1000, observedTempC: tC, entry }));
          expect(Math.abs(fromGrams.volumeL - volumeL)).toBeLessThanOrEqual(
            0.5 / m.densityKgM3 + 1e-9 * Math.max(1, volumeL),
          );
        },
      ),
      RUNS,
    );
  });
});

describe("applyMeasuredDensity", () => {
  it("moves the level to a measured 0.885 kg/L at 20 °C and keeps the slope", () => {
    // ρ15 = 885 + 0.7 × 5 = 888.5; ρ40 = 885 − 0.7 × 20 = 871 (hand arithmetic, FAME slope common practice)
    const e = applyMeasuredDensity(FAME_FIXTURE, { densityKgM3: 885, atTempC: 20, source: "CoA 123" });
    expect(e.densityAt15KgM3).toBeCloseTo(888.5, 9);
    expect(densityAt(e, 40)).toBeCloseTo(871, 9);
    expect(e.source).toContain("CoA 123");
  });

  it("uses the local Tanaka slope for water", () => {
    // Tanaka 2001 table: 997.0470 (25 °C) − 999.1026 (15 °C) over 10 K ≈ −0.21 kg/m³/K near 20 °C
    const e = applyMeasuredDensity(DEFAULT_DENSITY_TABLE.WATER, { densityKgM3: 998.2067, atTempC: 20, source: "lab" });
    expect(e.slopeKgM3PerK).toBeGreaterThan(-0.23);
    expect(e.slopeKgM3PerK).toBeLessThan(-0.19);
    expect(densityAt(e, 20)).toBeCloseTo(998.2067, 9);
  });
});

describe("bad inputs return issues naming the field", () => {
  const entry: DensityEntry = FAME_FIXTURE;
  const cases: Array<{ name: string; run: () => Result<unknown>; code: string; field: string }> = [
    {
      name: "negative volume",
      run: () => massFromObserved({ observedVolumeL: -1, observedTempC: 15, entry }),
      code: "QUANTITY.NEGATIVE",
      field: "observedVolumeL",
    },
    {
      name: "NaN volume",
      run: () => standardVolume({ observedVolumeL: Number.NaN, observedTempC: 15, entry }),
      code: "QUANTITY.NOT_A_NUMBER",
      field: "observedVolumeL",
    },
    {
      name: "NaN temperature",
      run: () => massFromObserved({ observedVolumeL: 1, observedTempC: Number.NaN, entry }),
      code: "QUANTITY.NOT_A_NUMBER",
      field: "observedTempC",
    },
    {
      name: "below absolute zero",
      run: () => standardVolume({ observedVolumeL: 1, observedTempC: -300, entry }),
      code: "QUANTITY.BELOW_ABSOLUTE_ZERO",
      field: "observedTempC",
    },
    {
      name: "bad reference temperature",
      run: () =>
        standardVolume({ observedVolumeL: 1, observedTempC: 15, entry, referenceTempC: Number.POSITIVE_INFINITY }),
      code: "QUANTITY.NOT_A_NUMBER",
      field: "referenceTempC",
    },
    {
      name: "negative mass",
      run: () => observedVolumeFromMass({ massKg: -5, observedTempC: 15, entry }),
      code: "QUANTITY.NEGATIVE",
      field: "massKg",
    },
    // 880 − 0.7 × (1400 − 15) < 0: the linear model has no density there
    {
      name: "model gives no density",
      run: () => massFromObserved({ observedVolumeL: 1, observedTempC: 1400, entry }),
      code: "DENSITY.NOT_POSITIVE",
      field: "observedTempC",
    },
    {
      name: "model gives no density (inverse)",
      run: () => observedVolumeFromMass({ massKg: 1, observedTempC: 1400, entry }),
      code: "DENSITY.NOT_POSITIVE",
      field: "observedTempC",
    },
  ];
  it.each(cases)("$name → $code on $field", ({ run, code, field }) => {
    const r = run();
    expect(issueCodes(r)).toContain(code);
    expect(issueFields(r)).toContain(field);
  });

  it("reports several bad fields at once", () => {
    const r = standardVolume({ observedVolumeL: -1, observedTempC: Number.NaN, entry });
    expect(issueFields(r).sort()).toEqual(["observedTempC", "observedVolumeL"]);
  });
});

describe("ordinary ambient readings of the oils", () => {
  // The oils' slope is backed over 24–110 °C (JAOCS 76:1415–1419, 1999) and their table density is at 15 °C
  // (Codex CXS 210-1999 relative density at 20 °C, moved to 15 °C): a 15–23 °C reading lies between the two.
  it("a soybean reading at 18 °C gives a note, not a warning (before: a warning on every such reading)", () => {
    const v = standardVolume({ observedVolumeL: 100, observedTempC: 18, entry: DEFAULT_DENSITY_TABLE.SOYBEAN });
    expect(v.ok && v.value.warnings).toEqual([]);
    expect(rangeNotes(DEFAULT_DENSITY_TABLE.SOYBEAN, 18)[0]).toContain("common practice");
  });
  it("below 15 °C still warns, and tallow (solid at ambient) still warns at 20 °C", () => {
    const cold = standardVolume({ observedVolumeL: 100, observedTempC: 5, entry: DEFAULT_DENSITY_TABLE.SOYBEAN });
    expect(cold.ok && cold.value.warnings.map((w) => w.code)).toEqual(["DENSITY.OUTSIDE_MODEL_RANGE"]);
    expect(rangeNotes(DEFAULT_DENSITY_TABLE.TALLOW, 20)).toEqual([]);
  });
});
