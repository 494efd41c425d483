// The balance page's query and GET /api/balance (documented in lib/api/endpoints/trace.ts, which re-exports these).
import { z } from "zod";
import { emptyAsMissing as blank, oneOf } from "@/lib/core/fields";
import {
  MAX_PERIOD_YEAR,
  MAX_TOLERANCE_PCT,
  MIN_PERIOD_YEAR,
  MIN_TOLERANCE_PCT,
} from "@/lib/mass-balance/period.schema";

export const BALANCE_PERIOD_KINDS = ["MONTH", "QUARTER", "CUSTOM"] as const;

const wholeNumber = (what: string, min: number, max: number) =>
  z.preprocess(
    blank,
    z.coerce
      .number({ error: `${what} must be a number` })
      .int(`${what} must be a whole number`)
      .min(min, `${what} must be ${min}–${max}`)
      .max(max, `${what} must be ${min}–${max}`)
      .optional(),
  );
const tolerancePct = (what: string) =>
  z.preprocess(
    blank,
    z.coerce
      .number({ error: `${what} (% of inputs) must be a number` })
      .min(MIN_TOLERANCE_PCT, `${what} must be at least ${MIN_TOLERANCE_PCT} %`)
      .max(MAX_TOLERANCE_PCT, `${what} must be at most ${MAX_TOLERANCE_PCT} %`)
      .optional(),
  );
const isoDay = (what: string) =>
  z.preprocess(
    blank,
    z
      .string()
      .regex(/^\d{4}-\d{2}-\d{2}$/, `${what} must be a date written YYYY-MM-DD`)
      .optional(),
  );

/**
 * The balance page's form and GET /api/balance. Without a period, the last full calendar month.
 * CUSTOM runs from `start` (inclusive) to `end` (exclusive), both local dates of the site.
 * Without warnPct/failPct the common-practice defaults apply (DEFAULT_CLOSURE_TOLERANCE).
 */
export const BalanceQuerySchema = z.object({
  period: z.preprocess(blank, oneOf("Period", BALANCE_PERIOD_KINDS).default("MONTH")),
  year: wholeNumber("Year", MIN_PERIOD_YEAR, MAX_PERIOD_YEAR),
  month: wholeNumber("Month", 1, 12),
  quarter: wholeNumber("Quarter", 1, 4),
  start: isoDay("Start date"),
  end: isoDay("End date (first day after the period)"),
  warnPct: tolerancePct("Warn level"),
  failPct: tolerancePct("Fail level"),
});
export type BalanceQuery = z.output<typeof BalanceQuerySchema>;
