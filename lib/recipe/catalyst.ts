import { MOLAR_MASS } from "@/lib/chemistry/molar-mass";
import type { CompoundName } from "@/lib/chemistry/molar-mass";
import { defineSourced } from "@/lib/chemistry/sourced-value";
import type { SourcedValue } from "@/lib/chemistry/sourced-value";
import type { FfaBasis } from "@/lib/titration/titration";

export const CATALYST_TYPES = ["NAOH", "KOH", "NAOME_SOLUTION", "KOME_SOLUTION"] as const;
export type CatalystType = (typeof CATALYST_TYPES)[number];

export interface CatalystProfile {
  type: CatalystType;
  compound: CompoundName;
  /** SOLID: purity of flakes/pellets; METHANOL_SOLUTION: strength of the methoxide solution, rest methanol. */
  form: "SOLID" | "METHANOL_SOLUTION";
  soap: CompoundName;
  /** RCOOH + MOH → RCOOM + H2O; RCOOH + MOCH3 → RCOOM + CH3OH. */
  neutralisationByproduct: "WATER" | "METHANOL";
  defaultBaseDosePctOfOil: SourcedValue;
  /** Purity (solids) or solution strength (methoxides), mass %. Replace with the supplier CoA value. */
  defaultAssayPct: SourcedValue;
}

const NAOME_BASE_DOSE_PCT = 0.5;

export const CATALYSTS: Readonly<Record<CatalystType, CatalystProfile>> = {
  NAOH: {
    type: "NAOH",
    compound: "sodiumHydroxide",
    form: "SOLID",
    soap: "sodiumOleate",
    neutralisationByproduct: "WATER",
    defaultBaseDosePctOfOil: defineSourced(
      0.5,
      "% of oil mass",
      "review excerpt: 6:1 MeOH, 0.5 % NaOH, 60 °C example; typical range 0.3–1.0 % (Ma, Clements & Hanna 1998 tallow optimum 0.3 %)",
      "verified",
      "range 0.3–1.0 % is common practice",
    ),
    defaultAssayPct: defineSourced(98, "% NaOH", "NaOH pellets ≈ 97–99 %", "common practice", "use the CoA assay"),
  },
  KOH: {
    type: "KOH",
    compound: "potassiumHydroxide",
    form: "SOLID",
    soap: "potassiumOleate",
    neutralisationByproduct: "WATER",
    defaultBaseDosePctOfOil: defineSourced(
      1.0,
      "% of oil mass",
      "Alarcón et al. 2017, Chem. Eng. Trans. 57 (6:1, 65 °C, 1 % KOH); typical range 1.0–1.5 %",
      "verified",
      "range 1.0–1.5 % is common practice",
    ),
    defaultAssayPct: defineSourced(
      90,
      "% KOH",
      "KOH flake ≈ 85–90 % KOH (rest water, K2CO3)",
      "common practice",
      "use the CoA assay",
    ),
  },
  NAOME_SOLUTION: {
    type: "NAOME_SOLUTION",
    compound: "sodiumMethoxide",
    form: "METHANOL_SOLUTION",
    soap: "sodiumOleate",
    neutralisationByproduct: "METHANOL",
    defaultBaseDosePctOfOil: defineSourced(
      NAOME_BASE_DOSE_PCT,
      "% of oil mass (as NaOMe)",
      "Ma, Clements & Hanna 1998, Trans. ASAE 41(5):1261 (NaOMe maximum activity at 0.5 % w/w of tallow)",
      "verified",
    ),
    defaultAssayPct: defineSourced(
      30,
      "% NaOMe in methanol",
      "sold as 25–30 wt % NaOMe in methanol",
      "common practice",
      "use the CoA strength",
    ),
  },
  KOME_SOLUTION: {
    type: "KOME_SOLUTION",
    compound: "potassiumMethoxide",
    form: "METHANOL_SOLUTION",
    soap: "potassiumOleate",
    neutralisationByproduct: "METHANOL",
    defaultBaseDosePctOfOil: defineSourced(
      (NAOME_BASE_DOSE_PCT * MOLAR_MASS.potassiumMethoxide) / MOLAR_MASS.sodiumMethoxide,
      "% of oil mass (as KOMe)",
      "molar equivalent of 0.5 % NaOMe (Ma, Clements & Hanna 1998) × M(KOMe)/M(NaOMe)",
      "computed",
      "no sourced KOMe dose; ≈ 0.65 %",
    ),
    defaultAssayPct: defineSourced(
      32,
      "% KOMe in methanol",
      "KOMe solutions commonly sold at about 32 %",
      "from memory",
      "use the CoA strength",
    ),
  },
};

/** The fatty acid each FFA basis names (AOCS Ca 5a-40: oleic, palmitic, lauric). */
export const FFA_BASIS_ACID: Readonly<Record<FfaBasis, CompoundName>> = {
  OLEIC: "oleicAcid",
  PALMITIC: "palmiticAcid",
  LAURIC: "lauricAcid",
};

/** mol of free fatty acid in ffaKg of FFA expressed as the basis acid. */
export function computeFfaMol(ffaKg: number, basis: FfaBasis = "OLEIC"): number {
  return (ffaKg * 1000) / MOLAR_MASS[FFA_BASIS_ACID[basis]];
}

/** kg of pure catalyst compound that neutralises ffaKg of free fatty acids expressed as the basis acid (1 mol per mol). */
export function computeNeutralisationKg(ffaKg: number, type: CatalystType, basis: FfaBasis = "OLEIC"): number {
  return (computeFfaMol(ffaKg, basis) * MOLAR_MASS[CATALYSTS[type].compound]) / 1000;
}
