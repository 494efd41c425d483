/** Who may see customer records: compliance records them, administrators may look. */
export const CUSTOMER_VIEWERS: ReadonlySet<string> = new Set(["COMPLIANCE", "ADMIN"]);
