import { describe, expect, it } from "vitest";
import { indexLedger } from "@/lib/ledger/moves";
import type { LedgerIndex, TraceHolder, TraceMove } from "@/lib/ledger/moves";
import { traceForward } from "@/lib/trace/genealogy";
import { findSeedMoves, groupCustomers, seedLedger } from "@/lib/trace/recall";

// Holders: two lots, a pooled tank, a first-in-first-out tank, a batch, a product lot and a shipment.
const LOT_A = 1,
  LOT_B = 2,
  TANK = 3,
  FIFO = 4,
  BATCH = 5,
  PRODUCT = 6,
  SHIP = 7;
const HOLDERS: TraceHolder[] = [
  { id: LOT_A, kind: "LOT", mixing: "MIXED" },
  { id: LOT_B, kind: "LOT", mixing: "MIXED" },
  { id: TANK, kind: "TANK", mixing: "MIXED" },
  { id: FIFO, kind: "TANK", mixing: "FIFO" },
  { id: BATCH, kind: "BATCH", mixing: "MIXED" },
  { id: PRODUCT, kind: "PRODUCT_LOT", mixing: "MIXED" },
  { id: SHIP, kind: "SHIPMENT", mixing: "MIXED" },
];
const DAY = 86_400_000;
const m = (id: number, day: number, from: number | null, to: number, massG: number): TraceMove => ({
  id,
  at: day * DAY,
  fromHolderId: from,
  toHolderId: to,
  massG,
});

function index(moves: TraceMove[]): LedgerIndex {
  const r = indexLedger(HOLDERS, moves);
  if (!r.ok) throw new Error(JSON.stringify(r.issues));
  return r.value;
}

function follow(idx: LedgerIndex, seeds: number[]) {
  const s = seedLedger(idx, seeds);
  if (!s.ok) throw new Error(JSON.stringify(s.issues));
  const f = traceForward(s.value.index, s.value.originIds);
  if (!f.ok) throw new Error(JSON.stringify(f.issues));
  return {
    seeded: s.value,
    held: new Map(f.value.holders.map((h) => [h.holderId, h.heldG])),
    enteredG: f.value.enteredG,
  };
}

describe("recall seeding: follow only what moved in", () => {
  // Worked by hand (common practice: a well-mixed tank gives every draw the same proportions).
  // Tank gets 300 kg from lot A, then 100 kg from lot B (the seed): B is 1/4 of the tank. A 200 kg draw to
  // the batch carries 50 kg of B; the batch makes a 200 kg product lot; 80 kg of it is shipped (20 kg of B).
  const moves = [
    m(1, 1, null, LOT_A, 300_000),
    m(2, 2, null, LOT_B, 100_000),
    m(3, 3, LOT_A, TANK, 300_000),
    m(4, 4, LOT_B, TANK, 100_000),
    m(5, 5, TANK, BATCH, 200_000),
    m(6, 6, BATCH, PRODUCT, 200_000),
    m(7, 7, PRODUCT, SHIP, 80_000),
  ];

  it("follows a share of a pooled tank, not the whole origins behind it", () => {
    const { held, enteredG } = follow(index(moves), [4]);
    expect(enteredG).toBe(100_000);
    expect(held.get(TANK)).toBe(50_000);
    expect(held.get(PRODUCT)).toBe(30_000);
    expect(held.get(SHIP)).toBe(20_000);
    expect(held.get(LOT_B) ?? 0).toBe(0);
    expect([...held.values()].reduce((s, g) => s + g, 0)).toBe(100_000);
  });

  it("keeps first-in-first-out order: a later seed is drawn only after the older layer is gone", () => {
    const fifo = moves.map((x) =>
      x.toHolderId === TANK ? { ...x, toHolderId: FIFO } : x.fromHolderId === TANK ? { ...x, fromHolderId: FIFO } : x,
    );
    const { held } = follow(index(fifo), [4]);
    // The 200 kg draw takes lot A's older 300 kg layer first: none of B leaves the tank.
    expect(held.get(FIFO)).toBe(100_000);
    expect(held.get(PRODUCT) ?? 0).toBe(0);
  });

  it("uses entry moves as origins as they are, without re-booking the ledger", () => {
    const idx = index(moves);
    const s = seedLedger(idx, [1, 2]);
    expect(s.ok && s.value.index).toBe(idx);
    expect(s.ok && s.value.originIds).toEqual([1, 2]);
  });

  it("picks the moves into the holders within [from, to) by their real time", () => {
    const idx = index(moves);
    const realAt = (id: number) => idx.moves[idx.positionOf.get(id) ?? -1]?.at ?? 0;
    expect(findSeedMoves(idx, [TANK], { from: 4 * DAY, to: 5 * DAY, realAt })).toEqual([4]);
    expect(findSeedMoves(idx, [TANK], { from: null, to: null, realAt })).toEqual([3, 4]);
    expect(findSeedMoves(idx, [TANK], { from: 5 * DAY, to: null, realAt })).toEqual([]);
  });

  it("totals customers with their first and last shipment dates, largest first", () => {
    const c = (name: string) => ({ name, code: name.toUpperCase() });
    const rows = groupCustomers(
      [
        { holderId: 10, grams: 5, firstAt: 3, lastAt: 3 },
        { holderId: 11, grams: 7, firstAt: 1, lastAt: 1 },
        { holderId: 12, grams: 9, firstAt: 2, lastAt: 2 },
      ],
      new Map([
        [10, c("a")],
        [11, c("a")],
        [12, c("b")],
      ]),
    );
    expect(rows.map((r) => [r.customer.name, r.grams, r.shipments, r.firstAt, r.lastAt])).toEqual([
      ["a", 12, 2, 1, 3],
      ["b", 9, 1, 2, 2],
    ]);
  });
});
