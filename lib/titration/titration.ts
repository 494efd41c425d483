import { fail, failMany, ok } from "@/lib/core/result";
import type { DomainIssue, Result } from "@/lib/core/result";
import type { SourceStatus } from "@/lib/quantity/density";

/**
 * Free fatty acids and acid value by titration.
 * FFA % (AOCS Ca 5a-40, Calculations): FFA = (V − B) × N × F / m, F = M(fatty acid)/10.
 * Acid value (EN 14104 clause 10; same expression in ISO 660 and, with a blank, AOCS Cd 3d-63):
 * AV = 56.1 × (V − B) × c / m, mg KOH/g.
 */

export const FFA_BASES = ["OLEIC", "PALMITIC", "LAURIC"] as const;
export type FfaBasis = (typeof FFA_BASES)[number];
/** Stored basis text → the basis; rows written before bases were recorded are oleic (the Ca 5a-40 default). */
export function toFfaBasis(stored: string): FfaBasis {
  return (FFA_BASES as readonly string[]).includes(stored) ? (stored as FfaBasis) : "OLEIC";
}

export const TITRANTS = ["NAOH", "KOH"] as const;
export type Titrant = (typeof TITRANTS)[number];

export interface FfaFactor {
  /** Factor printed in the method. */
  methodFactor: number;
  /** M/10 from IUPAC 2021 conventional atomic weights. */
  molarMassGMol: number;
  source: string;
  status: SourceStatus;
}

const MOLAR_MASS_SOURCE = "M from IUPAC/CIAAW 2021 conventional atomic weights (C 12.011, H 1.008, O 15.999)";

export const FFA_FACTORS: Readonly<Record<FfaBasis, FfaFactor>> = {
  OLEIC: {
    methodFactor: 28.2,
    molarMassGMol: 282.468,
    status: "sourced",
    source: `AOCS Ca 5a-40 (reapproved 2009), Calculations: 28.2 for oleic; ${MOLAR_MASS_SOURCE}, C18H34O2`,
  },
  PALMITIC: {
    methodFactor: 25.6,
    molarMassGMol: 256.43,
    status: "sourced",
    source: `AOCS Ca 5a-40: 25.6 for palmitic (palm oil); ${MOLAR_MASS_SOURCE}, C16H32O2`,
  },
  LAURIC: {
    methodFactor: 20.0,
    molarMassGMol: 200.322,
    status: "sourced",
    source: `AOCS Ca 5a-40: 20.0 for lauric (coconut, palm kernel); ${MOLAR_MASS_SOURCE}, C12H24O2`,
  },
};

/** "method": the factor printed in Ca 5a-40 (28.2 …); "molar-mass": M/10 (28.2468 …), 0.17 % higher for oleic. */
export type FfaFactorMode = "method" | "molar-mass";

/** The constant the acid-value standards print; M(KOH) = 56.1053 g/mol differs by 0.009 %. */
export const ACID_VALUE_KOH_CONSTANT = {
  value: 56.1,
  source: "EN 14104 clause 10; ISO 660 and AOCS Cd 3d-63 use the same 56.1 (from memory)",
} as const;

/** IUPAC 2021 conventional weights: K 39.0983 + O 15.999 + H 1.008. */
export const KOH_MOLAR_MASS_G_MOL = 56.1053;

/** AOCS Ca 5a-40, Calculations note: acid value = % FFA (as oleic) × 1.99. */
export const CA5A40_AV_PER_FFA_OLEIC = {
  value: 1.99,
  status: "sourced" as SourceStatus,
  source: "AOCS Ca 5a-40 Calculations note (seen in the 1997/2009 text)",
};

export interface TitrationLimits {
  maxConcentrationMolL: number;
  maxFfaPct: number;
  source: string;
}

/** 2 mol/L is above every titrant strength in Ca 5a-40 Table 1 (0.1–1.0 N); a typo guard, not a method limit. */
export const DEFAULT_TITRATION_LIMITS: TitrationLimits = {
  maxConcentrationMolL: 2,
  maxFfaPct: 100,
  source:
    "concentration: plausibility bound above the Ca 5a-40 Table 1 strengths (common practice); FFA: 100 % by definition",
};

export interface TitrationInput {
  titreMl: number;
  /** Blank titre (mL); Ca 5a-40 has no blank, EN 14104/Cd 3d-63 style methods subtract one. */
  blankMl?: number;
  concentrationMolL: number;
  sampleMassG: number;
}

function finiteIssue(value: number, field: string, unit: string): DomainIssue[] {
  return Number.isFinite(value)
    ? []
    : [{ code: "TITRATION.NOT_A_NUMBER", message: `${field} must be a number (${unit})`, field }];
}

function validateTitration(input: TitrationInput, limits: TitrationLimits): DomainIssue[] {
  const blankMl = input.blankMl ?? 0;
  const issues: DomainIssue[] = [
    ...finiteIssue(input.titreMl, "titreMl", "mL"),
    ...finiteIssue(blankMl, "blankMl", "mL"),
    ...finiteIssue(input.concentrationMolL, "concentrationMolL", "mol/L"),
    ...finiteIssue(input.sampleMassG, "sampleMassG", "g"),
  ];
  if (Number.isFinite(input.titreMl) && input.titreMl < 0) {
    issues.push({ code: "TITRATION.NEGATIVE_TITRE", message: "titreMl must not be negative (mL)", field: "titreMl" });
  }
  if (Number.isFinite(blankMl) && blankMl < 0) {
    issues.push({ code: "TITRATION.NEGATIVE_BLANK", message: "blankMl must not be negative (mL)", field: "blankMl" });
  }
  if (
    Number.isFinite(blankMl) &&
    Number.isFinite(input.titreMl) &&
    blankMl >= 0 &&
    blankMl > input.titreMl &&
    input.titreMl >= 0
  ) {
    issues.push({
      code: "TITRATION.BLANK_EXCEEDS_TITRE",
      message: `blankMl (${blankMl} mL) must not exceed titreMl (${input.titreMl} mL)`,
      field: "blankMl",
    });
  }
  if (Number.isFinite(input.sampleMassG) && input.sampleMassG <= 0) {
    issues.push({
      code: "TITRATION.SAMPLE_MASS_NOT_POSITIVE",
      message: "sampleMassG must be greater than 0 g",
      field: "sampleMassG",
    });
  }
  const c = input.concentrationMolL;
  if (Number.isFinite(c) && (c <= 0 || c > limits.maxConcentrationMolL)) {
    issues.push({
      code: "TITRATION.CONCENTRATION_OUT_OF_RANGE",
      message: `concentrationMolL must be greater than 0 and at most ${limits.maxConcentrationMolL} mol/L`,
      field: "concentrationMolL",
    });
  }
  return issues;
}

export interface FfaOptions {
  basis?: FfaBasis;
  factorMode?: FfaFactorMode;
  factors?: Readonly<Record<FfaBasis, FfaFactor>>;
  limits?: TitrationLimits;
}

export interface FfaResult {
  ffaPct: number;
  netTitreMl: number;
  factor: number;
  basis: FfaBasis;
}

export function getFfaFactor(basis: FfaBasis, mode: FfaFactorMode, factors = FFA_FACTORS): number {
  const entry = factors[basis];
  return mode === "method" ? entry.methodFactor : entry.molarMassGMol / 10;
}

/** AOCS Ca 5a-40, Calculations: % FFA = (V − B) × N × F / m. */
export function calculateFfaPercent(input: TitrationInput, options: FfaOptions = {}): Result<FfaResult> {
  const limits = options.limits ?? DEFAULT_TITRATION_LIMITS;
  const basis = options.basis ?? "OLEIC";
  const issues = validateTitration(input, limits);
  if (issues.length > 0) return failMany(issues);
  const factor = getFfaFactor(basis, options.factorMode ?? "method", options.factors ?? FFA_FACTORS);
  const netTitreMl = input.titreMl - (input.blankMl ?? 0);
  const ffaPct = (netTitreMl * input.concentrationMolL * factor) / input.sampleMassG;
  if (ffaPct > limits.maxFfaPct) {
    return fail(
      "TITRATION.FFA_OVER_100",
      `FFA ${ffaPct.toFixed(2)} % is over ${limits.maxFfaPct} %: check titreMl, concentrationMolL and sampleMassG`,
      "ffaPct",
    );
  }
  return ok({ ffaPct, netTitreMl, factor, basis });
}

export interface AcidValueOptions {
  /** Defaults to the standards' 56.1. */
  kohConstant?: number;
  limits?: TitrationLimits;
}

export interface AcidValueResult {
  acidValueMgKohG: number;
  netTitreMl: number;
}

/** EN 14104 clause 10 / ISO 660: AV = 56.1 × (V − B) × c / m, mg KOH/g. */
export function calculateAcidValue(input: TitrationInput, options: AcidValueOptions = {}): Result<AcidValueResult> {
  const limits = options.limits ?? DEFAULT_TITRATION_LIMITS;
  const issues = validateTitration(input, limits);
  if (issues.length > 0) return failMany(issues);
  const netTitreMl = input.titreMl - (input.blankMl ?? 0);
  const acidValueMgKohG =
    ((options.kohConstant ?? ACID_VALUE_KOH_CONSTANT.value) * netTitreMl * input.concentrationMolL) / input.sampleMassG;
  return ok({ acidValueMgKohG, netTitreMl });
}

/**
 * "molar-mass" (default): AV = FFA × 10 × M(KOH)/M(FA), defined for every basis (oleic 1.98625).
 * "ca5a40-note": AV = 1.99 × FFA, oleic only; 0.19 % above the molar-mass ratio.
 */
export type AvFfaConversion = "molar-mass" | "ca5a40-note";

export interface AvFfaOptions {
  basis?: FfaBasis;
  conversion?: AvFfaConversion;
  factors?: Readonly<Record<FfaBasis, FfaFactor>>;
}

function avPerFfa(options: AvFfaOptions): Result<number> {
  const basis = options.basis ?? "OLEIC";
  if ((options.conversion ?? "molar-mass") === "ca5a40-note") {
    if (basis !== "OLEIC") {
      return fail(
        "TITRATION.CONVERSION_UNAVAILABLE",
        "the Ca 5a-40 ×1.99 note applies to oleic only; use the molar-mass conversion",
        "basis",
      );
    }
    return ok(CA5A40_AV_PER_FFA_OLEIC.value);
  }
  return ok((10 * KOH_MOLAR_MASS_G_MOL) / (options.factors ?? FFA_FACTORS)[basis].molarMassGMol);
}

export function acidValueFromFfa(ffaPct: number, options: AvFfaOptions = {}): Result<number> {
  if (!Number.isFinite(ffaPct) || ffaPct < 0) {
    return fail("TITRATION.FFA_OUT_OF_RANGE", "ffaPct must be a number of at least 0 %", "ffaPct");
  }
  const ratio = avPerFfa(options);
  return ratio.ok ? ok(ffaPct * ratio.value) : ratio;
}

export function ffaFromAcidValue(acidValueMgKohG: number, options: AvFfaOptions = {}): Result<number> {
  if (!Number.isFinite(acidValueMgKohG) || acidValueMgKohG < 0) {
    return fail(
      "TITRATION.ACID_VALUE_OUT_OF_RANGE",
      "acidValueMgKohG must be a number of at least 0 mg KOH/g",
      "acidValueMgKohG",
    );
  }
  const ratio = avPerFfa(options);
  return ratio.ok ? ok(acidValueMgKohG / ratio.value) : ratio;
}

/** FFA % as one basis → FFA % as another, by molar mass: the moles of acid stay the same. */
export function convertFfaBasis(ffaPct: number, from: FfaBasis, to: FfaBasis, factors = FFA_FACTORS): number {
  return from === to ? ffaPct : (ffaPct * factors[to].molarMassGMol) / factors[from].molarMassGMol;
}
