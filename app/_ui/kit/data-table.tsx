import type { ReactNode } from "react";

export interface Column<T> {
  /** Stable key for React and for tests. */
  key: string;
  header: string;
  /** Shown after the header in brackets, e.g. "kg". */
  unit?: string;
  /** Numbers align right and read in tabular figures. */
  numeric?: boolean;
  cell: (row: T) => ReactNode;
  /** The totals row's cell for this column, if the table has totals. */
  total?: ReactNode;
}

/**
 * The one table every list uses: a caption, columns with units and alignment, an optional totals row,
 * a plain empty state and an optional link to the same rows as CSV.
 */
export function DataTable<T>({
  caption,
  columns,
  rows,
  rowKey,
  empty,
  csvHref,
  hideCaption = false,
  rowId,
}: {
  caption: string;
  columns: ReadonlyArray<Column<T>>;
  rows: readonly T[];
  rowKey: (row: T) => string | number;
  empty: ReactNode;
  csvHref?: string;
  hideCaption?: boolean;
  /** An anchor per row, for links that point at one row of the list (`/waste#M-2026-014`). */
  rowId?: (row: T) => string;
}) {
  if (rows.length === 0) return <p className="empty">{empty}</p>;
  const hasTotals = columns.some((c) => c.total !== undefined);
  return (
    // Focusable and named, so a table wider than the screen can be scrolled from the keyboard.
    <div className="table-wrap" tabIndex={0} role="region" aria-label={caption}>
      <table>
        <caption className={hideCaption ? "visually-hidden" : undefined}>
          {caption}
          {csvHref ? (
            <a className="caption-link" href={csvHref} download>
              CSV
            </a>
          ) : null}
        </caption>
        <thead>
          <tr>
            {columns.map((c) => (
              <th key={c.key} scope="col" className={c.numeric ? "num" : undefined}>
                {c.header}
                {c.unit ? <span className="unit"> ({c.unit})</span> : null}
              </th>
            ))}
          </tr>
        </thead>
        <tbody>
          {rows.map((r) => (
            <tr key={rowKey(r)} id={rowId?.(r)}>
              {columns.map((c) => (
                <td key={c.key} className={c.numeric ? "num" : undefined}>
                  {c.cell(r)}
                </td>
              ))}
            </tr>
          ))}
        </tbody>
        {hasTotals ? (
          <tfoot>
            <tr>
              {columns.map((c, i) => (
                <td key={c.key} className={c.numeric ? "num" : undefined}>
                  {c.total ?? (i === 0 ? "Total" : null)}
                </td>
              ))}
            </tr>
          </tfoot>
        ) : null}
      </table>
    </div>
  );
}
