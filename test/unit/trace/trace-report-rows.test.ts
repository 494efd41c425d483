import { describe, expect, it } from "vitest";
import { buildTables, certificateOf } from "@/lib/trace/contribution-tables";
import type { OriginFacts } from "@/lib/trace/contribution-tables";
import { foldGraph, GRAPH_MAX_PER_STAGE } from "@/lib/trace/trace-graph";
import type { GraphEdge, GraphNodeKind } from "@/lib/trace/trace-answers";
import type { EntryHolderFacts, SourceFacts } from "@/lib/trace/trace-facts";

// Fictional sources and lots.
const SOURCE: SourceFacts = {
  code: "SRC-1",
  name: "Canal Street Diner",
  kind: "RESTAURANT",
  certificateScheme: "SCHEME-A",
  certificateNo: "CERT-0001",
  certificateExpires: new Date("2026-06-30T00:00:00Z"),
  creditWithheld: false,
};

function pickupEntry(holderId: number, source: SourceFacts, lotCode: string, certified: boolean): EntryHolderFacts {
  return {
    holderId,
    kind: "PICKUP",
    code: `PU-${holderId}`,
    pickup: { code: `PU-${holderId}`, observedAt: new Date("2026-03-01T00:00:00Z") },
    lot: {
      holderId: 100,
      code: lotCode,
      material: "USED_COOKING_OIL",
      origin: "PICKUPS",
      certified,
      receivedAt: new Date("2026-03-02T00:00:00Z"),
    },
    source,
    material: "USED_COOKING_OIL",
    reagent: null,
  };
}

describe("certificates on the day the material entered", () => {
  it("is valid to its expiry day and named with the scheme", () => {
    const entry = pickupEntry(1, SOURCE, "L-1", true);
    expect(certificateOf(entry, Date.parse("2026-03-01T00:00:00Z"))).toEqual({
      valid: true,
      text: "SCHEME-A CERT-0001, valid to 2026-06-30",
    });
    expect(certificateOf(entry, Date.parse("2026-07-01T00:00:00Z"))).toEqual({
      valid: false,
      text: "SCHEME-A CERT-0001, expired 2026-06-30",
    });
  });

  it("has none when the source holds no certificate", () => {
    const entry = pickupEntry(1, { ...SOURCE, certificateNo: null }, "L-1", true);
    expect(certificateOf(entry, 0)).toEqual({ valid: false, text: null });
  });
});

describe("contribution tables", () => {
  const origin = (originId: number, entry: EntryHolderFacts, certification: OriginFacts["certification"]) => ({
    originId,
    enteredAt: Date.parse("2026-03-01T00:00:00Z"),
    entry,
    entryRef: { id: entry.holderId, kind: entry.kind, code: entry.code },
    certification,
    certificate: "SCHEME-A CERT-0001, valid to 2026-06-30",
    feedstock: true,
  });
  const info = new Map<number, OriginFacts>([
    [11, origin(11, pickupEntry(1, SOURCE, "L-1", true), "CERTIFIED")],
    [12, origin(12, pickupEntry(2, SOURCE, "L-1", true), "CERTIFIED")],
    [13, origin(13, pickupEntry(3, { ...SOURCE, code: "SRC-2", name: "Quay Fish Bar" }, "L-2", false), "SOURCE_ONLY")],
  ]);
  const composition = {
    totalG: 1000,
    origins: [
      { originId: 11, grams: 500, pct: 50 },
      { originId: 12, grams: 300, pct: 30 },
      { originId: 13, grams: 200, pct: 20 },
    ],
  };

  it("groups the same origins by lot, pickup, source and certification, every table adding up to the total", () => {
    const t = buildTables(composition, info);
    expect(t.byLot.map((r) => [r.key, r.grams, r.lotCertified])).toEqual([
      ["L-1", 800, true],
      ["L-2", 200, false],
    ]);
    expect(t.byPickup.map((r) => r.key)).toEqual(["PU-1", "PU-2", "PU-3"]);
    expect(t.bySource.map((r) => [r.key, r.label, r.origins])).toEqual([
      ["SRC-1", "Canal Street Diner (restaurant)", 2],
      ["SRC-2", "Quay Fish Bar (restaurant)", 1],
    ]);
    expect(t.byCertification.map((r) => [r.key, r.grams])).toEqual([
      ["CERTIFIED", 800],
      ["SOURCE_ONLY", 200],
    ]);
    for (const rows of [t.byLot, t.byPickup, t.bySource, t.byMaterial, t.byCertification])
      expect(rows.reduce((s, r) => s + r.grams, 0)).toBe(1000);
  });
});

describe("the stage graph's folding", () => {
  type RawNode = { stage: number; kind: GraphNodeKind; code: string; label: string; target: boolean };
  const node = (stage: number, code: string, target = false): [string, RawNode] => [
    code,
    { stage, kind: "LOT", code, label: code, target },
  ];

  it("folds the small boxes of a stage into one 'others' box and keeps the arrows' grams", () => {
    const sources = Array.from({ length: GRAPH_MAX_PER_STAGE + 3 }, (_, i) => `S${i}`);
    const nodes = new Map<string, RawNode>([...sources.map((s) => node(0, s)), node(5, "P", true)]);
    const edges = new Map<string, GraphEdge>(
      sources.map((s, i) => [`${s}>P`, { from: s, to: "P", grams: i === 0 ? 10_000 : 10 }]),
    );
    const total = 10_000 + 10 * (sources.length - 1);
    const g = foldGraph({ nodes, edges }, total, "note", 0);
    const others = g.nodes.find((n) => n.kind === "OTHERS");
    // 10 g of 10 110 g is under the 1 % fold limit: every box but S0 is folded.
    expect(others).toMatchObject({ stage: 0, folded: sources.length - 1, grams: 10 * (sources.length - 1) });
    expect(g.nodes.filter((n) => n.stage === 0).map((n) => n.id)).toEqual(["S0", "o0"]);
    expect(g.edges.reduce((s, e) => s + e.grams, 0)).toBe(total);
    expect(g.nodes.find((n) => n.id === "P")).toMatchObject({ target: true, grams: total });
  });

  it("keeps a lone small box rather than folding it alone", () => {
    const nodes = new Map<string, RawNode>([node(0, "A"), node(0, "B"), node(5, "P", true)]);
    const edges = new Map<string, GraphEdge>([
      ["A>P", { from: "A", to: "P", grams: 1000 }],
      ["B>P", { from: "B", to: "P", grams: 1 }],
    ]);
    const g = foldGraph({ nodes, edges }, 1001, "note", 0);
    expect(g.nodes.map((n) => n.id).sort()).toEqual(["A", "B", "P"]);
  });
});
