// The demo's source checks: declared capacities and hours for the collected sources, and a few anomalies
// of our own invention planted among normal variation, so the queue has something true to find.
import type { SourceProfileInput } from "@/lib/screening/screening.schema";
import type { Signal } from "@/lib/screening/screening";
import { WEEKS_PER_MONTH } from "@/lib/screening/capacity";

/** What the demo plants, and which check must find it. */
export const PLANTED: ReadonlyArray<{ source: string; signal: Signal; what: string }> = [
  { source: "R005", signal: "OVER_CAPACITY", what: "a restaurant whose volume triples for a calendar month" },
  { source: "R011", signal: "FRESH_OIL", what: "a lot booked as used cooking oil with the acid value of fresh oil" },
  { source: "O001", signal: "WATER_HIGH", what: "a drop-off bank lot with heavy water" },
];

export const TRIPLED_SOURCE = "R005";
export const FRESH_OIL_SOURCE = "R011";
export const WATER_SOURCE = "O001";
/** FFA of fresh refined oil, % as oleic (acid value ≈ 1.986 × 0.2 = 0.40 mg KOH/g, under the Codex 0.6 limit). */
export const FRESH_OIL_FFA = 0.2;
export const HEAVY_WATER_PCT = 7.5;

/** The calendar month (UTC) two months before the anchor's, where the tripled month is planted. */
export function tripledMonth(anchor: number): { year: number; month: number } {
  const d = new Date(anchor);
  d.setUTCDate(1);
  d.setUTCMonth(d.getUTCMonth() - 2);
  return { year: d.getUTCFullYear(), month: d.getUTCMonth() };
}

/** A declared capacity about 1.4 × what a source usually gives a month, as a kitchen would declare it. */
export function declaredProfile(
  s: { code: string; kind: string; material: string; every: number; litres: number },
  i: number,
  at: Date,
): SourceProfileInput {
  // Pickups skip Sundays and slip a day 15 % of the time; the pickup volume is 0.6–1.25 × its usual (mean 0.925).
  const usualPerMonth = (s.litres * 0.925 * ((365.2425 / 12) * (6 / 7))) / (s.every + 0.15);
  const capacity = usualPerMonth * 1.4;
  const common = {
    sourceCode: s.code,
    kind: s.kind as SourceProfileInput["kind"],
    capacityDeclaredAt: at,
    capacityDeclaredBy: "site manager, at the source visit",
    pickupEveryDays: s.every,
  };
  if (s.kind !== "RESTAURANT")
    return {
      ...common,
      capacityBasis: "MONTHLY",
      declaredLitresPerMonth: Math.round(capacity / 10) * 10,
      ...(s.kind === "DROP_OFF" ? {} : { opensHour: 5, closesHour: 22 }),
    };
  if (s.material === "TRAP_GREASE")
    return {
      ...common,
      capacityBasis: "MONTHLY",
      declaredLitresPerMonth: Math.round(capacity / 10) * 10,
      opensHour: 6,
      closesHour: 23,
    };
  const fryers = 2 + (i % 5);
  const changesPerWeek = 3 + (i % 4);
  const fryerLitres = Math.round((capacity / (fryers * changesPerWeek * WEEKS_PER_MONTH)) * 2) / 2;
  return { ...common, capacityBasis: "FRYERS", fryers, fryerLitres, changesPerWeek, opensHour: 6, closesHour: 23 };
}
