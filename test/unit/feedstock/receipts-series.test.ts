import { describe, expect, it } from "vitest";
import { computeReceiptsSeries, weekStartMs } from "@/lib/feedstock/receipts-series";
import type { FeedstockReceipt } from "@/lib/feedstock/receipts-series";
import { computePeriodBalance } from "@/lib/mass-balance/period-balance";
import type { BalanceHolder, BalanceMove } from "@/lib/mass-balance/period-balance";

const utc = (iso: string): number => Date.parse(iso);

// Pickups (estimates), a delivered lot, a receiving difference into the pooled lot, and internal moves
// that are not receipts (pickup into lot, lot into tank).
const holders: BalanceHolder[] = [
  { id: 1, kind: "PICKUP", siteId: 1, materialKind: "USED_COOKING_OIL" },
  { id: 2, kind: "PICKUP", siteId: 1, materialKind: "USED_COOKING_OIL" },
  { id: 3, kind: "LOT", siteId: 1, materialKind: "USED_COOKING_OIL" },
  { id: 4, kind: "LOT", siteId: 1, materialKind: "TALLOW" },
  { id: 5, kind: "TANK", siteId: 1, materialKind: "MIXED_FEEDSTOCK" },
];
const ledger: BalanceMove[] = [
  { id: 1, at: utc("2026-01-05T09:00:00Z"), fromHolderId: null, toHolderId: 1, massG: 180_000, role: "RECEIPT" },
  { id: 2, at: utc("2026-01-07T15:00:00Z"), fromHolderId: null, toHolderId: 2, massG: 95_500, role: "RECEIPT" },
  { id: 3, at: utc("2026-01-08T08:00:00Z"), fromHolderId: 1, toHolderId: 3, massG: 180_000, role: "TRANSFER" },
  { id: 4, at: utc("2026-01-08T08:00:00Z"), fromHolderId: 2, toHolderId: 3, massG: 95_500, role: "TRANSFER" },
  { id: 5, at: utc("2026-01-08T08:00:00Z"), fromHolderId: null, toHolderId: 3, massG: 1_250, role: "RECEIPT" },
  { id: 6, at: utc("2026-01-13T11:00:00Z"), fromHolderId: null, toHolderId: 4, massG: 21_000_000, role: "RECEIPT" },
  { id: 7, at: utc("2026-01-14T11:00:00Z"), fromHolderId: 4, toHolderId: 5, massG: 21_000_000, role: "TRANSFER" },
  { id: 8, at: utc("2026-02-02T11:00:00Z"), fromHolderId: null, toHolderId: 1, massG: 7_000, role: "RECEIPT" },
];
const material = new Map(holders.map((h) => [h.id, h.materialKind ?? "?"]));
const receipts: FeedstockReceipt[] = ledger
  .filter((m) => m.role === "RECEIPT" && m.fromHolderId === null)
  .map((m) => ({ at: m.at, massG: m.massG, material: material.get(m.toHolderId) ?? "?" }));
const JANUARY = { startMs: utc("2026-01-01T00:00:00Z"), endMs: utc("2026-02-01T00:00:00Z") };

describe("feedstock received per week", () => {
  const series = computeReceiptsSeries(receipts, JANUARY, 0);

  it("sums equal the movements: the period total is the balance's feedstock received", () => {
    const balance = computePeriodBalance({ holders, moves: ledger, period: JANUARY, scope: { siteId: 1 } });
    if (!balance.ok) throw new Error("balance refused");
    expect(series.totalG).toBe(balance.value.stock.receipts.feedstockG);
    expect(series.totalG).toBe(180_000 + 95_500 + 1_250 + 21_000_000);
    expect(series.weeks.reduce((s, w) => s + w.totalG, 0)).toBe(series.totalG);
  });

  it("stacks by material kind, week by week, with empty weeks kept", () => {
    expect(series.weeks.map((w) => w.weekOf)).toEqual([
      "2025-12-29",
      "2026-01-05",
      "2026-01-12",
      "2026-01-19",
      "2026-01-26",
    ]);
    expect(series.weeks[1]?.byMaterial).toEqual({ USED_COOKING_OIL: 276_750 });
    expect(series.weeks[2]?.byMaterial).toEqual({ TALLOW: 21_000_000 });
    expect(series.weeks[3]?.totalG).toBe(0);
    expect(series.materials).toEqual(["TALLOW", "USED_COOKING_OIL"]);
  });

  it("starts weeks on Monday at site midnight", () => {
    // ISO 8601-1:2019, 5.2.4.1: the calendar week begins on Monday. 2026-01-05 is a Monday (Date#getUTCDay 1).
    expect(new Date(utc("2026-01-05T00:00:00Z")).getUTCDay()).toBe(1);
    expect(weekStartMs(utc("2026-01-11T23:59:59Z"), 0)).toBe(utc("2026-01-05T00:00:00Z"));
    // Sunday 23:30 UTC is already Monday 01:30 at UTC+2: a new week there.
    expect(weekStartMs(utc("2026-01-11T23:30:00Z"), 120)).toBe(utc("2026-01-11T22:00:00Z"));
    // Monday 03:00 UTC is still Sunday evening at UTC−5.
    expect(weekStartMs(utc("2026-01-12T03:00:00Z"), -300)).toBe(utc("2026-01-05T05:00:00Z"));
  });

  it("gives an empty picture for an empty period", () => {
    const none = computeReceiptsSeries([], { startMs: JANUARY.endMs, endMs: JANUARY.endMs }, 0);
    expect(none).toEqual({ weeks: [], materials: [], totalsByMaterial: {}, totalG: 0 });
  });
});
