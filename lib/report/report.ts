// Printable reports: one data shape that the page, the CSV and the PDF all render, so the three agree
// to the gram. Each report's builder is a pure function from its service answer to a ReportDoc; the
// renderers (report-csv.ts, report-pdf.ts, app/_ui/report-view.tsx) know nothing about the subject.
import type { HolderKind } from "@/lib/core/vocabulary";

/** How a column's values are written: masses are whole grams, shown in kg to the gram. */
export type ReportColumnKind = "text" | "mass" | "pct" | "count" | "day" | "time" | "holder" | "status";

export interface ReportColumn {
  key: string;
  header: string;
  kind: ReportColumnKind;
}

export type ReportValue = string | number | Date | null | { kind: HolderKind; code: string };

export interface ReportTable {
  key: string;
  heading: string;
  columns: ReportColumn[];
  rows: ReportValue[][];
  /** The totals row (same columns), if the table has one: its masses are the sums of the rows'. */
  total?: ReportValue[];
  /** Shown instead of an empty table. */
  empty: string;
}

export interface ReportDoc {
  /** File names: lower case, hyphens. */
  slug: string;
  title: string;
  plant: string;
  /** What the report is about: "Source R001 Harbour Grill, pickups observed 2026-10-01 to 2026-10-14". */
  subject: string;
  producedAt: Date;
  producedBy: string;
  timeZone: string;
  /** Where the ledger stood: a reprint at the same position gives the same figures. */
  ledger: { movements: number; lastMoveId: number | null };
  facts: Array<[string, string]>;
  notes: string[];
  /** Safety cautions printed with the report (waste list). */
  cautions: string[];
  tables: ReportTable[];
}

export interface ReportContext {
  plant: string;
  producedAt: Date;
  producedBy: string;
  timeZone: string;
}

function parts(d: Date, timeZone: string, withTime: boolean): Record<string, string> {
  let fmt: Intl.DateTimeFormat;
  const opts: Intl.DateTimeFormatOptions = {
    year: "numeric",
    month: "2-digit",
    day: "2-digit",
    ...(withTime ? { hour: "2-digit", minute: "2-digit", hourCycle: "h23" as const } : {}),
  };
  try {
    fmt = new Intl.DateTimeFormat("en-GB", { timeZone, ...opts });
  } catch {
    fmt = new Intl.DateTimeFormat("en-GB", { timeZone: "UTC", ...opts });
  }
  return Object.fromEntries(fmt.formatToParts(d).map((p) => [p.type, p.value]));
}

export function reportDay(d: Date, timeZone: string): string {
  const p = parts(d, timeZone, false);
  return `${p.year}-${p.month}-${p.day}`;
}

export function reportTime(d: Date, timeZone: string): string {
  const p = parts(d, timeZone, true);
  return `${p.year}-${p.month}-${p.day} ${p.hour}:${p.minute}`;
}

/** Whole grams as kg with three decimals (exact: 1 g = 0.001 kg), grouped for reading when `grouped`. */
export function kgText(grams: number, grouped = false): string {
  const neg = grams < 0;
  const g = Math.abs(Math.round(grams));
  const whole = Math.floor(g / 1000);
  const frac = String(g % 1000).padStart(3, "0");
  const w = grouped ? whole.toLocaleString("en-US") : String(whole);
  return `${neg ? "-" : ""}${w}.${frac}`;
}

/** One cell as text, the same in the page, the CSV and the PDF (the page adds links and units). */
export function cellText(value: ReportValue, kind: ReportColumnKind, timeZone: string, grouped = false): string {
  if (value === null) return "";
  if (value instanceof Date) return kind === "time" ? reportTime(value, timeZone) : reportDay(value, timeZone);
  if (typeof value === "object") return value.code;
  if (typeof value === "number") {
    if (kind === "mass") return kgText(value, grouped);
    if (kind === "pct") return value.toFixed(2);
    return String(value);
  }
  return value;
}

export function ledgerText(l: ReportDoc["ledger"]): string {
  return l.lastMoveId === null ? "no movements yet" : `${l.movements} movements, last movement no. ${l.lastMoveId}`;
}

/** What a report says for itself; the rest of the document comes from where and when it was produced. */
export type ReportBody = Pick<ReportDoc, "slug" | "title" | "subject" | "facts" | "notes" | "tables"> & {
  cautions?: string[];
};

/** A report document: its own parts with the plant, who produced it and when, and where the ledger stood. */
export function composeReport(body: ReportBody, ctx: ReportContext, ledger: ReportDoc["ledger"]): ReportDoc {
  return {
    slug: body.slug,
    title: body.title,
    plant: ctx.plant,
    subject: body.subject,
    producedAt: ctx.producedAt,
    producedBy: ctx.producedBy,
    timeZone: ctx.timeZone,
    ledger,
    facts: body.facts,
    notes: body.notes,
    cautions: body.cautions ?? [],
    tables: body.tables,
  };
}

/** A period's days as printed: its first day to its last (the end is the start of the day after). */
export function periodDays(startsAt: Date, endsAt: Date, timeZone: string): string {
  return `${reportDay(startsAt, timeZone)} to ${reportDay(new Date(endsAt.getTime() - 1), timeZone)}`;
}

/** The header lines every report carries. */
export function headerLines(doc: ReportDoc): Array<[string, string]> {
  return [
    ["Plant", doc.plant],
    ["Subject", doc.subject],
    ["Produced", `${reportTime(doc.producedAt, doc.timeZone)} (${doc.timeZone}) by ${doc.producedBy}`],
    ["Ledger position", ledgerText(doc.ledger)],
  ];
}

/** Σ of a mass column over the rows (whole grams). */
export function sumColumn(table: ReportTable, key: string): number {
  const i = table.columns.findIndex((c) => c.key === key);
  return table.rows.reduce((s, r) => s + (typeof r[i] === "number" ? r[i] : 0), 0);
}
