import { describe, expect, it } from "vitest";
import { computePeriodFlows } from "@/lib/mass-balance/flows";
import type { FlowHolder, FlowMove } from "@/lib/mass-balance/flows";
import { computePeriodBalance } from "@/lib/mass-balance/period-balance";
import type { BalanceMove } from "@/lib/mass-balance/period-balance";
import type { HolderKind } from "@/lib/core/vocabulary";

const utc = (iso: string): number => Date.parse(iso);
const JANUARY = { startMs: utc("2026-01-01T00:00:00Z"), endMs: utc("2026-02-01T00:00:00Z") };

const src = (code: string) => ({ code, name: `Kitchen ${code}` });
// Eight sources with one pickup each, pooled into one lot; a delivered tallow lot; two feedstock tanks,
// the methanol tank, a reagent lot, one batch, its product, a glycerol drum, a shipment and a haul.
const holders: FlowHolder[] = [
  ...Array.from({ length: 8 }, (_, i): FlowHolder => ({
    id: 101 + i,
    kind: "PICKUP",
    code: `P-${i + 1}`,
    material: "USED_COOKING_OIL",
    source: src(`S-${i + 1}`),
  })),
  { id: 1, kind: "LOT", code: "L-1", material: "USED_COOKING_OIL" },
  { id: 2, kind: "LOT", code: "L-2", material: "TALLOW", source: src("S-9") },
  { id: 3, kind: "TANK", code: "T-1", service: "FEEDSTOCK" },
  { id: 4, kind: "TANK", code: "T-2", service: "FEEDSTOCK" },
  { id: 5, kind: "TANK", code: "T-M", service: "METHANOL" },
  { id: 6, kind: "REAGENT_LOT", code: "R-1", material: "KOH" },
  { id: 7, kind: "BATCH", code: "B-1" },
  { id: 8, kind: "PRODUCT_LOT", code: "PL-1" },
  { id: 9, kind: "WASTE_CONTAINER", code: "W-1", material: "GLYCEROL_PHASE" },
  { id: 10, kind: "SHIPMENT", code: "SH-1" },
  { id: 11, kind: "DISPOSAL", code: "D-1" },
  { id: 12, kind: "LOSS", code: "LOSS" },
];
const at = (d: number) => utc(`2026-01-${String(d).padStart(2, "0")}T08:00:00Z`);
const pickupMass = [500_000, 400_000, 300_000, 200_000, 100_000, 60_000, 40_000, 20_000];
const moves: FlowMove[] = [
  ...pickupMass.map((g, i): FlowMove => ({
    at: at(2),
    fromHolderId: null,
    toHolderId: 101 + i,
    massG: g,
    role: "RECEIPT",
  })),
  ...pickupMass.map((g, i): FlowMove => ({
    at: at(3),
    fromHolderId: 101 + i,
    toHolderId: 1,
    massG: g,
    role: "TRANSFER",
  })),
  { at: at(3), fromHolderId: 1, toHolderId: 12, massG: 2_000, role: "LOSS" }, // receiving shortfall
  { at: at(4), fromHolderId: null, toHolderId: 2, massG: 900_000, role: "RECEIPT" },
  { at: at(5), fromHolderId: null, toHolderId: 6, massG: 10_000, role: "RECEIPT" }, // reagent bought: no stage
  { at: at(6), fromHolderId: 1, toHolderId: 3, massG: 1_500_000, role: "TRANSFER" },
  { at: at(6), fromHolderId: 2, toHolderId: 3, massG: 900_000, role: "TRANSFER" },
  { at: at(7), fromHolderId: 3, toHolderId: 4, massG: 400_000, role: "TRANSFER" }, // tank to tank: same stage
  { at: at(8), fromHolderId: 3, toHolderId: 7, massG: 1_000_000, role: "OIL" },
  { at: at(8), fromHolderId: 5, toHolderId: 7, massG: 200_000, role: "METHANOL" },
  { at: at(8), fromHolderId: 6, toHolderId: 7, massG: 10_000, role: "CATALYST" },
  { at: at(9), fromHolderId: 7, toHolderId: 8, massG: 960_000, role: "ESTER" },
  { at: at(9), fromHolderId: 7, toHolderId: 9, massG: 150_000, role: "GLYCEROL_PHASE" },
  { at: at(9), fromHolderId: 7, toHolderId: 5, massG: 95_000, role: "RECOVERED_METHANOL" },
  { at: at(9), fromHolderId: 7, toHolderId: 12, massG: 5_000, role: "LOSS" },
  { at: at(12), fromHolderId: 8, toHolderId: 10, massG: 900_000, role: "SHIPMENT" },
  { at: at(13), fromHolderId: 9, toHolderId: 11, massG: 150_000, role: "DISPOSAL" },
  { at: utc("2026-02-03T08:00:00Z"), fromHolderId: 8, toHolderId: 10, massG: 60_000, role: "SHIPMENT" }, // next period
];

const grams = (f: ReturnType<typeof computePeriodFlows>, from: string, to: string) =>
  f.links.find((l) => l.from === from && l.to === to)?.grams;

describe("period flows for the Sankey picture", () => {
  const flows = computePeriodFlows({ holders, moves, period: JANUARY, maxSources: 4 });

  it("sums equal the movements: drawn + kept apart = every gram moved in the period", () => {
    const moved = moves.filter((m) => m.at >= JANUARY.startMs && m.at < JANUARY.endMs).reduce((s, m) => s + m.massG, 0);
    expect(flows.movedG).toBe(moved);
    expect(flows.drawnG + flows.withinNodeG + flows.sameStageG + flows.backwardG + flows.unplacedG).toBe(moved);
    expect(flows.sameStageG).toBe(400_000);
    expect(flows.unplacedG).toBe(10_000);
    // Pickups are their sources' node: a receipt into a pickup stays inside it.
    expect(flows.withinNodeG).toBe(pickupMass.reduce((s, g) => s + g, 0));
    expect(flows.backwardG).toBe(0);
  });

  it("pools the small sources so the picture stays readable, keeping their mass", () => {
    expect(flows.pooledSources).toBe(5);
    expect(grams(flows, "source:S-1", "lot:USED_COOKING_OIL")).toBe(500_000);
    expect(grams(flows, "source:*other", "lot:USED_COOKING_OIL")).toBe(200_000 + 100_000 + 60_000 + 40_000 + 20_000);
    expect(grams(flows, "source:*other", "lot:TALLOW")).toBeUndefined();
    expect(grams(flows, "source:S-9", "lot:TALLOW")).toBe(900_000);
    expect(flows.nodes.filter((n) => n.stage === 0).map((n) => n.key)).toEqual([
      "source:S-9",
      "source:S-1",
      "source:*other",
      "source:S-2",
      "source:S-3",
    ]);
  });

  it("draws batch outputs by their role and the batch balances: charged = drawn off", () => {
    const batch = flows.nodes.find((n) => n.key === "batch");
    expect(batch?.inG).toBe(1_000_000 + 200_000 + 10_000);
    expect(batch?.outG).toBe(960_000 + 150_000 + 95_000 + 5_000);
    expect(grams(flows, "batch", "out:RECOVERED_METHANOL")).toBe(95_000);
    expect(grams(flows, "out:ESTER", "end:SHIPPED")).toBe(900_000);
    expect(grams(flows, "out:GLYCEROL_PHASE", "end:HAULED")).toBe(150_000);
    expect(grams(flows, "lot:USED_COOKING_OIL", "out:LOSS")).toBe(2_000);
  });

  it("agrees with the period balance: shipped and hauled are the balance's outputs", () => {
    const kinds = new Map(holders.map((h) => [h.id, h.kind]));
    const bh = holders.map((h) => ({
      id: h.id,
      kind: kinds.get(h.id) as HolderKind,
      siteId: 1,
      ...(h.kind === "BATCH" ? { completedAt: at(9) } : {}),
    }));
    const bm: BalanceMove[] = moves.map((m, i) => ({ ...m, id: i + 1 }));
    const balance = computePeriodBalance({ holders: bh, moves: bm, period: JANUARY, scope: { siteId: 1 } });
    if (!balance.ok) throw new Error(`balance refused: ${JSON.stringify(balance.issues)}`);
    expect(grams(flows, "out:ESTER", "end:SHIPPED")).toBe(balance.value.stock.outputs.shipmentG);
    expect(grams(flows, "out:GLYCEROL_PHASE", "end:HAULED")).toBe(balance.value.stock.outputs.disposalG);
    const lossLinks = flows.links.filter((l) => l.to === "out:LOSS").reduce((s, l) => s + l.grams, 0);
    expect(lossLinks).toBe(balance.value.stock.outputs.lossG);
  });

  it("never draws a loop: every link goes forward a stage", () => {
    const stage = new Map(flows.nodes.map((n) => [n.key, n.stage]));
    for (const l of flows.links) expect(stage.get(l.from) ?? 9).toBeLessThan(stage.get(l.to) ?? -1);
    const reuse = computePeriodFlows({
      holders,
      moves: [{ at: at(10), fromHolderId: 12, toHolderId: 7, massG: 5, role: "TRANSFER" }],
      period: JANUARY,
    });
    expect(reuse.backwardG).toBe(5);
    expect(reuse.links).toEqual([]);
  });

  it("is empty for an empty period", () => {
    const none = computePeriodFlows({
      holders,
      moves,
      period: { startMs: utc("2025-06-01T00:00:00Z"), endMs: utc("2025-07-01T00:00:00Z") },
    });
    expect(none.nodes).toEqual([]);
    expect(none.links).toEqual([]);
    expect(none.movedG).toBe(0);
  });
});
