// Today's collection route: which sources are due, from each source's usual pickup interval and its last pickup.
// Calendar days are compared in the site's time zone; the caller passes "today" and each last pickup's local date.

export interface RouteSource {
  code: string;
  name: string;
  active: boolean;
  /** Usual days between pickups; null = collected on call, never on the route. */
  pickupEveryDays: number | null;
  /** Local calendar date (YYYY-MM-DD) of the last pickup, or null when never collected. */
  lastPickupDay: string | null;
}

export interface RouteStop {
  code: string;
  name: string;
  /** Local date the next pickup falls due; null for a source never collected (due at once). */
  dueDay: string | null;
  /** Days past the due date (0 = due today). */
  daysOverdue: number;
}

const DAY_PATTERN = /^(\d{4})-(\d{2})-(\d{2})$/;

/** Days since 1970-01-01 for a calendar date; the calendar has no time zone of its own. */
export function dayNumber(day: string): number {
  const m = DAY_PATTERN.exec(day);
  if (!m) throw new Error(`Not a calendar date: ${day}`);
  return Math.round(Date.UTC(Number(m[1]), Number(m[2]) - 1, Number(m[3])) / 86_400_000);
}

export function dayFromNumber(n: number): string {
  return new Date(n * 86_400_000).toISOString().slice(0, 10);
}

/**
 * A source is due when its last pickup plus its interval is today or earlier; a source with an interval
 * that was never collected is due today. Most overdue first, then by code.
 */
export function routeDue(sources: readonly RouteSource[], today: string): RouteStop[] {
  const t = dayNumber(today);
  const stops: RouteStop[] = [];
  for (const s of sources) {
    if (!s.active || s.pickupEveryDays === null || s.pickupEveryDays <= 0) continue;
    if (s.lastPickupDay === null) {
      stops.push({ code: s.code, name: s.name, dueDay: null, daysOverdue: 0 });
      continue;
    }
    const due = dayNumber(s.lastPickupDay) + s.pickupEveryDays;
    if (due <= t) stops.push({ code: s.code, name: s.name, dueDay: dayFromNumber(due), daysOverdue: t - due });
  }
  return stops.sort((a, b) => b.daysOverdue - a.daysOverdue || a.code.localeCompare(b.code));
}
