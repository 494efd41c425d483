import { z } from "zod";
import { MAX_UTC_OFFSET_MIN, MIN_UTC_OFFSET_MIN, parseIsoDate } from "@/lib/mass-balance/period";

export const MIN_PERIOD_YEAR = 2000;
export const MAX_PERIOD_YEAR = 2100;
export const MIN_TOLERANCE_PCT = 0;
export const MAX_TOLERANCE_PCT = 100;

const year = z
  .number({ error: "Year must be a number" })
  .int("Year must be a whole number")
  .min(MIN_PERIOD_YEAR, `Year must be ${MIN_PERIOD_YEAR} or later`)
  .max(MAX_PERIOD_YEAR, `Year must be ${MAX_PERIOD_YEAR} or earlier`);

const utcOffsetMin = (what: string) =>
  z
    .number({ error: `${what} (minutes east of UTC) must be a number` })
    .int(`${what} must be whole minutes`)
    .min(MIN_UTC_OFFSET_MIN, `${what} must be at least ${MIN_UTC_OFFSET_MIN} minutes (UTC−12:00)`)
    .max(MAX_UTC_OFFSET_MIN, `${what} must be at most ${MAX_UTC_OFFSET_MIN} minutes (UTC+14:00)`);

const isoDate = (what: string) =>
  z
    .string({ error: `${what} is required (YYYY-MM-DD)` })
    .refine((s) => parseIsoDate(s) !== null, `${what} must be a calendar date written YYYY-MM-DD`);

const offsets = {
  utcOffsetMin: utcOffsetMin("UTC offset at the period start"),
  /** Only where daylight-saving time changes inside the period; defaults to the start offset. */
  utcOffsetAtEndMin: utcOffsetMin("UTC offset at the period end").optional(),
};

export const PeriodRangeSchema = z.discriminatedUnion(
  "kind",
  [
    z.object({
      kind: z.literal("MONTH"),
      year,
      month: z
        .number({ error: "Month must be a number" })
        .int("Month must be a whole number")
        .min(1, "Month must be 1–12")
        .max(12, "Month must be 1–12"),
      ...offsets,
    }),
    z.object({
      kind: z.literal("QUARTER"),
      year,
      quarter: z
        .number({ error: "Quarter must be a number" })
        .int("Quarter must be a whole number")
        .min(1, "Quarter must be 1–4")
        .max(4, "Quarter must be 1–4"),
      ...offsets,
    }),
    z
      .object({
        kind: z.literal("CUSTOM"),
        startDate: isoDate("Start date"),
        /** Exclusive: the first day no longer in the period. */
        endDate: isoDate("End date"),
        ...offsets,
      })
      .refine((v) => v.endDate > v.startDate, { error: "End date must be after the start date", path: ["endDate"] }),
  ],
  { error: "Choose a month, a quarter or your own dates for the period" },
);
export type PeriodRange = z.infer<typeof PeriodRangeSchema>;

const tolerancePct = (what: string) =>
  z
    .number({ error: `${what} (% of inputs) must be a number` })
    .min(MIN_TOLERANCE_PCT, `${what} must be at least ${MIN_TOLERANCE_PCT} %`)
    .max(MAX_TOLERANCE_PCT, `${what} must be at most ${MAX_TOLERANCE_PCT} %`);

export const ClosureToleranceSchema = z
  .object({
    warnPct: tolerancePct("Warn level"),
    failPct: tolerancePct("Fail level"),
    source: z.string().trim().min(1, "Source of the tolerance is required").max(200, "Source: at most 200 characters"),
    note: z.string().trim().max(500, "Note: at most 500 characters").default(""),
  })
  .refine((t) => t.warnPct <= t.failPct, { error: "Warn level must not be above the fail level", path: ["warnPct"] });
export type ClosureToleranceInput = z.input<typeof ClosureToleranceSchema>;
