import { describe, expect, it } from "vitest";
import { computePeriodBalance } from "@/lib/mass-balance/period-balance";
import type { BalanceHolder, BalanceMove } from "@/lib/mass-balance/period-balance";
import { computeTankStockSeries } from "@/lib/tank/stock-series";
import type { TankMove } from "@/lib/tank/stock-series";

const utc = (iso: string): number => Date.parse(iso);

// A small ledger: two lots into tank 3, a transfer to tank 4, two charges to a batch, all in January.
const TANK = 3;
const holders: BalanceHolder[] = [
  { id: 1, kind: "LOT", siteId: 1, materialKind: "USED_COOKING_OIL" },
  { id: 2, kind: "LOT", siteId: 1, materialKind: "TALLOW" },
  { id: TANK, kind: "TANK", siteId: 1, materialKind: "MIXED_FEEDSTOCK" },
  { id: 4, kind: "TANK", siteId: 1, materialKind: "MIXED_FEEDSTOCK" },
  { id: 5, kind: "BATCH", siteId: 1, completedAt: null },
];
const ledger: BalanceMove[] = [
  { id: 1, at: utc("2026-01-02T08:00:00Z"), fromHolderId: null, toHolderId: 1, massG: 900_000, role: "RECEIPT" },
  { id: 2, at: utc("2026-01-02T09:00:00Z"), fromHolderId: null, toHolderId: 2, massG: 400_000, role: "RECEIPT" },
  { id: 3, at: utc("2026-01-03T10:00:00Z"), fromHolderId: 1, toHolderId: TANK, massG: 900_000, role: "TRANSFER" },
  { id: 4, at: utc("2026-01-03T10:00:00Z"), fromHolderId: 2, toHolderId: TANK, massG: 400_000, role: "TRANSFER" },
  { id: 5, at: utc("2026-01-05T07:30:00Z"), fromHolderId: TANK, toHolderId: 4, massG: 250_000, role: "TRANSFER" },
  { id: 6, at: utc("2026-01-06T06:00:00Z"), fromHolderId: TANK, toHolderId: 5, massG: 600_000, role: "OIL" },
  { id: 7, at: utc("2026-01-09T06:00:00Z"), fromHolderId: TANK, toHolderId: 5, massG: 123_457, role: "OIL" },
];

function tankMoves(moves: readonly BalanceMove[], tank: number): TankMove[] {
  return moves.flatMap((m): TankMove[] => {
    if (m.toHolderId === tank) return [{ at: m.at, massG: m.massG, direction: "IN" }];
    if (m.fromHolderId === tank) return [{ at: m.at, massG: m.massG, direction: "OUT" }];
    return [];
  });
}

describe("tank stock series", () => {
  const series = computeTankStockSeries(
    tankMoves(ledger, TANK),
    [{ at: utc("2026-01-07T12:00:00Z"), massG: 449_000 }],
    2_000_000,
  );

  it("sums equal the movements: in, out and closing match the ledger, to the gram", () => {
    expect(series.inG).toBe(900_000 + 400_000);
    expect(series.outG).toBe(250_000 + 600_000 + 123_457);
    expect(series.closingG).toBe(326_543);
    expect(series.book.at(-1)?.stockG).toBe(series.closingG);
  });

  it("ends where the period balance puts the tank's closing stock", () => {
    const balance = computePeriodBalance({
      holders,
      moves: ledger,
      period: { startMs: utc("2026-01-01T00:00:00Z"), endMs: utc("2026-02-01T00:00:00Z") },
      scope: { siteId: 1 },
    });
    if (!balance.ok) throw new Error("balance refused");
    const tank = balance.value.stock.byHolder.find((h) => h.holderId === TANK);
    expect(series.book.at(-1)?.stockG).toBe(tank?.closingG);
  });

  it("starts empty, steps once per instant and keeps the peak", () => {
    expect(series.book.map((p) => p.stockG)).toEqual([0, 1_300_000, 1_050_000, 450_000, 326_543]);
    expect(series.book[0]?.at).toBe(utc("2026-01-03T10:00:00Z"));
    expect(series.peakG).toBe(1_300_000);
    expect(series.gauges).toEqual([{ at: utc("2026-01-07T12:00:00Z"), stockG: 449_000 }]);
    expect(series.capacityG).toBe(2_000_000);
  });

  it("draws nothing for a tank with no movements", () => {
    const empty = computeTankStockSeries([], [], 1_000_000);
    expect(empty.book).toEqual([]);
    expect(empty.closingG).toBe(0);
    expect(empty.peakG).toBe(0);
  });
});
