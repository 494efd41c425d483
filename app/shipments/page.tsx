import type { Metadata } from "next";
import { listShipments } from "@/lib/product/product.store";
import { kg, litres, when } from "@/app/_ui/format";
import { PAGE_SIZE, pageParam } from "@/app/_ui/links";
import { loadSite } from "@/app/_ui/site";
import { CodeLink, Empty, HistoryLink, HolderLink, NoSite, Pager } from "@/app/_ui/ui";

export const dynamic = "force-dynamic";
export const metadata: Metadata = { title: "Shipments" };

export default async function ShipmentsPage({ searchParams }: { searchParams: Promise<{ page?: string | string[] }> }) {
  const { db, site } = await loadSite();
  if (!site) return <NoSite />;
  const page = pageParam((await searchParams).page);
  const { rows, total } = await listShipments(db, site.id, { skip: (page - 1) * PAGE_SIZE, take: PAGE_SIZE });
  const tz = site.timeZone;
  return (
    <>
      <h1>Shipments</h1>
      <p className="lede">Finished fuel leaving the site, newest first, with the lot or tank it was loaded from.</p>
      {total === 0 ? (
        <Empty>No shipments recorded yet.</Empty>
      ) : (
        <>
          <div className="table-wrap">
            <table>
              <thead>
                <tr>
                  <th scope="col">Document</th>
                  <th scope="col">Shipped</th>
                  <th scope="col">Customer</th>
                  <th scope="col">Loaded from</th>
                  <th scope="col" className="num">
                    Mass
                  </th>
                  <th scope="col" className="num">
                    Volume
                  </th>
                  <th scope="col">Certified claim</th>
                  <th scope="col">History</th>
                </tr>
              </thead>
              <tbody>
                {rows.map((s) => (
                  <tr key={s.documentNo}>
                    <td>
                      <CodeLink href={`/shipments/${encodeURIComponent(s.documentNo)}`} code={s.documentNo} />
                    </td>
                    <td className="nowrap">{when(s.shippedAt, tz)}</td>
                    <td>{s.customer}</td>
                    <td>
                      <HolderLink holder={s.from} />
                    </td>
                    <td className="num">{kg(s.massG)}</td>
                    <td className="num">{litres(s.volumeMl)}</td>
                    <td>{s.certifiedClaim ? "Yes" : "No"}</td>
                    <td>
                      <HistoryLink kind="shipment" recordKey={s.documentNo} label="shipment" />
                    </td>
                  </tr>
                ))}
              </tbody>
            </table>
          </div>
          <Pager basePath="/shipments" page={page} total={total} pageSize={PAGE_SIZE} />
        </>
      )}
    </>
  );
}
