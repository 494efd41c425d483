// Dates as pasted from spreadsheets: ISO 8601 forms and the common local day/month orders.
import type { Result } from "@/lib/core/result";
import { fail, ok } from "@/lib/core/result";

export type DateOrder = "DMY" | "MDY" | "YMD";

/** Day/month order of a locale's short date, from CLDR via Intl (en-US → MDY, en-GB/de/fr → DMY, ja → YMD). */
export function dateOrderFor(locale: string): DateOrder {
  let parts: Intl.DateTimeFormatPart[];
  try {
    parts = new Intl.DateTimeFormat(locale, {
      year: "numeric",
      month: "2-digit",
      day: "2-digit",
      timeZone: "UTC",
    }).formatToParts(Date.UTC(2026, 10, 25));
  } catch {
    return "YMD";
  }
  const order = parts
    .filter((p) => p.type === "day" || p.type === "month" || p.type === "year")
    .map((p) => p.type[0])
    .join("");
  return order === "mdy" ? "MDY" : order === "ymd" ? "YMD" : "DMY";
}

const ISO = /^(\d{4})-(\d{2})-(\d{2})(?:[T ](\d{2}):(\d{2})(?::(\d{2})(?:\.(\d{1,3})\d*)?)?(Z|[+-]\d{2}:?\d{2})?)?$/;
const LOCAL = /^(\d{1,4})[./-](\d{1,2})[./-](\d{1,4})(?:[ T,]+(\d{1,2}):(\d{2})(?::(\d{2}))?)?$/;

function build(
  y: number,
  mo: number,
  d: number,
  h: number,
  mi: number,
  s: number,
  ms: number,
  offsetMin: number,
  raw: string,
  field?: string,
): Result<string> {
  const t = Date.UTC(y, mo - 1, d, h, mi, s, ms) - offsetMin * 60_000;
  const back = new Date(Date.UTC(y, mo - 1, d));
  if (mo < 1 || mo > 12 || back.getUTCDate() !== d || back.getUTCMonth() !== mo - 1 || h > 23 || mi > 59 || s > 59) {
    return fail("INPUT.BAD_DATE", `"${raw}" is not a real date or time`, field);
  }
  return ok(new Date(t).toISOString());
}

/**
 * Parses a date or date-time cell to an ISO 8601 UTC string. ISO 8601 forms (2026-03-01, 2026-03-01T08:30,
 * with Z or ±hh:mm) are read as written; local forms (01.03.2026, 3/1/2026, 1-3-26) follow the sheet's order.
 * Times without an offset are the site's local time (`siteOffsetMin` minutes east of UTC).
 */
export function parseDateCell(raw: string, order: DateOrder, siteOffsetMin: number, field?: string): Result<string> {
  const text = raw.trim();
  if (text === "") return fail("INPUT.EMPTY", "no date given", field);
  const iso = ISO.exec(text);
  if (iso) {
    const [, y, mo, d, h, mi, s, ms, zone] = iso;
    let offset = siteOffsetMin;
    if (zone === "Z") offset = 0;
    else if (zone !== undefined) {
      const sign = zone.startsWith("-") ? -1 : 1;
      const digits = zone.slice(1).replace(":", "");
      offset = sign * (Number(digits.slice(0, 2)) * 60 + Number(digits.slice(2)));
    }
    return build(
      Number(y),
      Number(mo),
      Number(d),
      Number(h ?? 0),
      Number(mi ?? 0),
      Number(s ?? 0),
      Number((ms ?? "0").padEnd(3, "0")),
      offset,
      text,
      field,
    );
  }
  const local = LOCAL.exec(text);
  if (local) {
    const [, a, b, c, h, mi, s] = local;
    const first = a ?? "";
    let y: string, mo: string, d: string;
    if (first.length === 4) [y, mo, d] = [first, b ?? "", c ?? ""];
    else if (order === "MDY") [mo, d, y] = [first, b ?? "", c ?? ""];
    else [d, mo, y] = [first, b ?? "", c ?? ""];
    if (y.length === 3 || y.length === 1)
      return fail("INPUT.BAD_DATE", `"${text}": give the year with 2 or 4 digits`, field);
    const year = y.length === 2 ? 2000 + Number(y) : Number(y); // two-digit years are this century (common practice)
    return build(
      year,
      Number(mo),
      Number(d),
      Number(h ?? 0),
      Number(mi ?? 0),
      Number(s ?? 0),
      0,
      siteOffsetMin,
      text,
      field,
    );
  }
  return fail("INPUT.BAD_DATE", `"${text}" is not a date; use e.g. 2026-03-01 or 2026-03-01 08:30`, field);
}
