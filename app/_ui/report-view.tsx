import type { ReactNode } from "react";
import { DataTable } from "@/app/_ui/kit";
import type { Column } from "@/app/_ui/kit";
import { Facts, HolderLink } from "@/app/_ui/ui";
import { cellText, headerLines } from "@/lib/report/report";
import type { ReportDoc, ReportTable, ReportValue } from "@/lib/report/report";

/** Download links for a report: the PDF, and each table as CSV (same data as the page). */
export function ReportDownloads({
  doc,
  href,
}: {
  doc: ReportDoc;
  href: (format: "pdf" | "csv", table?: string) => string;
}) {
  return (
    <p className="report-downloads">
      <a href={href("pdf")} download>
        {doc.title} (PDF)
      </a>
      {doc.tables.map((t) => (
        <span key={t.key}>
          {" · "}
          <a href={href("csv", t.key)} download>
            {t.heading} (CSV)
          </a>
        </span>
      ))}
    </p>
  );
}

/** The report's header lines as the page shows them (plant, subject, produced, ledger position). */
export function ReportHeader({ doc }: { doc: ReportDoc }) {
  return <Facts items={[...headerLines(doc), ...doc.facts]} />;
}

function cell(value: ReportValue, kind: ReportTable["columns"][number]["kind"], timeZone: string): ReactNode {
  if (value !== null && typeof value === "object" && !(value instanceof Date))
    return <HolderLink holder={value} showKind={false} />;
  const text = cellText(value, kind, timeZone, true);
  return kind === "mass" || kind === "pct" ? text : text === "" ? "—" : text;
}

/** One table of a report, drawn with the kit's DataTable; the totals row is the report's own. */
export function ReportTableView({
  doc,
  table,
  csvHref,
  headingLevel = 3,
}: {
  doc: ReportDoc;
  table: ReportTable;
  csvHref?: string;
  headingLevel?: 2 | 3;
}) {
  const Heading = headingLevel === 2 ? "h2" : "h3";
  const columns: Array<Column<{ n: number; row: ReportValue[] }>> = table.columns.map((c, i) => ({
    key: c.key,
    header: c.header,
    ...(c.kind === "mass" ? { unit: "kg" } : c.kind === "pct" ? { unit: "%" } : {}),
    numeric: c.kind === "mass" || c.kind === "pct" || c.kind === "count",
    cell: (r: { n: number; row: ReportValue[] }) => cell(r.row[i] ?? null, c.kind, doc.timeZone),
    ...(table.total ? { total: i === 0 ? "Total" : cellText(table.total[i] ?? null, c.kind, doc.timeZone, true) } : {}),
  }));
  return (
    <>
      <Heading>{table.heading}</Heading>
      <DataTable
        caption={table.heading}
        hideCaption
        columns={columns}
        rows={table.rows.map((row, n) => ({ n, row }))}
        rowKey={(r) => r.n}
        empty={table.empty}
        {...(csvHref ? { csvHref } : {})}
      />
    </>
  );
}

/** Links to a page's printable report: the PDF and its tables as CSV (same figures as the page). */
export function ReportLinks({
  base,
  pdfLabel,
  tables,
}: {
  base: string;
  pdfLabel: string;
  tables: ReadonlyArray<readonly [key: string, label: string]>;
}) {
  const sep = base.includes("?") ? "&" : "?";
  return (
    <p className="report-downloads">
      <a href={`${base}${sep}format=pdf`} download>
        {pdfLabel} (PDF)
      </a>
      {tables.map(([key, label]) => (
        <span key={key}>
          {" · "}
          <a href={`${base}${sep}format=csv&table=${key}`} download>
            {label} (CSV)
          </a>
        </span>
      ))}
    </p>
  );
}
