import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { plausibleLitresPerMonth, WEEKS_PER_MONTH } from "@/lib/screening/capacity";
import { haversineMetres } from "@/lib/screening/geo";
import { flagDensityRange, flagFreshOil, flagLabExcess } from "@/lib/screening/lot-signals";
import {
  distanceBandOf,
  flagIntervalShift,
  flagLevelShift,
  flagOffHours,
  flagPhoneFar,
  withinHours,
} from "@/lib/screening/pattern-signals";
import { mad, MAD_CONSISTENCY, median, robustScore } from "@/lib/screening/robust";
import type { LotFact, MonthVolume, PickupFact } from "@/lib/screening/screening";
import {
  flagCertifiedOverCapacity,
  flagOverCapacity,
  flagOwnHistory,
  flagPeerGroup,
} from "@/lib/screening/volume-signals";

const month = (key: string, litres: number): MonthVolume => ({
  month: key,
  label: key,
  litres,
  pickupCodes: [`P-${key}`],
  lotCodes: [],
});
const months = (litres: number[]): MonthVolume[] =>
  litres.map((l, i) => month(`2026-${String(i + 1).padStart(2, "0")}`, l));
const DAY = 86_400_000;
const pickup = (i: number, litres: number, extra: Partial<PickupFact> = {}): PickupFact => ({
  code: `P-${i}`,
  at: Date.UTC(2026, 0, 1) + i * 7 * DAY,
  month: "2026-01",
  monthLabel: "January 2026",
  localHour: 14,
  litres,
  lotCode: null,
  distanceBand: null,
  certified: false,
  ...extra,
});
const lot = (code: string, extra: Partial<LotFact> = {}): LotFact => ({
  code,
  at: 0,
  material: "USED_COOKING_OIL",
  acidValue: null,
  waterPct: null,
  insolublesPct: null,
  densityKgM3: 915,
  densityMeasured: false,
  ...extra,
});

describe("robust statistics", () => {
  it("uses the 1.4826 consistency constant for MAD (Hampel 1974; Rousseeuw & Croux 1993)", () => {
    // 1.4826 ≈ 1 / Φ⁻¹(0.75) = 1 / 0.67449 — standard normal 75th percentile (Rousseeuw & Croux 1993, JASA 88:1273)
    expect(MAD_CONSISTENCY).toBeCloseTo(1 / 0.67449, 3);
  });
  it("median and MAD of a worked sample", () => {
    // [10, 12, 11, 13, 40]: median 12; |x − 12| = [2, 0, 1, 1, 28] → sorted [0, 1, 1, 2, 28], MAD = 1 (worked by hand)
    expect(median([10, 12, 11, 13, 40])).toBe(12);
    expect(mad([10, 12, 11, 13, 40])).toBe(1);
    // even count: median of [1, 2, 3, 4] = 2.5
    expect(median([4, 1, 3, 2])).toBe(2.5);
  });
  it("scores against the median in units of 1.4826 × MAD, with a floor proportional to the median", () => {
    // x = 40 against [10, 12, 11, 13]: median 11.5, |x − 11.5| = [1.5, 0.5, 0.5, 1.5] → MAD 1; σ̂ = 1.4826; z = 28.5 / 1.4826 = 19.223
    expect(robustScore(40, [10, 12, 11, 13], 0).z).toBeCloseTo(19.223, 3);
    // floor 0.5 × 11.5 = 5.75 > 1.4826 → z = 28.5 / 5.75 = 4.957
    expect(robustScore(40, [10, 12, 11, 13], 0.5).z).toBeCloseTo(4.957, 3);
    expect(robustScore(5, [5, 5, 5], 0).z).toBe(0);
  });
});

describe("capacity", () => {
  it("fryers × litres × changes a week × weeks a month", () => {
    // 3 × 20 L × 2 a week = 120 L/week; × 365.2425 / 84 = 4.348125 weeks → 521.775 L/month (Gregorian mean month)
    expect(WEEKS_PER_MONTH).toBeCloseTo(4.348125, 6);
    expect(
      plausibleLitresPerMonth({
        basis: "FRYERS",
        fryers: 3,
        fryerLitres: 20,
        changesPerWeek: 2,
        declaredLitresPerMonth: null,
      }),
    ).toBeCloseTo(521.775, 3);
    expect(
      plausibleLitresPerMonth({
        basis: "MONTHLY",
        fryers: null,
        fryerLitres: null,
        changesPerWeek: null,
        declaredLitresPerMonth: 600,
      }),
    ).toBe(600);
    expect(plausibleLitresPerMonth(null)).toBeNull();
  });
  it("flags a month above the ratio with its numbers in one sentence", () => {
    // 1 840 / 600 = 3.067 → "3.1×" (above 1.5×); 800 / 600 = 1.33 stays below
    const flags = flagOverCapacity(
      [{ ...month("2026-11", 1840), label: "November 2026" }, month("2026-10", 800)],
      { basis: "MONTHLY", fryers: null, fryerLitres: null, changesPerWeek: null, declaredLitresPerMonth: 600 },
      1.5,
    );
    expect(flags).toHaveLength(1);
    expect(flags[0]?.message).toContain("1,840 L in November 2026 against a declared 600 L/month: 3.1×");
    expect(flags[0]?.measured).toBeCloseTo(3.0667, 4);
  });
});

describe("own history", () => {
  it("flags a month far above the others (modified z > 3.5, Iglewicz & Hoaglin 1993)", () => {
    // others [600, 620, 580, 610, 590, 605]: median 602.5; |x − 602.5| sorted [2.5, 2.5, 7.5, 12.5, 17.5, 22.5] → MAD 10
    // σ̂ = 14.826, floor 0.1 × 602.5 = 60.25 wins; z = (1 840 − 602.5) / 60.25 = 20.539
    const flags = flagOwnHistory(months([600, 620, 580, 610, 590, 605, 1840]), 3.5, 0.1, 6);
    expect(flags.map((f) => f.subjectKey)).toEqual(["2026-07"]);
    expect(flags[0]?.measured).toBeCloseTo(20.539, 3);
  });
  it("does not flag normal variation, a low month, or a short history", () => {
    expect(flagOwnHistory(months([600, 620, 580, 610, 590, 605, 640]), 3.5, 0.1, 6)).toEqual([]);
    expect(flagOwnHistory(months([600, 620, 580, 610, 590, 605, 100]), 3.5, 0.1, 6)).toEqual([]);
    expect(flagOwnHistory(months([600, 620, 1840]), 3.5, 0.1, 6)).toEqual([]);
  });
  it("scaling all of a source's history by one factor does not change its own-history flags (property)", () => {
    fc.assert(
      fc.property(
        fc.array(fc.integer({ min: 50, max: 5000 }), { minLength: 7, maxLength: 30 }),
        fc.constantFrom(0.001, 0.5, 3.785411784, 10, 1000),
        (litres, k) => {
          const a = flagOwnHistory(months(litres), 3.5, 0.1, 6).map((f) => f.subjectKey);
          const b = flagOwnHistory(months(litres.map((l) => l * k)), 3.5, 0.1, 6).map((f) => f.subjectKey);
          const pa = flagLevelShift(
            litres.map((l, i) => pickup(i, l)),
            4,
            2,
          ).map((f) => f.subjectKey);
          const pb = flagLevelShift(
            litres.map((l, i) => pickup(i, l * k)),
            4,
            2,
          ).map((f) => f.subjectKey);
          return a.join() === b.join() && pa.join() === pb.join();
        },
      ),
      { numRuns: 300 },
    );
  });
});

describe("peer group", () => {
  it("compares the logarithm of litres with sources of the same kind", () => {
    // ln of peers [500, 600, 550, 650, 450] = [6.2146, 6.3969, 6.3099, 6.4770, 6.1092]: median 6.3099 (550 L)
    // |d| sorted [0, 0.0870, 0.0953, 0.1671, 0.2007] → MAD 0.0953, σ̂ = 0.14131; z = (ln 3000 − ln 550) / 0.14131 = 1.6964 / 0.14131 = 12.00
    const peers = new Map([["2026-11", [500, 600, 550, 650, 450]]]);
    const flags = flagPeerGroup([month("2026-11", 3000)], peers, "Restaurant", 3.5, 5);
    expect(flags[0]?.measured).toBeCloseTo(12.0, 1);
    expect(flags[0]?.message).toContain("5.5× theirs");
    expect(flagPeerGroup([month("2026-11", 620)], peers, "Restaurant", 3.5, 5)).toEqual([]);
    expect(flagPeerGroup([month("2026-11", 3000)], new Map([["2026-11", [500, 600]]]), "Restaurant", 3.5, 5)).toEqual(
      [],
    );
  });
});

describe("quality", () => {
  it("a used-oil lot at or below the fresh refined oil acid value (Codex CXS 210-1999: ≤ 0.6 mg KOH/g)", () => {
    const flags = flagFreshOil(
      [
        lot("L-1", { acidValue: 0.45 }),
        lot("L-2", { acidValue: 0.61 }),
        lot("L-3", { acidValue: 0.3, material: "SOYBEAN" }),
      ],
      0.6,
    );
    expect(flags.map((f) => f.subjectKey)).toEqual(["L-1"]);
    expect(flags[0]?.message).toContain("acid value is 0.45 mg KOH/g, at or below the 0.60 mg KOH/g");
  });
  it("water far above the source's other lots", () => {
    // all 7 lots sorted [0.30, 0.30, 0.35, 0.40, 0.40, 0.45, 4.0]: median 0.40; |d| sorted [0, 0, .05, .05, .1, .1, 3.6] → MAD 0.05
    // σ̂ = 1.4826 × 0.05 = 0.07413 (floor 0.1 × 0.40 = 0.04 lower); z = (4.0 − 0.40) / 0.07413 = 48.56; excess 3.60 points ≥ 1
    const water = [0.3, 0.4, 0.35, 0.3, 0.45, 0.4, 4.0].map((w, i) => lot(`L-${i}`, { waterPct: w }));
    const flags = flagLabExcess(water, "waterPct", { z: 3.5, floorShare: 0.1, minHistory: 6, minExcess: 1 });
    expect(flags.map((f) => f.subjectKey)).toEqual(["L-6"]);
    expect(flags[0]?.measured).toBeCloseTo(3.6, 3);
    expect(flags[0]?.message).toContain(
      "4.00 % water against this source's usual 0.40 % (median of its 7 lots): 3.60 points and 48.6 spreads above",
    );
    // 0.9 % is many spreads above but only 0.50 points above the median 0.40: not flagged
    const small = [0.3, 0.4, 0.35, 0.3, 0.45, 0.4, 0.9].map((w, i) => lot(`L-${i}`, { waterPct: w }));
    expect(flagLabExcess(small, "waterPct", { z: 3.5, floorShare: 0.1, minHistory: 6, minExcess: 1 })).toEqual([]);
  });
  it("measured density outside the vegetable oil range; table densities are not judged", () => {
    const flags = flagDensityRange(
      [
        lot("L-1", { densityKgM3: 962, densityMeasured: true }),
        lot("L-2", { densityKgM3: 962 }),
        lot("L-3", { densityKgM3: 918, densityMeasured: true }),
      ],
      895,
      935,
    );
    expect(flags.map((f) => f.subjectKey)).toEqual(["L-1"]);
  });
});

describe("pattern breaks", () => {
  it("a sudden volume level", () => {
    // window 2: before = median [100, 110, 90, 105, 95, 100] = 100; after = median [300, 310] = 305 → 3.05× > 2
    const p = [100, 110, 90, 105, 95, 100, 300, 310].map((l, i) => pickup(i, l));
    const flags = flagLevelShift(p, 2, 2);
    expect(flags[0]?.subjectKey).toBe("P-6");
    expect(flags[0]?.measured).toBeCloseTo(3.05, 3);
    expect(
      flagLevelShift(
        [100, 110, 90, 105, 95, 100, 120, 90].map((l, i) => pickup(i, l)),
        2,
        2,
      ),
    ).toEqual([]);
  });
  it("a sudden change of interval", () => {
    // weekly for 7 pickups (6 gaps of 7 d), then every 2 days: 2 / 7 = 0.29 < 1/2
    const at = [0, 7, 14, 21, 28, 35, 42, 44, 46].map((d) => Date.UTC(2026, 0, 1) + d * DAY);
    const flags = flagIntervalShift(
      at.map((t, i) => pickup(i, 100, { at: t })),
      2,
      2,
      3,
    );
    expect(flags[0]?.subjectKey).toBe("P-7");
    expect(flags[0]?.measured).toBeCloseTo(2 / 7, 4);
    // a daily route whose gaps go from 1 to 2.5 days: 2.5× but only 1.5 days apart — normal weekend slips (our own choice)
    const daily = [0, 1, 2, 3, 4, 5, 6, 8.5, 11, 13.5].map((d) => Date.UTC(2026, 0, 1) + d * DAY);
    expect(
      flagIntervalShift(
        daily.map((t, i) => pickup(i, 100, { at: t })),
        2,
        2,
        3,
      ),
    ).toEqual([]);
    expect(
      flagIntervalShift(
        daily.map((t, i) => pickup(i, 100, { at: t })),
        2,
        2,
        1,
      ),
    ).toHaveLength(1);
  });
  it("opening hours with a margin, including hours past midnight", () => {
    expect(withinHours(9.5, 10, 23, 1)).toBe(true);
    expect(withinHours(3.2, 10, 23, 1)).toBe(false);
    expect(withinHours(23.5, 10, 23, 1)).toBe(true);
    expect(withinHours(1, 18, 2, 0)).toBe(true);
    expect(withinHours(10, 18, 2, 0)).toBe(false);
    const flags = flagOffHours([pickup(1, 100, { localHour: 3.25 }), pickup(2, 100, { localHour: 14 })], 10, 23, 1);
    expect(flags.map((f) => f.message)).toEqual([
      "Pickup P-1 was logged at 03:15, outside the declared opening hours 10:00–23:00 (with 1.0 h either side).",
    ]);
    expect(flagOffHours([pickup(1, 100, { localHour: 3 })], null, null, 1)).toEqual([]);
  });
  it("phone distance bands", () => {
    expect([250, 251, 1000, 1001, 10_001].map(distanceBandOf)).toEqual(["NEAR", "KM_1", "KM_1", "KM_10", "FAR"]);
    const flags = flagPhoneFar([
      pickup(1, 100, { distanceBand: "KM_1" }),
      pickup(2, 100, { distanceBand: "FAR" }),
      pickup(3, 100),
    ]);
    expect(flags.map((f) => f.subjectKey)).toEqual(["P-2"]);
  });
  it("haversine distance on the IUGG mean Earth radius", () => {
    // 1° along a meridian = 6 371 008.8 m × π / 180 = 111 195.08 m (IUGG mean radius R1, Moritz 2000)
    expect(haversineMetres({ lat: 10, lon: 5 }, { lat: 11, lon: 5 })).toBeCloseTo(111_195.08, 1);
    // a quarter of a great circle: equator to pole = R × π / 2 = 10 007 557.2 m
    expect(haversineMetres({ lat: 0, lon: 0 }, { lat: 90, lon: 0 })).toBeCloseTo(10_007_557.2, 0);
  });
});

describe("custody", () => {
  it("certified litres over the certificate's period against capacity × months elapsed", () => {
    // certificate to 2026-12-01, 12 months → from 2025-12-01: 365 d / 30.436875 d = 11.9921 months
    // plausible 600 × 11.9921 = 7 195.3 L; certified 12 × 1 000 = 12 000 L → 1.668× > 1.5
    const expires = Date.UTC(2026, 11, 1);
    const p = Array.from({ length: 12 }, (_, i) => ({
      code: `P-${i}`,
      at: Date.UTC(2025, 11, 15 + i * 28),
      litres: 1000,
      certified: true,
      lotCode: "L-1",
    }));
    const cap = {
      basis: "MONTHLY" as const,
      fryers: null,
      fryerLitres: null,
      changesPerWeek: null,
      declaredLitresPerMonth: 600,
    };
    const flags = flagCertifiedOverCapacity(p, cap, { no: "C-1", expires, months: 12 }, Date.UTC(2026, 11, 15), 1.5);
    expect(flags[0]?.measured).toBeCloseTo(12000 / (600 * (365 / 30.436875)), 3);
    expect(flags[0]?.lotCodes).toEqual(["L-1"]);
    expect(
      flagCertifiedOverCapacity(
        p.map((x) => ({ ...x, certified: false })),
        cap,
        { no: "C-1", expires, months: 12 },
        Date.UTC(2026, 11, 15),
        1.5,
      ),
    ).toEqual([]);
  });
});
