import Link from "next/link";
import type { ReactNode } from "react";
import { labelOf } from "@/lib/core/vocabulary";
import type { HolderRef, MovementView } from "@/lib/ledger/movement.store";
import { kgExact, litres, when } from "@/app/_ui/format";
import { hrefOf } from "@/app/_ui/links";
import { DataTable } from "@/app/_ui/kit/data-table";
import type { Column } from "@/app/_ui/kit/data-table";

export function HolderLink({
  holder,
  showKind = true,
}: {
  holder: Pick<HolderRef, "kind" | "code"> | null;
  showKind?: boolean;
}) {
  if (holder === null) return <span className="muted">outside the books</span>;
  const href = hrefOf(holder.kind, holder.code);
  return (
    <span className="holder">
      {showKind ? <span className="holder-kind">{labelOf(holder.kind)}</span> : null}
      {href ? (
        <Link prefetch={false} href={href}>
          {holder.code}
        </Link>
      ) : (
        <span className="code">{holder.code}</span>
      )}
    </span>
  );
}

/**
 * A record's code linking to its page. Not prefetched, like HolderLink and HistoryLink: they sit in
 * table rows, and a list of fifty rows would otherwise ask the server for a hundred pages nobody opened.
 */
export function CodeLink({ href, code }: { href: string; code: string }) {
  return (
    <Link prefetch={false} href={href} className="code">
      {code}
    </Link>
  );
}

export function Status({ code }: { code: string }) {
  return <span className={`status status-${code.toLowerCase()}`}>{labelOf(code)}</span>;
}

export function PassFail({ pass }: { pass: boolean }) {
  return <span className={`status ${pass ? "status-pass" : "status-fail"}`}>{pass ? "Pass" : "Fail"}</span>;
}

export function Empty({ children }: { children: ReactNode }) {
  return <p className="empty">{children}</p>;
}

export function Note({ children }: { children: ReactNode }) {
  return <p className="note">{children}</p>;
}

export function NoSite() {
  return (
    <>
      <h1>Nothing recorded yet</h1>
      <Empty>No plant has been set up in this database. Load the demo plant or create a site to begin.</Empty>
    </>
  );
}

export function Facts({ items }: { items: ReadonlyArray<readonly [string, ReactNode]> }) {
  return (
    <dl className="facts">
      {items.map(([term, value]) => (
        <div key={term}>
          <dt>{term}</dt>
          <dd>{value}</dd>
        </div>
      ))}
    </dl>
  );
}

export function Pager({
  basePath,
  page,
  total,
  pageSize,
  query = {},
}: {
  basePath: string;
  page: number;
  total: number;
  pageSize: number;
  query?: Record<string, string>;
}) {
  const pages = Math.max(1, Math.ceil(total / pageSize));
  if (pages <= 1) return null;
  const href = (p: number) => `${basePath}?${new URLSearchParams({ ...query, page: String(p) }).toString()}`;
  const near = [...new Set([1, page - 2, page - 1, page, page + 1, page + 2, pages])]
    .filter((p) => p >= 1 && p <= pages)
    .sort((a, b) => a - b);
  return (
    <nav className="pager" aria-label="Pages">
      <span className="pager-summary">
        Page {Math.min(page, pages)} of {pages} ({total} rows)
      </span>
      {page > 1 ? <Link href={href(page - 1)}>Previous</Link> : null}
      {near.map((p, i) => (
        <span key={p}>
          {i > 0 && p - (near[i - 1] ?? p) > 1 ? <span className="muted"> … </span> : null}
          {p === page ? (
            <span aria-current="page" className="pager-current">
              {p}
            </span>
          ) : (
            <Link href={href(p)} aria-label={`Page ${p}`}>
              {p}
            </Link>
          )}
        </span>
      ))}
      {page < pages ? <Link href={href(page + 1)}>Next</Link> : null}
    </nav>
  );
}

function movementColumns(
  timeZone: string,
  side: "from" | "to" | undefined,
  action: { header: string; render: (m: MovementView) => ReactNode } | undefined,
): Array<Column<MovementView>> {
  const columns: Array<Column<MovementView> | null> = [
    { key: "at", header: "When", cell: (m) => <span className="nowrap">{when(m.at, timeZone)}</span> },
    { key: "role", header: "Role", cell: (m) => labelOf(m.role) },
    side !== "from" ? { key: "from", header: "From", cell: (m) => <HolderLink holder={m.from} /> } : null,
    side !== "to" ? { key: "to", header: "To", cell: (m) => <HolderLink holder={m.to} /> } : null,
    { key: "mass", header: "Mass", numeric: true, cell: (m) => kgExact(m.massG) },
    { key: "volume", header: "Volume", numeric: true, cell: (m) => (m.volumeMl === null ? "—" : litres(m.volumeMl)) },
    {
      key: "note",
      header: "Note",
      cell: (m) => (
        <>
          {m.note}
          {m.reversesId !== null ? <span className="tag">reverses #{m.reversesId}</span> : null}
          {m.reversedById !== null ? <span className="tag">reversed by #{m.reversedById}</span> : null}
        </>
      ),
    },
    action ? { key: "action", header: action.header, cell: action.render } : null,
  ];
  return columns.filter((c): c is Column<MovementView> => c !== null);
}

const SIDE_CAPTION = { to: "Movements in", from: "Movements out" } as const;

/** Movements as a table; `side` hides the column that is always the page's own holder. */
export function MovementTable({
  rows,
  timeZone,
  side,
  caption,
  action,
}: {
  rows: MovementView[];
  timeZone: string;
  side?: "from" | "to";
  caption?: string;
  action?: { header: string; render: (m: MovementView) => ReactNode };
}) {
  return (
    <DataTable
      caption={caption ?? (side ? SIDE_CAPTION[side] : "Movements")}
      hideCaption={caption === undefined}
      columns={movementColumns(timeZone, side, action)}
      rows={rows}
      rowKey={(m) => m.id}
      empty="No movements."
    />
  );
}

/** One click from a row to everything recorded about it (app/history). */
export function HistoryLink({ kind, recordKey, label }: { kind: string; recordKey: string; label: string }) {
  return (
    <Link
      prefetch={false}
      href={`/history?${new URLSearchParams({ kind, key: recordKey }).toString()}`}
      className="history-link"
      aria-label={`History of ${label} ${recordKey}`}
    >
      History
    </Link>
  );
}
