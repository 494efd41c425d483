/** Form field names of the recall hold form and its server action. */
export const RECALL_HOLD_FIELDS = ["reason"] as const;
