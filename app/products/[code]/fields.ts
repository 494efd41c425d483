/** Form field names shared by the product lot forms and their server actions. */
export const QC_FIELDS = ["property", "value", "method", "lab", "reportNo", "testedAt"] as const;
export const SPEC_FIELDS = ["specKey"] as const;
export const DECISION_FIELDS = ["decision", "reason"] as const;
