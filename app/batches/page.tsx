import type { Metadata } from "next";
import Link from "next/link";
import { labelOf } from "@/lib/ledger/kinds";
import { listBatches } from "@/lib/batch/batch.store";
import { kg, num, when } from "@/app/_ui/format";
import { PAGE_SIZE, pageParam } from "@/app/_ui/links";
import { loadSite } from "@/app/_ui/site";
import { CodeLink, Empty, HistoryLink, NoSite, Pager, Status } from "@/app/_ui/ui";

export const dynamic = "force-dynamic";
export const metadata: Metadata = { title: "Batches" };

export default async function BatchesPage({ searchParams }: { searchParams: Promise<{ page?: string | string[] }> }) {
  const { db, site } = await loadSite();
  if (!site) return <NoSite />;
  const page = pageParam((await searchParams).page);
  const { rows, total } = await listBatches(db, site.id, { skip: (page - 1) * PAGE_SIZE, take: PAGE_SIZE });
  const tz = site.timeZone;
  return (
    <>
      <h1>Batches</h1>
      <p className="lede">Reaction runs, newest first: planned, reacting, finished or voided, with the product lots each one made.</p>
      {total === 0 ? (
        <Empty>No batches recorded yet.</Empty>
      ) : (
        <>
          <div className="table-wrap">
            <table>
              <thead>
                <tr>
                  <th scope="col">Batch</th>
                  <th scope="col">Status</th>
                  <th scope="col">Planned</th>
                  <th scope="col">Started</th>
                  <th scope="col">Finished</th>
                  <th scope="col" className="num">
                    Target oil
                  </th>
                  <th scope="col" className="num">
                    Methanol ratio
                  </th>
                  <th scope="col">Catalyst</th>
                  <th scope="col">Product lots</th>
                  <th scope="col">History</th>
                </tr>
              </thead>
              <tbody>
                {rows.map((b) => (
                  <tr key={b.code}>
                    <td>
                      <CodeLink href={`/batches/${encodeURIComponent(b.code)}`} code={b.code} />
                      {b.pretreated ? <span className="tag">pretreated</span> : null}
                    </td>
                    <td>
                      <Status code={b.status} />
                    </td>
                    <td className="nowrap">{when(b.plannedAt, tz)}</td>
                    <td className="nowrap">{when(b.startedAt, tz)}</td>
                    <td className="nowrap">{when(b.completedAt, tz)}</td>
                    <td className="num">{kg(b.targetOilG)}</td>
                    <td className="num">{num(b.molarRatio, 1)} : 1</td>
                    <td>{labelOf(b.catalyst)}</td>
                    <td>
                      {b.productLots.length === 0 ? (
                        <span className="muted">none</span>
                      ) : (
                        b.productLots.map((p, i) => (
                          <span key={p}>
                            {i > 0 ? ", " : ""}
                            <Link href={`/products/${encodeURIComponent(p)}`}>{p}</Link>
                          </span>
                        ))
                      )}
                    </td>
                    <td>
                      <HistoryLink kind="batch" recordKey={b.code} label="batch" />
                    </td>
                  </tr>
                ))}
              </tbody>
            </table>
          </div>
          <Pager basePath="/batches" page={page} total={total} pageSize={PAGE_SIZE} />
        </>
      )}
    </>
  );
}
