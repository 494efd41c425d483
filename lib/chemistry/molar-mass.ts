import { fail, failMany, invariant, ok } from "@/lib/core/result";
import type { DomainIssue, Result } from "@/lib/core/result";

export const ATOMIC_WEIGHTS_SOURCE =
  "IUPAC/CIAAW Standard Atomic Weights 2021, conventional values (H, C, O, S) and standard values (Na, K)";

/** g/mol. H, C, O and S have interval standard weights; these are the conventional single values. */
export const ATOMIC_WEIGHTS = {
  H: 1.008,
  C: 12.011,
  O: 15.999,
  Na: 22.98976928,
  K: 39.0983,
  S: 32.06,
} as const;

export type ElementSymbol = keyof typeof ATOMIC_WEIGHTS;
export type ElementCounts = Partial<Record<ElementSymbol, number>>;

function isElementSymbol(symbol: string): symbol is ElementSymbol {
  return Object.prototype.hasOwnProperty.call(ATOMIC_WEIGHTS, symbol);
}

const TOKEN = /([A-Z][a-z]?)([1-9][0-9]*)?/y;

/**
 * Parses a plain molecular formula ("C57H104O6", "CH3NaO", "H2SO4"): element symbols with optional
 * counts, no groups, charges or hydrates. Repeated symbols add up (CH3OH = C1 H4 O1).
 */
export function parseFormula(formula: string): Result<ElementCounts> {
  const text = formula.trim();
  if (text.length === 0) return fail("CHEMISTRY.EMPTY_FORMULA", "The formula is empty.", "formula");
  const counts: ElementCounts = {};
  const unknown: DomainIssue[] = [];
  TOKEN.lastIndex = 0;
  while (TOKEN.lastIndex < text.length) {
    const at = TOKEN.lastIndex;
    const match = TOKEN.exec(text);
    if (match === null) {
      return fail(
        "CHEMISTRY.FORMULA_SYNTAX",
        `Formula "${text}" cannot be read at position ${at + 1} ("${text.slice(at)}"); use element symbols with counts, e.g. C18H34O2.`,
        "formula",
      );
    }
    const symbol = match[1] ?? "";
    const count = match[2] === undefined ? 1 : Number(match[2]);
    if (!isElementSymbol(symbol)) {
      unknown.push({
        code: "CHEMISTRY.UNKNOWN_ELEMENT",
        message: `Element "${symbol}" in "${text}" has no atomic weight here (supported: ${Object.keys(ATOMIC_WEIGHTS).join(", ")}).`,
        field: "formula",
      });
      continue;
    }
    counts[symbol] = (counts[symbol] ?? 0) + count;
  }
  if (unknown.length > 0) return failMany(unknown);
  return ok(counts);
}

export function computeMolarMassOfCounts(counts: ElementCounts): number {
  let sum = 0;
  for (const [symbol, count] of Object.entries(counts)) {
    invariant(isElementSymbol(symbol), `unknown element ${symbol}`);
    sum += ATOMIC_WEIGHTS[symbol] * (count ?? 0);
  }
  return sum;
}

/** Molar mass in g/mol from IUPAC 2021 atomic weights. */
export function molarMass(formula: string): Result<number> {
  const parsed = parseFormula(formula);
  if (!parsed.ok) return parsed;
  return ok(computeMolarMassOfCounts(parsed.value));
}

/** For formulas written in code; a bad formula here is a programming error. */
export function requireMolarMass(formula: string): number {
  const result = molarMass(formula);
  invariant(result.ok, `bad formula ${formula}: ${result.ok ? "" : result.issues.map((i) => i.message).join("; ")}`);
  return result.value;
}

export const COMPOUND_FORMULAS = {
  triolein: "C57H104O6",
  tripalmitin: "C51H98O6",
  trilinolein: "C57H98O6",
  methylOleate: "C19H36O2",
  methylPalmitate: "C17H34O2",
  methylStearate: "C19H38O2",
  methylLinoleate: "C19H34O2",
  methylLinolenate: "C19H32O2",
  oleicAcid: "C18H34O2",
  palmiticAcid: "C16H32O2",
  lauricAcid: "C12H24O2",
  linoleicAcid: "C18H32O2",
  stearicAcid: "C18H36O2",
  methanol: "CH4O",
  glycerol: "C3H8O3",
  sodiumHydroxide: "NaOH",
  potassiumHydroxide: "KOH",
  sodiumMethoxide: "CH3NaO",
  potassiumMethoxide: "CH3KO",
  sulfuricAcid: "H2SO4",
  water: "H2O",
  sodiumOleate: "C18H33NaO2",
  potassiumOleate: "C18H33KO2",
} as const;

export type CompoundName = keyof typeof COMPOUND_FORMULAS;

function computeCompoundMolarMasses(): Readonly<Record<CompoundName, number>> {
  const out = {} as Record<CompoundName, number>;
  for (const name of Object.keys(COMPOUND_FORMULAS) as CompoundName[]) {
    out[name] = requireMolarMass(COMPOUND_FORMULAS[name]);
  }
  return Object.freeze(out);
}

/** g/mol, IUPAC 2021 atomic weights. */
export const MOLAR_MASS: Readonly<Record<CompoundName, number>> = computeCompoundMolarMasses();

/** Saturated or unsaturated straight-chain fatty acid CX:Y → C_X H_(2X−2Y) O2. */
export function formatFattyAcidFormula(carbons: number, doubleBonds: number): string {
  invariant(Number.isInteger(carbons) && carbons >= 2, `carbons must be an integer ≥ 2, got ${carbons}`);
  invariant(
    Number.isInteger(doubleBonds) && doubleBonds >= 0 && 2 * carbons - 2 * doubleBonds >= 2,
    `bad double-bond count ${doubleBonds} for C${carbons}`,
  );
  return `C${carbons}H${2 * carbons - 2 * doubleBonds}O2`;
}

const SHORTHAND = /^C?(\d{1,2}):(\d)$/;

/** Lipid shorthand "C18:1" or "18:1" → { carbons: 18, doubleBonds: 1 }. */
export function parseFattyAcidShorthand(shorthand: string): Result<{ carbons: number; doubleBonds: number }> {
  const match = SHORTHAND.exec(shorthand.trim());
  const carbons = match ? Number(match[1]) : NaN;
  const doubleBonds = match ? Number(match[2]) : NaN;
  // Non-cumulated C=C bonds fit between carbons 2..n, so at most ⌊(n − 2)/2⌋ of them.
  if (!match || carbons < 4 || carbons > 30 || doubleBonds > Math.floor((carbons - 2) / 2)) {
    return fail(
      "CHEMISTRY.FATTY_ACID_SHORTHAND",
      `"${shorthand}" is not a fatty-acid shorthand like C18:1 (4–30 carbons, then the number of double bonds).`,
      "acid",
    );
  }
  return ok({ carbons, doubleBonds });
}
