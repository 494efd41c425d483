import type { Metadata } from "next";
import { labelOf } from "@/lib/core/vocabulary";
import { listTankLevels } from "@/lib/tank/tank.store";
import { gaugeVsBook } from "@/lib/tank/strapping";
import { kg, litres, when } from "@/app/_ui/format";
import { loadSite } from "@/app/_ui/site";
import { DensityNote, FillBar } from "@/app/_ui/tank-ui";
import { CodeLink, Empty, HistoryLink, NoSite } from "@/app/_ui/ui";
import type { Column } from "@/app/_ui/kit";
import { DataTable } from "@/app/_ui/kit";

export const dynamic = "force-dynamic";
export const metadata: Metadata = { title: "Tanks" };

/** The last gauge against the book stock at its time, in kg and %. */
function vsBook(gaugeG: number, bookG: number): string {
  const d = gaugeVsBook(gaugeG, bookG);
  const sign = d.differenceG > 0 ? "+" : d.differenceG < 0 ? "−" : "";
  return `${sign}${kg(Math.abs(d.differenceG))}${d.differencePct === null ? "" : ` (${sign}${Math.abs(d.differencePct).toFixed(2)} %)`}`;
}

type TankRow = Awaited<ReturnType<typeof listTankLevels>>[number];

const tankColumns = (tz: string): Column<TankRow>[] => [
  {
    key: "tank",
    header: "Tank",
    cell: (t) => <CodeLink href={`/tanks/${encodeURIComponent(t.code)}`} code={t.code} />,
  },
  { key: "name", header: "Name", cell: (t) => t.name },
  { key: "service", header: "Service", cell: (t) => labelOf(t.service) },
  { key: "mixing", header: "Mixing", cell: (t) => labelOf(t.mixing) },
  { key: "capacity", header: "Capacity", numeric: true, cell: (t) => litres(t.capacityMl, 0) },
  { key: "stock", header: "Book stock", numeric: true, cell: (t) => kg(t.stockG) },
  { key: "fill", header: "Fill (estimate)", cell: (t) => <FillBar tank={t} /> },
  {
    key: "gauge",
    header: "Last gauge",
    numeric: true,
    cell: (t) => (t.lastGauge ? `${kg(t.lastGauge.massG)} · ${litres(t.lastGauge.volumeMl, 0)}` : "—"),
  },
  {
    key: "gauged",
    header: "Gauged",
    cell: (t) =>
      t.lastGauge ? <span className="nowrap">{when(t.lastGauge.at, tz)}</span> : <span className="muted">never</span>,
  },
  {
    key: "vs",
    header: "Gauge vs book then",
    numeric: true,
    cell: (t) =>
      t.lastGauge && t.lastGauge.bookStockG !== null ? vsBook(t.lastGauge.massG, t.lastGauge.bookStockG) : "—",
  },
  { key: "history", header: "History", cell: (t) => <HistoryLink kind="tank" recordKey={t.code} label="tank" /> },
];

export default async function TanksPage() {
  const { db, site } = await loadSite();
  if (!site) return <NoSite />;
  const tanks = await listTankLevels(db, site.id);
  const tz = site.timeZone;
  return (
    <>
      <h1>Tanks</h1>
      <p className="lede">
        Storage tanks with their book stock from the ledger, and the latest gauge reading where one was taken, against
        the book stock at that time. Open a tank to move material or record a reading.
      </p>
      {tanks.length === 0 ? (
        <Empty>No tanks recorded yet.</Empty>
      ) : (
        <>
          <DataTable
            caption="Tanks"
            hideCaption
            columns={tankColumns(tz)}
            rows={tanks}
            rowKey={(t) => t.code}
            empty="No tanks recorded yet."
          />
          <DensityNote tanks={tanks} />
        </>
      )}
    </>
  );
}
