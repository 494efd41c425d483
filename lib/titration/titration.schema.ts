import { z } from "zod";
import { DEFAULT_TITRATION_LIMITS, FFA_BASES, TITRANTS } from "@/lib/titration/titration";

/** Typo guard above the Ca 5a-40 Table 1 strengths (0.1–1.0 N); see DEFAULT_TITRATION_LIMITS.source. */
export const MAX_CONCENTRATION_MOL_L = DEFAULT_TITRATION_LIMITS.maxConcentrationMolL;
export const MAX_FFA_PCT = DEFAULT_TITRATION_LIMITS.maxFfaPct;
export const MIN_TITRE_ML = 0;
export const MIN_BLANK_ML = 0;
export const DEFAULT_BLANK_ML = 0;

/** One titration as entered in the lab grid or form. */
export const TitrationEntrySchema = z
  .object({
    sampleMassG: z
      .number({ error: "sample mass must be a number (g)" })
      .gt(0, { error: "sample mass must be greater than 0 g" }),
    titrant: z.enum(TITRANTS, { error: "titrant must be NAOH or KOH" }),
    concentrationMolL: z
      .number({ error: "titrant concentration must be a number (mol/L)" })
      .gt(0, { error: "titrant concentration must be greater than 0 mol/L" })
      .lte(MAX_CONCENTRATION_MOL_L, {
        error: `titrant concentration must be at most ${MAX_CONCENTRATION_MOL_L} mol/L`,
      }),
    titreMl: z
      .number({ error: "titre must be a number (mL)" })
      .gte(MIN_TITRE_ML, { error: "titre must not be negative (mL)" }),
    blankMl: z
      .number({ error: "blank must be a number (mL)" })
      .gte(MIN_BLANK_ML, { error: "blank must not be negative (mL)" })
      .default(DEFAULT_BLANK_ML),
    basis: z.enum(FFA_BASES, { error: "basis must be OLEIC, PALMITIC or LAURIC" }).default("OLEIC"),
  })
  .refine((entry) => entry.blankMl <= entry.titreMl, {
    error: "blank (mL) must not exceed the titre (mL)",
    path: ["blankMl"],
  });

export type TitrationEntryInput = z.input<typeof TitrationEntrySchema>;
export type TitrationEntry = z.output<typeof TitrationEntrySchema>;
