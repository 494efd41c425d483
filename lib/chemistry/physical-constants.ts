import { defineSourced } from "@/lib/chemistry/sourced-value";

// Kept here (not in lib/quantity) so the recipe does not depend on the general density module.

/** d(20/4) = 0.7915 → ρ = 0.7915 × 0.999975 g/mL ≈ 0.79148 g/mL; the 0.003 % difference is below the datum's precision. */
export const METHANOL_DENSITY_20C = defineSourced(
  0.7915,
  "g/mL",
  "Merck Index, methanol: d(20/4) 0.7915",
  "verified",
  "relative density to water at 4 °C, used as g/mL",
);

export const METHANOL_BOILING_POINT = defineSourced(
  64.7,
  "°C",
  "Merck Index / Engineering Toolbox: methanol b.p. 64.7 °C at 1 atm",
  "verified",
  "lower at altitude; a site above sea level should override it",
);

/** The constant 56.1 the standards use for M(KOH); exact IUPAC 2021 value is 56.1053 g/mol (0.009 % apart). */
export const KOH_EQUIVALENT_MASS_IN_STANDARDS = defineSourced(
  56.1,
  "mg KOH/mmol",
  "EN 14104 cl. 10 (AV = 56.1 × V × c / m); the SV → mean molar mass relation is quoted with the same 56.1",
  "verified",
);
