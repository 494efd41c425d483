import { describe, expect, it } from "vitest";
import { computeFfaBySource, lotFfa } from "@/lib/feedstock/ffa-series";
import type { FfaLot } from "@/lib/feedstock/ffa-series";

const utc = (iso: string): number => Date.parse(iso);

const lots: FfaLot[] = [
  {
    code: "L-1",
    receivedAt: utc("2026-01-08T08:00:00Z"),
    material: "USED_COOKING_OIL",
    massG: 300_000,
    sourceCodes: ["S-A", "S-B", "S-A"],
    titrations: [{ testedAt: utc("2026-01-08T10:00:00Z"), ffaPct: 2.0, voided: false }],
  },
  {
    code: "L-2",
    receivedAt: utc("2026-01-02T08:00:00Z"),
    material: "USED_COOKING_OIL",
    massG: 100_000,
    sourceCodes: ["S-A"],
    titrations: [
      { testedAt: utc("2026-01-02T10:00:00Z"), ffaPct: 9.9, voided: false },
      { testedAt: utc("2026-01-02T11:00:00Z"), ffaPct: 6.0, voided: false },
      { testedAt: utc("2026-01-02T12:00:00Z"), ffaPct: 40, voided: true },
    ],
  },
  {
    code: "L-3",
    receivedAt: utc("2026-01-09T08:00:00Z"),
    material: "TALLOW",
    massG: 500_000,
    sourceCodes: ["S-C"],
    titrations: [],
  },
];

describe("FFA of the lots per source", () => {
  const series = computeFfaBySource(lots);
  const a = series.find((s) => s.sourceCode === "S-A");

  it("takes the mean of each lot's titrations that were not voided", () => {
    // Replicates are reported as their mean (common practice), as the lots list does: (9.9 + 6.0) ÷ 2.
    expect(lotFfa(lots[1]?.titrations ?? [])).toBeCloseTo(7.95, 10);
    expect(lotFfa([])).toBeNull();
  });

  it("puts a pooled lot under every source in it, once, oldest first", () => {
    expect(series.map((s) => s.sourceCode)).toEqual(["S-A", "S-B", "S-C"]);
    expect(a?.points.map((p) => p.lotCode)).toEqual(["L-2", "L-1"]);
    expect(series.find((s) => s.sourceCode === "S-B")?.points.map((p) => p.lotCode)).toEqual(["L-1"]);
  });

  it("counts a lot not yet titrated apart, with no point", () => {
    const c = series.find((s) => s.sourceCode === "S-C");
    expect(c?.points).toEqual([]);
    expect(c?.untested).toBe(1);
    expect(c?.massWeightedPct).toBeNull();
  });

  it("weights the mean by mass, as pooling the lots would", () => {
    // FFA is a mass fraction (AOCS Ca 5a-40: % free fatty acids, as oleic, by mass), so a pool's FFA is Σ(FFA·m)/Σm:
    // (2.0 × 300 kg + 7.95 × 100 kg) ÷ 400 kg = 3.4875 %.
    expect(a?.massWeightedPct).toBeCloseTo(3.4875, 10);
    expect(a?.minPct).toBe(2.0);
    expect(a?.maxPct).toBeCloseTo(7.95, 10);
  });
});
