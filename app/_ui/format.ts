import { formatFixed, formatMass, formatVolume } from "@/lib/quantity/units";

/** Display of stored quantities: always through lib/quantity, metric until users pick a unit system. */
export function kg(grams: number, decimals = 1): string {
  return formatMass(grams, "metric", { decimals });
}

/** Exact to the gram, for ledger rows. */
export function kgExact(grams: number): string {
  return formatMass(grams, "metric");
}

export function litres(ml: number, decimals = 1): string {
  return formatVolume(ml, "metric", { decimals });
}

export function pct(value: number | null, decimals = 2): string {
  return value === null ? "—" : `${formatFixed(value, decimals)} %`;
}

/** FFA with the fatty acid it is expressed as: "2.00 % as palmitic". */
export function ffa(value: number | null, basis: string, decimals = 2): string {
  return value === null ? "—" : `${formatFixed(value, decimals)} % as ${basis.toLowerCase()}`;
}

export function num(value: number | null, decimals: number): string {
  return value === null ? "—" : formatFixed(value, decimals);
}

/** One formatter per time zone and shape: building one costs several times the formatting itself. */
const formatters = new Map<string, Intl.DateTimeFormat>();

function formatter(timeZone: string, withTime: boolean): Intl.DateTimeFormat {
  const key = `${timeZone}|${withTime ? "t" : "d"}`;
  const kept = formatters.get(key);
  if (kept !== undefined) return kept;
  const options: Intl.DateTimeFormatOptions = {
    year: "numeric",
    month: "2-digit",
    day: "2-digit",
    ...(withTime ? { hour: "2-digit", minute: "2-digit", hourCycle: "h23" } : {}),
  };
  let fmt: Intl.DateTimeFormat;
  try {
    fmt = new Intl.DateTimeFormat("en-GB", { timeZone, ...options });
  } catch {
    fmt = new Intl.DateTimeFormat("en-GB", { timeZone: "UTC", ...options });
  }
  formatters.set(key, fmt);
  return fmt;
}

function parts(d: Date, timeZone: string, withTime: boolean): Record<string, string> {
  return Object.fromEntries(
    formatter(timeZone, withTime)
      .formatToParts(d)
      .map((p) => [p.type, p.value]),
  );
}

/** "2026-03-04 14:05" in the site's time zone. */
export function when(d: Date | null, timeZone: string): string {
  if (d === null) return "—";
  const p = parts(d, timeZone, true);
  return `${p.year}-${p.month}-${p.day} ${p.hour}:${p.minute}`;
}

export function day(d: Date | null, timeZone: string): string {
  if (d === null) return "—";
  const p = parts(d, timeZone, false);
  return `${p.year}-${p.month}-${p.day}`;
}

/** Whole days from `from` to `to`, rounded down. */
export function daysBetween(from: Date, to: Date): number {
  return Math.floor((to.getTime() - from.getTime()) / 86_400_000);
}
