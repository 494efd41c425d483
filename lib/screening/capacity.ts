// What a source can plausibly give in a month, from what it declared.

/** Mean weeks in a month of the Gregorian calendar: 365.2425 / 12 / 7. */
export const WEEKS_PER_MONTH = 365.2425 / 12 / 7;

export const CAPACITY_BASES = ["FRYERS", "MONTHLY"] as const;
export type CapacityBasis = (typeof CAPACITY_BASES)[number];

export interface DeclaredCapacity {
  basis: CapacityBasis;
  fryers: number | null;
  fryerLitres: number | null;
  changesPerWeek: number | null;
  declaredLitresPerMonth: number | null;
}

/** Litres a month: fryers × litres per fryer × oil changes a week × weeks a month, or the declared monthly volume. */
export function plausibleLitresPerMonth(c: DeclaredCapacity | null): number | null {
  if (c === null) return null;
  if (c.basis === "MONTHLY") return c.declaredLitresPerMonth;
  if (c.fryers === null || c.fryerLitres === null || c.changesPerWeek === null) return null;
  return c.fryers * c.fryerLitres * c.changesPerWeek * WEEKS_PER_MONTH;
}
