// Pattern breaks: a sudden change of level or interval, pickups outside opening hours, a phone far away.
import { DISTANCE_BANDS, DISTANCE_BAND_WORDS } from "@/lib/core/vocabulary";
import type { DistanceBand } from "@/lib/core/vocabulary";
import { median } from "@/lib/screening/robust";
import { oneDecimal, wholeNumber } from "@/lib/screening/screening";
import type { Flag, PickupFact } from "@/lib/screening/screening";

const DAY_MS = 86_400_000;

/**
 * The first point where the median of the next `window` values differs from the median of the
 * 3 × window values before it by more than `ratio` (either way). Returns its index and both medians.
 */
export function findShift(
  values: readonly number[],
  window: number,
  ratio: number,
  minChange = 0,
): { index: number; before: number; after: number } | null {
  for (let i = 3 * window; i + window <= values.length; i++) {
    const before = median(values.slice(i - 3 * window, i));
    const after = median(values.slice(i, i + window));
    if (before <= 0 || after <= 0) continue;
    const r = after / before;
    if ((r > ratio || r < 1 / ratio) && Math.abs(after - before) >= minChange) return { index: i, before, after };
  }
  return null;
}

export function flagLevelShift(pickups: readonly PickupFact[], window: number, ratio: number): Flag[] {
  const shift = findShift(
    pickups.map((p) => p.litres),
    window,
    ratio,
  );
  if (shift === null) return [];
  const first = pickups[shift.index] as PickupFact;
  const involved = pickups.slice(shift.index, shift.index + window);
  return [
    {
      signal: "LEVEL_SHIFT",
      subjectKey: first.code,
      message: `From pickup ${first.code} the median pickup is ${wholeNumber(shift.after)} L against ${wholeNumber(shift.before)} L over the ${3 * window} pickups before: ${oneDecimal(shift.after / shift.before)}× (flagged beyond ${oneDecimal(ratio)}× either way).`,
      measured: shift.after / shift.before,
      threshold: ratio,
      pickupCodes: involved.map((p) => p.code),
      lotCodes: [...new Set(involved.flatMap((p) => (p.lotCode === null ? [] : [p.lotCode])))],
    },
  ];
}

/** A sudden change of interval, by ratio and by at least minDays: a daily route slipping a day over a weekend is normal. */
export function flagIntervalShift(
  pickups: readonly PickupFact[],
  window: number,
  ratio: number,
  minDays: number,
): Flag[] {
  const gaps = pickups.slice(1).map((p, i) => (p.at - (pickups[i] as PickupFact).at) / DAY_MS);
  const shift = findShift(gaps, window, ratio, minDays);
  if (shift === null) return [];
  const first = pickups[shift.index + 1] as PickupFact;
  const involved = pickups.slice(shift.index + 1, shift.index + 1 + window);
  return [
    {
      signal: "INTERVAL_SHIFT",
      subjectKey: first.code,
      message: `From pickup ${first.code} pickups come every ${oneDecimal(shift.after)} days (median) against every ${oneDecimal(shift.before)} days over the ${3 * window} intervals before: ${oneDecimal(shift.after / shift.before)}× (flagged beyond ${oneDecimal(ratio)}× either way and ${oneDecimal(minDays)} days apart).`,
      measured: shift.after / shift.before,
      threshold: ratio,
      pickupCodes: involved.map((p) => p.code),
      lotCodes: [],
    },
  ];
}

/** Whether a local hour is within opening hours widened by a margin; hours may run past midnight. */
export function withinHours(hour: number, opens: number, closes: number, margin: number): boolean {
  const o = opens - margin;
  const c = closes + margin;
  if (c - o >= 24) return true;
  const h = ((hour % 24) + 24) % 24;
  const from = ((o % 24) + 24) % 24;
  const to = ((c % 24) + 24) % 24;
  return from < to ? h >= from && h < to : h >= from || h < to;
}

function clock(hour: number): string {
  const h = Math.floor(hour);
  const m = Math.floor((hour - h) * 60);
  return `${String(h).padStart(2, "0")}:${String(m).padStart(2, "0")}`;
}

export function flagOffHours(
  pickups: readonly PickupFact[],
  opens: number | null,
  closes: number | null,
  margin: number,
): Flag[] {
  if (opens === null || closes === null) return [];
  return pickups
    .filter((p) => !withinHours(p.localHour, opens, closes, margin))
    .map((p) => ({
      signal: "OFF_HOURS",
      subjectKey: p.code,
      message: `Pickup ${p.code} was logged at ${clock(p.localHour)}, outside the declared opening hours ${clock(opens)}–${clock(closes)} (with ${oneDecimal(margin)} h either side).`,
      measured: p.localHour,
      threshold: margin,
      pickupCodes: [p.code],
      lotCodes: p.lotCode === null ? [] : [p.lotCode],
    }));
}

/** The band a distance in metres falls in. */
export function distanceBandOf(metres: number): DistanceBand {
  if (metres <= 250) return "NEAR";
  if (metres <= 1000) return "KM_1";
  if (metres <= 10_000) return "KM_10";
  return "FAR";
}

/** Pickups whose phone was at or beyond the flag band (default: more than 1 km away). */
export function flagPhoneFar(pickups: readonly PickupFact[], fromBand: DistanceBand = "KM_10"): Flag[] {
  const limit = DISTANCE_BANDS.indexOf(fromBand);
  return pickups
    .filter((p) => p.distanceBand !== null && DISTANCE_BANDS.indexOf(p.distanceBand as DistanceBand) >= limit)
    .map((p) => ({
      signal: "PHONE_FAR",
      subjectKey: p.code,
      message: `When pickup ${p.code} was logged the collector's phone was ${DISTANCE_BAND_WORDS[p.distanceBand as DistanceBand]} from the source's address.`,
      measured: DISTANCE_BANDS.indexOf(p.distanceBand as DistanceBand),
      threshold: limit,
      pickupCodes: [p.code],
      lotCodes: p.lotCode === null ? [] : [p.lotCode],
    }));
}
