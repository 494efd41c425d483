import type { Metadata } from "next";
import Link from "next/link";
import { listProductLots } from "@/lib/product/product.store";
import { kg, when } from "@/app/_ui/format";
import { PAGE_SIZE, pageParam } from "@/app/_ui/links";
import { loadSite } from "@/app/_ui/site";
import { CodeLink, Empty, HistoryLink, NoSite, Pager, Status } from "@/app/_ui/ui";

export const dynamic = "force-dynamic";
export const metadata: Metadata = { title: "Product lots" };

export default async function ProductsPage({ searchParams }: { searchParams: Promise<{ page?: string | string[] }> }) {
  const { db, site } = await loadSite();
  if (!site) return <NoSite />;
  const page = pageParam((await searchParams).page);
  const { rows, total } = await listProductLots(db, site.id, { skip: (page - 1) * PAGE_SIZE, take: PAGE_SIZE });
  const tz = site.timeZone;
  return (
    <>
      <h1>Product lots</h1>
      <p className="lede">Ester from each batch, held until its quality-control results are in and then released or rejected. Only released lots ship.</p>
      {total === 0 ? (
        <Empty>No product lots recorded yet.</Empty>
      ) : (
        <>
          <div className="table-wrap">
            <table>
              <thead>
                <tr>
                  <th scope="col">Product lot</th>
                  <th scope="col">Batch</th>
                  <th scope="col">Produced</th>
                  <th scope="col" className="num">
                    Mass made
                  </th>
                  <th scope="col" className="num">
                    Book stock
                  </th>
                  <th scope="col">QC</th>
                  <th scope="col">Release</th>
                  <th scope="col">Released</th>
                  <th scope="col">History</th>
                </tr>
              </thead>
              <tbody>
                {rows.map((p) => (
                  <tr key={p.code}>
                    <td>
                      <CodeLink href={`/products/${encodeURIComponent(p.code)}`} code={p.code} />
                    </td>
                    <td>{p.batchCode ? <Link href={`/batches/${encodeURIComponent(p.batchCode)}`}>{p.batchCode}</Link> : "—"}</td>
                    <td className="nowrap">{when(p.producedAt, tz)}</td>
                    <td className="num">{kg(p.massG)}</td>
                    <td className="num">{kg(p.stockG)}</td>
                    <td>
                      {p.qcCount === 0 ? (
                        <span className="muted">no results</span>
                      ) : p.qcFailed > 0 ? (
                        <span className="status status-fail">
                          {p.qcFailed} of {p.qcCount} fail
                        </span>
                      ) : (
                        <span className="status status-pass">all {p.qcCount} pass</span>
                      )}
                    </td>
                    <td>
                      <Status code={p.status} />
                    </td>
                    <td className="nowrap">{when(p.releasedAt, tz)}</td>
                    <td>
                      <HistoryLink kind="product" recordKey={p.code} label="product lot" />
                    </td>
                  </tr>
                ))}
              </tbody>
            </table>
          </div>
          <Pager basePath="/products" page={page} total={total} pageSize={PAGE_SIZE} />
        </>
      )}
    </>
  );
}
