// The site's wall clock: a time zone's offset at an instant (daylight saving included), read from the
// runtime's time-zone database. Pure: the instant comes in as an argument.

/** One offset formatter per time zone: building one costs several times reading an offset with it. */
const offsetFormatters = new Map<string, Intl.DateTimeFormat>();

function offsetFormatter(timeZone: string): Intl.DateTimeFormat {
  const kept = offsetFormatters.get(timeZone);
  if (kept !== undefined) return kept;
  const fmt = new Intl.DateTimeFormat("en-US", { timeZone, timeZoneName: "longOffset" });
  offsetFormatters.set(timeZone, fmt);
  return fmt;
}

/** Minutes east of UTC of a time zone at an instant (0 for an unknown zone). */
export function getUtcOffsetMin(timeZone: string, at: Date): number {
  try {
    const name = offsetFormatter(timeZone)
      .formatToParts(at)
      .find((p) => p.type === "timeZoneName")?.value;
    const m = name ? /GMT([+-])(\d{2}):?(\d{2})?/.exec(name) : null;
    if (!m) return 0;
    const minutes = Number(m[2]) * 60 + Number(m[3] ?? "0");
    return m[1] === "-" ? -minutes : minutes;
  } catch {
    return 0;
  }
}

/** An instant as the site's wall-clock time, "YYYY-MM-DD HH:MM". */
export function toSiteWallClock(iso: string, timeZone: string): string {
  const at = new Date(iso);
  if (Number.isNaN(at.getTime())) return iso;
  const local = new Date(at.getTime() + getUtcOffsetMin(timeZone, at) * 60_000).toISOString();
  return `${local.slice(0, 10)} ${local.slice(11, 16)}`;
}
