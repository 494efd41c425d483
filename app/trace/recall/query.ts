import "server-only";
import { toSiteInstant } from "@/app/trace/site-time";

/** The recall page's query string: dates are the site's calendar days, the last one included. */
export interface RecallSearch {
  kind: string;
  code: string;
  from: string;
  to: string;
}

const DAY = /^(\d{4})-(\d{2})-(\d{2})$/;

function nextDay(date: string): string {
  const m = DAY.exec(date);
  if (m === null) return date;
  return new Date(Date.UTC(Number(m[1]), Number(m[2]) - 1, Number(m[3]) + 1)).toISOString().slice(0, 10);
}

/** Site days to the service's window: from the start of the first day to the start of the day after the last. */
export function recallInput(
  s: RecallSearch,
  timeZone: string,
): { kind: string; code: string; from: string | undefined; to: string | undefined } {
  const at = (d: string) => (d === "" ? undefined : DAY.test(d) ? toSiteInstant(`${d}T00:00`, timeZone) : d);
  return { kind: s.kind, code: s.code, from: at(s.from), to: at(s.to === "" ? "" : nextDay(s.to)) };
}

export function readRecallSearch(get: (name: string) => string | undefined): RecallSearch {
  return { kind: get("kind") ?? "", code: get("code") ?? "", from: get("from") ?? "", to: get("to") ?? "" };
}

export function recallQueryString(s: RecallSearch): string {
  return new URLSearchParams(Object.entries(s).filter(([, v]) => v !== "")).toString();
}
