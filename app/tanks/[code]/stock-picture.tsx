import type { Db } from "@/lib/core/connect";
import { PositionCache, quarterHourOf } from "@/lib/ledger/position";
import { keptAtPosition, questionKey } from "@/lib/ledger/position-cache.service";
import type { Kept } from "@/lib/ledger/position-cache.service";
import { getUtcOffsetMin } from "@/lib/period/site-time";
import { computeTankStockSeries } from "@/lib/tank/stock-series";
import type { StockPoint, TankStockSeries } from "@/lib/tank/stock-series";
import { loadTankStockHistory } from "@/lib/tank/stock-series.store";
import { day, kg, num, when } from "@/app/_ui/format";
import { DataTable } from "@/app/_ui/kit";
import { NoPicture, Picture } from "@/app/_ui/charts/picture";
import { PALETTE, renderPictureSvg } from "@/app/_ui/charts/render";

// The time axis is drawn in UTC from instants shifted by the site's offset, so its labels read as site time.
function siteX(at: number, timeZone: string): number {
  return at + getUtcOffsetMin(timeZone, new Date(at)) * 60_000;
}

const kgNumber = (grams: number) => Math.round(grams) / 1000;

type Series = TankStockSeries;
type Span = { first: number; last: number };

function stockChart(s: Series, { first, last }: Span, capacityG: number, timeZone: string): string {
  const book = [
    ...s.book.map((p) => [siteX(p.at, timeZone), kgNumber(p.stockG)]),
    [siteX(last, timeZone), kgNumber(s.closingG)],
  ];
  return renderPictureSvg(
    {
      useUTC: true,
      legend: { top: 0, itemGap: 26, data: ["Book stock", "Gauge readings", "Capacity"] },
      grid: { left: 78, right: 24, top: 56, bottom: 36 },
      xAxis: { type: "time", min: siteX(first, timeZone), max: siteX(last, timeZone) },
      yAxis: { type: "value", name: "kg", min: 0, axisLabel: { formatter: (v: number) => v.toLocaleString("en-GB") } },
      series: [
        {
          name: "Book stock",
          type: "line",
          step: "end",
          showSymbol: false,
          lineStyle: { width: 2 },
          itemStyle: { color: PALETTE[0] },
          data: book,
        },
        {
          name: "Gauge readings",
          type: "scatter",
          symbolSize: 9,
          itemStyle: { color: PALETTE[5] },
          data: s.gauges.map((g) => [siteX(g.at, timeZone), kgNumber(g.stockG)]),
        },
        {
          name: "Capacity",
          type: "line",
          showSymbol: false,
          lineStyle: { type: "dashed", width: 1.5 },
          itemStyle: { color: "#7a7a7a" },
          data: [
            [siteX(first, timeZone), kgNumber(capacityG)],
            [siteX(last, timeZone), kgNumber(capacityG)],
          ],
        },
      ],
    },
    { height: 320 },
  );
}

function stockSummary(s: Series, { first }: Span, code: string, capacityG: number, timeZone: string): string {
  const latest = s.gauges.at(-1);
  return (
    `Tank ${code}: book stock ${kg(s.closingG)} now, highest ${kg(s.peakG)} against a capacity of about ${kg(capacityG, 0)}; ` +
    `${kg(s.inG)} moved in and ${kg(s.outG)} out since ${day(new Date(first), timeZone)}; ` +
    (latest
      ? `${s.gauges.length} gauge readings, the latest ${kg(latest.stockG)} on ${day(new Date(latest.at), timeZone)}.`
      : "never gauged.")
  );
}

// The series and its drawing, kept by ledger position (decision 0037) and quarter-hour: bookings and
// gauge readings move the position; the time axis runs to the moment it was drawn, at most a
// quarter-hour before the page is shown.
interface StockDrawing {
  s: Series;
  drawn: { svg: string; summary: string } | null;
}
const home = globalThis as unknown as { tracevatTankPictures?: PositionCache<StockDrawing> };
const kept: PositionCache<StockDrawing> = (home.tracevatTankPictures ??= new PositionCache<StockDrawing>(100));

async function drawStock(
  db: Db,
  siteId: number,
  tank: { code: string; capacityG: number },
  timeZone: string,
  now: Date,
): Promise<StockDrawing> {
  const history = await loadTankStockHistory(db, siteId, tank.code);
  const s = computeTankStockSeries(history?.moves ?? [], history?.readings ?? [], tank.capacityG);
  const first = Math.min(s.book[0]?.at ?? Infinity, s.gauges[0]?.at ?? Infinity);
  const last = Math.max(now.getTime(), s.book.at(-1)?.at ?? 0, s.gauges.at(-1)?.at ?? 0);
  const span = { first, last };
  if (s.book.length === 0 && s.gauges.length === 0) return { s, drawn: null };
  return {
    s,
    drawn: {
      svg: stockChart(s, span, tank.capacityG, timeZone),
      summary: stockSummary(s, span, tank.code, tank.capacityG, timeZone),
    },
  };
}

/** Forgets every kept tank stock pictures (tests). */
export function clearTankPictures(): void {
  kept.clear();
}

export function keptStockDrawing(
  db: Db,
  siteId: number,
  tank: { code: string; capacityG: number },
  timeZone: string,
  now: Date,
): Promise<Kept<StockDrawing>> {
  const key = questionKey(siteId, null, tank.code, tank.capacityG, timeZone, quarterHourOf(now));
  return keptAtPosition(kept, db, siteId, key, () => drawStock(db, siteId, tank, timeZone, now));
}

export async function TankStockPicture({
  db,
  siteId,
  code,
  capacityG,
  timeZone,
  now,
}: {
  db: Db;
  siteId: number;
  code: string;
  capacityG: number;
  timeZone: string;
  now: Date;
}) {
  const id = "tank-stock";
  const title = "Stock over time";
  const { s, drawn } = (await keptStockDrawing(db, siteId, { code, capacityG }, timeZone, now)).value;
  if (drawn === null) {
    return (
      <NoPicture id={id} title={title}>
        Nothing has been moved into or out of this tank and it has not been gauged, so there is no stock to draw yet.
      </NoPicture>
    );
  }
  const steps = s.book.slice(1).map((p, i) => ({ ...p, changeG: p.stockG - (s.book[i]?.stockG ?? 0) }));
  return (
    <Picture
      id={id}
      title={title}
      svg={drawn.svg}
      summary={drawn.summary}
      numbers={
        <>
          <DataTable
            caption="Book stock after each booking"
            rows={steps}
            rowKey={(p) => p.at}
            empty="No bookings."
            columns={[
              { key: "at", header: "When", cell: (p) => when(new Date(p.at), timeZone) },
              { key: "change", header: "Change", unit: "kg", numeric: true, cell: (p) => num(p.changeG / 1000, 3) },
              { key: "stock", header: "Book stock", unit: "kg", numeric: true, cell: (p) => num(p.stockG / 1000, 3) },
            ]}
          />
          <DataTable<StockPoint>
            caption="Gauge readings"
            rows={s.gauges}
            rowKey={(p) => `${p.at}-${p.stockG}`}
            empty="Not gauged yet."
            columns={[
              { key: "at", header: "When", cell: (p) => when(new Date(p.at), timeZone) },
              { key: "mass", header: "Measured", unit: "kg", numeric: true, cell: (p) => num(p.stockG / 1000, 3) },
            ]}
          />
        </>
      }
    />
  );
}
