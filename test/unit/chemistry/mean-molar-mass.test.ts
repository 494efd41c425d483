import { describe, it, expect } from "vitest";
import {
  FEEDSTOCK_MOLAR_MASS_DEFAULTS,
  computeFameMolarMassFromFa,
  computeFameMolarMassFromTg,
  computeMeanFaMolarMass,
  computeMeanFameMolarMassFromProfile,
  computeMeanTgMolarMassFromProfile,
  computeMeanTgMolarMassFromSv,
  computeTgMolarMassFromFa,
} from "@/lib/chemistry/mean-molar-mass";
import { MOLAR_MASS } from "@/lib/chemistry/molar-mass";

function value(r: { ok: true; value: number } | { ok: false }): number {
  if (!r.ok) throw new Error("expected ok");
  return r.value;
}

describe("mean TG molar mass from saponification value", () => {
  // saponification value definition, computed check values, computed with 168 316 / SV (exact M(KOH) 56.1053), printed to 0.1 g/mol
  it.each([
    [180, 935.1],
    [185, 909.8],
    [189, 890.6],
    [190, 885.9],
    [192, 876.6],
    [195, 863.2],
    [200, 841.6],
    [209, 805.3],
  ])("SV %d → %f g/mol with exact M(KOH)", (sv, expected) => {
    expect(Math.abs(value(computeMeanTgMolarMassFromSv(sv, { kohMolarMass: 56.1053 })) - expected)).toBeLessThanOrEqual(
      0.051,
    );
  });

  it("uses 56.1 by default, as the SV definition does", () => {
    // definition of SV: M_TG = 3 × 56.1 × 1000 / SV = 168 300 / SV
    expect(value(computeMeanTgMolarMassFromSv(190))).toBeCloseTo(168300 / 190, 9);
  });

  it("subtracts the acid value", () => {
    // saponification value definition, computed (Q&A page [V]): Mwt = 56.1·1000·3/(SV − AV)
    expect(value(computeMeanTgMolarMassFromSv(195, { acidValueMgKohPerG: 4 }))).toBeCloseTo(168300 / 191, 9);
  });

  it("inverts the SV of triolein", () => {
    // saponification value definition, computed: SV of triolein = 168 316 / 885.453 = 190.09 mg KOH/g
    expect(Math.abs(value(computeMeanTgMolarMassFromSv(190.09, { kohMolarMass: 56.1053 })) - 885.453)).toBeLessThan(
      0.05,
    );
  });

  it.each([
    [0, undefined, "CHEMISTRY.BAD_SAPONIFICATION_VALUE"],
    [-5, undefined, "CHEMISTRY.BAD_SAPONIFICATION_VALUE"],
    [190, -1, "CHEMISTRY.BAD_ACID_VALUE"],
    [5, 5, "CHEMISTRY.SV_NOT_ABOVE_AV"],
  ])("SV %d, AV %s fails with %s", (sv, av, code) => {
    const r = computeMeanTgMolarMassFromSv(sv, av === undefined ? {} : { acidValueMgKohPerG: av });
    expect(r.ok).toBe(false);
    if (r.ok) return;
    expect(r.issues[0]?.code).toBe(code);
  });
});

describe("from fatty-acid profile", () => {
  it("glycerol − 3 water = 38.049 g/mol and methanol − water = 14.027 g/mol", () => {
    // saponification value definition, computed: M_TG = 3·M̄_FA + 38.049; M̄_FAME = M̄_FA + 14.027; M_TG = 3·M̄_FAME − 4.032 (computed)
    expect(computeTgMolarMassFromFa(0)).toBeCloseTo(38.049, 3);
    expect(computeFameMolarMassFromFa(0)).toBeCloseTo(14.027, 3);
    expect(3 * computeFameMolarMassFromTg(0)).toBeCloseTo(3 * 32.042 - 92.094, 3);
  });

  it.each([
    ["C18:1", 885.453, 296.495],
    ["C16:0", 807.339, 270.457],
    ["C18:2", 879.405, 294.479],
  ])("pure %s gives the single-acid TG and FAME", (acid, tg, fame) => {
    // IUPAC 2021 atomic weights, computed (triolein/methyl oleate, tripalmitin/methyl palmitate, trilinolein/methyl linoleate)
    expect(Math.abs(value(computeMeanTgMolarMassFromProfile([{ acid, massPct: 100 }])) - tg)).toBeLessThan(0.001);
    expect(Math.abs(value(computeMeanFameMolarMassFromProfile([{ acid, massPct: 100 }])) - fame)).toBeLessThan(0.001);
  });

  it("averages mass fractions harmonically and normalises the shares", () => {
    // standard: M̄ = 1/Σ(w_i/M_i); palmitic 256.430, oleic 282.468 (IUPAC 2021 atomic weights, computed)
    const expected = 1 / (0.5 / 256.43 + 0.5 / 282.468);
    expect(
      value(
        computeMeanFaMolarMass([
          { acid: "C16:0", massPct: 50 },
          { acid: "C18:1", massPct: 50 },
        ]),
      ),
    ).toBeCloseTo(expected, 2);
    expect(
      value(
        computeMeanFaMolarMass([
          { acid: "C16:0", massPct: 49 },
          { acid: "C18:1", massPct: 49 },
        ]),
      ),
    ).toBeCloseTo(expected, 2);
  });

  it("reports bad shares with their field", () => {
    const r = computeMeanFaMolarMass([
      { acid: "C16:0", massPct: 50 },
      { acid: "oleic", massPct: 50 },
    ]);
    expect(r.ok).toBe(false);
    if (r.ok) return;
    expect(r.issues[0]).toMatchObject({ code: "CHEMISTRY.FATTY_ACID_SHORTHAND", field: "profile.1.acid" });
    const empty = computeMeanFaMolarMass([]);
    expect(empty.ok ? "" : empty.issues[0]?.code).toBe("CHEMISTRY.EMPTY_PROFILE");
  });
});

describe("FAME from TG", () => {
  it("triolein → methyl oleate", () => {
    // IUPAC 2021 atomic weights, computed: triolein 885.453 → methyl oleate 296.495
    expect(computeFameMolarMassFromTg(885.453)).toBeCloseTo(296.495, 3);
  });
});

describe("stoichiometric yield, 1 kg triolein (triolein model, IUPAC 2021 atomic weights, computed)", () => {
  const molTg = 1000 / MOLAR_MASS.triolein;
  it("mol TG, methanol consumed, FAME and glycerol", () => {
    expect(molTg).toBeCloseTo(1.12937, 5);
    expect(3 * molTg * MOLAR_MASS.methanol).toBeCloseTo(108.56, 2);
    expect((3 * molTg * MOLAR_MASS.methylOleate) / 1000).toBeCloseTo(1.00455, 5);
    expect((molTg * MOLAR_MASS.glycerol) / 1000).toBeCloseTo(0.10401, 5);
  });
  it("closes the mass balance 1000 + 108.56 = 1004.55 + 104.01", () => {
    const left = 1000 + 3 * molTg * MOLAR_MASS.methanol;
    const right = 3 * molTg * MOLAR_MASS.methylOleate + molTg * MOLAR_MASS.glycerol;
    expect(left).toBeCloseTo(1108.56, 2);
    expect(Math.abs(left - right)).toBeLessThan(1e-9);
  });
});

describe("feedstock defaults", () => {
  it.each([
    ["SOYBEAN", 168300 / 192],
    ["RAPESEED_LEAR", 168300 / 187.5],
    ["PALM", 168300 / 199.5],
    ["TALLOW", 168300 / 196],
  ] as const)("%s from the SV range midpoint", (material, expected) => {
    // Codex CXS 210-1999 SV ranges (soybean 189–195, rapeseed 182–193, palm 190–209); tallow 190–202 (Bockisch 1998)
    expect(FEEDSTOCK_MOLAR_MASS_DEFAULTS[material].meanTgMolarMass).toBeCloseTo(expected, 6);
  });

  it("soybean default sits on the §c.1 SV 192 check value", () => {
    // saponification value definition, computed: SV 192 → 876.6 g/mol
    expect(Math.abs(FEEDSTOCK_MOLAR_MASS_DEFAULTS.SOYBEAN.meanTgMolarMass - 876.6)).toBeLessThan(0.1);
  });

  it("marks the used-cooking-oil default as from memory", () => {
    // Codex Stan 210: UCO SV ≈ 185–200 is (from memory, unverified)
    expect(FEEDSTOCK_MOLAR_MASS_DEFAULTS.USED_COOKING_OIL.status).toBe("from memory");
  });
});
