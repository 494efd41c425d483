import { fail, failMany, ok } from "@/lib/core/result";
import type { DomainIssue, Result } from "@/lib/core/result";
import {
  MOLAR_MASS,
  formatFattyAcidFormula,
  parseFattyAcidShorthand,
  requireMolarMass,
} from "@/lib/chemistry/molar-mass";
import { KOH_EQUIVALENT_MASS_IN_STANDARDS } from "@/lib/chemistry/physical-constants";
import type { SourceStatus } from "@/lib/chemistry/sourced-value";

// Triglyceride = glycerol + 3 fatty acids − 3 water; FAME = fatty acid + methanol − water.
// With IUPAC 2021 weights: M(glycerol) − 3·M(water) = 38.049 g/mol, M(MeOH) − M(water) = 14.027 g/mol.

export function computeTgMolarMassFromFa(meanFaMolarMass: number): number {
  return 3 * meanFaMolarMass + MOLAR_MASS.glycerol - 3 * MOLAR_MASS.water;
}

export function computeFameMolarMassFromFa(meanFaMolarMass: number): number {
  return meanFaMolarMass + MOLAR_MASS.methanol - MOLAR_MASS.water;
}

/** TG + 3 MeOH → 3 FAME + glycerol, so 3·M_FAME = M_TG + 3·M_MeOH − M_glycerol (closes the mass balance exactly). */
export function computeFameMolarMassFromTg(meanTgMolarMass: number): number {
  return (meanTgMolarMass + 3 * MOLAR_MASS.methanol - MOLAR_MASS.glycerol) / 3;
}

export interface SvOptions {
  /** Acid value of the same sample; FFA consume KOH in the SV test but are not triglyceride. */
  acidValueMgKohPerG?: number;
  /** Defaults to 56.1, the value the SV definition uses; pass 56.1053 for the exact IUPAC 2021 M(KOH). */
  kohMolarMass?: number;
}

/**
 * Mean triglyceride molar mass from the saponification value: 3 mol KOH saponify 1 mol TG, so
 * M_TG = 3 × 56.1 × 1000 / (SV − AV) g/mol (SV, AV in mg KOH/g). Definition of SV.
 */
export function computeMeanTgMolarMassFromSv(svMgKohPerG: number, options: SvOptions = {}): Result<number> {
  const av = options.acidValueMgKohPerG ?? 0;
  const mKoh = options.kohMolarMass ?? KOH_EQUIVALENT_MASS_IN_STANDARDS.value;
  if (!(svMgKohPerG > 0)) {
    return fail("CHEMISTRY.BAD_SAPONIFICATION_VALUE", "Saponification value must be above 0 mg KOH/g.", "svMgKohPerG");
  }
  if (!(av >= 0)) {
    return fail("CHEMISTRY.BAD_ACID_VALUE", "Acid value must be 0 mg KOH/g or more.", "acidValueMgKohPerG");
  }
  if (!(svMgKohPerG > av)) {
    return fail(
      "CHEMISTRY.SV_NOT_ABOVE_AV",
      `Saponification value (${svMgKohPerG} mg KOH/g) must exceed the acid value (${av} mg KOH/g).`,
      "svMgKohPerG",
    );
  }
  return ok((3 * mKoh * 1000) / (svMgKohPerG - av));
}

export interface FattyAcidShare {
  /** Shorthand such as "C18:1". */
  acid: string;
  /** Mass % of total fatty acids. */
  massPct: number;
}

/** Shares are normalised by their sum, so a profile summing to 98.7 % (minor acids not listed) still works. */
export function computeMeanFaMolarMass(profile: readonly FattyAcidShare[]): Result<number> {
  const issues: DomainIssue[] = [];
  let totalPct = 0;
  let molesPerGram = 0;
  profile.forEach((share, i) => {
    const parsed = parseFattyAcidShorthand(share.acid);
    if (!parsed.ok) {
      issues.push(...parsed.issues.map((issue) => ({ ...issue, field: `profile.${i}.acid` })));
      return;
    }
    if (!(share.massPct >= 0)) {
      issues.push({
        code: "CHEMISTRY.NEGATIVE_SHARE",
        message: `Fatty acid ${share.acid}: mass share must be 0 % or more.`,
        field: `profile.${i}.massPct`,
      });
      return;
    }
    const m = requireMolarMass(formatFattyAcidFormula(parsed.value.carbons, parsed.value.doubleBonds));
    totalPct += share.massPct;
    molesPerGram += share.massPct / m;
  });
  if (issues.length > 0) return failMany(issues);
  if (!(totalPct > 0)) {
    return fail("CHEMISTRY.EMPTY_PROFILE", "The fatty-acid profile has no positive mass shares.", "profile");
  }
  // M̄ = 1 / Σ(w_i / M_i) for mass fractions w_i.
  return ok(totalPct / molesPerGram);
}

export function computeMeanTgMolarMassFromProfile(profile: readonly FattyAcidShare[]): Result<number> {
  const fa = computeMeanFaMolarMass(profile);
  return fa.ok ? ok(computeTgMolarMassFromFa(fa.value)) : fa;
}

export function computeMeanFameMolarMassFromProfile(profile: readonly FattyAcidShare[]): Result<number> {
  const fa = computeMeanFaMolarMass(profile);
  return fa.ok ? ok(computeFameMolarMassFromFa(fa.value)) : fa;
}

export type FeedstockMaterial = "TRIOLEIN_MODEL" | "SOYBEAN" | "RAPESEED_LEAR" | "PALM" | "TALLOW" | "USED_COOKING_OIL";

export interface FeedstockMolarMassDefault {
  material: FeedstockMaterial;
  /** g/mol */
  meanTgMolarMass: number;
  /** g/mol */
  meanFameMolarMass: number;
  basis: string;
  source: string;
  status: SourceStatus;
}

function fromSvRange(
  material: FeedstockMaterial,
  svLow: number,
  svHigh: number,
  source: string,
  status: SourceStatus,
): FeedstockMolarMassDefault {
  const sv = (svLow + svHigh) / 2;
  const tg = (3 * KOH_EQUIVALENT_MASS_IN_STANDARDS.value * 1000) / sv;
  return {
    material,
    meanTgMolarMass: tg,
    meanFameMolarMass: computeFameMolarMassFromTg(tg),
    basis: `SV midpoint ${sv} of ${svLow}–${svHigh} mg KOH/g`,
    source,
    status,
  };
}

const trioleinTg = requireMolarMass("C57H104O6");

/**
 * Fallback values when a lot has no measured SV or profile. Ranges are wide (palm 190–209 → 805–886 g/mol),
 * so a measured SV per lot is always better.
 */
export const FEEDSTOCK_MOLAR_MASS_DEFAULTS: Readonly<Record<FeedstockMaterial, FeedstockMolarMassDefault>> = {
  TRIOLEIN_MODEL: {
    material: "TRIOLEIN_MODEL",
    meanTgMolarMass: trioleinTg,
    meanFameMolarMass: computeFameMolarMassFromTg(trioleinTg),
    basis: "triolein C57H104O6 as a model oil",
    source: "IUPAC 2021 atomic weights (computed)",
    status: "computed",
  },
  SOYBEAN: fromSvRange("SOYBEAN", 189, 195, "Codex CXS 210-1999 SV range (computed midpoint)", "computed"),
  RAPESEED_LEAR: fromSvRange("RAPESEED_LEAR", 182, 193, "Codex CXS 210-1999 SV range (computed midpoint)", "computed"),
  PALM: fromSvRange("PALM", 190, 209, "Codex CXS 210-1999 SV range (computed midpoint)", "computed"),
  TALLOW: fromSvRange(
    "TALLOW",
    190,
    202,
    "Bockisch 1998, Fats and Oils Handbook, SV range (computed midpoint)",
    "computed",
  ),
  USED_COOKING_OIL: fromSvRange("USED_COOKING_OIL", 185, 200, "typical UCO SV range", "from memory"),
};
