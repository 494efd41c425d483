import type { Metadata } from "next";
import Link from "next/link";
import { labelOf } from "@/lib/core/vocabulary";
import { listBatches } from "@/lib/batch/batch.store";
import { kg, num, when } from "@/app/_ui/format";
import { PAGE_SIZE, pageParam } from "@/app/_ui/links";
import { loadSite } from "@/app/_ui/site";
import { CodeLink, Empty, HistoryLink, NoSite, Pager, Status } from "@/app/_ui/ui";
import type { Column } from "@/app/_ui/kit/data-table";
import { DataTable } from "@/app/_ui/kit/data-table";

export const dynamic = "force-dynamic";
export const metadata: Metadata = { title: "Batches" };

type BatchListRow = Awaited<ReturnType<typeof listBatches>>["rows"][number];

const BATCH_COLUMNS = (tz: string): Column<BatchListRow>[] => [
  {
    key: "batch",
    header: "Batch",
    cell: (b) => (
      <>
        <CodeLink href={`/batches/${encodeURIComponent(b.code)}`} code={b.code} />
        {b.pretreated ? <span className="tag">pretreated</span> : null}
      </>
    ),
  },
  { key: "status", header: "Status", cell: (b) => <Status code={b.status} /> },
  { key: "planned", header: "Planned", cell: (b) => <span className="nowrap">{when(b.plannedAt, tz)}</span> },
  { key: "started", header: "Started", cell: (b) => <span className="nowrap">{when(b.startedAt, tz)}</span> },
  { key: "finished", header: "Finished", cell: (b) => <span className="nowrap">{when(b.completedAt, tz)}</span> },
  { key: "oil", header: "Target oil", numeric: true, cell: (b) => kg(b.targetOilG) },
  { key: "ratio", header: "Methanol ratio", numeric: true, cell: (b) => `${num(b.molarRatio, 1)} : 1` },
  { key: "catalyst", header: "Catalyst", cell: (b) => labelOf(b.catalyst) },
  {
    key: "products",
    header: "Product lots",
    cell: (b) =>
      b.productLots.length === 0 ? (
        <span className="muted">none</span>
      ) : (
        b.productLots.map((p, i) => (
          <span key={p}>
            {i > 0 ? ", " : ""}
            <Link href={`/products/${encodeURIComponent(p)}`}>{p}</Link>
          </span>
        ))
      ),
  },
  { key: "history", header: "History", cell: (b) => <HistoryLink kind="batch" recordKey={b.code} label="batch" /> },
];

export default async function BatchesPage({ searchParams }: { searchParams: Promise<{ page?: string | string[] }> }) {
  const { db, site } = await loadSite();
  if (!site) return <NoSite />;
  const page = pageParam((await searchParams).page);
  const { rows, total } = await listBatches(db, site.id, { skip: (page - 1) * PAGE_SIZE, take: PAGE_SIZE });
  const tz = site.timeZone;
  return (
    <>
      <h1>Batches</h1>
      <p className="lede">
        Reaction runs, newest first: planned, reacting, finished or voided, with the product lots each one made.
      </p>
      {total === 0 ? (
        <Empty>No batches recorded yet.</Empty>
      ) : (
        <>
          <DataTable
            caption="Batches"
            hideCaption
            columns={BATCH_COLUMNS(tz)}
            rows={rows}
            rowKey={(b) => b.code}
            empty="No batches recorded yet."
          />
          <Pager basePath="/batches" page={page} total={total} pageSize={PAGE_SIZE} />
        </>
      )}
    </>
  );
}
