import type { Metadata } from "next";
import Link from "next/link";
import { labelOf } from "@/lib/core/vocabulary";
import { listPickups } from "@/lib/feedstock/pickup.store";
import { kg, litres, num, when } from "@/app/_ui/format";
import { PAGE_SIZE, pageParam } from "@/app/_ui/links";
import { loadSite } from "@/app/_ui/site";
import { CodeLink, Empty, HistoryLink, NoSite, Pager } from "@/app/_ui/ui";

export const dynamic = "force-dynamic";
export const metadata: Metadata = { title: "Pickups" };

export default async function PickupsPage({ searchParams }: { searchParams: Promise<{ page?: string | string[] }> }) {
  const { db, site, user } = await loadSite();
  if (!site) return <NoSite />;
  const page = pageParam((await searchParams).page);
  // A collector sees their own entries; everyone else the whole site.
  const own = user.role === "COLLECTOR";
  const { rows, total } = await listPickups(db, site.id, {
    skip: (page - 1) * PAGE_SIZE,
    take: PAGE_SIZE,
    ...(own ? { collectorId: user.userId } : {}),
  });
  const tz = site.timeZone;
  return (
    <>
      <h1>Pickups</h1>
      <p className="lede">
        {own ? "Your pickups" : "Each collection of oil at a source"} as the collector observed it, newest first. Masses
        are estimated from volume and temperature until the lot is measured at the plant.
      </p>
      {total === 0 ? (
        <Empty>No pickups recorded yet.</Empty>
      ) : (
        <>
          <Pager basePath="/pickups" page={page} total={total} pageSize={PAGE_SIZE} />
          <div className="table-wrap">
            <table className="phone-cards">
              <thead>
                <tr>
                  <th scope="col">Pickup</th>
                  <th scope="col">Observed</th>
                  <th scope="col">Source</th>
                  <th scope="col">Collector</th>
                  <th scope="col">Material</th>
                  <th scope="col" className="num">
                    Containers
                  </th>
                  <th scope="col" className="num">
                    Volume
                  </th>
                  <th scope="col" className="num">
                    Temp.
                  </th>
                  <th scope="col" className="num">
                    Mass
                  </th>
                  <th scope="col">Lot</th>
                  <th scope="col">History</th>
                </tr>
              </thead>
              <tbody>
                {rows.map((p) => (
                  <tr key={p.code}>
                    <td data-label="Pickup" className="card-title">
                      <CodeLink href={`/pickups/${encodeURIComponent(p.code)}`} code={p.code} />
                    </td>
                    <td data-label="Observed" className="nowrap">
                      {when(p.observedAt, tz)}
                    </td>
                    <td data-label="Source">
                      <Link
                        href={`/sources/${encodeURIComponent(p.sourceCode)}`}
                        aria-label={`Source ${p.sourceCode} ${p.sourceName}`}
                      >
                        {p.sourceCode}
                      </Link>{" "}
                      <span className="muted">{p.sourceName}</span>
                    </td>
                    <td data-label="Collector">{p.collector}</td>
                    <td data-label="Material">{labelOf(p.material)}</td>
                    <td data-label="Containers" className="num">
                      {p.containers}
                    </td>
                    <td data-label="Volume" className="num">
                      {litres(p.volumeMl)}
                    </td>
                    <td data-label="Temp." className="num">
                      {num(p.tempC, 1)} °C
                    </td>
                    <td data-label="Mass" className="num">
                      {kg(p.massG)}
                    </td>
                    <td data-label="Lot">
                      {p.lotCode ? (
                        <CodeLink href={`/lots/${encodeURIComponent(p.lotCode)}`} code={p.lotCode} />
                      ) : (
                        <span className="muted">not yet</span>
                      )}
                    </td>
                    <td data-label="History">
                      <HistoryLink kind="pickup" recordKey={p.code} label="pickup" />
                    </td>
                  </tr>
                ))}
              </tbody>
            </table>
          </div>
          <Pager basePath="/pickups" page={page} total={total} pageSize={PAGE_SIZE} />
        </>
      )}
    </>
  );
}
