// Which holders a period's statement keeps out of a read that may have returned more.
import { describe, expect, it } from "vitest";
import { shownHolderIds } from "@/lib/mass-balance/shown-holders";

const SINCE = Date.UTC(2026, 6, 1);

describe("shownHolderIds", () => {
  const holders = [
    { id: 1, kind: "TANK" },
    { id: 2, kind: "LOT" },
    { id: 3, kind: "BATCH" },
    { id: 4, kind: "BATCH" },
    { id: 5, kind: "BATCH" },
    { id: 6, kind: "BATCH" },
    { id: 7, kind: "PICKUP" },
  ];
  const batches = [
    { holderId: 3, completedAt: new Date(SINCE - 1) },
    { holderId: 4, completedAt: new Date(SINCE) },
    { holderId: 5, completedAt: null },
  ];

  it("keeps the named holders and every batch not finished before the period, and leaves out the rest", () => {
    const kept = shownHolderIds(holders, batches, new Set([1, 3]), SINCE);
    // 1 and 3 named; 4 finished at the period start; 5 still running; 6 has no batch record.
    expect([...kept].sort((a, b) => a - b)).toEqual([1, 3, 4, 5, 6]);
  });

  it("leaves out a holder the read returned but nothing names (a movement committed between the reads)", () => {
    expect(shownHolderIds(holders, batches, new Set([1]), SINCE).has(7)).toBe(false);
    expect(shownHolderIds(holders, batches, new Set([1, 7]), SINCE).has(7)).toBe(true);
  });

  it("keeps only named holders whose batch finished before the period", () => {
    expect(shownHolderIds(holders, batches, new Set<number>(), SINCE).has(3)).toBe(false);
  });
});
