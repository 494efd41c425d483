import { describe, expect, it } from "vitest";
import { composePlanStock, lotsByEntryHolder, lotsNeeded } from "@/lib/batch/plan-stock";

const d = (day: number) => new Date(Date.UTC(2026, 1, day));
const L1 = { id: 1, holderId: 11, code: "L-1", receivedAt: d(1) };
const L2 = { id: 2, holderId: 12, code: "L-2", receivedAt: d(2) };

describe("the planner's stock from rows already read", () => {
  const lotOfHolder = lotsByEntryHolder(
    [L1, L2],
    [
      { holderId: 21, lotId: 2 }, // a pickup received into L-2
      { holderId: 22, lotId: null }, // a pickup not yet received
    ],
  );

  it("finds a tank's lots through the pickups they came in by", () => {
    expect(lotOfHolder.get(21)?.code).toBe("L-2");
    expect(lotOfHolder.get(11)?.code).toBe("L-1");
    expect(lotOfHolder.has(22)).toBe(false);
  });

  it("asks for the lab results of the lots offered and of every lot in a tank", () => {
    const shares = new Map([["T1", [{ lotHolderId: 21, grams: 5 }]]]);
    expect(lotsNeeded([1], shares, lotOfHolder).sort()).toEqual([1, 2]);
  });

  it("gives FFA as oleic, tank contents by lot (largest first) and unknown origins apart", () => {
    const stock = composePlanStock({
      lots: [{ ...L1, material: "USED_COOKING_OIL", stockG: 100_000 }],
      tanks: [
        { code: "T1", name: "Feed", stockG: 70_000 },
        { code: "T2", name: "Odd", stockG: 1_000 },
      ],
      tankShares: new Map([
        [
          "T1",
          [
            { lotHolderId: 11, grams: 20_000 },
            { lotHolderId: 21, grams: 30_000 },
            { lotHolderId: 12, grams: 15_000 },
            { lotHolderId: null, grams: 5_000 },
          ],
        ],
        ["T2", null],
      ]),
      lotOfHolder,
      results: new Map([
        [1, { ffaPct: 2, ffaBasis: "PALMITIC" as const, waterPct: 0.1 }],
        [2, { ffaPct: 1, ffaBasis: "OLEIC" as const, waterPct: null }],
      ]),
    });
    // 2 % as palmitic = 2 × 282.468 / 256.43 = 2.2031 % as oleic (IUPAC 2021 molar masses)
    expect(stock.lots[0]?.ffaPct).toBeCloseTo(2.2031, 4);
    expect(stock.lots[0]?.waterPct).toBe(0.1);
    const t1 = stock.tanks[0]?.contents ?? [];
    expect(t1.map((s) => [s.lotCode, s.grams])).toEqual([
      ["L-2", 45_000],
      ["L-1", 20_000],
      [null, 5_000],
    ]);
    expect(t1[0]?.ffaPct).toBe(1);
    expect(t1[2]?.ffaPct).toBeNull();
    expect(stock.tanks[1]?.contents).toBeNull();
  });
});
