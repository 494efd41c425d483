import type { ReactNode } from "react";
import type { PlainCell } from "@/app/_ui/kit/plain-cell";
import { PlainRows } from "@/app/_ui/kit/plain-rows";
import { numeric, TableHead } from "@/app/_ui/kit/table-head";

export interface PlainColumn<T> {
  key: string;
  header: string;
  /** Numbers align right and read in tabular figures. */
  numeric?: boolean;
  cell: (row: T) => PlainCell;
}

/**
 * DataTable for long lists whose cells are text, links and marks: the same table, caption and
 * keyboard-scrollable frame, with the body rows sent as plain values (PlainRows).
 */
export function PlainTable<T>({
  caption,
  hideCaption = false,
  columns,
  rows,
  rowKey,
  empty,
}: {
  caption: string;
  hideCaption?: boolean;
  columns: ReadonlyArray<PlainColumn<T>>;
  rows: readonly T[];
  rowKey: (row: T) => string;
  empty: ReactNode;
}) {
  if (rows.length === 0) return <p className="empty">{empty}</p>;
  const numericColumns = columns.flatMap((c, i) => (c.numeric ? [i] : []));
  return (
    <div className="table-wrap" tabIndex={0} role="region" aria-label={caption}>
      <table>
        <caption className={hideCaption ? "visually-hidden" : undefined}>{caption}</caption>
        <TableHead headings={columns.map((c) => (c.numeric ? numeric(c.header) : c.header))} />
        <PlainRows
          rows={rows.map((r) => ({ key: rowKey(r), cells: columns.map((c) => c.cell(r)) }))}
          keys={columns.map((c) => c.key)}
          numericColumns={numericColumns}
        />
      </table>
    </div>
  );
}
