import { describe, expect, it } from "vitest";
import {
  getCustomPeriod,
  getMonthPeriod,
  getPeriodContaining,
  getQuarterPeriod,
  MAX_BALANCE_SPAN_DAYS,
  refuseUnreasonablePeriod,
} from "@/lib/mass-balance/period";
import { resolvePeriodRange } from "@/lib/mass-balance/period-range";
import {
  ClosureToleranceSchema,
  MAX_TOLERANCE_PCT,
  MIN_TOLERANCE_PCT,
  PeriodRangeSchema,
} from "@/lib/mass-balance/period.schema";

const utc = (iso: string): number => Date.parse(iso);
const HOUR = 3_600_000;

describe("getMonthPeriod", () => {
  const cases = [
    // Gregorian calendar: 2028 is a leap year, so February has 29 days.
    {
      name: "leap February, UTC",
      year: 2028,
      month: 2,
      offset: 0,
      start: "2028-02-01T00:00:00Z",
      end: "2028-03-01T00:00:00Z",
      days: 29,
    },
    {
      name: "common February, UTC",
      year: 2027,
      month: 2,
      offset: 0,
      start: "2027-02-01T00:00:00Z",
      end: "2027-03-01T00:00:00Z",
      days: 28,
    },
    {
      name: "December rolls into next year, UTC+01:00",
      year: 2026,
      month: 12,
      offset: 60,
      start: "2026-11-30T23:00:00Z",
      end: "2026-12-31T23:00:00Z",
      days: 31,
    },
    {
      name: "January, UTC−05:00",
      year: 2026,
      month: 1,
      offset: -300,
      start: "2026-01-01T05:00:00Z",
      end: "2026-02-01T05:00:00Z",
      days: 31,
    },
  ];
  it.each(cases)("$name", ({ year, month, offset, start, end, days }) => {
    const p = getMonthPeriod(year, month, offset);
    expect(p.startMs).toBe(utc(start));
    expect(p.endMs).toBe(utc(end));
    expect((p.endMs - p.startMs) / (24 * HOUR)).toBe(days);
  });

  it("labels the month", () => {
    expect(getMonthPeriod(2026, 3, 0).label).toBe("2026-03");
  });
});

describe("getQuarterPeriod", () => {
  it("Q1 with a daylight-saving change inside: starts at +01:00, ends at +02:00", () => {
    const p = getQuarterPeriod(2026, 1, { atStartMin: 60, atEndMin: 120 });
    expect(p.startMs).toBe(utc("2025-12-31T23:00:00Z"));
    expect(p.endMs).toBe(utc("2026-03-31T22:00:00Z"));
    expect(p.label).toBe("2026-Q1");
  });

  it("Q4 ends at the next year's first midnight", () => {
    const p = getQuarterPeriod(2026, 4, 0);
    expect(p.startMs).toBe(utc("2026-10-01T00:00:00Z"));
    expect(p.endMs).toBe(utc("2027-01-01T00:00:00Z"));
  });
});

describe("getCustomPeriod", () => {
  it("runs from local midnight of the start date to local midnight of the (exclusive) end date", () => {
    const r = getCustomPeriod("2026-01-15", "2026-02-01", 120);
    expect(r).toEqual({
      ok: true,
      value: {
        startMs: utc("2026-01-14T22:00:00Z"),
        endMs: utc("2026-01-31T22:00:00Z"),
        label: "2026-01-15..2026-02-01",
      },
    });
  });

  it.each([
    {
      name: "a day that does not exist",
      start: "2026-02-30",
      end: "2026-03-01",
      code: "PERIOD.INVALID_DATE",
      field: "startDate",
    },
    { name: "a malformed end", start: "2026-02-01", end: "1/3/2026", code: "PERIOD.INVALID_DATE", field: "endDate" },
    {
      name: "end before start",
      start: "2026-03-01",
      end: "2026-02-01",
      code: "PERIOD.END_NOT_AFTER_START",
      field: "endDate",
    },
    {
      name: "an empty range",
      start: "2026-03-01",
      end: "2026-03-01",
      code: "PERIOD.END_NOT_AFTER_START",
      field: "endDate",
    },
  ])("refuses $name", ({ start, end, code, field }) => {
    const r = getCustomPeriod(start, end, 0);
    expect(r.ok).toBe(false);
    if (!r.ok) expect(r.issues[0]).toMatchObject({ code, field });
  });
});

describe("getPeriodContaining", () => {
  const cases = [
    {
      name: "quarter of a May day",
      at: "2026-05-10T12:00:00Z",
      months: 3,
      anchor: 1,
      offset: 0,
      start: "2026-04-01T00:00:00Z",
      end: "2026-07-01T00:00:00Z",
      label: "2026-Q2",
    },
    {
      name: "first instant of a quarter belongs to it",
      at: "2026-04-01T00:00:00Z",
      months: 3,
      anchor: 1,
      offset: 0,
      start: "2026-04-01T00:00:00Z",
      end: "2026-07-01T00:00:00Z",
      label: "2026-Q2",
    },
    {
      name: "last millisecond before it does not",
      at: "2026-03-31T23:59:59.999Z",
      months: 3,
      anchor: 1,
      offset: 0,
      start: "2026-01-01T00:00:00Z",
      end: "2026-04-01T00:00:00Z",
      label: "2026-Q1",
    },
    {
      name: "UTC instant on 31 March is already 1 April at +02:00",
      at: "2026-03-31T22:30:00Z",
      months: 3,
      anchor: 1,
      offset: 120,
      start: "2026-03-31T22:00:00Z",
      end: "2026-06-30T22:00:00Z",
      label: "2026-Q2",
    },
    {
      name: "calendar year",
      at: "2026-05-10T12:00:00Z",
      months: 12,
      anchor: 1,
      offset: 0,
      start: "2026-01-01T00:00:00Z",
      end: "2027-01-01T00:00:00Z",
      label: "2026",
    },
    {
      name: "year starting in July",
      at: "2026-05-10T12:00:00Z",
      months: 12,
      anchor: 7,
      offset: 0,
      start: "2025-07-01T00:00:00Z",
      end: "2026-07-01T00:00:00Z",
      label: "2025-07-01..2026-07-01",
    },
  ];
  it.each(cases)("$name", ({ at, months, anchor, offset, start, end, label }) => {
    expect(getPeriodContaining(utc(at), months, anchor, offset)).toEqual({
      startMs: utc(start),
      endMs: utc(end),
      label,
    });
  });
});

describe("PeriodRangeSchema and resolvePeriodRange", () => {
  it("resolves a parsed quarter", () => {
    const range = PeriodRangeSchema.parse({ kind: "QUARTER", year: 2026, quarter: 2, utcOffsetMin: 0 });
    expect(resolvePeriodRange(range)).toEqual({
      ok: true,
      value: { startMs: utc("2026-04-01T00:00:00Z"), endMs: utc("2026-07-01T00:00:00Z"), label: "2026-Q2" },
    });
  });

  it.each([
    {
      name: "month 13",
      input: { kind: "MONTH", year: 2026, month: 13, utcOffsetMin: 0 },
      path: "month",
      text: "Month must be 1–12",
    },
    {
      name: "offset beyond UTC+14",
      input: { kind: "MONTH", year: 2026, month: 1, utcOffsetMin: 900 },
      path: "utcOffsetMin",
      text: "UTC offset at the period start",
    },
    {
      name: "impossible date",
      input: { kind: "CUSTOM", startDate: "2026-02-29", endDate: "2026-03-01", utcOffsetMin: 0 },
      path: "startDate",
      text: "Start date",
    },
    {
      name: "reversed range",
      input: { kind: "CUSTOM", startDate: "2026-03-01", endDate: "2026-02-01", utcOffsetMin: 0 },
      path: "endDate",
      text: "End date must be after",
    },
  ])("rejects $name, naming the field", ({ input, path, text }) => {
    const r = PeriodRangeSchema.safeParse(input);
    expect(r.success).toBe(false);
    const issue = r.error?.issues[0];
    expect(issue?.path.join(".")).toBe(path);
    expect(issue?.message).toContain(text);
  });
});

describe("ClosureToleranceSchema", () => {
  it("accepts the common-practice defaults", () => {
    // warn > 0.5 %, fail > 2 % of inputs — common practice, no source
    expect(
      ClosureToleranceSchema.safeParse({ warnPct: 0.5, failPct: 2, source: "common practice, no source" }).success,
    ).toBe(true);
  });

  it.each([
    {
      name: "below 0 %",
      input: { warnPct: MIN_TOLERANCE_PCT - 0.1, failPct: 2, source: "x" },
      path: "warnPct",
      text: "Warn level must be at least 0 %",
    },
    {
      name: "above 100 %",
      input: { warnPct: 0.5, failPct: MAX_TOLERANCE_PCT + 1, source: "x" },
      path: "failPct",
      text: "Fail level must be at most 100 %",
    },
    {
      name: "warn above fail",
      input: { warnPct: 3, failPct: 2, source: "x" },
      path: "warnPct",
      text: "must not be above the fail level",
    },
    { name: "no source", input: { warnPct: 0.5, failPct: 2, source: " " }, path: "source", text: "Source" },
  ])("rejects $name", ({ input, path, text }) => {
    const r = ClosureToleranceSchema.safeParse(input);
    expect(r.success).toBe(false);
    expect(r.error?.issues[0]?.path.join(".")).toBe(path);
    expect(r.error?.issues[0]?.message).toContain(text);
  });
});

describe("a balance period is a statement of what has happened", () => {
  const now = Date.UTC(2026, 11, 5, 10); // 2026-12-05 10:00 UTC
  const span = (start: string, end: string) => ({
    startMs: Date.parse(`${start}T00:00:00Z`),
    endMs: Date.parse(`${end}T00:00:00Z`),
    label: "x",
  });
  it("refuses 1990–2040: its end lies beyond today, and it spans more than three years", () => {
    expect(refuseUnreasonablePeriod(span("1990-01-01", "2040-01-01"), "CUSTOM", now)?.field).toBe("end");
    expect(refuseUnreasonablePeriod(span("1990-01-01", "2020-01-01"), "CUSTOM", now)?.message).toBe(
      `A balance period spans at most ${MAX_BALANCE_SPAN_DAYS.toLocaleString("en")} days (three years)`,
    );
  });
  it("refuses a period that starts after today; accepts the running month and a custom range up to today", () => {
    expect(refuseUnreasonablePeriod(span("2027-01-01", "2027-02-01"), "MONTH", now)?.field).toBe("month");
    expect(refuseUnreasonablePeriod(span("2026-12-01", "2027-01-01"), "MONTH", now)).toBeNull();
    expect(refuseUnreasonablePeriod(span("2026-01-01", "2026-12-06"), "CUSTOM", now)).toBeNull();
    expect(refuseUnreasonablePeriod(span("2026-01-01", "2026-12-07"), "CUSTOM", now)?.field).toBe("end");
    expect(refuseUnreasonablePeriod(span("2023-12-05", "2026-12-05"), "CUSTOM", now)).toBeNull(); // 1,096 days
  });
});
