import type { Db } from "@/lib/core/connect";
import { PositionCache } from "@/lib/ledger/position";
import { keptAtPosition, questionKey } from "@/lib/ledger/position-cache.service";
import type { Kept } from "@/lib/ledger/position-cache.service";
import { labelOf } from "@/lib/core/vocabulary";
import { computeFfaBySource } from "@/lib/feedstock/ffa-series";
import type { FfaPoint, SourceFfaSeries } from "@/lib/feedstock/ffa-series";
import { listSourceLotsWithFfa } from "@/lib/feedstock/ffa-series.store";
import { getUtcOffsetMin } from "@/lib/period/site-time";
import { day, num, pct } from "@/app/_ui/format";
import { DataTable } from "@/app/_ui/kit";
import type { Column } from "@/app/_ui/kit";
import { NoPicture, Picture } from "@/app/_ui/charts/picture";
import { renderPictureSvg } from "@/app/_ui/charts/render";

const PAD_MS = 4 * 86_400_000;

function siteX(at: number, timeZone: string): number {
  return at + getUtcOffsetMin(timeZone, new Date(at)) * 60_000;
}

function ffaChart(s: SourceFfaSeries, timeZone: string): string {
  const materials = [...new Set(s.points.map((p) => p.material))].sort();
  const first = s.points[0]?.at ?? 0;
  const last = s.points.at(-1)?.at ?? 0;
  return renderPictureSvg(
    {
      useUTC: true,
      legend: { top: 0, itemGap: 26 },
      grid: { left: 56, right: 24, top: 40, bottom: 36 },
      // A few days either side, so the first and last lots are not cut by the axes.
      xAxis: { type: "time", min: siteX(first, timeZone) - PAD_MS, max: siteX(last, timeZone) + PAD_MS },
      yAxis: { type: "value", name: "FFA %", min: 0 },
      series: materials.map((m, i) => ({
        name: labelOf(m),
        type: "scatter",
        symbolSize: 10,
        data: s.points
          .filter((p) => p.material === m)
          .map((p) => [siteX(p.at, timeZone), Math.round(p.ffaPct * 100) / 100]),
        ...(i === 0 && s.massWeightedPct !== null
          ? {
              markLine: {
                silent: true,
                symbol: "none",
                lineStyle: { type: "dashed", color: "#4a524e" },
                label: { formatter: "mean by mass", position: "insideEndTop" },
                data: [{ yAxis: Math.round(s.massWeightedPct * 100) / 100 }],
              },
            }
          : {}),
      })),
    },
    { height: 300 },
  );
}

function ffaSummary(s: SourceFfaSeries, code: string, timeZone: string): string {
  const latest = s.points.at(-1);
  return (
    `${s.points.length} lots with material from source ${code} titrated: FFA from ${pct(s.minPct)} to ${pct(s.maxPct)}, ${pct(s.massWeightedPct)} weighted by mass` +
    (latest
      ? `; the latest, lot ${latest.lotCode} received ${day(new Date(latest.at), timeZone)}, ${pct(latest.ffaPct)}`
      : "") +
    (s.untested > 0 ? `; ${s.untested} more awaiting titration.` : ".")
  );
}

const ffaColumns = (timeZone: string): Array<Column<FfaPoint>> => [
  { key: "lot", header: "Lot", cell: (p) => p.lotCode },
  { key: "received", header: "Received", cell: (p) => day(new Date(p.at), timeZone) },
  { key: "material", header: "Material", cell: (p) => labelOf(p.material) },
  { key: "mass", header: "Lot mass", unit: "kg", numeric: true, cell: (p) => num(p.massG / 1000, 1) },
  { key: "ffa", header: "FFA", unit: "%", numeric: true, cell: (p) => num(p.ffaPct, 2) },
];

// The series and its drawing, kept by ledger position (decision 0037): titrations, voids, lots and
// pickups all move the position, and the next request reads the source's lots again.
interface FfaDrawing {
  s: SourceFfaSeries | undefined;
  drawn: { svg: string; summary: string } | null;
}
const home = globalThis as unknown as { tracevatFfaPictures?: PositionCache<FfaDrawing> };
const kept: PositionCache<FfaDrawing> = (home.tracevatFfaPictures ??= new PositionCache<FfaDrawing>(100));

async function drawFfa(
  db: Db,
  siteId: number,
  source: { id: number; code: string },
  timeZone: string,
): Promise<FfaDrawing> {
  const lots = await listSourceLotsWithFfa(db, siteId, source.id);
  const s = computeFfaBySource(lots).find((x) => x.sourceCode === source.code);
  if (!s || s.points.length === 0) return { s, drawn: null };
  return { s, drawn: { svg: ffaChart(s, timeZone), summary: ffaSummary(s, source.code, timeZone) } };
}

/** Forgets every kept source FFA pictures (tests). */
export function clearFfaPictures(): void {
  kept.clear();
}

export function keptFfaDrawing(
  db: Db,
  siteId: number,
  source: { id: number; code: string },
  timeZone: string,
): Promise<Kept<FfaDrawing>> {
  const key = questionKey(siteId, null, source.id, source.code, timeZone);
  return keptAtPosition(kept, db, siteId, key, () => drawFfa(db, siteId, source, timeZone));
}

/** The FFA of the lots this source supplied, by date received, one colour per material kind. */
export async function SourceFfaPicture({
  db,
  siteId,
  source,
  timeZone,
}: {
  db: Db;
  siteId: number;
  source: { id: number; code: string };
  timeZone: string;
}) {
  const id = "source-ffa";
  const title = "FFA of the lots from this source";
  const { s, drawn } = (await keptFfaDrawing(db, siteId, source, timeZone)).value;
  if (!s || drawn === null) {
    return (
      <NoPicture id={id} title={title}>
        {s && s.untested > 0
          ? `None of the ${s.untested} lots with material from this source has been titrated yet.`
          : "No lot has been received with material from this source yet."}
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
          <DataTable<FfaPoint>
            caption="Lots with material from this source"
            rows={s.points}
            rowKey={(p) => p.lotCode}
            empty="No lots titrated."
            columns={ffaColumns(timeZone)}
          />
          <p className="muted">
            A lot pooled from several sources&apos; pickups counts for each of them; its FFA is the mean of its
            titrations that are not voided.
          </p>
        </>
      }
    />
  );
}
