import { describe, expect, it } from "vitest";
import { dayNumber, routeDue } from "@/lib/collect/route";
import type { RouteSource } from "@/lib/collect/route";

const src = (code: string, every: number | null, last: string | null, active = true): RouteSource => ({
  code,
  name: `Source ${code}`,
  active,
  pickupEveryDays: every,
  lastPickupDay: last,
});

describe("today's route from the usual pickup interval (common practice: due = last pickup + interval)", () => {
  it("counts calendar days across month and leap-year ends", () => {
    // Gregorian calendar: 2028 is a leap year, so 2028-02-28 → 2028-03-01 is 2 days.
    expect(dayNumber("2028-03-01") - dayNumber("2028-02-28")).toBe(2);
    expect(dayNumber("2027-03-01") - dayNumber("2027-02-28")).toBe(1);
    expect(dayNumber("1970-01-01")).toBe(0);
    expect(() => dayNumber("2026-12-2")).toThrow();
  });

  it.each([
    ["due today", src("R1", 7, "2026-11-25"), { due: true, dueDay: "2026-12-02", overdue: 0 }],
    ["overdue by 3 days", src("R2", 7, "2026-11-22"), { due: true, dueDay: "2026-11-29", overdue: 3 }],
    ["not yet due (tomorrow)", src("R3", 7, "2026-11-26"), { due: false }],
    ["collected today, weekly", src("R4", 7, "2026-12-02"), { due: false }],
    ["daily source collected yesterday", src("R5", 1, "2026-12-01"), { due: true, dueDay: "2026-12-02", overdue: 0 }],
    ["never collected, has an interval", src("R6", 14, null), { due: true, dueDay: null, overdue: 0 }],
    ["on call (no interval)", src("R7", null, "2026-01-01"), { due: false }],
    ["inactive", src("R8", 7, "2026-10-01", false), { due: false }],
  ] as const)("%s", (_name, source, expected) => {
    const stops = routeDue([source], "2026-12-02");
    if (!expected.due) return expect(stops).toEqual([]);
    expect(stops).toEqual([
      { code: source.code, name: source.name, dueDay: expected.dueDay, daysOverdue: expected.overdue },
    ]);
  });

  it("puts the most overdue first, then by code", () => {
    const stops = routeDue(
      [src("B", 7, "2026-11-25"), src("A", 7, "2026-11-25"), src("C", 7, "2026-11-01")],
      "2026-12-02",
    );
    expect(stops.map((s) => s.code)).toEqual(["C", "A", "B"]);
  });
});
