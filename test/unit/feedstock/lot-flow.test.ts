import { describe, expect, it } from "vitest";
import { carriedFlow, groupOrigins, timeOrderedMoves } from "@/lib/feedstock/lot-flow";
import type { FlowHolder, FlowLedger } from "@/lib/feedstock/lot-flow";
import { indexLedger } from "@/lib/ledger/moves";
import type { LedgerIndex, TraceHolder, TraceMove } from "@/lib/ledger/moves";
import { traceForward, traceHolder } from "@/lib/trace/genealogy";

// A fictional plant: two pickups pooled into lot L-1, a delivery lot L-2, a tank, a batch, a product lot
// and a methanol reagent lot.
const REFS: FlowHolder[] = [
  { id: 1, kind: "PICKUP", code: "PU-1" },
  { id: 2, kind: "PICKUP", code: "PU-2" },
  { id: 3, kind: "LOT", code: "L-1" },
  { id: 4, kind: "TANK", code: "T-1" },
  { id: 5, kind: "BATCH", code: "B-1" },
  { id: 6, kind: "PRODUCT_LOT", code: "P-1" },
  { id: 7, kind: "DELIVERY", code: "D-1" },
  { id: 8, kind: "LOT", code: "L-2" },
  { id: 9, kind: "REAGENT_LOT", code: "MEOH-1" },
];
const HOLDERS: TraceHolder[] = REFS.map((r) => ({ id: r.id, kind: r.kind, mixing: "MIXED" }));
const day = (d: number) => Date.parse("2026-04-01T00:00:00Z") + d * 86_400_000;
const MOVES: TraceMove[] = [
  { id: 1, at: day(0), fromHolderId: null, toHolderId: 1, massG: 60_000 },
  { id: 2, at: day(0), fromHolderId: null, toHolderId: 2, massG: 40_000 },
  { id: 3, at: day(1), fromHolderId: 1, toHolderId: 3, massG: 60_000 },
  { id: 4, at: day(1), fromHolderId: 2, toHolderId: 3, massG: 40_000 },
  { id: 5, at: day(2), fromHolderId: null, toHolderId: 7, massG: 100_000 },
  { id: 6, at: day(2), fromHolderId: 7, toHolderId: 8, massG: 100_000 },
  { id: 7, at: day(3), fromHolderId: 3, toHolderId: 4, massG: 80_000 },
  { id: 8, at: day(3), fromHolderId: 8, toHolderId: 4, massG: 80_000 },
  { id: 9, at: day(4), fromHolderId: null, toHolderId: 9, massG: 20_000 },
  { id: 10, at: day(5), fromHolderId: 4, toHolderId: 5, massG: 100_000 },
  { id: 11, at: day(5), fromHolderId: 9, toHolderId: 5, massG: 10_000 },
  { id: 12, at: day(6), fromHolderId: 5, toHolderId: 6, massG: 100_000 },
];
const LEDGER: FlowLedger = { moves: MOVES, refs: new Map(REFS.map((r) => [r.id, r])), reversedPairsLeftOut: 0 };

function indexed(): LedgerIndex {
  const r = indexLedger(HOLDERS, MOVES);
  if (!r.ok) throw new Error("ledger refused");
  return r.value;
}

describe("where a lot's material went", () => {
  it("follows the lot downstream in order of first arrival, halving in the mixed tank", () => {
    const index = indexed();
    const back = traceHolder(index, 3);
    if (!back.ok) throw new Error("trace refused");
    const fwd = traceForward(
      index,
      back.value.received.origins.map((o) => o.originId),
    );
    if (!fwd.ok) throw new Error("trace refused");
    const flow = carriedFlow(LEDGER, index, fwd.value, 3);
    expect(flow.stillInLotG).toBe(20_000);
    expect(flow.carried.map((m) => m.moveId)).toEqual([7, 10, 12]);
    expect(flow.destinations.map((d) => [d.holder.code, d.receivedG, d.heldG])).toEqual([
      ["T-1", 80_000, 30_000],
      // the batch holds 110 kg with the methanol; 100 kg go on: 50 × 100/110 = 45.455 kg of the lot
      ["B-1", 50_000, 4_545],
      ["P-1", 45_455, 45_455],
    ]);
    expect(flow.destinations[0]?.firstAt).toEqual(new Date(day(3)));
  });

  it("falls back to every later move out of a holder the lot reached", () => {
    const t = timeOrderedMoves(LEDGER, 3);
    expect(t.enteredG).toBe(100_000);
    expect(t.picked.map((m) => m.id)).toEqual([7, 10, 12]);
    expect(t.destinations.map((d) => [d.holder.code, d.receivedG, d.heldG])).toEqual([
      ["T-1", 80_000, null],
      ["B-1", 100_000, null],
      ["P-1", 100_000, null],
    ]);
  });
});

describe("what a product was made of", () => {
  it("sums the origins by the lot or reagent lot they entered through", () => {
    const index = indexed();
    const back = traceHolder(index, 6);
    if (!back.ok) throw new Error("trace refused");
    const lotOfHolder = new Map([
      [1, "L-1"],
      [2, "L-1"],
      [3, "L-1"],
      [8, "L-2"],
    ]);
    const groups = groupOrigins(LEDGER, index, back.value, lotOfHolder, new Map([[9, "METHANOL"]]));
    expect(groups).toEqual(
      expect.arrayContaining([
        { kind: "LOT", code: "L-1", grams: expect.any(Number) as number },
        { kind: "OTHER", code: "D-1", grams: expect.any(Number) as number },
        { kind: "REAGENT_LOT", code: "MEOH-1", grams: expect.any(Number) as number, reagent: "METHANOL" },
      ]),
    );
    expect(groups.reduce((s, g) => s + g.grams, 0)).toBe(back.value.received.totalG);
  });
});
