import type { Metadata } from "next";
import { labelOf } from "@/lib/ledger/kinds";
import { listTankLevels } from "@/lib/site/dashboard.store";
import { gaugeVsBook } from "@/lib/tank/strapping";
import { kg, litres, when } from "@/app/_ui/format";
import { loadSite } from "@/app/_ui/site";
import { DensityNote, FillBar } from "@/app/_ui/tank-ui";
import { CodeLink, Empty, HistoryLink, NoSite } from "@/app/_ui/ui";

export const dynamic = "force-dynamic";
export const metadata: Metadata = { title: "Tanks" };

/** The last gauge against the book stock at its time, in kg and %. */
function vsBook(gaugeG: number, bookG: number): string {
  const d = gaugeVsBook(gaugeG, bookG);
  const sign = d.differenceG > 0 ? "+" : d.differenceG < 0 ? "−" : "";
  return `${sign}${kg(Math.abs(d.differenceG))}${d.differencePct === null ? "" : ` (${sign}${Math.abs(d.differencePct).toFixed(2)} %)`}`;
}

export default async function TanksPage() {
  const { db, site } = await loadSite();
  if (!site) return <NoSite />;
  const tanks = await listTankLevels(db, site.id);
  const tz = site.timeZone;
  return (
    <>
      <h1>Tanks</h1>
      <p className="lede">Storage tanks with their book stock from the ledger, and the latest gauge reading where one was taken, against the book stock at that time. Open a tank to move material or record a reading.</p>
      {tanks.length === 0 ? (
        <Empty>No tanks recorded yet.</Empty>
      ) : (
        <>
          <div className="table-wrap">
            <table>
              <thead>
                <tr>
                  <th scope="col">Tank</th>
                  <th scope="col">Name</th>
                  <th scope="col">Service</th>
                  <th scope="col">Mixing</th>
                  <th scope="col" className="num">
                    Capacity
                  </th>
                  <th scope="col" className="num">
                    Book stock
                  </th>
                  <th scope="col">Fill (estimate)</th>
                  <th scope="col" className="num">
                    Last gauge
                  </th>
                  <th scope="col">Gauged</th>
                  <th scope="col" className="num">
                    Gauge vs book then
                  </th>
                  <th scope="col">History</th>
                </tr>
              </thead>
              <tbody>
                {tanks.map((t) => (
                  <tr key={t.code}>
                    <td>
                      <CodeLink href={`/tanks/${encodeURIComponent(t.code)}`} code={t.code} />
                    </td>
                    <td>{t.name}</td>
                    <td>{labelOf(t.service)}</td>
                    <td>{labelOf(t.mixing)}</td>
                    <td className="num">{litres(t.capacityMl, 0)}</td>
                    <td className="num">{kg(t.stockG)}</td>
                    <td>
                      <FillBar tank={t} />
                    </td>
                    <td className="num">{t.lastGauge ? `${kg(t.lastGauge.massG)} · ${litres(t.lastGauge.volumeMl, 0)}` : "—"}</td>
                    <td className="nowrap">{t.lastGauge ? when(t.lastGauge.at, tz) : <span className="muted">never</span>}</td>
                    <td className="num">{t.lastGauge && t.lastGauge.bookStockG !== null ? vsBook(t.lastGauge.massG, t.lastGauge.bookStockG) : "—"}</td>
                    <td>
                      <HistoryLink kind="tank" recordKey={t.code} label="tank" />
                    </td>
                  </tr>
                ))}
              </tbody>
            </table>
          </div>
          <DensityNote tanks={tanks} />
        </>
      )}
    </>
  );
}
