import "server-only";
import { getUtcOffsetMin } from "@/lib/period/site-time";

/** An instant as the site's wall-clock time for a datetime-local field ("2026-10-15T12:00"). */
export function siteLocalInput(at: Date, timeZone: string): string {
  return new Date(at.getTime() + getUtcOffsetMin(timeZone, at) * 60_000).toISOString().slice(0, 16);
}
