import type { Db } from "@/lib/core/connect";
import type { ReceiptsSeries, ReceiptWeek } from "@/lib/feedstock/receipts-series";
import { num } from "@/app/_ui/format";
import { DataTable } from "@/app/_ui/kit";
import type { Column } from "@/app/_ui/kit";
import { NoPicture, Picture } from "@/app/_ui/charts/picture";
import { keptReceiptsDrawing, materialLabel, RECEIPT_WEEKS } from "@/app/lots/lots-kept";

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
  const { series: s, drawn } = (await keptReceiptsDrawing(db, siteId, timeZone, now)).value;
  if (drawn === null) {
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
      svg={drawn.svg}
      summary={drawn.summary}
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
