// The balance page's question resolved: which month, quarter or custom range (default: last month at
// the site), with the site's UTC offsets at both ends, and the closure tolerance entered with it.
import { getLocalDate } from "@/lib/mass-balance/period";
import type { ClosureTolerance } from "@/lib/mass-balance/balance-types";
import { DEFAULT_CLOSURE_TOLERANCE } from "@/lib/mass-balance/period-balance";
import type { BalanceQuery } from "@/lib/mass-balance/balance-query.schema";
import { getUtcOffsetMin } from "@/lib/period/site-time";

export interface ResolvedBalanceQuery {
  period: BalanceQuery["period"];
  year: number;
  month: number;
  quarter: number;
  start: string;
  end: string;
}

function previousMonth(nowMs: number, timeZone: string): { year: number; month: number } {
  const local = getLocalDate(nowMs, getUtcOffsetMin(timeZone, new Date(nowMs)));
  return local.month === 1 ? { year: local.year - 1, month: 12 } : { year: local.year, month: local.month - 1 };
}

function quarterOf(month: number): number {
  return Math.floor((month - 1) / 3) + 1;
}

function offsetAt(timeZone: string, y: number, m1: number, d: number): number {
  return getUtcOffsetMin(timeZone, new Date(Date.UTC(y, m1 - 1, d, 12)));
}

function pad2(n: number): string {
  return String(n).padStart(2, "0");
}

/** The query with its defaults filled in: last month at the site unless a year, month, quarter or range is given. */
export function resolveBalanceQuery(q: BalanceQuery, nowMs: number, timeZone: string): ResolvedBalanceQuery {
  const last = previousMonth(nowMs, timeZone);
  const year = q.year ?? last.year;
  const month = q.month ?? (q.year === undefined ? last.month : 1);
  const quarter = q.quarter ?? quarterOf(q.year === undefined ? last.month : 1);
  const start = q.start ?? `${year}-${pad2(month)}-01`;
  const end = q.end ?? (month === 12 ? `${year + 1}-01-01` : `${year}-${pad2(month + 1)}-01`);
  return { period: q.period, year, month, quarter, start, end };
}

/** The first and the first-after-last local days of the period, as year, month, day. */
function boundsOf(r: ResolvedBalanceQuery): { sy: number; sm: number; sd: number; ey: number; em: number; ed: number } {
  const { year, month, quarter } = r;
  if (r.period === "MONTH")
    return { sy: year, sm: month, sd: 1, ey: month === 12 ? year + 1 : year, em: month === 12 ? 1 : month + 1, ed: 1 };
  if (r.period === "QUARTER")
    return {
      sy: year,
      sm: (quarter - 1) * 3 + 1,
      sd: 1,
      ey: quarter === 4 ? year + 1 : year,
      em: quarter === 4 ? 1 : quarter * 3 + 1,
      ed: 1,
    };
  const [sy = 0, sm = 1, sd = 1] = r.start.split("-").map(Number);
  const [ey = 0, em = 1, ed = 1] = r.end.split("-").map(Number);
  return { sy, sm, sd, ey, em, ed };
}

/** The input of PeriodRangeSchema for the resolved query, with the site's offsets at the period's ends. */
export function periodRangeInput(r: ResolvedBalanceQuery, timeZone: string): Record<string, unknown> {
  const b = boundsOf(r);
  const utcOffsetMin = offsetAt(timeZone, b.sy, b.sm, b.sd);
  const utcOffsetAtEndMin = offsetAt(timeZone, b.ey, b.em, b.ed);
  if (r.period === "MONTH") return { kind: "MONTH", year: r.year, month: r.month, utcOffsetMin, utcOffsetAtEndMin };
  if (r.period === "QUARTER")
    return { kind: "QUARTER", year: r.year, quarter: r.quarter, utcOffsetMin, utcOffsetAtEndMin };
  return { kind: "CUSTOM", startDate: r.start, endDate: r.end, utcOffsetMin, utcOffsetAtEndMin };
}

/** The input of ClosureToleranceSchema: the default, or the entered limits marked as a site setting. */
export function toleranceInput(
  q: Pick<BalanceQuery, "warnPct" | "failPct">,
  site: ClosureTolerance = DEFAULT_CLOSURE_TOLERANCE,
): Record<string, unknown> {
  const warnPct = q.warnPct ?? site.warnPct;
  const failPct = q.failPct ?? site.failPct;
  if (warnPct === site.warnPct && failPct === site.failPct) return { ...site };
  return {
    warnPct,
    failPct,
    source: "entered with this balance",
    note: `The site works to warn above ${site.warnPct} %, fail above ${site.failPct} % (${site.source}).`,
  };
}
