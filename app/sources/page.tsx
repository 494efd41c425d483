import type { Metadata } from "next";
import { labelOf } from "@/lib/ledger/kinds";
import { listSources } from "@/lib/source/source.store";
import { day } from "@/app/_ui/format";
import { loadSite } from "@/app/_ui/site";
import { CodeLink, Empty, HistoryLink, NoSite } from "@/app/_ui/ui";

export const dynamic = "force-dynamic";
export const metadata: Metadata = { title: "Sources" };

export default async function SourcesPage() {
  const { db, site } = await loadSite();
  if (!site) return <NoSite />;
  const rows = await listSources(db, site.id);
  const now = new Date();
  return (
    <>
      <h1>Sources</h1>
      <p className="lede">Restaurants, food processors, renderers, crushers and other suppliers the plant collects from or buys from.</p>
      {rows.length === 0 ? (
        <Empty>No sources recorded yet.</Empty>
      ) : (
        <div className="table-wrap">
          <table>
            <thead>
              <tr>
                <th scope="col">Code</th>
                <th scope="col">Name</th>
                <th scope="col">Kind</th>
                <th scope="col">Materials</th>
                <th scope="col">Certificate</th>
                <th scope="col" className="num">
                  Pickup every
                </th>
                <th scope="col" className="num">
                  Pickups
                </th>
                <th scope="col">Last pickup</th>
                <th scope="col">History</th>
              </tr>
            </thead>
            <tbody>
              {rows.map((s) => (
                <tr key={s.code}>
                  <td>
                    <CodeLink href={`/sources/${encodeURIComponent(s.code)}`} code={s.code} />
                  </td>
                  <td>{s.name}</td>
                  <td>{labelOf(s.kind)}</td>
                  <td>{s.materials.map(labelOf).join(", ")}</td>
                  <td>
                    {s.certificateNo ? (
                      <>
                        {s.certificateNo}{" "}
                        {s.certificateExpires && s.certificateExpires < now ? (
                          <span className="status status-fail">expired {day(s.certificateExpires, site.timeZone)}</span>
                        ) : (
                          <span className="muted">to {day(s.certificateExpires, site.timeZone)}</span>
                        )}
                      </>
                    ) : (
                      <span className="muted">none</span>
                    )}
                  </td>
                  <td className="num">{s.pickupEveryDays === null ? "—" : `${s.pickupEveryDays} d`}</td>
                  <td className="num">{s.pickups}</td>
                  <td className="nowrap">{day(s.lastPickupAt, site.timeZone)}</td>
                  <td>
                    <HistoryLink kind="source" recordKey={s.code} label="source" />
                  </td>
                </tr>
              ))}
            </tbody>
          </table>
        </div>
      )}
    </>
  );
}
