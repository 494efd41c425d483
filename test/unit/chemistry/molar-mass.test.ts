import { describe, it, expect } from "vitest";
import { MF } from "mf-parser";
import {
  ATOMIC_WEIGHTS,
  COMPOUND_FORMULAS,
  MOLAR_MASS,
  formatFattyAcidFormula,
  molarMass,
  parseFattyAcidShorthand,
  parseFormula,
} from "@/lib/chemistry/molar-mass";
import type { CompoundName } from "@/lib/chemistry/molar-mass";

// IUPAC 2021 atomic weights — IUPAC/CIAAW Standard Atomic Weights 2021 (conventional values for H, C, O, S).
const IUPAC_2021 = { H: 1.008, C: 12.011, O: 15.999, Na: 22.98976928, K: 39.0983, S: 32.06 };

// IUPAC 2021 atomic weights, computed, column "M g/mol (IUPAC conventional)", printed to 3 decimals → ±0.0005 plus float noise.
const PRINTED_TOLERANCE = 0.0006;
const D2_TABLE: Array<[CompoundName, string, number]> = [
  ["triolein", "C57H104O6", 885.453],
  ["tripalmitin", "C51H98O6", 807.339],
  ["trilinolein", "C57H98O6", 879.405],
  ["methylOleate", "C19H36O2", 296.495],
  ["methylPalmitate", "C17H34O2", 270.457],
  ["methylStearate", "C19H38O2", 298.511],
  ["methylLinoleate", "C19H34O2", 294.479],
  ["methylLinolenate", "C19H32O2", 292.463],
  ["oleicAcid", "C18H34O2", 282.468],
  ["palmiticAcid", "C16H32O2", 256.43],
  ["lauricAcid", "C12H24O2", 200.322],
  ["linoleicAcid", "C18H32O2", 280.452],
  ["stearicAcid", "C18H36O2", 284.484],
  ["methanol", "CH4O", 32.042],
  ["glycerol", "C3H8O3", 92.094],
  ["sodiumHydroxide", "NaOH", 39.997],
  ["potassiumHydroxide", "KOH", 56.105],
  ["sulfuricAcid", "H2SO4", 98.072],
  ["water", "H2O", 18.015],
  ["sodiumMethoxide", "CH3NaO", 54.024],
  ["potassiumMethoxide", "CH3KO", 70.132],
  ["sodiumOleate", "C18H33NaO2", 304.45],
  ["potassiumOleate", "C18H33KO2", 320.558],
];

describe("atomic weights", () => {
  it("are the IUPAC 2021 conventional/standard values", () => {
    // IUPAC 2021 atomic weights (IUPAC 2021 atomic weights)
    expect(ATOMIC_WEIGHTS).toEqual(IUPAC_2021);
  });
});

describe("molarMass against IUPAC 2021 atomic weights, computed", () => {
  it.each(D2_TABLE)("%s (%s) = %f g/mol", (name, formula, expected) => {
    // IUPAC 2021 atomic weights, computed, IUPAC 2021 column
    expect(COMPOUND_FORMULAS[name]).toBe(formula);
    const m = molarMass(formula);
    expect(m.ok).toBe(true);
    if (!m.ok) return;
    expect(Math.abs(m.value - expected)).toBeLessThanOrEqual(PRINTED_TOLERANCE);
    expect(Math.abs(MOLAR_MASS[name] - expected)).toBeLessThanOrEqual(PRINTED_TOLERANCE);
  });

  it("gives the 5-decimal hydroxide values", () => {
    // IUPAC 2021 atomic weights, computed: NaOH 39.99677, KOH 56.1053 (IUPAC 2021)
    expect(Math.abs(MOLAR_MASS.sodiumHydroxide - 39.99677)).toBeLessThan(5e-6);
    expect(Math.abs(MOLAR_MASS.potassiumHydroxide - 56.1053)).toBeLessThan(5e-5);
  });

  it("matches hand arithmetic for triolein", () => {
    // IUPAC 2021 atomic weights: 57·12.011 + 104·1.008 + 6·15.999
    expect(MOLAR_MASS.triolein).toBeCloseTo(57 * 12.011 + 104 * 1.008 + 6 * 15.999, 9);
  });
});

describe("cross-check with mf-parser (cheminfo element masses)", () => {
  // mf-parser's own documentation: mf-parser uses abundance-weighted masses, not IUPAC conventional values
  // (triolein 885.434 vs 885.453); relative tolerance must be ≥ 5e-5. H2SO4 differs by 6.4e-5 (S 32.0648 vs 32.06).
  const REL_TOL = 1e-4;
  it.each(D2_TABLE)("%s", (_name, formula) => {
    const ours = molarMass(formula);
    const info = new MF(formula).getInfo();
    const theirs = "mass" in info ? info.mass : NaN;
    expect(ours.ok).toBe(true);
    if (!ours.ok) return;
    expect(Math.abs(ours.value - theirs) / theirs).toBeLessThanOrEqual(REL_TOL);
  });

  it.each(D2_TABLE)("atom counts of %s agree with mf-parser", (_name, formula) => {
    const ours = parseFormula(formula);
    const info = new MF(formula).getInfo();
    const atoms = "atoms" in info ? info.atoms : {};
    expect(ours.ok).toBe(true);
    if (!ours.ok) return;
    expect(ours.value).toEqual(atoms);
  });
});

describe("parseFormula", () => {
  it.each([
    ["CH3OH", { C: 1, H: 4, O: 1 }],
    ["CH3NaO", { C: 1, H: 3, Na: 1, O: 1 }],
    ["  H2SO4 ", { H: 2, S: 1, O: 4 }],
    ["C57H104O6", { C: 57, H: 104, O: 6 }],
  ])("%s", (formula, counts) => {
    expect(parseFormula(formula)).toEqual({ ok: true, value: counts });
  });

  it.each([
    ["", "CHEMISTRY.EMPTY_FORMULA"],
    ["c18h34o2", "CHEMISTRY.FORMULA_SYNTAX"],
    ["C0H2", "CHEMISTRY.FORMULA_SYNTAX"],
    ["C18H34O2)", "CHEMISTRY.FORMULA_SYNTAX"],
    ["Ca(OH)2", "CHEMISTRY.FORMULA_SYNTAX"],
    ["XeF2", "CHEMISTRY.UNKNOWN_ELEMENT"],
  ])("rejects %j with %s", (formula, code) => {
    const r = parseFormula(formula);
    expect(r.ok).toBe(false);
    if (r.ok) return;
    expect(r.issues[0]?.code).toBe(code);
    expect(r.issues[0]?.field).toBe("formula");
  });
});

describe("fatty-acid shorthand", () => {
  it.each([
    ["C18:1", "oleicAcid"],
    ["18:2", "linoleicAcid"],
    ["C16:0", "palmiticAcid"],
    ["C12:0", "lauricAcid"],
    ["C18:0", "stearicAcid"],
  ] as const)("%s has the formula of %s", (shorthand, compound) => {
    const parsed = parseFattyAcidShorthand(shorthand);
    expect(parsed.ok).toBe(true);
    if (!parsed.ok) return;
    expect(formatFattyAcidFormula(parsed.value.carbons, parsed.value.doubleBonds)).toBe(COMPOUND_FORMULAS[compound]);
  });

  it.each(["C18", "C18:x", "C2:0", "C4:3"])("rejects %s", (shorthand) => {
    const r = parseFattyAcidShorthand(shorthand);
    expect(r.ok).toBe(false);
  });
});
