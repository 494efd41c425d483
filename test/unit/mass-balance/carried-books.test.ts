// The books brought forward (lib/mass-balance/carried-books.ts): a period computed from the books
// carried to its start and its own movements must equal the same period walked from the first
// movement, whatever the ledger: stock below zero, several movements at one instant, batches charged
// before the period, other sites, in one step or several. An identity of the computation, no source.
import fc from "fast-check";
import { describe, expect, it } from "vitest";
import type { MoveRole } from "@/lib/core/vocabulary";
import { carryBooks, emptyBooks } from "@/lib/mass-balance/carried-books";
import { computePeriodBalance, DEFAULT_HOLDER_CLASSES } from "@/lib/mass-balance/period-balance";
import type { BalanceHolder, BalanceMove, CarriedBooks } from "@/lib/mass-balance/period-balance";

const DAY = 86_400_000;
const T0 = Date.parse("2026-01-01T00:00:00Z");

const holders: BalanceHolder[] = [
  { id: 1, kind: "PICKUP", siteId: 1, materialKind: "USED_COOKING_OIL" },
  { id: 2, kind: "LOT", siteId: 1, materialKind: "USED_COOKING_OIL" },
  { id: 3, kind: "TANK", siteId: 1, materialKind: "MIXED_FEEDSTOCK" },
  { id: 4, kind: "REAGENT_LOT", siteId: 1, materialKind: "METHANOL" },
  { id: 5, kind: "BATCH", siteId: 1, materialKind: "IN_REACTION", completedAt: T0 + 9 * DAY },
  { id: 6, kind: "BATCH", siteId: 1, materialKind: "IN_REACTION", completedAt: null },
  { id: 7, kind: "PRODUCT_LOT", siteId: 1, materialKind: "FAME" },
  { id: 8, kind: "WASTE_CONTAINER", siteId: 1, materialKind: "GLYCEROL_PHASE" },
  { id: 9, kind: "SHIPMENT", siteId: 1 },
  { id: 10, kind: "LOSS", siteId: 1 },
  { id: 11, kind: "DIFFERENCE", siteId: 1 },
  { id: 12, kind: "TANK", siteId: 2, materialKind: "MIXED_FEEDSTOCK" },
  { id: 13, kind: "BATCH", siteId: 1, materialKind: "IN_REACTION", completedAt: T0 + 2 * DAY },
];
const ROLES: MoveRole[] = ["RECEIPT", "TRANSFER", "OIL", "METHANOL", "ESTER", "GLYCEROL_PHASE", "LOSS", "UNMEASURED"];
const kinds = {
  isStock: (id: number) => DEFAULT_HOLDER_CLASSES[holders.find((h) => h.id === id)?.kind ?? "LOSS"] === "STOCK",
  isBatch: (id: number) => holders.find((h) => h.id === id)?.kind === "BATCH",
};

const moveArb = fc.record({
  // Half-days over three weeks, so many movements share an instant.
  slot: fc.integer({ min: 0, max: 42 }),
  from: fc.option(fc.integer({ min: 1, max: 13 }), { nil: null, freq: 4 }),
  to: fc.integer({ min: 1, max: 13 }),
  massG: fc.integer({ min: 1, max: 5_000 }),
  role: fc.constantFrom(...ROLES),
});

function ledgerOf(
  raw: ReadonlyArray<{ slot: number; from: number | null; to: number; massG: number; role: MoveRole }>,
) {
  return raw
    .filter((m) => m.from !== m.to)
    .map((m, i): BalanceMove => ({
      id: i + 1,
      at: T0 + m.slot * (DAY / 2),
      fromHolderId: m.from,
      toHolderId: m.to,
      massG: m.massG,
      role: m.role,
    }));
}

function carried(moves: readonly BalanceMove[], steps: readonly number[]): CarriedBooks {
  let books = emptyBooks(Number.NEGATIVE_INFINITY);
  for (const at of steps) {
    const next = carryBooks(books, moves, at, kinds);
    if (!next.ok) throw new Error(JSON.stringify(next.issues));
    books = next.value;
  }
  return books;
}

describe("books brought forward", () => {
  it("give the same balance as the walk from the first movement, for every scope", () => {
    fc.assert(
      fc.property(
        fc.array(moveArb, { maxLength: 80 }),
        fc.integer({ min: 0, max: 40 }),
        fc.integer({ min: 1, max: 20 }),
        fc.integer({ min: 0, max: 40 }),
        fc.boolean(),
        (raw, startSlot, length, stepSlot, dropEarlier) => {
          const moves = ledgerOf(raw);
          const period = { startMs: T0 + startSlot * (DAY / 2), endMs: T0 + (startSlot + length) * (DAY / 2) };
          // Carried in one step or through an earlier instant first.
          const steps = stepSlot < startSlot ? [T0 + stepSlot * (DAY / 2), period.startMs] : [period.startMs];
          const books = carried(moves, steps);
          const own = dropEarlier ? moves.filter((m) => m.at >= period.startMs) : moves;
          for (const materialKind of [undefined, "USED_COOKING_OIL", "MIXED_FEEDSTOCK", "IN_REACTION", "FAME"]) {
            const scope = materialKind === undefined ? { siteId: 1 } : { siteId: 1, materialKind };
            const whole = computePeriodBalance({ holders, moves, period, scope });
            const fromBooks = computePeriodBalance({ holders, moves: own, period, scope, carried: books });
            expect(fromBooks).toEqual(whole);
          }
        },
      ),
      { numRuns: 300 },
    );
  });

  it("keep only stock holders' stock and the first time each went below zero", () => {
    const moves: BalanceMove[] = [
      { id: 1, at: T0, fromHolderId: null, toHolderId: 3, massG: 100, role: "RECEIPT" },
      { id: 2, at: T0 + DAY, fromHolderId: 3, toHolderId: 9, massG: 150, role: "TRANSFER" },
      { id: 3, at: T0 + 2 * DAY, fromHolderId: 3, toHolderId: 9, massG: 10, role: "TRANSFER" },
      { id: 4, at: T0 + 2 * DAY, fromHolderId: 3, toHolderId: 5, massG: 5, role: "OIL" },
    ];
    const books = carried(moves, [T0 + 3 * DAY]);
    expect(books.stockG).toEqual(
      new Map([
        [3, -65],
        [5, 5],
      ]),
    );
    expect(books.negativeStock).toEqual([{ holderId: 3, at: T0 + DAY, moveId: 2, balanceG: -50 }]);
    expect(books.batches.get(5)?.inputsByRole).toEqual({ OIL: 5 });
  });

  it("refuse to be used for a period that starts before them", () => {
    const books = carried([], [T0 + 5 * DAY]);
    const r = computePeriodBalance({
      holders,
      moves: [],
      period: { startMs: T0, endMs: T0 + 10 * DAY },
      scope: { siteId: 1 },
      carried: books,
    });
    expect(r.ok).toBe(false);
  });
});
