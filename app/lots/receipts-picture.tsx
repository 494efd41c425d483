import type { Db } from "@/lib/core/connect";
import { labelOf } from "@/lib/core/vocabulary";
import { computeReceiptsSeries, weekStartMs } from "@/lib/feedstock/receipts-series";
import type { ReceiptsSeries, ReceiptWeek } from "@/lib/feedstock/receipts-series";
import { listFeedstockReceipts } from "@/lib/feedstock/receipts-series.store";
import { getUtcOffsetMin } from "@/lib/period/site-time";
import { kg, num } from "@/app/_ui/format";
import { DataTable } from "@/app/_ui/kit";
import type { Column } from "@/app/_ui/kit";
import { NoPicture, Picture } from "@/app/_ui/charts/picture";
import { renderPictureSvg } from "@/app/_ui/charts/render";

export const RECEIPT_WEEKS = 12;
const WEEK_MS = 7 * 86_400_000;

function materialLabel(material: string): string {
  return material === "MIXED_FEEDSTOCK" ? "Straight into a tank" : labelOf(material);
}

function shortDay(weekOf: string): string {
  return new Date(`${weekOf}T00:00:00Z`).toLocaleDateString("en-GB", {
    day: "numeric",
    month: "short",
    timeZone: "UTC",
  });
}

function receiptsChart(s: ReceiptsSeries): string {
  return renderPictureSvg(
    {
      legend: { top: 0, itemGap: 26 },
      grid: { left: 78, right: 16, top: 56, bottom: 36 },
      xAxis: { type: "category", data: s.weeks.map((w) => shortDay(w.weekOf)) },
      yAxis: { type: "value", name: "kg", axisLabel: { formatter: (v: number) => v.toLocaleString("en-GB") } },
      series: s.materials.map((m) => ({
        name: materialLabel(m),
        type: "bar",
        stack: "received",
        barMaxWidth: 40,
        data: s.weeks.map((w) => (w.byMaterial[m] ?? 0) / 1000),
      })),
    },
    { height: 320 },
  );
}

function receiptsSummary(s: ReceiptsSeries): string {
  const top = s.materials[0] ?? "";
  const busiest = s.weeks.reduce<ReceiptWeek | null>((b, w) => (b === null || w.totalG > b.totalG ? w : b), null);
  return (
    `${kg(s.totalG, 0)} of feedstock received in the ${RECEIPT_WEEKS} weeks from ${s.weeks[0]?.weekOf ?? ""}, ` +
    `${num((100 * (s.totalsByMaterial[top] ?? 0)) / s.totalG, 0)} % of it ${materialLabel(top).toLowerCase()}` +
    (busiest ? `; the most in the week of ${busiest.weekOf}, ${kg(busiest.totalG, 0)}.` : ".")
  );
}

function receiptsColumns(s: ReceiptsSeries): Array<Column<ReceiptWeek>> {
  return [
    { key: "week", header: "Week of", cell: (w) => w.weekOf, total: "Total" },
    ...s.materials.map((m): Column<ReceiptWeek> => ({
      key: m,
      header: materialLabel(m),
      unit: "kg",
      numeric: true,
      cell: (w) => num((w.byMaterial[m] ?? 0) / 1000, 3),
      total: num((s.totalsByMaterial[m] ?? 0) / 1000, 3),
    })),
    {
      key: "total",
      header: "All kinds",
      unit: "kg",
      numeric: true,
      cell: (w) => num(w.totalG / 1000, 3),
      total: num(s.totalG / 1000, 3),
    },
  ];
}

/** Feedstock received per week over the last twelve weeks, stacked by material kind. */
export async function ReceiptsPicture({
  db,
  siteId,
  timeZone,
  now,
}: {
  db: Db;
  siteId: number;
  timeZone: string;
  now: Date;
}) {
  const id = "receipts-per-week";
  const title = `Feedstock received per week, last ${RECEIPT_WEEKS} weeks`;
  const offset = getUtcOffsetMin(timeZone, now);
  const thisWeek = weekStartMs(now.getTime(), offset);
  const range = { startMs: thisWeek - (RECEIPT_WEEKS - 1) * WEEK_MS, endMs: thisWeek + WEEK_MS };
  const receipts = await listFeedstockReceipts(db, siteId, {
    from: new Date(range.startMs),
    to: new Date(range.endMs),
  });
  const s = computeReceiptsSeries(receipts, range, offset);
  if (s.totalG === 0) {
    return (
      <NoPicture id={id} title={title}>
        No feedstock was received in the last {RECEIPT_WEEKS} weeks.
      </NoPicture>
    );
  }
  return (
    <Picture
      id={id}
      title={title}
      svg={receiptsChart(s)}
      summary={receiptsSummary(s)}
      numbers={
        <>
          <DataTable
            caption="Feedstock received per week, by material"
            rows={s.weeks}
            rowKey={(w) => w.weekOf}
            empty="Nothing received."
            columns={receiptsColumns(s)}
          />
          <p className="muted">
            Pickups count when collected, deliveries when received, and a lot measured above its pickups&apos; estimates
            adds the difference; weeks start on Monday, site time.
          </p>
        </>
      }
    />
  );
}
