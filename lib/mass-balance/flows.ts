// The period's flows as stages left to right, for the Sankey picture on the balance page:
//   sources → lots (by material) → feedstock tanks and reagents → batches → products and waste → leaving the site.
// Every movement dated in the period becomes one link between the nodes of its two holders, summed.
// A picture of this kind must have no loop, so only links that go forward a stage are drawn; a move
// between two places of one stage (tank to tank) or back (recovered methanol charged again) is counted
// apart, and the three totals add up to every gram moved. Small sources are pooled into one node. Pure.
import { BATCH_OUTPUT_ROLES, labelOf } from "@/lib/core/vocabulary";
import type { HolderKind, MoveRole } from "@/lib/core/vocabulary";

export interface FlowHolder {
  id: number;
  kind: HolderKind;
  code: string;
  /** Material of a lot or pickup, reagent of a reagent lot, stream of a waste container. */
  material?: string | null;
  /** Service of a tank. */
  service?: string | null;
  /** The source of a pickup, or the supplier of a delivered lot. */
  source?: { code: string; name: string } | null;
}

export interface FlowMove {
  at: number;
  fromHolderId: number | null;
  toHolderId: number;
  massG: number;
  role: MoveRole;
}

export type FlowStage = 0 | 1 | 2 | 3 | 4 | 5;

export interface FlowNode {
  key: string;
  label: string;
  stage: FlowStage;
  inG: number;
  outG: number;
}

export interface FlowLink {
  from: string;
  to: string;
  grams: number;
}

export interface PeriodFlows {
  nodes: FlowNode[];
  links: FlowLink[];
  /** Every gram moved in the period = drawnG + withinNodeG + sameStageG + backwardG + unplacedG. */
  movedG: number;
  drawnG: number;
  /** Between two holders of one node (lot to lot of one material, pickup to pickup of one source). */
  withinNodeG: number;
  /** Between two nodes of one stage, e.g. from one feedstock tank to another. */
  sameStageG: number;
  /** Back to an earlier stage, e.g. recovered methanol charged to a batch again. */
  backwardG: number;
  /** Receipts of reagents and other movements with no place among the stages. */
  unplacedG: number;
  /** Sources pooled into "Other sources". */
  pooledSources: number;
}

interface Place {
  key: string;
  label: string;
  stage: FlowStage;
}

const OUTPUT_LABEL: Readonly<Record<string, string>> = {
  ESTER: "Methyl ester (product)",
  GLYCEROL_PHASE: "Glycerol phase",
  WASH_WATER: "Wash water",
  RECOVERED_METHANOL: "Recovered methanol",
  LOSS: "Recorded losses",
  UNMEASURED: "Unmeasured differences",
};

function output(what: string): Place {
  return { key: `out:${what}`, label: OUTPUT_LABEL[what] ?? labelOf(what), stage: 4 };
}

function sourcePlace(h: FlowHolder): Place {
  return h.source
    ? { key: `source:${h.source.code}`, label: h.source.name, stage: 0 }
    : { key: "source:?", label: "Source not recorded", stage: 0 };
}

const TANK_OUTPUT: Readonly<Record<string, string>> = {
  PRODUCT: "ESTER",
  GLYCEROL_PHASE: "GLYCEROL_PHASE",
  WASH_WATER: "WASH_WATER",
};

/** Where a holder stands in the picture, or null when it has no place (a reagent receipt's origin). */
export function placeOf(h: FlowHolder): Place | null {
  switch (h.kind) {
    case "PICKUP":
    case "DELIVERY":
      return sourcePlace(h);
    case "LOT":
      return { key: `lot:${h.material ?? "?"}`, label: `${labelOf(h.material ?? "OTHER_OIL")} lots`, stage: 1 };
    case "TANK": {
      const out = TANK_OUTPUT[h.service ?? ""];
      if (out) return output(out);
      if (h.service === "METHANOL") return { key: "reagent:METHANOL", label: "Methanol", stage: 2 };
      return { key: `tank:${h.code}`, label: `Tank ${h.code}`, stage: 2 };
    }
    case "REAGENT_LOT":
      return { key: `reagent:${h.material ?? "?"}`, label: labelOf(h.material ?? "OTHER"), stage: 2 };
    case "BATCH":
      return { key: "batch", label: "Batches", stage: 3 };
    case "PRODUCT_LOT":
      return output("ESTER");
    case "WASTE_CONTAINER":
      return output(h.material ?? "OTHER");
    case "LOSS":
      return output("LOSS");
    case "DIFFERENCE":
      return output("UNMEASURED");
    case "SHIPMENT":
      return { key: "end:SHIPPED", label: "Shipped", stage: 5 };
    case "DISPOSAL":
      return { key: "end:HAULED", label: "Hauled away", stage: 5 };
  }
}

const OUTPUT_ROLES: ReadonlySet<MoveRole> = new Set(BATCH_OUTPUT_ROLES);

function ends(m: FlowMove, from: FlowHolder | undefined, to: FlowHolder): [Place | null, Place | null] {
  const toPlace = from?.kind === "BATCH" && OUTPUT_ROLES.has(m.role) ? output(m.role) : placeOf(to);
  if (from) return [placeOf(from), toPlace];
  // Material entering the books: from its source when the holder has one, else as an other receipt.
  if (to.source) return [sourcePlace(to), toPlace];
  if (to.kind === "REAGENT_LOT") return [null, toPlace];
  return [{ key: "source:*receipts", label: "Other receipts", stage: 0 }, toPlace];
}

/** Keep the `keep` largest sources by mass sent on; pool the rest as one node. */
function poolSources(links: Map<string, FlowLink>, labels: Map<string, Place>, keep: number): number {
  const sent = new Map<string, number>();
  for (const l of links.values()) if (l.from.startsWith("source:")) sent.set(l.from, (sent.get(l.from) ?? 0) + l.grams);
  const ranked = [...sent.entries()].sort((a, b) => b[1] - a[1] || a[0].localeCompare(b[0]));
  const pooled = new Set(ranked.slice(keep).map(([k]) => k));
  if (pooled.size < 2) return 0;
  const other: Place = { key: "source:*other", label: `Other sources (${pooled.size})`, stage: 0 };
  labels.set(other.key, other);
  for (const [id, l] of [...links.entries()]) {
    if (!pooled.has(l.from)) continue;
    links.delete(id);
    const key = `${other.key}>${l.to}`;
    const into = links.get(key);
    if (into) into.grams += l.grams;
    else links.set(key, { from: other.key, to: l.to, grams: l.grams });
  }
  for (const k of pooled) labels.delete(k);
  return pooled.size;
}

export function computePeriodFlows(input: {
  holders: readonly FlowHolder[];
  moves: readonly FlowMove[];
  period: { startMs: number; endMs: number };
  maxSources?: number;
}): PeriodFlows {
  const holders = new Map(input.holders.map((h) => [h.id, h]));
  const links = new Map<string, FlowLink>();
  const places = new Map<string, Place>();
  const totals = { movedG: 0, withinNodeG: 0, sameStageG: 0, backwardG: 0, unplacedG: 0 };
  for (const m of input.moves) {
    if (m.at < input.period.startMs || m.at >= input.period.endMs) continue;
    totals.movedG += m.massG;
    const to = holders.get(m.toHolderId);
    const from = m.fromHolderId === null ? undefined : holders.get(m.fromHolderId);
    const [a, b] = to && (m.fromHolderId === null || from) ? ends(m, from, to) : [null, null];
    if (a === null || b === null) totals.unplacedG += m.massG;
    else if (a.key === b.key) totals.withinNodeG += m.massG;
    else if (a.stage === b.stage) totals.sameStageG += m.massG;
    else if (a.stage > b.stage) totals.backwardG += m.massG;
    else {
      places.set(a.key, a);
      places.set(b.key, b);
      const key = `${a.key}>${b.key}`;
      const link = links.get(key);
      if (link) link.grams += m.massG;
      else links.set(key, { from: a.key, to: b.key, grams: m.massG });
    }
  }
  const pooledSources = poolSources(links, places, input.maxSources ?? 6);
  const list = [...links.values()].sort((x, y) => x.from.localeCompare(y.from) || x.to.localeCompare(y.to));
  const nodes: FlowNode[] = [...places.values()]
    .map((p) => ({
      ...p,
      inG: list.filter((l) => l.to === p.key).reduce((s, l) => s + l.grams, 0),
      outG: list.filter((l) => l.from === p.key).reduce((s, l) => s + l.grams, 0),
    }))
    .sort(
      (x, y) => x.stage - y.stage || Math.max(y.inG, y.outG) - Math.max(x.inG, x.outG) || x.key.localeCompare(y.key),
    );
  const drawnG = list.reduce((s, l) => s + l.grams, 0);
  return { nodes, links: list, drawnG, pooledSources, ...totals };
}
