import type { ReactNode } from "react";
import { labelOf } from "@/lib/core/vocabulary";
import type { ContributionRow, LedgerFreshness } from "@/lib/trace/trace.service";
import { CERTIFICATION_LABELS } from "@/lib/trace/trace.service";
import { kg, kgExact, pct } from "@/app/_ui/format";
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
  const renderRows = (list: readonly ContributionRow[]) =>
    list.map((r) => (
      <tr key={r.key}>
        <td className="nowrap">
          <CodeCell row={r} columns={columns} />
        </td>
        <td>{r.label}</td>
        {columns !== "plain" ? <td>{r.materialKind ? labelOf(r.materialKind) : "—"}</td> : null}
        {columns === "lot" ? <td>{r.lotCertified === null ? "—" : r.lotCertified ? "Yes" : "No"}</td> : null}
        {columns === "pickup" ? (
          <td>
            <CertCell row={r} />
          </td>
        ) : null}
        {columns === "source" || columns === "pickup" ? (
          <td>{r.certificate ?? <span className="muted">none</span>}</td>
        ) : null}
        <td className="num">{r.origins}</td>
        <td className="num">{kg(r.grams, 3)}</td>
        <td className="num">{pct(r.pct, 2)}</td>
      </tr>
    ));
  const header = (
    <thead>
      <tr>
        <th scope="col">{first}</th>
        <th scope="col">Description</th>
        {columns !== "plain" ? <th scope="col">Material</th> : null}
        {columns === "lot" ? <th scope="col">Lot certified</th> : null}
        {columns === "pickup" ? <th scope="col">Certification</th> : null}
        {columns === "source" || columns === "pickup" ? <th scope="col">Source certificate</th> : null}
        <th scope="col" className="num">
          Origins
        </th>
        <th scope="col" className="num">
          Mass
        </th>
        <th scope="col" className="num">
          Share
        </th>
      </tr>
    </thead>
  );
  const span =
    2 +
    (columns !== "plain" ? 1 : 0) +
    (columns === "lot" ? 1 : 0) +
    (columns === "pickup" ? 2 : 0) +
    (columns === "source" ? 1 : 0) +
    1;
  return (
    <div className="table-wrap">
      <table>
        <caption>
          {caption}{" "}
          <a href={csvHref} className="csv-link" download>
            Download CSV
          </a>
        </caption>
        {header}
        <tbody>{renderRows(head)}</tbody>
        <tfoot>
          <tr>
            <td colSpan={span}>Total{rows.length > head.length ? ` (all ${rows.length} rows)` : ""}</td>
            <td className="num">{kg(totalG, 3)}</td>
            <td className="num">{pct(totalPct, 2)}</td>
          </tr>
        </tfoot>
      </table>
      {rest.length > 0 ? (
        <details className="more-rows">
          <summary>
            {rest.length} more {rest.length === 1 ? "row" : "rows"} (smaller contributions)
            {csvOnly > 0 ? `; the ${csvOnly} smallest are in the CSV only` : ""}
          </summary>
          <table>
            {header}
            <tbody>{renderRows(rest)}</tbody>
          </table>
        </details>
      ) : null}
    </div>
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
