import "server-only";
import { getUtcOffsetMin } from "@/lib/period/site-time";

/**
 * A datetime-local value ("2026-10-15T12:00") is the site's wall-clock time; it becomes an ISO instant
 * at the site's UTC offset on that day. A value with its own zone is passed on as written.
 */
export function toSiteInstant(local: string, timeZone: string): string | undefined {
  if (local === "") return undefined;
  const m = /^(\d{4})-(\d{2})-(\d{2})T(\d{2}):(\d{2})$/.exec(local);
  if (m === null) return local;
  const naive = Date.UTC(Number(m[1]), Number(m[2]) - 1, Number(m[3]), Number(m[4]), Number(m[5]));
  return new Date(naive - getUtcOffsetMin(timeZone, new Date(naive)) * 60_000).toISOString();
}
