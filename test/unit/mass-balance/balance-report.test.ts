import { describe, expect, it } from "vitest";
import { periodRangeInput, resolveBalanceQuery, toleranceInput } from "@/lib/mass-balance/balance-period-query";
import { assembleBalanceReport, balanceLines, materialRows } from "@/lib/mass-balance/balance-report";
import type { BalanceLedger } from "@/lib/mass-balance/balance-types";
import { computePeriodBalance, DEFAULT_CLOSURE_TOLERANCE } from "@/lib/mass-balance/period-balance";

const utc = (iso: string): number => Date.parse(iso);
const KG = 1000;

describe("the balance page's question", () => {
  it("defaults to last month at the site, including across a year end", () => {
    const now = utc("2026-01-15T12:00:00Z");
    expect(resolveBalanceQuery({ period: "MONTH" }, now, "UTC")).toEqual({
      period: "MONTH",
      year: 2025,
      month: 12,
      quarter: 4,
      start: "2025-12-01",
      end: "2026-01-01",
    });
    // The site's clock decides the month: 23:30 UTC on 31 January is already February in UTC+2.
    expect(resolveBalanceQuery({ period: "MONTH" }, utc("2026-01-31T23:30:00Z"), "Europe/Athens").month).toBe(1);
  });

  it("takes a given year as its first month and quarter", () => {
    const r = resolveBalanceQuery({ period: "QUARTER", year: 2025 }, utc("2026-06-01T00:00:00Z"), "UTC");
    expect([r.year, r.month, r.quarter]).toEqual([2025, 1, 1]);
  });

  it("gives the range schema the site's offsets at both ends (daylight saving starts inside the quarter)", () => {
    const r = resolveBalanceQuery(
      { period: "QUARTER", year: 2026, quarter: 1 },
      utc("2026-06-01T00:00:00Z"),
      "Europe/Berlin",
    );
    expect(periodRangeInput(r, "Europe/Berlin")).toEqual({
      kind: "QUARTER",
      year: 2026,
      quarter: 1,
      utcOffsetMin: 60,
      utcOffsetAtEndMin: 120,
    });
    const custom = resolveBalanceQuery({ period: "CUSTOM", start: "2026-03-01", end: "2026-03-08" }, 0, "UTC");
    expect(periodRangeInput(custom, "UTC")).toMatchObject({
      kind: "CUSTOM",
      startDate: "2026-03-01",
      endDate: "2026-03-08",
    });
  });

  it("marks an entered tolerance as entered, and keeps the site's own otherwise", () => {
    expect(toleranceInput({})).toEqual(DEFAULT_CLOSURE_TOLERANCE);
    expect(toleranceInput({ warnPct: DEFAULT_CLOSURE_TOLERANCE.warnPct + 1 })).toMatchObject({
      warnPct: DEFAULT_CLOSURE_TOLERANCE.warnPct + 1,
      failPct: DEFAULT_CLOSURE_TOLERANCE.failPct,
      source: "entered with this balance",
    });
    const site = { ...DEFAULT_CLOSURE_TOLERANCE, warnPct: 0.2, failPct: 0.8, source: "set by this site" };
    expect(toleranceInput({}, site)).toEqual(site);
    expect(toleranceInput({ failPct: 0.9 }, site)).toMatchObject({
      warnPct: 0.2,
      failPct: 0.9,
      note: "The site works to warn above 0.2 %, fail above 0.8 % (set by this site).",
    });
  });
});

// A fictional plant in January: 1 000 kg of oil received into a lot, 600 kg moved into a tank, 100 kg shipped.
const JANUARY = { startMs: utc("2026-01-01T00:00:00Z"), endMs: utc("2026-02-01T00:00:00Z") };
const LEDGER: BalanceLedger = {
  holders: [
    { id: 1, kind: "LOT", siteId: 1, materialKind: "USED_COOKING_OIL" },
    { id: 2, kind: "TANK", siteId: 1, materialKind: "MIXED_FEEDSTOCK" },
    { id: 3, kind: "SHIPMENT", siteId: 1 },
    { id: 4, kind: "TANK", siteId: 1, materialKind: "METHANOL" },
  ],
  moves: [
    { id: 10, at: utc("2026-01-02T00:00:00Z"), fromHolderId: null, toHolderId: 1, massG: 1000 * KG, role: "RECEIPT" },
    { id: 11, at: utc("2026-01-03T00:00:00Z"), fromHolderId: 1, toHolderId: 2, massG: 600 * KG, role: "TRANSFER" },
    { id: 12, at: utc("2026-01-04T00:00:00Z"), fromHolderId: 2, toHolderId: 3, massG: 100 * KG, role: "SHIPMENT" },
  ],
  refs: new Map([
    [1, { id: 1, kind: "LOT", code: "L-1", materialKind: "USED_COOKING_OIL" }],
    [2, { id: 2, kind: "TANK", code: "T-1", materialKind: "MIXED_FEEDSTOCK" }],
    [3, { id: 3, kind: "SHIPMENT", code: "S-1", materialKind: null }],
  ]),
};
const computation = {
  ledger: LEDGER,
  span: JANUARY,
  siteId: 1,
  tolerance: DEFAULT_CLOSURE_TOLERANCE,
  gauges: [],
};

describe("the balance report", () => {
  const whole = computePeriodBalance({
    holders: LEDGER.holders,
    moves: LEDGER.moves,
    period: JANUARY,
    scope: { siteId: 1 },
    tolerance: DEFAULT_CLOSURE_TOLERANCE,
  });

  it("lists the stock identity so that what came in equals what went out", () => {
    expect(whole.ok).toBe(true);
    if (!whole.ok) return;
    const { inputs, outputs, internal } = balanceLines(whole.value.stock);
    const sum = (lines: { grams: number }[]) => lines.reduce((s, l) => s + l.grams, 0);
    expect(sum(inputs)).toBe(1000 * KG);
    expect(sum(outputs)).toBe(1000 * KG);
    expect(outputs.find((l) => l.key === "shipments")?.grams).toBe(100 * KG);
    expect(outputs.find((l) => l.key === "closing")?.grams).toBe(900 * KG);
    expect(internal.find((l) => l.key === "TRANSFER")?.grams).toBe(600 * KG);
  });

  it("balances each material kind that held or moved something, and leaves out one that did not", () => {
    const rows = materialRows(computation);
    expect(rows.ok && rows.value.map((r) => [r.materialKind, r.openingG, r.inG, r.outputsG, r.closingG])).toEqual([
      ["MIXED_FEEDSTOCK", 0, 600 * KG, 100 * KG, 500 * KG],
      ["USED_COOKING_OIL", 0, 1000 * KG, 0, 400 * KG],
    ]);
  });

  it("names holders by their codes and adds up the lines", () => {
    if (!whole.ok) throw new Error("the balance above is computed");
    const report = assembleBalanceReport({
      query: {
        period: "MONTH",
        year: 2026,
        month: 1,
        quarter: 1,
        start: "2026-01-01",
        end: "2026-02-01",
        warnPct: 1,
        failPct: 2,
      },
      period: { label: "2026-01", startsAt: new Date(JANUARY.startMs), endsAt: new Date(JANUARY.endMs) },
      tolerance: DEFAULT_CLOSURE_TOLERANCE,
      ledger: LEDGER,
      whole: whole.value,
      byMaterial: [],
      gauge: {
        rows: [
          {
            holderId: 2,
            at: utc("2026-01-31T00:00:00Z"),
            bookG: 500 * KG,
            measuredG: 495 * KG,
            differenceG: -5 * KG,
            closure: { imbalanceG: -5 * KG, baseG: 500 * KG, pct: -1, flag: "OK" },
          },
        ],
        total: {
          bookG: 500 * KG,
          measuredG: 495 * KG,
          differenceG: -5 * KG,
          closure: { imbalanceG: -5 * KG, baseG: 500 * KG, pct: -1, flag: "OK" },
        },
      },
      accountingPeriod: null,
      events: [],
    });
    expect(report.inputsG).toBe(report.outputsG);
    expect(report.gauges?.rows.map((r) => r.tankCode)).toEqual(["T-1"]);
    expect(report.negativeStock).toEqual([]);
  });
});
