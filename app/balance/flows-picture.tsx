import type { Db } from "@/lib/core/connect";
import { PositionCache } from "@/lib/ledger/position";
import { keptAtPosition, questionKey } from "@/lib/ledger/position-cache.service";
import type { Kept } from "@/lib/ledger/position-cache.service";
import { computePeriodFlows } from "@/lib/mass-balance/flows";
import type { FlowLink, FlowNode, PeriodFlows } from "@/lib/mass-balance/flows";
import { loadFlowLedger } from "@/lib/mass-balance/flows.store";
import { kg, num } from "@/app/_ui/format";
import { DataTable } from "@/app/_ui/kit";
import { NoPicture, Picture } from "@/app/_ui/charts/picture";
import { PALETTE, renderPictureSvg } from "@/app/_ui/charts/render";

/** Six steps side by side need more room than the other pictures. */
const FLOWS_WIDTH = 960;

const STAGE_COLOUR = [PALETTE[1], PALETTE[0], PALETTE[4], PALETTE[5], PALETTE[2], PALETTE[3]] as const;

function sumInto(nodes: readonly FlowNode[], key: string): number {
  return nodes.find((n) => n.key === key)?.inG ?? 0;
}

function describe(nodes: readonly FlowNode[], label: string): string {
  const sources = nodes.filter((n) => n.stage === 0);
  const fromSources = sources.reduce((s, n) => s + n.outG, 0);
  const biggest = sources[0];
  const parts = [
    `In ${label}, ${kg(fromSources, 0)} came in from ${sources.length === 1 ? "one origin" : `${sources.length} origins`}${biggest ? ` (most from ${biggest.label}, ${kg(biggest.outG, 0)})` : ""}`,
    `${kg(sumInto(nodes, "batch"), 0)} was charged to batches`,
    `${kg(sumInto(nodes, "out:ESTER"), 0)} of methyl ester came out`,
    `${kg(sumInto(nodes, "end:SHIPPED"), 0)} was shipped and ${kg(sumInto(nodes, "end:HAULED"), 0)} hauled away as waste.`,
  ];
  return parts.join(", ");
}

/** The period's flows drawn as a Sankey diagram, one column per step. */
function flowsSvg(f: PeriodFlows, label: ReadonlyMap<string, string>): string {
  const stages = [...new Set(f.nodes.map((n) => n.stage))].sort((a, b) => a - b);
  return renderPictureSvg(
    {
      series: [
        {
          type: "sankey",
          left: 8,
          right: 120,
          top: 12,
          bottom: 12,
          nodeWidth: 14,
          nodeGap: 10,
          layoutIterations: 0,
          emphasis: { disabled: true },
          label: {
            position: "right",
            fontSize: 11,
            color: "#1c211f",
            formatter: (p: { name: string }) => label.get(p.name) ?? p.name,
          },
          lineStyle: { color: "source", opacity: 0.35, curveness: 0.5 },
          data: f.nodes.map((n) => {
            const depth = stages.indexOf(n.stage);
            return { name: n.key, depth, itemStyle: { color: STAGE_COLOUR[n.stage], borderWidth: 0 } };
          }),
          links: f.links.map((l) => ({ source: l.from, target: l.to, value: l.grams / 1000 })),
        },
      ],
    },
    { width: FLOWS_WIDTH, height: 440 },
  );
}

// The flows and their drawing, kept by ledger position (decision 0037) for the period's bounds: any
// booking or audited change moves the position and the next request reads the period's ledger again.
interface FlowsDrawing {
  f: PeriodFlows;
  svg: string | null;
}
const home = globalThis as unknown as { tracevatFlowsPictures?: PositionCache<FlowsDrawing> };
const kept: PositionCache<FlowsDrawing> = (home.tracevatFlowsPictures ??= new PositionCache<FlowsDrawing>(50));

async function drawFlows(db: Db, siteId: number, period: { startsAt: Date; endsAt: Date }): Promise<FlowsDrawing> {
  const ledger = await loadFlowLedger(db, siteId, { from: period.startsAt, to: period.endsAt });
  const f = computePeriodFlows({
    holders: ledger.holders,
    moves: ledger.moves,
    period: { startMs: period.startsAt.getTime(), endMs: period.endsAt.getTime() },
  });
  if (f.links.length === 0) return { f, svg: null };
  return { f, svg: flowsSvg(f, new Map(f.nodes.map((n) => [n.key, n.label]))) };
}

/** Forgets every kept flows pictures (tests). */
export function clearFlowsPictures(): void {
  kept.clear();
}

export function keptFlows(
  db: Db,
  siteId: number,
  period: { startsAt: Date; endsAt: Date },
): Promise<Kept<FlowsDrawing>> {
  const key = questionKey(siteId, null, period.startsAt.getTime(), period.endsAt.getTime());
  return keptAtPosition(kept, db, siteId, key, () => drawFlows(db, siteId, period));
}

/** The period's flows from sources to what left the site, as a Sankey picture. */
export async function FlowsPicture({
  db,
  siteId,
  period,
}: {
  db: Db;
  siteId: number;
  period: { label: string; startsAt: Date; endsAt: Date };
}) {
  const id = "period-flows";
  const title = `Where the material went in ${period.label}`;
  const { f, svg } = (await keptFlows(db, siteId, period)).value;
  if (svg === null) {
    return (
      <NoPicture id={id} title={title}>
        Nothing was moved in this period, so there are no flows to draw.
      </NoPicture>
    );
  }
  const label = new Map(f.nodes.map((n) => [n.key, n.label]));
  const apart = [
    f.sameStageG > 0 ? `${kg(f.sameStageG, 0)} moved between places of one step (such as tank to tank)` : "",
    f.backwardG > 0 ? `${kg(f.backwardG, 0)} went back a step (such as recovered methanol charged again)` : "",
    f.unplacedG > 0 ? `${kg(f.unplacedG, 0)} of reagents was received` : "",
  ].filter((x) => x !== "");
  return (
    <Picture
      id={id}
      wide
      title={title}
      summary={describe(f.nodes, period.label)}
      svg={svg}
      numbers={
        <>
          <DataTable<FlowLink>
            caption="Flows drawn, from each step to the next"
            rows={f.links}
            rowKey={(l) => `${l.from}>${l.to}`}
            empty="No flows."
            columns={[
              { key: "from", header: "From", cell: (l) => label.get(l.from) ?? l.from },
              { key: "to", header: "To", cell: (l) => label.get(l.to) ?? l.to },
              {
                key: "mass",
                header: "Mass",
                unit: "kg",
                numeric: true,
                cell: (l) => num(l.grams / 1000, 3),
                total: num(f.drawnG / 1000, 3),
              },
            ]}
          />
          <p className="muted">
            Steps left to right: sources, lots by material, feedstock tanks and reagents, batches, what came out of the
            batches, what left the site.{" "}
            {f.pooledSources > 0 ? `The ${f.pooledSources} smallest sources are drawn together. ` : ""}
            {apart.length > 0 ? `Not drawn, so the picture has no loops: ${apart.join("; ")}. ` : ""}
            Everything moved in the period: {kg(f.movedG, 0)}.
          </p>
        </>
      }
    />
  );
}
