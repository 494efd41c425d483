// Every default that can change a plan carries where it came from, so an editor can show it and a
// site can override it with its own reference (SOP, supplier CoA, newer edition).

/** verified = read in the named source; computed = derived from verified constants; the other two are weaker. */
export type SourceStatus = "verified" | "computed" | "from memory" | "common practice";

export interface SourcedValue {
  value: number;
  unit: string;
  /** Source id and edition, e.g. "Ma, Clements & Hanna 1998, Trans. ASAE 41(5):1261". */
  source: string;
  status: SourceStatus;
  note?: string;
}

export function defineSourced(
  value: number,
  unit: string,
  source: string,
  status: SourceStatus,
  note?: string,
): SourcedValue {
  return note === undefined ? { value, unit, source, status } : { value, unit, source, status, note };
}
