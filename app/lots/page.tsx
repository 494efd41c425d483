import type { Metadata } from "next";
import Link from "next/link";
import { LOT_STATUSES, labelOf } from "@/lib/core/vocabulary";
import type { LotRow } from "@/lib/feedstock/lot.store";
import { ffa, kg, pct, when } from "@/app/_ui/format";
import { PAGE_SIZE, pageParam } from "@/app/_ui/links";
import { loadSite } from "@/app/_ui/site";
import { Empty, NoSite, Note, Pager } from "@/app/_ui/ui";
import { PlainTable } from "@/app/_ui/kit/plain-table";
import type { PlainColumn } from "@/app/_ui/kit/plain-table";
import { codePart, historyPart, statusPart } from "@/app/_ui/kit/plain-cell";
import { ReceiptsPicture } from "@/app/lots/receipts-picture";
import { keptLotPage } from "@/app/lots/lots-kept";

export const dynamic = "force-dynamic";
export const metadata: Metadata = { title: "Feedstock lots" };

const LOT_COLUMNS = (tz: string): PlainColumn<LotRow>[] => [
  {
    key: "lot",
    header: "Lot",
    cell: (l) => [
      codePart(`/lots/${encodeURIComponent(l.code)}`, l.code),
      ...(l.certified ? [{ text: "certified", className: "tag" }] : []),
    ],
  },
  { key: "received", header: "Received", cell: (l) => [{ text: when(l.receivedAt, tz), className: "nowrap" }] },
  { key: "material", header: "Material", cell: (l) => labelOf(l.material) },
  {
    key: "from",
    header: "From",
    cell: (l) =>
      l.origin === "DELIVERY" ? (l.supplier ?? "Delivery") : `${l.pickups} pickup${l.pickups === 1 ? "" : "s"}`,
  },
  { key: "status", header: "Status", cell: (l) => [statusPart(l.status)] },
  { key: "ffa", header: "FFA", numeric: true, cell: (l) => ffa(l.ffaPct, l.ffaBasis) },
  { key: "water", header: "Water", numeric: true, cell: (l) => pct(l.waterPct) },
  { key: "mass", header: "Received mass", numeric: true, cell: (l) => kg(l.massG) },
  { key: "stock", header: "Book stock", numeric: true, cell: (l) => kg(l.stockG) },
  { key: "history", header: "History", cell: (l) => [historyPart("lot", l.code, "lot")] },
];

type Props = { searchParams: Promise<{ page?: string | string[]; status?: string | string[] }> };

export default async function LotsPage({ searchParams }: Props) {
  const { db, site, user } = await loadSite();
  if (!site) return <NoSite />;
  const sp = await searchParams;
  const page = pageParam(sp.page);
  const rawStatus = Array.isArray(sp.status) ? sp.status[0] : sp.status;
  const status = LOT_STATUSES.find((s) => s === rawStatus);
  const { rows, total } = (
    await keptLotPage(db, site.id, { skip: (page - 1) * PAGE_SIZE, take: PAGE_SIZE, ...(status ? { status } : {}) })
  ).value;
  const tz = site.timeZone;
  const query: Record<string, string> = status ? { status } : {};
  return (
    <>
      <h1>Feedstock lots</h1>
      <p className="lede">
        Oil as received at the plant, from pooled pickups or a supplier&apos;s delivery. A lot waits for the lab until
        its FFA is titrated and it is accepted or rejected.
      </p>
      <nav className="pager" aria-label="Filter by status">
        {status ? (
          <Link href="/lots">All</Link>
        ) : (
          <span className="pager-current" aria-current="page">
            All
          </span>
        )}
        {LOT_STATUSES.map((s) =>
          s === status ? (
            <span key={s} className="pager-current" aria-current="page">
              {labelOf(s)}
            </span>
          ) : (
            <Link key={s} href={`/lots?status=${s}`}>
              {labelOf(s)}
            </Link>
          ),
        )}
      </nav>
      {total === 0 ? (
        <Empty>{status ? `No lots are “${labelOf(status).toLowerCase()}”.` : "No lots recorded yet."}</Empty>
      ) : (
        <>
          <PlainTable
            caption="Feedstock lots"
            hideCaption
            columns={LOT_COLUMNS(tz)}
            rows={rows}
            rowKey={(l) => l.code}
            empty="No lots recorded yet."
          />
          <Pager basePath="/lots" page={page} total={total} pageSize={PAGE_SIZE} query={query} />
          <Note>
            FFA is the mean of the lot&apos;s titrations that are not voided, each converted through its acid value when
            they name different fatty acids; water is the latest water test.
          </Note>
        </>
      )}
      <ReceiptsPicture db={db} siteId={site.id} timeZone={tz} now={user.now} />
    </>
  );
}
