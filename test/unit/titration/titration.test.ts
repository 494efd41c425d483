import { describe, it, expect } from "vitest";
import fc from "fast-check";
import { MF } from "mf-parser";
import {
  acidValueFromFfa,
  CA5A40_AV_PER_FFA_OLEIC,
  calculateAcidValue,
  calculateFfaPercent,
  DEFAULT_TITRATION_LIMITS,
  FFA_BASES,
  FFA_FACTORS,
  ffaFromAcidValue,
  getFfaFactor,
  KOH_MOLAR_MASS_G_MOL,
} from "@/lib/titration/titration";
import { DEFAULT_FFA_REPEATABILITY, summariseReplicates } from "@/lib/titration/replicates";
import { CA5A40_SAMPLE_SIZE_TABLE, suggestSampleSize } from "@/lib/titration/sample-size";
import type { TitrationInput } from "@/lib/titration/titration";
import type { Result } from "@/lib/core/result";

const RUNS = { numRuns: 300 };

function requireOk<T>(r: Result<T>): T {
  if (!r.ok) throw new Error(`expected ok, got ${JSON.stringify(r.issues)}`);
  return r.value;
}

function issuePairs<T>(r: Result<T>): Array<[string, string | undefined]> {
  return r.ok ? [] : r.issues.map((i) => [i.code, i.field]);
}

describe("FFA factor table", () => {
  it("prints the Ca 5a-40 factors", () => {
    // AOCS Ca 5a-40, Calculations: 28.2 oleic, 25.6 palmitic, 20.0 lauric
    expect(FFA_FACTORS.OLEIC.methodFactor).toBe(28.2);
    expect(FFA_FACTORS.PALMITIC.methodFactor).toBe(25.6);
    expect(FFA_FACTORS.LAURIC.methodFactor).toBe(20.0);
    for (const basis of FFA_BASES) expect(FFA_FACTORS[basis].source).toMatch(/Ca 5a-40/);
  });

  it.each([
    { basis: "OLEIC" as const, formula: "C18H34O2" },
    { basis: "PALMITIC" as const, formula: "C16H32O2" },
    { basis: "LAURIC" as const, formula: "C12H24O2" },
  ])(
    "molar mass of $basis acid agrees with mf-parser within 5e-5 (mf-parser's own documentation)",
    ({ basis, formula }) => {
      // mf-parser uses abundance-weighted element masses, slightly off IUPAC conventional values (mf-parser's own documentation)
      const reference = new MF(formula).getInfo().mass;
      expect(Math.abs(FFA_FACTORS[basis].molarMassGMol - reference) / reference).toBeLessThan(5e-5);
    },
  );

  it("the method factor is M/10 rounded to one decimal", () => {
    // acid value definition, computed: 28.2 = 282.468/10 rounded; 25.64 → 25.6; 20.03 → 20.0
    for (const basis of FFA_BASES) {
      expect(Math.round(getFfaFactor(basis, "molar-mass") * 10) / 10).toBeCloseTo(FFA_FACTORS[basis].methodFactor, 9);
    }
  });

  it("KOH molar mass agrees with mf-parser (IUPAC 2021 atomic weights, computed: 56.1053 IUPAC, 56.106 cheminfo)", () => {
    const reference = new MF("KOH").getInfo().mass;
    expect(Math.abs(KOH_MOLAR_MASS_G_MOL - reference) / reference).toBeLessThan(5e-5);
  });
});

describe("calculateFfaPercent (AOCS Ca 5a-40)", () => {
  const vectors: Array<{
    name: string;
    input: TitrationInput;
    basis?: "OLEIC" | "PALMITIC" | "LAURIC";
    mode?: "method" | "molar-mass";
    expected: number;
    digits: number;
  }> = [
    // AOCS Ca 5a-40, computed worked check values
    {
      name: "V 10.00, N 0.1, m 28.2 → 1.000 % oleic",
      input: { titreMl: 10, concentrationMolL: 0.1, sampleMassG: 28.2 },
      expected: 1.0,
      digits: 9,
    },
    {
      name: "same with exact M → 1.0017 %",
      input: { titreMl: 10, concentrationMolL: 0.1, sampleMassG: 28.2 },
      mode: "molar-mass",
      expected: 1.0017,
      digits: 4,
    },
    {
      name: "V 5.00, N 0.25, m 7.05 → 5.000 %",
      input: { titreMl: 5, concentrationMolL: 0.25, sampleMassG: 7.05 },
      expected: 5.0,
      digits: 9,
    },
    {
      name: "V 2.00, N 0.1, m 56.4 → 0.100 %",
      input: { titreMl: 2, concentrationMolL: 0.1, sampleMassG: 56.4 },
      expected: 0.1,
      digits: 9,
    },
    // Ca 5a-40 palmitic/lauric factors, hand arithmetic: 10 × 0.1 × 25.6 / 28.2 = 0.907801; 10 × 0.1 × 20.0 / 20 = 1
    {
      name: "palmitic: 10 × 0.1 × 25.6 / 28.2",
      input: { titreMl: 10, concentrationMolL: 0.1, sampleMassG: 28.2 },
      basis: "PALMITIC",
      expected: 0.907801,
      digits: 6,
    },
    {
      name: "lauric: 10 × 0.1 × 20.0 / 20",
      input: { titreMl: 10, concentrationMolL: 0.1, sampleMassG: 20 },
      basis: "LAURIC",
      expected: 1.0,
      digits: 9,
    },
    // blank correction (V − B): (10.05 − 0.05) × 0.1 × 28.2 / 28.2 = 1.000
    {
      name: "blank 0.05 mL subtracted",
      input: { titreMl: 10.05, blankMl: 0.05, concentrationMolL: 0.1, sampleMassG: 28.2 },
      expected: 1.0,
      digits: 9,
    },
    {
      name: "zero titre → 0 %",
      input: { titreMl: 0, concentrationMolL: 0.1, sampleMassG: 28.2 },
      expected: 0,
      digits: 12,
    },
  ];
  it.each(vectors)("$name", ({ input, basis, mode, expected, digits }) => {
    const r = requireOk(
      calculateFfaPercent(input, { ...(basis ? { basis } : {}), ...(mode ? { factorMode: mode } : {}) }),
    );
    expect(r.ffaPct).toBeCloseTo(expected, digits);
  });

  it("is monotone non-decreasing in the titre", () => {
    fc.assert(
      fc.property(
        fc.double({ min: 0, max: 50, noNaN: true }),
        fc.double({ min: 0, max: 50, noNaN: true }),
        fc.double({ min: 0.01, max: 2, noNaN: true }),
        fc.double({ min: 50, max: 100, noNaN: true }),
        fc.constantFrom(...FFA_BASES),
        (a, b, c, m, basis) => {
          const [lo, hi] = a <= b ? [a, b] : [b, a];
          const f = (titreMl: number) =>
            requireOk(calculateFfaPercent({ titreMl, concentrationMolL: c, sampleMassG: m }, { basis })).ffaPct;
          expect(f(lo)).toBeLessThanOrEqual(f(hi));
          if (hi - lo > 1e-6) expect(f(lo)).toBeLessThan(f(hi));
        },
      ),
      RUNS,
    );
  });
});

describe("calculateAcidValue (EN 14104 / ISO 660 form)", () => {
  it("A 4.45, B 0.05, c 0.1000, m 5.000 → 4.9368 mg KOH/g", () => {
    // AOCS Ca 5a-40, computed: (4.40 × 0.1 × 56.1)/5 = 4.9368
    const r = requireOk(calculateAcidValue({ titreMl: 4.45, blankMl: 0.05, concentrationMolL: 0.1, sampleMassG: 5 }));
    expect(r.acidValueMgKohG).toBeCloseTo(4.9368, 9);
    expect(r.netTitreMl).toBeCloseTo(4.4, 12);
  });

  it("uses the exact M(KOH) when asked", () => {
    // 4.40 × 0.1 × 56.1053 / 5 = 4.93727 (IUPAC 2021 M(KOH))
    const r = requireOk(
      calculateAcidValue(
        { titreMl: 4.45, blankMl: 0.05, concentrationMolL: 0.1, sampleMassG: 5 },
        { kohConstant: 56.1053 },
      ),
    );
    expect(r.acidValueMgKohG).toBeCloseTo(4.93727, 5);
  });
});

describe("AV ↔ FFA", () => {
  const cases: Array<{ name: string; run: () => Result<number>; expected: number; tolerance: number }> = [
    // AOCS Ca 5a-40, computed (computed with exact molar masses): FFA 1.00 % oleic → AV 1.986; AV 1.00 → FFA 0.503
    { name: "FFA 1 % oleic → AV 1.986 (molar mass)", run: () => acidValueFromFfa(1), expected: 1.986, tolerance: 5e-4 },
    { name: "AV 1 → FFA 0.503 % oleic (molar mass)", run: () => ffaFromAcidValue(1), expected: 0.503, tolerance: 5e-4 },
    {
      name: "AV 4.9368 → FFA 2.485 % oleic (molar mass)",
      run: () => ffaFromAcidValue(4.9368),
      expected: 2.485,
      tolerance: 5e-4,
    },
    // acid value definition, computed (computed): palmitic 2.188, lauric 2.801 AV per % FFA
    {
      name: "FFA 1 % palmitic → AV 2.188",
      run: () => acidValueFromFfa(1, { basis: "PALMITIC" }),
      expected: 2.188,
      tolerance: 5e-4,
    },
    {
      name: "FFA 1 % lauric → AV 2.801",
      run: () => acidValueFromFfa(1, { basis: "LAURIC" }),
      expected: 2.801,
      tolerance: 5e-4,
    },
    // AOCS Ca 5a-40 Calculations note: AV = 1.99 × % FFA (oleic); inverse by hand 1/1.99 = 0.502513, 4.9368/1.99 = 2.480804
    {
      name: "FFA 1 % → AV 1.99 (Ca 5a-40 note)",
      run: () => acidValueFromFfa(1, { conversion: "ca5a40-note" }),
      expected: 1.99,
      tolerance: 1e-12,
    },
    {
      name: "AV 1 → FFA 0.502513 (Ca 5a-40 note)",
      run: () => ffaFromAcidValue(1, { conversion: "ca5a40-note" }),
      expected: 0.502513,
      tolerance: 1e-6,
    },
    {
      name: "AV 4.9368 → FFA 2.480804 (Ca 5a-40 note)",
      run: () => ffaFromAcidValue(4.9368, { conversion: "ca5a40-note" }),
      expected: 2.480804,
      tolerance: 1e-6,
    },
  ];
  it.each(cases)("$name", ({ run, expected, tolerance }) => {
    const value = requireOk(run());
    expect(Math.abs(value - expected)).toBeLessThanOrEqual(tolerance);
  });

  it("the two oleic conversions differ by the 0.19 % rounding of the note", () => {
    // 1.99 / 1.98625 = 1.00189 (acid value definition, computed)
    const exact = requireOk(acidValueFromFfa(1));
    expect(CA5A40_AV_PER_FFA_OLEIC.value / exact).toBeCloseTo(1.00189, 4);
  });

  it("the Ca 5a-40 note is oleic only", () => {
    expect(issuePairs(acidValueFromFfa(1, { basis: "PALMITIC", conversion: "ca5a40-note" }))).toEqual([
      ["TITRATION.CONVERSION_UNAVAILABLE", "basis"],
    ]);
  });

  it.each([
    { run: () => acidValueFromFfa(-1), pair: ["TITRATION.FFA_OUT_OF_RANGE", "ffaPct"] },
    { run: () => acidValueFromFfa(Number.NaN), pair: ["TITRATION.FFA_OUT_OF_RANGE", "ffaPct"] },
    { run: () => ffaFromAcidValue(-0.1), pair: ["TITRATION.ACID_VALUE_OUT_OF_RANGE", "acidValueMgKohG"] },
  ])("rejects bad conversion input: $pair", ({ run, pair }) => {
    expect(issuePairs(run())).toEqual([pair]);
  });

  it("round-trips in both conversions", () => {
    fc.assert(
      fc.property(
        fc.double({ min: 0, max: 100, noNaN: true }),
        fc.constantFrom("molar-mass" as const, "ca5a40-note" as const),
        (ffa, conversion) => {
          const av = requireOk(acidValueFromFfa(ffa, { conversion }));
          const back = requireOk(ffaFromAcidValue(av, { conversion }));
          expect(Math.abs(back - ffa)).toBeLessThanOrEqual(1e-12 * Math.max(1, ffa));
        },
      ),
      RUNS,
    );
  });

  it("FFA from a titration and from its acid value agree within the 56.1 vs M(KOH) rounding", () => {
    // Same titration both ways: FFA(M/10 factor) vs ffaFromAcidValue(AV with 56.1) differ only by 56.1/56.1053
    const input = { titreMl: 4.4, concentrationMolL: 0.1, sampleMassG: 5 };
    const ffa = requireOk(calculateFfaPercent(input, { factorMode: "molar-mass" })).ffaPct;
    const viaAv = requireOk(ffaFromAcidValue(requireOk(calculateAcidValue(input)).acidValueMgKohG));
    expect(Math.abs(viaAv / ffa - 56.1 / 56.1053)).toBeLessThan(1e-12);
  });
});

describe("bad titration inputs return issues naming the field", () => {
  const ok: TitrationInput = { titreMl: 10, blankMl: 0, concentrationMolL: 0.1, sampleMassG: 28.2 };
  const cases: Array<{ name: string; input: TitrationInput; code: string; field: string }> = [
    { name: "negative titre", input: { ...ok, titreMl: -0.1 }, code: "TITRATION.NEGATIVE_TITRE", field: "titreMl" },
    { name: "negative blank", input: { ...ok, blankMl: -0.1 }, code: "TITRATION.NEGATIVE_BLANK", field: "blankMl" },
    {
      name: "blank > titre",
      input: { ...ok, titreMl: 0.2, blankMl: 0.3 },
      code: "TITRATION.BLANK_EXCEEDS_TITRE",
      field: "blankMl",
    },
    {
      name: "sample mass 0",
      input: { ...ok, sampleMassG: 0 },
      code: "TITRATION.SAMPLE_MASS_NOT_POSITIVE",
      field: "sampleMassG",
    },
    {
      name: "sample mass negative",
      input: { ...ok, sampleMassG: -5 },
      code: "TITRATION.SAMPLE_MASS_NOT_POSITIVE",
      field: "sampleMassG",
    },
    {
      name: "concentration 0",
      input: { ...ok, concentrationMolL: 0 },
      code: "TITRATION.CONCENTRATION_OUT_OF_RANGE",
      field: "concentrationMolL",
    },
    {
      name: "concentration negative",
      input: { ...ok, concentrationMolL: -0.1 },
      code: "TITRATION.CONCENTRATION_OUT_OF_RANGE",
      field: "concentrationMolL",
    },
    {
      name: "concentration 2.5 mol/L",
      input: { ...ok, concentrationMolL: 2.5 },
      code: "TITRATION.CONCENTRATION_OUT_OF_RANGE",
      field: "concentrationMolL",
    },
    { name: "titre NaN", input: { ...ok, titreMl: Number.NaN }, code: "TITRATION.NOT_A_NUMBER", field: "titreMl" },
    {
      name: "mass Infinity",
      input: { ...ok, sampleMassG: Number.POSITIVE_INFINITY },
      code: "TITRATION.NOT_A_NUMBER",
      field: "sampleMassG",
    },
  ];
  it.each(cases)("FFA: $name → $code on $field", ({ input, code, field }) => {
    expect(issuePairs(calculateFfaPercent(input))).toContainEqual([code, field]);
  });
  it.each(cases)("AV: $name → $code on $field", ({ input, code, field }) => {
    expect(issuePairs(calculateAcidValue(input))).toContainEqual([code, field]);
  });

  it("FFA over 100 % is an issue on ffaPct", () => {
    // 50 mL × 1.0 N × 28.2 / 7.05 g = 200 %
    expect(issuePairs(calculateFfaPercent({ titreMl: 50, concentrationMolL: 1, sampleMassG: 7.05 }))).toEqual([
      ["TITRATION.FFA_OVER_100", "ffaPct"],
    ]);
  });

  it("2 mol/L is still accepted; the limit is configurable", () => {
    expect(DEFAULT_TITRATION_LIMITS.maxConcentrationMolL).toBe(2);
    expect(calculateFfaPercent({ ...ok, concentrationMolL: 2, sampleMassG: 56.4 }).ok).toBe(true);
    const wider = { ...DEFAULT_TITRATION_LIMITS, maxConcentrationMolL: 3, source: "test" };
    expect(calculateFfaPercent({ ...ok, concentrationMolL: 2.5, sampleMassG: 56.4 }, { limits: wider }).ok).toBe(true);
  });

  it("collects every issue, not just the first", () => {
    const fields = issuePairs(calculateFfaPercent({ titreMl: -1, concentrationMolL: 0, sampleMassG: 0 })).map(
      ([, f]) => f,
    );
    expect(fields.sort()).toEqual(["concentrationMolL", "sampleMassG", "titreMl"]);
  });
});

describe("summariseReplicates", () => {
  it("duplicate-free triplicate 2.48 / 2.50 / 2.52", () => {
    // hand: mean 2.50; spread 0.04; s = sqrt((0.02² + 0 + 0.02²)/2) = 0.02
    const s = requireOk(summariseReplicates([2.48, 2.5, 2.52]));
    expect(s.n).toBe(3);
    expect(s.mean).toBeCloseTo(2.5, 12);
    expect(s.spread).toBeCloseTo(0.04, 12);
    expect(s.sampleStdDev).toBeCloseTo(0.02, 12);
    expect(s.exceedsRepeatability).toBe(false);
  });

  it("flags 10.0 / 10.8: spread 0.8 over max(0.1, 5 % × 10.4 = 0.52)", () => {
    const s = requireOk(summariseReplicates([10.0, 10.8]));
    expect(s.allowedSpread).toBeCloseTo(0.52, 12);
    expect(s.sampleStdDev).toBeCloseTo(0.8 / Math.SQRT2, 12);
    expect(s.exceedsRepeatability).toBe(true);
  });

  it("uses the absolute floor at low FFA, and a custom limit when given", () => {
    expect(requireOk(summariseReplicates([0.5, 0.58])).exceedsRepeatability).toBe(false);
    const strict = { ...DEFAULT_FFA_REPEATABILITY, absolute: 0.05, relativeOfMean: 0, source: "test" };
    expect(requireOk(summariseReplicates([0.5, 0.58], strict)).exceedsRepeatability).toBe(true);
  });

  it("marks the default limit as common practice", () => {
    expect(DEFAULT_FFA_REPEATABILITY.status).toBe("common practice");
  });

  it("a single value has no standard deviation", () => {
    expect(requireOk(summariseReplicates([3]))).toMatchObject({
      n: 1,
      mean: 3,
      spread: 0,
      sampleStdDev: null,
      exceedsRepeatability: false,
    });
  });

  it("keeps identical replicates exact", () => {
    // naive (0.1 + 0.1 + 0.1)/3 = 0.10000000000000002 would leave [min, max]
    expect(requireOk(summariseReplicates([0.1, 0.1, 0.1])).mean).toBe(0.1);
  });

  it.each([
    { values: [], pair: ["TITRATION.NO_REPLICATES", "replicates"] },
    { values: [1, Number.NaN], pair: ["TITRATION.NOT_A_NUMBER", "replicates.1"] },
  ])("rejects $values", ({ values, pair }) => {
    expect(issuePairs(summariseReplicates(values))).toEqual([pair]);
  });

  it("mean lies between min and max; spread and s are non-negative", () => {
    fc.assert(
      fc.property(
        fc.array(fc.double({ min: -1e6, max: 1e6, noNaN: true }), { minLength: 1, maxLength: 12 }),
        (values) => {
          const s = requireOk(summariseReplicates(values));
          expect(s.mean).toBeGreaterThanOrEqual(Math.min(...values));
          expect(s.mean).toBeLessThanOrEqual(Math.max(...values));
          expect(s.spread).toBeGreaterThanOrEqual(0);
          if (s.sampleStdDev !== null) expect(s.sampleStdDev).toBeGreaterThanOrEqual(0);
        },
      ),
      RUNS,
    );
  });
});

describe("suggestSampleSize (AOCS Ca 5a-40 Table 1)", () => {
  // AOCS Ca 5a-40 Table 1 rows and their "FFA % per mL" check column (computed N × 28.2 / m)
  const rows: Array<{ ffa: number; mass: number; alcohol: number; n: number[]; perMl: number[] }> = [
    { ffa: 0.1, mass: 56.4, alcohol: 50, n: [0.1], perMl: [0.05] },
    { ffa: 0.5, mass: 28.2, alcohol: 50, n: [0.1], perMl: [0.1] },
    { ffa: 5, mass: 7.05, alcohol: 75, n: [0.25], perMl: [1.0] },
    { ffa: 40, mass: 7.05, alcohol: 100, n: [0.25, 1.0], perMl: [1.0, 4.0] },
    { ffa: 75, mass: 3.525, alcohol: 100, n: [1.0], perMl: [8.0] },
    // boundaries go to the lower row
    { ffa: 0, mass: 56.4, alcohol: 50, n: [0.1], perMl: [0.05] },
    { ffa: 0.2, mass: 56.4, alcohol: 50, n: [0.1], perMl: [0.05] },
    { ffa: 1.0, mass: 28.2, alcohol: 50, n: [0.1], perMl: [0.1] },
    { ffa: 30, mass: 7.05, alcohol: 75, n: [0.25], perMl: [1.0] },
    { ffa: 100, mass: 3.525, alcohol: 100, n: [1.0], perMl: [8.0] },
  ];
  it.each(rows)("expected $ffa % → $mass g, $alcohol mL alcohol, N $n", ({ ffa, mass, alcohol, n, perMl }) => {
    const s = requireOk(suggestSampleSize(ffa));
    expect(s.row.sampleMassG).toBe(mass);
    expect(s.row.alcoholMl).toBe(alcohol);
    expect(s.row.concentrationsMolL).toEqual(n);
    s.ffaPctPerMl.forEach((v, i) => expect(v).toBeCloseTo(perMl[i] ?? Number.NaN, 9));
  });

  it("carries its source and status on every row", () => {
    for (const row of CA5A40_SAMPLE_SIZE_TABLE) {
      expect(row.source).toMatch(/Ca 5a-40 Table 1/);
      expect(["sourced", "from memory", "common practice"]).toContain(row.status);
    }
  });

  it.each([-0.1, 100.1, Number.NaN])("expected FFA %p → issue on expectedFfaPct", (ffa) => {
    expect(issuePairs(suggestSampleSize(ffa))).toEqual([["TITRATION.EXPECTED_FFA_OUT_OF_RANGE", "expectedFfaPct"]]);
  });
});
