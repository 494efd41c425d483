// How the collect page writes numbers, times and quick looks (client side; no clock read here).
import type { UnitSystem } from "@/lib/quantity/units";
import { celsiusToFahrenheit, formatFixed, formatVolume } from "@/lib/quantity/units";

/** A number as typed on a phone: "" is missing, a decimal comma is read as a point. */
export function num(s: string): number {
  const t = s.trim().replace(",", ".");
  return t === "" ? Number.NaN : Number(t);
}

const PARTS: Intl.DateTimeFormatOptions = {
  year: "numeric",
  month: "2-digit",
  day: "2-digit",
  hour: "2-digit",
  minute: "2-digit",
  hourCycle: "h23",
};

/** The day and time in the site's zone (UTC if the phone does not know the zone). */
export function localParts(d: Date, timeZone: string): { day: string; time: string } {
  let f: Intl.DateTimeFormat;
  try {
    f = new Intl.DateTimeFormat("en-GB", { ...PARTS, timeZone });
  } catch {
    f = new Intl.DateTimeFormat("en-GB", { ...PARTS, timeZone: "UTC" });
  }
  const p = Object.fromEntries(f.formatToParts(d).map((x) => [x.type, x.value]));
  return { day: `${p.year}-${p.month}-${p.day}`, time: `${p.hour}:${p.minute}` };
}

export function shown(iso: string, tz: string, today: string): string {
  const p = localParts(new Date(iso), tz);
  return p.day === today ? `today ${p.time}` : `${p.day} ${p.time}`;
}

export function volumeText(ml: number, system: UnitSystem): string {
  return formatVolume(ml, system, { decimals: 1 });
}

export function tempText(c: number, system: UnitSystem): string {
  return system === "us" ? `${formatFixed(celsiusToFahrenheit(c), 0)} °F` : `${formatFixed(c, 0)} °C`;
}

export function lookText(look: string): string {
  return look === "TRACE" ? "trace" : look === "LAYER" ? "layer" : "none";
}
