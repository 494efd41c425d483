// The trace drawn as stages left to right: one box per holder (small ones folded into "others"),
// arrows whose width follows the kilograms they carry. Plain server-rendered SVG.
import type { GraphEdge, GraphNode, TraceGraph } from "@/lib/trace/trace.service";
import { kg, pct } from "@/app/_ui/format";

const COL_W = 174;
const BOX_W = 140;
const BOX_H = 40;
const GAP_Y = 12;
const TOP = 30;
const PAD = 8;
const BACK_LANE = 44;
const MAX_STROKE = 22;

const SHORT_KIND: Readonly<Record<string, string>> = {
  SOURCE: "Source",
  PICKUP: "Pickup",
  LOT: "Lot",
  DELIVERY: "Delivery",
  REAGENT_LOT: "Reagent",
  TANK: "Tank",
  BATCH: "Batch",
  PRODUCT_LOT: "Product",
  SHIPMENT: "Shipment",
  DISPOSAL: "Disposal",
  LOSS: "Losses",
  WASTE_CONTAINER: "Waste",
};

function clip(text: string, max: number): string {
  return text.length > max ? `${text.slice(0, max - 1)}…` : text;
}

function titleOf(n: GraphNode): string {
  if (n.kind === "OTHERS" || n.kind === "ENTRY") return n.label;
  if (n.kind === "SOURCE") return `${n.code} ${n.label}`;
  return `${SHORT_KIND[n.kind] ?? n.label} ${n.code}`;
}

interface Placed {
  node: GraphNode;
  col: number;
  x: number;
  y: number;
}

/** Columns left to right; inside a column, boxes follow the weighted height of what feeds them (fewer crossings). */
function layout(graph: TraceGraph): { placed: Map<string, Placed>; columns: number[]; height: number } {
  const stages = [...new Set(graph.nodes.map((n) => n.stage))].sort((a, b) => a - b);
  const placed = new Map<string, Placed>();
  const incoming = new Map<string, Array<{ from: string; grams: number }>>();
  for (const e of graph.edges) incoming.set(e.to, [...(incoming.get(e.to) ?? []), { from: e.from, grams: e.grams }]);
  let rows = 0;
  stages.forEach((stage, col) => {
    const nodes = graph.nodes.filter((n) => n.stage === stage);
    const rank = (n: GraphNode): number => {
      if (n.kind === "OTHERS") return Number.POSITIVE_INFINITY;
      let sum = 0;
      let w = 0;
      for (const e of incoming.get(n.id) ?? []) {
        const p = placed.get(e.from);
        if (p === undefined || p.col >= col) continue;
        sum += p.y * e.grams;
        w += e.grams;
      }
      return w > 0 ? sum / w : Number.MAX_SAFE_INTEGER - n.grams;
    };
    const ranked = nodes.map((n) => ({ n, r: rank(n) })).sort((a, b) => a.r - b.r || b.n.grams - a.n.grams);
    ranked.forEach(({ n }, i) =>
      placed.set(n.id, { node: n, col, x: PAD + col * COL_W, y: TOP + i * (BOX_H + GAP_Y) }),
    );
    rows = Math.max(rows, nodes.length);
  });
  return { placed, columns: stages, height: TOP + rows * (BOX_H + GAP_Y) + BACK_LANE };
}

export function TraceGraphView({ graph, title }: { graph: TraceGraph; title: string }) {
  const { placed, columns, height } = layout(graph);
  const width = PAD * 2 + (columns.length - 1) * COL_W + BOX_W;
  const laneY = height - BACK_LANE / 2;
  const titleId = "trace-graph-title";
  return (
    <div className="graph-wrap">
      <svg
        className="trace-graph"
        role="img"
        aria-labelledby={titleId}
        width={width}
        height={height}
        viewBox={`0 0 ${width} ${height}`}
        xmlns="http://www.w3.org/2000/svg"
      >
        <title id={titleId}>{title}</title>
        {columns.map((stage, col) => (
          <text key={stage} className="graph-stage" x={PAD + col * COL_W + BOX_W / 2} y={16} textAnchor="middle">
            {graph.stages[stage] ?? ""}
          </text>
        ))}
        {[...graph.edges]
          .sort((x, y) => y.grams - x.grams)
          .map((e) => (
            <GraphEdgePath key={`${e.from}>${e.to}`} e={e} placed={placed} graph={graph} laneY={laneY} />
          ))}
        {[...placed.values()].map(({ node, x, y }) => (
          <GraphBox key={node.id} node={node} x={x} y={y} graph={graph} />
        ))}
      </svg>
    </div>
  );
}

function GraphEdgePath({
  e,
  placed,
  graph,
  laneY,
}: {
  e: GraphEdge;
  placed: ReadonlyMap<string, Placed>;
  graph: TraceGraph;
  laneY: number;
}) {
  const a = placed.get(e.from);
  const b = placed.get(e.to);
  if (a === undefined || b === undefined) return null;
  const w = Math.max(1.2, (MAX_STROKE * e.grams) / Math.max(1, graph.totalG));
  const label = `${titleOf(a.node)} → ${titleOf(b.node)}: ${kg(e.grams)} (${pct((e.grams * 100) / Math.max(1, graph.totalG), 1)})`;
  if (a.col < b.col) {
    const x1 = a.x + BOX_W;
    const y1 = a.y + BOX_H / 2;
    const x2 = b.x;
    const y2 = b.y + BOX_H / 2;
    const mid = (x1 + x2) / 2;
    return (
      <path className="graph-edge" d={`M${x1},${y1} C${mid},${y1} ${mid},${y2} ${x2},${y2}`} strokeWidth={w}>
        <title>{label}</title>
      </path>
    );
  }
  // Against the stage order (recovered methanol back to its tank): under the boxes, dashed.
  const x1 = a.x + BOX_W / 2;
  const x2 = b.x + BOX_W / 2;
  return (
    <path
      className="graph-edge graph-edge-back"
      d={`M${x1},${a.y + BOX_H} C${x1},${laneY} ${x2},${laneY} ${x2},${b.y + BOX_H}`}
      strokeWidth={w}
    >
      <title>{label}</title>
    </path>
  );
}

function GraphBox({ node, x, y, graph }: { node: GraphNode; x: number; y: number; graph: TraceGraph }) {
  const cls = node.target
    ? "graph-box graph-target"
    : node.kind === "OTHERS"
      ? "graph-box graph-others"
      : `graph-box graph-${node.kind.toLowerCase().replace(/_/g, "-")}`;
  const share = (node.grams * 100) / Math.max(1, graph.totalG);
  return (
    <g className={cls}>
      <title>{`${titleOf(node)}: ${kg(node.grams)} (${pct(share, 2)})${node.folded > 0 ? `, ${node.folded} holders below ${graph.foldBelowPct} % each or beyond the largest per stage` : ""}`}</title>
      <rect x={x} y={y} width={BOX_W} height={BOX_H} rx={4} />
      <rect
        className="graph-share"
        x={x}
        y={y + BOX_H - 4}
        width={Math.max(1, (BOX_W * Math.min(100, share)) / 100)}
        height={4}
      />
      <text x={x + 7} y={y + 16}>
        {clip(titleOf(node), 21)}
      </text>
      <text className="graph-kg" x={x + 7} y={y + 31}>
        {`${kg(node.grams, 0)} · ${pct(share, 1)}`}
      </text>
    </g>
  );
}
