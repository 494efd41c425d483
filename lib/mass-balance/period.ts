// Balance periods as half-open instants [startMs, endMs), bounded at local midnight of a site.
// The caller resolves the site's time zone to a UTC offset (minutes east of UTC, e.g. +60 for CET,
// -300 for EST); nothing here reads a clock or a time-zone database.
import { fail, invariant, ok } from "@/lib/core/result";
import type { Result } from "@/lib/core/result";

export interface Period {
  startMs: number;
  endMs: number;
  label: string;
}

/**
 * One offset for both bounds, or one per bound where daylight-saving time changes inside the period
 * (a January–March quarter in Central Europe starts at +60 and ends at +120).
 */
export type UtcOffset = number | { atStartMin: number; atEndMin: number };

export const MIN_UTC_OFFSET_MIN = -12 * 60;
export const MAX_UTC_OFFSET_MIN = 14 * 60;

const MS_PER_MIN = 60_000;
const ISO_DATE = /^(\d{4})-(\d{2})-(\d{2})$/;

function offsets(offset: UtcOffset): { start: number; end: number } {
  const o =
    typeof offset === "number" ? { start: offset, end: offset } : { start: offset.atStartMin, end: offset.atEndMin };
  for (const v of [o.start, o.end]) {
    invariant(
      Number.isInteger(v) && v >= MIN_UTC_OFFSET_MIN && v <= MAX_UTC_OFFSET_MIN,
      `UTC offset out of range: ${v} min`,
    );
  }
  return o;
}

/** The instant of local midnight starting a calendar day; months past 12 roll into later years. */
function localMidnightMs(year: number, month1: number, day: number, offsetMin: number): number {
  return Date.UTC(year, month1 - 1, day) - offsetMin * MS_PER_MIN;
}

function pad2(n: number): string {
  return String(n).padStart(2, "0");
}

function formatDate(year: number, month1: number, day: number): string {
  const d = new Date(Date.UTC(year, month1 - 1, day));
  return `${String(d.getUTCFullYear()).padStart(4, "0")}-${pad2(d.getUTCMonth() + 1)}-${pad2(d.getUTCDate())}`;
}

/** Calendar month `month` (1–12) of `year`. */
export function getMonthPeriod(year: number, month: number, offset: UtcOffset): Period {
  invariant(
    Number.isInteger(year) && Number.isInteger(month) && month >= 1 && month <= 12,
    `bad month ${year}-${month}`,
  );
  const o = offsets(offset);
  return {
    startMs: localMidnightMs(year, month, 1, o.start),
    endMs: localMidnightMs(year, month + 1, 1, o.end),
    label: `${year}-${pad2(month)}`,
  };
}

/** Calendar quarter `quarter` (1–4) of `year`: Q1 = January–March. */
export function getQuarterPeriod(year: number, quarter: number, offset: UtcOffset): Period {
  invariant(
    Number.isInteger(year) && Number.isInteger(quarter) && quarter >= 1 && quarter <= 4,
    `bad quarter ${year}-Q${quarter}`,
  );
  const o = offsets(offset);
  const firstMonth = (quarter - 1) * 3 + 1;
  return {
    startMs: localMidnightMs(year, firstMonth, 1, o.start),
    endMs: localMidnightMs(year, firstMonth + 3, 1, o.end),
    label: `${year}-Q${quarter}`,
  };
}

interface CalendarDate {
  year: number;
  month: number;
  day: number;
}

/** Parses "YYYY-MM-DD", refusing dates that do not exist (2026-02-30). */
export function parseIsoDate(text: string): CalendarDate | null {
  const m = ISO_DATE.exec(text);
  if (m === null) return null;
  const year = Number(m[1]);
  const month = Number(m[2]);
  const day = Number(m[3]);
  const d = new Date(Date.UTC(year, month - 1, day));
  if (d.getUTCFullYear() !== year || d.getUTCMonth() !== month - 1 || d.getUTCDate() !== day) return null;
  return { year, month, day };
}

/** Custom range from local date `startDate` (inclusive) to local date `endDate` (exclusive), both "YYYY-MM-DD". */
export function getCustomPeriod(startDate: string, endDate: string, offset: UtcOffset): Result<Period> {
  const s = parseIsoDate(startDate);
  if (s === null)
    return fail("PERIOD.INVALID_DATE", `Start date "${startDate}" is not a calendar date (YYYY-MM-DD)`, "startDate");
  const e = parseIsoDate(endDate);
  if (e === null)
    return fail("PERIOD.INVALID_DATE", `End date "${endDate}" is not a calendar date (YYYY-MM-DD)`, "endDate");
  const o = offsets(offset);
  const startMs = localMidnightMs(s.year, s.month, s.day, o.start);
  const endMs = localMidnightMs(e.year, e.month, e.day, o.end);
  if (endMs <= startMs)
    return fail("PERIOD.END_NOT_AFTER_START", `End date ${endDate} must be after start date ${startDate}`, "endDate");
  return ok({ startMs, endMs, label: `${startDate}..${endDate}` });
}

/** Local calendar date and time of day of an instant at a fixed UTC offset. */
export function getLocalDate(atMs: number, offsetMin: number): CalendarDate {
  const d = new Date(atMs + offsets(offsetMin).start * MS_PER_MIN);
  return { year: d.getUTCFullYear(), month: d.getUTCMonth() + 1, day: d.getUTCDate() };
}

export function formatLocalDate(atMs: number, offsetMin: number): string {
  const { year, month, day } = getLocalDate(atMs, offsetMin);
  return formatDate(year, month, day);
}

/**
 * The balance period of `lengthMonths` months that contains `atMs`, where periods start on the first
 * day of `anchorMonth` (1 = January: calendar quarters for 3, calendar years for 12) and repeat.
 */
export function getPeriodContaining(
  atMs: number,
  lengthMonths: number,
  anchorMonth: number,
  offsetMin: number,
): Period {
  invariant(
    Number.isInteger(lengthMonths) && lengthMonths >= 1 && lengthMonths <= 120,
    `bad period length ${lengthMonths}`,
  );
  invariant(Number.isInteger(anchorMonth) && anchorMonth >= 1 && anchorMonth <= 12, `bad anchor month ${anchorMonth}`);
  invariant(Number.isSafeInteger(atMs), `bad instant ${atMs}`);
  const local = getLocalDate(atMs, offsetMin);
  const monthIndex = local.year * 12 + (local.month - 1);
  const anchorIndex = anchorMonth - 1;
  const k = Math.floor((monthIndex - anchorIndex) / lengthMonths);
  const startIndex = anchorIndex + k * lengthMonths;
  const startYear = Math.floor(startIndex / 12);
  const startMonth = (startIndex % 12) + 1;
  const startMs = localMidnightMs(startYear, startMonth, 1, offsetMin);
  const endMs = localMidnightMs(startYear, startMonth + lengthMonths, 1, offsetMin);
  const label =
    lengthMonths === 3 && anchorMonth === 1
      ? `${startYear}-Q${(startMonth - 1) / 3 + 1}`
      : lengthMonths === 12 && anchorMonth === 1
        ? `${startYear}`
        : lengthMonths === 1
          ? `${startYear}-${pad2(startMonth)}`
          : `${formatDate(startYear, startMonth, 1)}..${formatDate(startYear, startMonth + lengthMonths, 1)}`;
  return { startMs, endMs, label };
}

/** Longest period a balance is computed for: three years (our own choice; statements are monthly to yearly). */
export const MAX_BALANCE_SPAN_DAYS = 1_096;
const DAY_MS = 86_400_000;

/**
 * A balance is a statement of what happened: the period may not start after today, a chosen end may
 * not lie beyond today (the exclusive end at most tomorrow), and it spans at most MAX_BALANCE_SPAN_DAYS.
 * Returns the message and the field it concerns, or null.
 */
export function refuseUnreasonablePeriod(
  period: Period,
  kind: "MONTH" | "QUARTER" | "CUSTOM",
  nowMs: number,
): { message: string; field: string } | null {
  if (period.startMs > nowMs)
    return {
      message: "The period starts after today; a balance covers what has happened",
      field: kind === "CUSTOM" ? "start" : kind === "MONTH" ? "month" : "quarter",
    };
  if (kind === "CUSTOM" && period.endMs > nowMs + DAY_MS)
    return { message: "End date is after today; choose today or an earlier day", field: "end" };
  if (period.endMs - period.startMs > MAX_BALANCE_SPAN_DAYS * DAY_MS)
    return {
      message: `A balance period spans at most ${MAX_BALANCE_SPAN_DAYS.toLocaleString("en")} days (three years)`,
      field: "end",
    };
  return null;
}
