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
  /** In a table read as cards on a phone, this column heads the card (it carries no label of its own). */
  title?: boolean;
}

/** A cell's classes: numbers right-aligned; a card's title cell. */
function cellClass<T>(c: Column<T>): string | undefined {
  return [c.numeric ? "num" : "", c.title ? "card-title" : ""].filter(Boolean).join(" ") || undefined;
}

/**
 * Only the attributes a cell has: an attribute left undefined still travels in the page's data, on
 * every cell of every row.
 */
function cellAttributes<T>(c: Column<T>, cards: boolean): { className?: string; "data-label"?: string } {
  const className = cellClass(c);
  return {
    ...(className ? { className } : {}),
    ...(cards ? { "data-label": `${c.header}${c.unit ? ` (${c.unit})` : ""}` } : {}),
  };
}

/**
 * The one table every list uses: a caption, columns with units and alignment, an optional totals row,
 * a plain empty state, an optional link to the same rows as CSV, and (for lists read on a phone) cards.
 */
export function DataTable<T>({
  caption,
  columns,
  rows,
  rowKey,
  empty,
  csvHref,
  hideCaption = false,
  cards = false,
  className,
  rowId,
}: {
  caption: string;
  columns: ReadonlyArray<Column<T>>;
  rows: readonly T[];
  rowKey: (row: T) => string | number;
  empty: ReactNode;
  csvHref?: string;
  hideCaption?: boolean;
  /** On a narrow screen each row reads as a card, each value beside its column's name. */
  cards?: boolean;
  /** A page's own class for the table, for its own column widths. */
  className?: string;
  /** An anchor per row, for links that point at one row of the list (`/waste#M-2026-014`). */
  rowId?: (row: T) => string;
}) {
  if (rows.length === 0) return <p className="empty">{empty}</p>;
  const hasTotals = columns.some((c) => c.total !== undefined);
  const cellProps = columns.map((c) => cellAttributes(c, cards));
  return (
    // Focusable and named, so a table wider than the screen can be scrolled from the keyboard.
    <div className="table-wrap" tabIndex={0} role="region" aria-label={caption}>
      <table className={[cards ? "phone-cards" : "", className ?? ""].filter(Boolean).join(" ") || undefined}>
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
            <tr key={rowKey(r)} {...(rowId ? { id: rowId(r) } : {})}>
              {columns.map((c, i) => (
                <td key={c.key} {...cellProps[i]}>
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
