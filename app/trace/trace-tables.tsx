import type { ReactNode } from "react";
import { labelOf } from "@/lib/core/vocabulary";
import type { ContributionRow, LedgerFreshness } from "@/lib/trace/trace.service";
import { CERTIFICATION_LABELS } from "@/lib/trace/trace.service";
import { kg, kgExact, pct } from "@/app/_ui/format";
import { DataTable } from "@/app/_ui/kit";
import type { Column } from "@/app/_ui/kit";
import { Note } from "@/app/_ui/ui";

/** A pooled tank can go back to thousands of pickups; the page lists this many and the CSV all of them. */
export const MAX_ROWS_ON_PAGE = 250;

export type ContributionColumns = "lot" | "pickup" | "source" | "plain";

function CodeCell({ row, columns }: { row: ContributionRow; columns: ContributionColumns }) {
  // Plain links: a trace table can have hundreds of rows, and client-side prefetching buys nothing here.
  if (columns === "lot" && row.lotCode !== null)
    return <a href={`/lots/${encodeURIComponent(row.lotCode)}`}>{row.key}</a>;
  if (columns === "source" && row.sourceCode !== null)
    return <a href={`/sources/${encodeURIComponent(row.sourceCode)}`}>{row.key}</a>;
  if (columns === "pickup" && row.key.startsWith("PU-"))
    return <a href={`/pickups/${encodeURIComponent(row.key)}`}>{row.key}</a>;
  return <>{row.key}</>;
}

function CertCell({ row }: { row: ContributionRow }) {
  if (row.certification === null) return <span className="muted">—</span>;
  const cls =
    row.certification === "CERTIFIED"
      ? "status-pass"
      : row.certification === "NOT_FEEDSTOCK"
        ? ""
        : row.certification === "NOT_CERTIFIED"
          ? "status-closed"
          : "status-warn";
  return <span className={`status ${cls}`}>{CERTIFICATION_LABELS[row.certification]}</span>;
}

function contributionColumns(
  first: string,
  columns: ContributionColumns,
  totals: { label: string; grams: number; pct: number } | null,
): Array<Column<ContributionRow>> {
  const cols: Array<Column<ContributionRow> | false> = [
    {
      key: "code",
      header: first,
      cell: (r) => (
        <span className="nowrap">
          <CodeCell row={r} columns={columns} />
        </span>
      ),
      ...(totals ? { total: totals.label } : {}),
    },
    { key: "label", header: "Description", cell: (r) => r.label },
    columns !== "plain" && {
      key: "material",
      header: "Material",
      cell: (r) => (r.materialKind ? labelOf(r.materialKind) : "—"),
    },
    columns === "lot" && {
      key: "lotCertified",
      header: "Lot certified",
      cell: (r) => (r.lotCertified === null ? "—" : r.lotCertified ? "Yes" : "No"),
    },
    columns === "pickup" && { key: "certification", header: "Certification", cell: (r) => <CertCell row={r} /> },
    (columns === "source" || columns === "pickup") && {
      key: "certificate",
      header: "Source certificate",
      cell: (r) => r.certificate ?? <span className="muted">none</span>,
    },
    { key: "origins", header: "Origins", numeric: true, cell: (r) => r.origins, ...(totals ? { total: "" } : {}) },
    {
      key: "mass",
      header: "Mass",
      numeric: true,
      cell: (r) => kg(r.grams, 3),
      ...(totals ? { total: kg(totals.grams, 3) } : {}),
    },
    {
      key: "share",
      header: "Share",
      numeric: true,
      cell: (r) => pct(r.pct, 2),
      ...(totals ? { total: pct(totals.pct, 2) } : {}),
    },
  ];
  return cols.filter((c): c is Column<ContributionRow> => c !== false);
}

/**
 * One contribution table with a total row. `shown` rows are on the page, up to MAX_ROWS_ON_PAGE more
 * open in a disclosure, and every row is in the CSV. The total is the whole table's, so it always adds up.
 */
export function ContributionTable({
  caption,
  first,
  rows,
  totalG,
  totalPct = 100,
  columns,
  csvHref,
  shown = 40,
}: {
  caption: string;
  first: string;
  rows: readonly ContributionRow[];
  totalG: number;
  totalPct?: number;
  columns: ContributionColumns;
  csvHref: string;
  shown?: number;
}) {
  const head = rows.slice(0, shown);
  const rest = rows.slice(shown, MAX_ROWS_ON_PAGE);
  const csvOnly = rows.length - head.length - rest.length;
  const label = `Total${rows.length > head.length ? ` (all ${rows.length} rows)` : ""}`;
  return (
    <>
      <DataTable
        caption={caption}
        rows={head}
        rowKey={(r) => r.key}
        empty="Nothing traced."
        csvHref={csvHref}
        columns={contributionColumns(first, columns, { label, grams: totalG, pct: totalPct })}
      />
      {rest.length > 0 ? (
        <details className="more-rows">
          <summary>
            {rest.length} more {rest.length === 1 ? "row" : "rows"} (smaller contributions)
            {csvOnly > 0 ? `; the ${csvOnly} smallest are in the CSV only` : ""}
          </summary>
          <DataTable
            caption={`${caption}: smaller contributions`}
            hideCaption
            rows={rest}
            rowKey={(r) => r.key}
            empty="None."
            columns={contributionColumns(first, columns, null)}
          />
        </details>
      ) : null}
    </>
  );
}

export function FreshnessNote({ f, extra }: { f: LedgerFreshness; extra?: ReactNode }) {
  return (
    <Note>
      Computed from the ledger as of movement no. {f.lastMoveId ?? "—"} ({f.movements} movements
      {f.reversedPairsLeftOut > 0
        ? `; ${f.reversedPairsLeftOut} reversed movements left out as booking corrections`
        : ""}
      ); a later booking may change it.
      {f.order === "booked"
        ? ` Replayed in booking order because the dates do not replay: ${f.orderProblem ?? ""}.`
        : ""}{" "}
      {extra}
    </Note>
  );
}

export function ExactTotal({ label, grams }: { label: string; grams: number }) {
  return (
    <>
      {label}: <strong>{kgExact(grams)}</strong>
    </>
  );
}
