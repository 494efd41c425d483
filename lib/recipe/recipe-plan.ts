// What a recipe plan holds, and the small helpers its steps share.

import type { DomainIssue } from "@/lib/core/result";
import type { CompoundName } from "@/lib/chemistry/molar-mass";
import type { FfaBasis } from "@/lib/titration/titration";
import type { CatalystType } from "@/lib/recipe/catalyst";

// Model: every lot is triglyceride + FFA (as its lab basis: oleic, palmitic or lauric) + water + ester already present; 100 % conversion of
// the triglyceride; FFA neutralised 1 mol catalyst per mol; unsaponifiables are counted as triglyceride.

export interface RecipeProducts {
  /** Ester from the triglyceride plus ester carried in. */
  fameKg: number;
  glycerolKg: number;
  soapKg: number;
  /** From FFA neutralisation by a hydroxide. */
  waterFormedKg: number;
  waterFromOilKg: number;
  /** Charged methanol not consumed, plus methanol formed when a methoxide neutralises FFA. */
  excessMethanolKg: number;
  /** Base-dose catalyst, not consumed by FFA; ends up in the glycerol phase and wash water. */
  catalystResidueKg: number;
  /** The non-catalyst part of a solid catalyst (water, carbonate). */
  catalystImpurityKg: number;
}

export type RecipeProductKey = keyof RecipeProducts;

export interface RecipePlan {
  oil: {
    lots: Array<{ lotRef: string; massKg: number; massG: number }>;
    massKg: number;
    /** Blend FFA expressed as ffaBasis: the lots' shared basis, or oleic when they differ. */
    ffaPct: number;
    ffaBasis: FfaBasis;
    /** The same FFA as oleic, which the warning thresholds use. */
    ffaPctAsOleic: number;
    /** Blend acid value from the FFA moles (mg KOH/g of oil). */
    acidValueMgKohG: number;
    /** Present when the mean oil molar mass came from a saponification value: M = 3 × 56.1 × 1000 / (SV − AV). */
    molarMassFromSv: { saponificationValueMgKohG: number; acidValueMgKohG: number } | null;
    waterPct: number;
    famePct: number;
    ffaKg: number;
    waterKg: number;
    fameInKg: number;
    triglycerideKg: number;
    triglycerideMol: number;
    ffaMol: number;
    meanTgMolarMass: number;
    meanFameMolarMass: number;
  };
  methanol: {
    molarRatio: number;
    /** Methanol the ratio asks for (kg), whether it comes from the drum or from a methoxide solution. */
    chargeKg: number;
    chargeL20C: number;
    fromCatalystSolutionKg: number;
    toAddKg: number;
    toAddL20C: number;
    toAddG: number;
    toAddMl20C: number;
    /** Methanol actually in the reactor: what is added plus what the solution brings (≥ chargeKg). */
    totalKg: number;
    /** Total methanol over triglyceride moles; null when there is no triglyceride. */
    effectiveMolarRatio: number | null;
    consumedKg: number;
  };
  catalyst: {
    type: CatalystType;
    compound: CompoundName;
    baseDosePctOfOil: number;
    baseKg: number;
    neutralisationKg: number;
    pureKg: number;
    /** Mass of the product as bought (flakes, pellets or solution). */
    productKg: number;
    productG: number;
    assayPct: number;
    assayKind: "PURITY" | "SOLUTION_STRENGTH";
  };
  products: RecipeProducts;
  washWater: { washes: number; waterPerWashPctOfEster: number; perWashKg: number; totalKg: number };
  reactionTempC: number;
  massBalance: {
    inputKg: number;
    outputKg: number;
    residualKg: number;
    toleranceKg: number;
    /** Integer-gram view for booking: inputs as weighed, outputs split from the same total (exact). */
    inputsG: { oil: number; methanol: number; catalyst: number };
    outputsG: Record<RecipeProductKey, number>;
  };
  warnings: DomainIssue[];
}

export const PRODUCT_KEYS: readonly RecipeProductKey[] = [
  "fameKg",
  "glycerolKg",
  "soapKg",
  "waterFormedKg",
  "waterFromOilKg",
  "excessMethanolKg",
  "catalystResidueKg",
  "catalystImpurityKg",
];

export function toGrams(kg: number): number {
  return Math.round(kg * 1000);
}

export function fmt(n: number, digits = 2): string {
  return n.toFixed(digits);
}
