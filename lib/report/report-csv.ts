// One table of a report as CSV (RFC 4180, CRLF, formula-looking cells neutralised), preceded by the
// report's header lines as "#" comment lines: plant, subject, when and by whom, ledger position.
import { cellText, headerLines } from "@/lib/report/report";
import type { ReportDoc, ReportTable } from "@/lib/report/report";

/** Characters that make a spreadsheet treat a cell as a formula (OWASP "CSV injection"). */
const FORMULA_START = /^[=+\-@\t\r]/;

export function csvCell(text: string, numeric: boolean): string {
  const t = !numeric && FORMULA_START.test(text) ? `'${text}` : text;
  return /[",\r\n]/.test(t) ? `"${t.replace(/"/g, '""')}"` : t;
}

const NUMERIC = new Set(["mass", "pct", "count"]);

function headerOf(c: ReportTable["columns"][number]): string {
  return c.kind === "mass" ? `${c.key}_kg` : c.kind === "pct" ? `${c.key}_percent` : c.key;
}

export function reportCsv(doc: ReportDoc, table: ReportTable): string {
  const lines: string[] = [];
  for (const [k, v] of [
    ["Report", doc.title] as [string, string],
    ...headerLines(doc),
    ["Table", table.heading] as [string, string],
  ]) {
    lines.push(`# ${k}: ${v.replace(/[\r\n]+/g, " ")}`);
  }
  lines.push(table.columns.map((c) => csvCell(headerOf(c), false)).join(","));
  const row = (r: readonly ReportTable["rows"][number][number][]) =>
    table.columns.map((c, i) => csvCell(cellText(r[i] ?? null, c.kind, doc.timeZone), NUMERIC.has(c.kind))).join(",");
  for (const r of table.rows) lines.push(row(r));
  if (table.total) lines.push(row(table.total));
  return lines.join("\r\n") + "\r\n";
}

export function reportFileName(doc: ReportDoc, ext: "csv" | "pdf", table?: string): string {
  const safe = (s: string) =>
    s
      .toLowerCase()
      .replace(/[^a-z0-9]+/g, "-")
      .replace(/^-|-$/g, "");
  return [doc.slug, ...(table ? [table] : []), safe(doc.subject).slice(0, 60)].filter(Boolean).join("-") + `.${ext}`;
}
