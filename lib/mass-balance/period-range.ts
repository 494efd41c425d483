// A parsed period choice turned into instants. Kept apart from period.ts because the schema uses
// period.ts (offset limits, calendar dates) and this function uses the schema's type: together they
// would import each other.
import { ok } from "@/lib/core/result";
import type { Result } from "@/lib/core/result";
import { getCustomPeriod, getMonthPeriod, getQuarterPeriod } from "@/lib/mass-balance/period";
import type { Period, UtcOffset } from "@/lib/mass-balance/period";
import type { PeriodRange } from "@/lib/mass-balance/period.schema";

/** Turns a parsed period choice (see PeriodRangeSchema) into instants. */
export function resolvePeriodRange(range: PeriodRange): Result<Period> {
  const offset: UtcOffset =
    range.utcOffsetAtEndMin === undefined
      ? range.utcOffsetMin
      : { atStartMin: range.utcOffsetMin, atEndMin: range.utcOffsetAtEndMin };
  switch (range.kind) {
    case "MONTH":
      return ok(getMonthPeriod(range.year, range.month, offset));
    case "QUARTER":
      return ok(getQuarterPeriod(range.year, range.quarter, offset));
    case "CUSTOM":
      return getCustomPeriod(range.startDate, range.endDate, offset);
  }
}
