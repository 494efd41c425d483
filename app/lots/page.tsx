import type { Metadata } from "next";
import Link from "next/link";
import { LOT_STATUSES, labelOf } from "@/lib/ledger/kinds";
import { listLots } from "@/lib/feedstock/lot.store";
import { ffa, kg, pct, when } from "@/app/_ui/format";
import { PAGE_SIZE, pageParam } from "@/app/_ui/links";
import { loadSite } from "@/app/_ui/site";
import { CodeLink, Empty, HistoryLink, NoSite, Note, Pager, Status } from "@/app/_ui/ui";

export const dynamic = "force-dynamic";
export const metadata: Metadata = { title: "Feedstock lots" };

type Props = { searchParams: Promise<{ page?: string | string[]; status?: string | string[] }> };

export default async function LotsPage({ searchParams }: Props) {
  const { db, site } = await loadSite();
  if (!site) return <NoSite />;
  const sp = await searchParams;
  const page = pageParam(sp.page);
  const rawStatus = Array.isArray(sp.status) ? sp.status[0] : sp.status;
  const status = LOT_STATUSES.find((s) => s === rawStatus);
  const { rows, total } = await listLots(db, site.id, { skip: (page - 1) * PAGE_SIZE, take: PAGE_SIZE, ...(status ? { status } : {}) });
  const tz = site.timeZone;
  const query: Record<string, string> = status ? { status } : {};
  return (
    <>
      <h1>Feedstock lots</h1>
      <p className="lede">Oil as received at the plant, from pooled pickups or a supplier&apos;s delivery. A lot waits for the lab until its FFA is titrated and it is accepted or rejected.</p>
      <nav className="pager" aria-label="Filter by status">
        {status ? <Link href="/lots">All</Link> : <span className="pager-current" aria-current="page">All</span>}
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
          <div className="table-wrap">
            <table>
              <thead>
                <tr>
                  <th scope="col">Lot</th>
                  <th scope="col">Received</th>
                  <th scope="col">Material</th>
                  <th scope="col">From</th>
                  <th scope="col">Status</th>
                  <th scope="col" className="num">
                    FFA
                  </th>
                  <th scope="col" className="num">
                    Water
                  </th>
                  <th scope="col" className="num">
                    Received mass
                  </th>
                  <th scope="col" className="num">
                    Book stock
                  </th>
                  <th scope="col">History</th>
                </tr>
              </thead>
              <tbody>
                {rows.map((l) => (
                  <tr key={l.code}>
                    <td>
                      <CodeLink href={`/lots/${encodeURIComponent(l.code)}`} code={l.code} />
                      {l.certified ? <span className="tag">certified</span> : null}
                    </td>
                    <td className="nowrap">{when(l.receivedAt, tz)}</td>
                    <td>{labelOf(l.material)}</td>
                    <td>{l.origin === "DELIVERY" ? (l.supplier ?? "Delivery") : `${l.pickups} pickup${l.pickups === 1 ? "" : "s"}`}</td>
                    <td>
                      <Status code={l.status} />
                    </td>
                    <td className="num">{ffa(l.ffaPct, l.ffaBasis)}</td>
                    <td className="num">{pct(l.waterPct)}</td>
                    <td className="num">{kg(l.massG)}</td>
                    <td className="num">{kg(l.stockG)}</td>
                    <td>
                      <HistoryLink kind="lot" recordKey={l.code} label="lot" />
                    </td>
                  </tr>
                ))}
              </tbody>
            </table>
          </div>
          <Pager basePath="/lots" page={page} total={total} pageSize={PAGE_SIZE} query={query} />
          <Note>FFA is the mean of the lot&apos;s titrations that are not voided, each converted through its acid value when they name different fatty acids; water is the latest water test.</Note>
        </>
      )}
    </>
  );
}
