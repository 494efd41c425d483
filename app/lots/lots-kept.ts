import "server-only";
// The lots page's two reads kept by ledger position (decision 0037): a page of the lot list (each row
// gathers its titrations, water test, supplier and pickup count) and the receipts picture (the week's
// receipts query and the drawing on the server). Lots, lab results, receipts and stock changes all
// write an audit event or a movement, so they move the position and the next request reads again.
// The picture is also keyed by the site-time week it shows and the time zone's offset then.
import type { Db } from "@/lib/core/connect";
import { PositionCache } from "@/lib/ledger/position";
import { keptAtPosition, questionKey } from "@/lib/ledger/position-cache.service";
import type { Kept } from "@/lib/ledger/position-cache.service";
import { listLots } from "@/lib/feedstock/lot.store";
import type { LotRow } from "@/lib/feedstock/lot.store";
import { computeReceiptsSeries, weekStartMs } from "@/lib/feedstock/receipts-series";
import type { ReceiptsSeries, ReceiptWeek } from "@/lib/feedstock/receipts-series";
import { listFeedstockReceipts } from "@/lib/feedstock/receipts-series.store";
import { getUtcOffsetMin } from "@/lib/period/site-time";
import { labelOf } from "@/lib/core/vocabulary";
import { kg, num } from "@/app/_ui/format";
import { renderPictureSvg } from "@/app/_ui/charts/render";

export const RECEIPT_WEEKS = 12;
const WEEK_MS = 7 * 86_400_000;

export interface LotPage {
  rows: LotRow[];
  total: number;
}

/** The receipts of the last twelve site-time weeks, drawn: nothing to draw when none were received. */
export interface ReceiptsDrawing {
  series: ReceiptsSeries;
  drawn: { svg: string; summary: string } | null;
}

interface Caches {
  lotPages: PositionCache<LotPage>;
  receipts: PositionCache<ReceiptsDrawing>;
}
const home = globalThis as unknown as { tracevatLotsCaches?: Caches };
const caches: Caches = (home.tracevatLotsCaches ??= {
  lotPages: new PositionCache<LotPage>(100),
  receipts: new PositionCache<ReceiptsDrawing>(50),
});

export function keptLotPage(
  db: Db,
  siteId: number,
  query: { status?: string; skip: number; take: number },
): Promise<Kept<LotPage>> {
  return keptAtPosition(caches.lotPages, db, siteId, questionKey(siteId, query), () => listLots(db, siteId, query));
}

/** The twelve weeks ending with the one `now` falls in, Monday 00:00 site time. */
export function receiptWeeks(timeZone: string, now: Date): { offset: number; startMs: number; endMs: number } {
  const offset = getUtcOffsetMin(timeZone, now);
  const thisWeek = weekStartMs(now.getTime(), offset);
  return { offset, startMs: thisWeek - (RECEIPT_WEEKS - 1) * WEEK_MS, endMs: thisWeek + WEEK_MS };
}

export function materialLabel(material: string): string {
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

/** The receipts picture's series, drawing and sentence, kept by position, time zone and week. */
export function keptReceiptsDrawing(
  db: Db,
  siteId: number,
  timeZone: string,
  now: Date,
): Promise<Kept<ReceiptsDrawing>> {
  const { offset, startMs, endMs } = receiptWeeks(timeZone, now);
  const key = questionKey(siteId, null, timeZone, offset, startMs);
  return keptAtPosition(caches.receipts, db, siteId, key, async () => {
    const receipts = await listFeedstockReceipts(db, siteId, { from: new Date(startMs), to: new Date(endMs) });
    const series = computeReceiptsSeries(receipts, { startMs, endMs }, offset);
    return {
      series,
      drawn: series.totalG === 0 ? null : { svg: receiptsChart(series), summary: receiptsSummary(series) },
    };
  });
}

/** Forgets every kept lot page and receipts picture (tests). */
export function clearLotsCaches(): void {
  caches.lotPages.clear();
  caches.receipts.clear();
}
