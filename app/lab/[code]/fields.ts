/** Form field names shared by the lab forms and their server actions. */
export const TITRATION_FIELDS = ["sampleMassG", "titrant", "concentrationMolL", "titreMl", "blankMl", "basis"] as const;
export const LAB_TEST_FIELDS = ["kind", "method", "valuePct"] as const;
