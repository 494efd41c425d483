import fc from "fast-check";
import { describe, expect, it } from "vitest";
import type { HolderKind, MoveRole } from "@/lib/core/vocabulary";
import {
  DEFAULT_CLOSURE_TOLERANCE,
  DEFAULT_HOLDER_CLASSES,
  classifyClosure,
  compareBookToGauges,
  computePeriodBalance,
} from "@/lib/mass-balance/period-balance";
import type { BalanceHolder, BalanceMove, PeriodBalance } from "@/lib/mass-balance/period-balance";

const utc = (iso: string): number => Date.parse(iso);
const JANUARY = { startMs: utc("2026-01-01T00:00:00Z"), endMs: utc("2026-02-01T00:00:00Z") };

// A small plant, site 1, with one holder of each kind and a tank at another site (site 2).
const H = {
  pickup: 1,
  lot: 2,
  tank: 3,
  methanol: 4,
  koh: 5,
  batch: 6,
  product: 7,
  glycerolDrum: 8,
  shipment: 9,
  loss: 10,
  disposal: 11,
  otherSiteTank: 12,
} as const;

const holders: BalanceHolder[] = [
  { id: H.pickup, kind: "PICKUP", siteId: 1, materialKind: "USED_COOKING_OIL" },
  { id: H.lot, kind: "LOT", siteId: 1, materialKind: "USED_COOKING_OIL" },
  { id: H.tank, kind: "TANK", siteId: 1, materialKind: "USED_COOKING_OIL" },
  { id: H.methanol, kind: "REAGENT_LOT", siteId: 1, materialKind: "METHANOL" },
  { id: H.koh, kind: "REAGENT_LOT", siteId: 1, materialKind: "KOH" },
  { id: H.batch, kind: "BATCH", siteId: 1, completedAt: utc("2026-01-12T00:00:00Z") },
  { id: H.product, kind: "PRODUCT_LOT", siteId: 1 },
  { id: H.glycerolDrum, kind: "WASTE_CONTAINER", siteId: 1 },
  { id: H.shipment, kind: "SHIPMENT", siteId: 1 },
  { id: H.loss, kind: "LOSS", siteId: 1 },
  { id: H.disposal, kind: "DISPOSAL", siteId: 1 },
  { id: H.otherSiteTank, kind: "TANK", siteId: 2, materialKind: "USED_COOKING_OIL" },
];

let nextId = 1;
const mv = (at: string, from: number | null, to: number, massG: number, role: MoveRole): BalanceMove => ({
  id: nextId++,
  at: utc(at),
  fromHolderId: from,
  toHolderId: to,
  massG,
  role,
});

const moves: BalanceMove[] = [
  mv("2025-12-20T08:00:00Z", null, H.tank, 2_000_000, "RECEIPT"), // opening stock: 2 000 kg in the tank
  mv("2026-01-02T08:00:00Z", null, H.pickup, 1_200_000, "RECEIPT"),
  mv("2026-01-03T08:00:00Z", H.pickup, H.lot, 1_200_000, "TRANSFER"),
  mv("2026-01-04T08:00:00Z", H.lot, H.tank, 1_200_000, "TRANSFER"),
  mv("2026-01-05T08:00:00Z", null, H.methanol, 300_000, "RECEIPT"),
  mv("2026-01-05T08:00:00Z", null, H.koh, 20_000, "RECEIPT"),
  mv("2026-01-10T08:00:00Z", H.tank, H.batch, 1_000_000, "OIL"),
  mv("2026-01-10T08:05:00Z", H.methanol, H.batch, 220_000, "METHANOL"),
  mv("2026-01-10T08:10:00Z", H.koh, H.batch, 15_000, "CATALYST"),
  mv("2026-01-11T08:00:00Z", H.batch, H.product, 990_000, "ESTER"),
  mv("2026-01-11T08:10:00Z", H.batch, H.glycerolDrum, 150_000, "GLYCEROL_PHASE"),
  mv("2026-01-11T09:00:00Z", H.batch, H.methanol, 80_000, "RECOVERED_METHANOL"),
  mv("2026-01-11T09:10:00Z", H.batch, H.loss, 10_000, "LOSS"), // recorded loss
  mv("2026-01-20T08:00:00Z", H.product, H.shipment, 900_000, "SHIPMENT"),
  mv("2026-01-25T08:00:00Z", H.glycerolDrum, H.disposal, 150_000, "DISPOSAL"),
  mv("2026-01-26T08:00:00Z", H.tank, H.otherSiteTank, 100_000, "TRANSFER"),
  mv("2026-02-02T08:00:00Z", H.product, H.shipment, 90_000, "SHIPMENT"), // after the period
];

function requireBalance(input: Parameters<typeof computePeriodBalance>[0]): PeriodBalance {
  const r = computePeriodBalance(input);
  if (!r.ok) throw new Error(JSON.stringify(r.issues));
  return r.value;
}

describe("computePeriodBalance — hand-worked January", () => {
  const b = requireBalance({ holders, moves, period: JANUARY, scope: { siteId: 1 } });

  it("stock view: opening + receipts = outputs + transfers out + closing, by hand", () => {
    expect(b.stock.openingG).toBe(2_000_000);
    expect(b.stock.receipts).toEqual({
      totalG: 1_200_000 + 300_000 + 20_000,
      feedstockG: 1_200_000,
      reagentG: 320_000,
      otherG: 0,
      unmeasuredG: 0,
    });
    expect(b.stock.outputs).toEqual({
      totalG: 900_000 + 150_000 + 10_000,
      shipmentG: 900_000,
      disposalG: 150_000,
      lossG: 10_000,
      unmeasuredG: 0,
      otherG: 0,
    });
    expect(b.stock.transfersOutG).toBe(100_000);
    expect(b.stock.transfersInG).toBe(0);
    // 2 000 000 + 1 520 000 − 1 060 000 − 100 000
    expect(b.stock.closingG).toBe(2_360_000);
    expect(b.stock.deltaStockG).toBe(360_000);
    expect(b.stock.imbalanceG).toBe(0);
    expect(b.stock.closure.flag).toBe("OK");
    expect(b.stock.negativeStock).toEqual([]);
  });

  it("closing stock per holder; holders empty at both ends are left out", () => {
    const closing = Object.fromEntries(b.stock.byHolder.map((h) => [h.holderId, h.closingG]));
    expect(closing).toEqual({
      [H.tank]: 2_000_000 + 1_200_000 - 1_000_000 - 100_000,
      [H.methanol]: 300_000 - 220_000 + 80_000,
      [H.koh]: 20_000 - 15_000,
      [H.batch]: 1_235_000 - 1_230_000,
      [H.product]: 990_000 - 900_000,
    });
    // The pickup, the lot and the glycerol drum were filled and emptied within the period.
    expect(b.stock.byHolder.map((h) => h.holderId)).not.toEqual(expect.arrayContaining([H.pickup]));
    expect(b.stock.byHolder.some((h) => h.holderId === H.lot || h.holderId === H.glycerolDrum)).toBe(false);
  });

  it("per-role breakdown of what crossed the scope boundary and what moved inside it", () => {
    expect(b.stock.byRole.RECEIPT).toEqual({ inG: 1_520_000, outG: 0, internalG: 0 });
    expect(b.stock.byRole.TRANSFER).toEqual({ inG: 0, outG: 100_000, internalG: 2_400_000 });
    expect(b.stock.byRole.LOSS).toEqual({ inG: 0, outG: 10_000, internalG: 0 });
    expect(b.stock.byRole.SHIPMENT).toEqual({ inG: 0, outG: 900_000, internalG: 0 });
    expect(b.stock.byRole.OIL).toEqual({ inG: 0, outG: 0, internalG: 1_000_000 });
  });

  it("process view: batch inputs vs outputs with the recorded loss", () => {
    expect(b.process.completed).toHaveLength(1);
    expect(b.process.inProgress).toHaveLength(0);
    expect(b.process.inputsByRole).toEqual({ OIL: 1_000_000, METHANOL: 220_000, CATALYST: 15_000 });
    expect(b.process.outputsByRole).toEqual({
      ESTER: 990_000,
      GLYCEROL_PHASE: 150_000,
      RECOVERED_METHANOL: 80_000,
      LOSS: 10_000,
    });
    expect(b.process.inputsG).toBe(1_235_000);
    expect(b.process.outputsG).toBe(1_230_000);
    expect(b.process.imbalanceG).toBe(5_000);
    // 5 000 / 1 235 000 = 0.4049 %, under the 0.5 % warn level (common practice, no source)
    expect(b.process.closure.pct).toBeCloseTo(0.404858, 6);
    expect(b.process.closure.flag).toBe("OK");
  });

  it("a batch not finished by the period end is in progress and holds its charge", () => {
    const open = holders.map((h) => (h.id === H.batch ? { ...h, completedAt: null } : h));
    const r = requireBalance({ holders: open, moves, period: JANUARY, scope: { siteId: 1 } });
    expect(r.process.completed).toHaveLength(0);
    expect(r.process.inProgress.map((x) => [x.holderId, x.imbalanceG])).toEqual([[H.batch, 5_000]]);
    expect(r.process.inputsG).toBe(0);
  });

  it("a material-scoped balance counts the oil charged to the batch as leaving its scope", () => {
    const uco = requireBalance({
      holders,
      moves,
      period: JANUARY,
      scope: { siteId: 1, materialKind: "USED_COOKING_OIL" },
    });
    expect(uco.stock.receipts.totalG).toBe(1_200_000);
    expect(uco.stock.transfersOutG).toBe(1_000_000 + 100_000);
    expect(uco.stock.outputs.totalG).toBe(0);
    expect(uco.stock.closingG).toBe(2_100_000);
    expect(uco.stock.imbalanceG).toBe(0);
    expect(uco.process.completed).toHaveLength(0);
  });

  it("the other site sees the transfer as coming in", () => {
    const s2 = requireBalance({ holders, moves, period: JANUARY, scope: { siteId: 2 } });
    expect(s2.stock.transfersInG).toBe(100_000);
    expect(s2.stock.closingG).toBe(100_000);
  });

  it("February opens with January's closing stock", () => {
    const feb = requireBalance({
      holders,
      moves,
      period: { startMs: JANUARY.endMs, endMs: utc("2026-03-01T00:00:00Z") },
      scope: { siteId: 1 },
    });
    expect(feb.stock.openingG).toBe(2_360_000);
    expect(feb.stock.outputs.shipmentG).toBe(90_000);
    expect(feb.stock.closingG).toBe(2_270_000);
    expect(feb.process.completed).toHaveLength(0);
  });
});

describe("computePeriodBalance — signals of missing records", () => {
  it("reports a holder whose book stock goes below zero (a movement in is missing)", () => {
    const missingReceipt = [mv("2026-01-03T08:00:00Z", H.lot, H.tank, 50_000, "TRANSFER")];
    const b = requireBalance({ holders, moves: missingReceipt, period: JANUARY, scope: { siteId: 1 } });
    expect(b.stock.negativeStock).toEqual([
      { holderId: H.lot, at: utc("2026-01-03T08:00:00Z"), moveId: missingReceipt[0]?.id, balanceG: -50_000 },
    ]);
  });

  it("finds the same first negative stock whatever order the movements are listed in", () => {
    const history = [
      mv("2026-01-02T08:00:00Z", null, H.lot, 30_000, "RECEIPT"),
      mv("2026-01-03T08:00:00Z", H.lot, H.tank, 50_000, "TRANSFER"),
      mv("2026-01-04T08:00:00Z", null, H.lot, 40_000, "RECEIPT"),
      mv("2026-01-05T08:00:00Z", H.lot, H.tank, 30_000, "TRANSFER"),
    ];
    const expected = [{ holderId: H.lot, at: utc("2026-01-03T08:00:00Z"), moveId: history[1]?.id, balanceG: -20_000 }];
    expect(
      requireBalance({ holders, moves: history, period: JANUARY, scope: { siteId: 1 } }).stock.negativeStock,
    ).toEqual(expected);
    expect(
      requireBalance({ holders, moves: [...history].reverse(), period: JANUARY, scope: { siteId: 1 } }).stock
        .negativeStock,
    ).toEqual(expected);
  });

  it("does not flag a draw booked at the same instant as the receipt that covers it", () => {
    const sameInstant = [
      mv("2026-01-03T08:00:00Z", H.lot, H.tank, 50_000, "TRANSFER"),
      mv("2026-01-03T08:00:00Z", null, H.lot, 50_000, "RECEIPT"),
    ];
    expect(
      requireBalance({ holders, moves: sameInstant, period: JANUARY, scope: { siteId: 1 } }).stock.negativeStock,
    ).toEqual([]);
  });

  it("flags a batch whose outputs were not all recorded", () => {
    const unrecorded = moves.filter((m) => m.role !== "RECOVERED_METHANOL");
    const b = requireBalance({ holders, moves: unrecorded, period: JANUARY, scope: { siteId: 1 } });
    // (5 000 + 80 000) / 1 235 000 = 6.88 % > 2 % fail level (common practice, no source)
    expect(b.process.imbalanceG).toBe(85_000);
    expect(b.process.closure.flag).toBe("FAIL");
  });

  it.each([
    {
      name: "unknown holder",
      bad: { ...mv("2026-01-02T00:00:00Z", null, 99, 1, "RECEIPT") },
      code: "MASS_BALANCE.UNKNOWN_HOLDER",
      field: "moves.0.toHolderId",
    },
    {
      name: "zero mass",
      bad: { ...mv("2026-01-02T00:00:00Z", null, H.lot, 0, "RECEIPT") },
      code: "MASS_BALANCE.INVALID_MASS",
      field: "moves.0.massG",
    },
    {
      name: "fractional grams",
      bad: { ...mv("2026-01-02T00:00:00Z", null, H.lot, 1.5, "RECEIPT") },
      code: "MASS_BALANCE.INVALID_MASS",
      field: "moves.0.massG",
    },
    {
      name: "move to itself",
      bad: { ...mv("2026-01-02T00:00:00Z", H.lot, H.lot, 5, "TRANSFER") },
      code: "MASS_BALANCE.SELF_MOVE",
      field: "moves.0.toHolderId",
    },
  ])("refuses a ledger with $name", ({ bad, code, field }) => {
    const r = computePeriodBalance({ holders, moves: [bad], period: JANUARY, scope: { siteId: 1 } });
    expect(r.ok).toBe(false);
    if (!r.ok) expect(r.issues).toContainEqual(expect.objectContaining({ code, field }));
  });

  it("refuses a reversed period and a warn level above the fail level", () => {
    const r = computePeriodBalance({
      holders,
      moves,
      period: { startMs: JANUARY.endMs, endMs: JANUARY.startMs },
      scope: { siteId: 1 },
      tolerance: { ...DEFAULT_CLOSURE_TOLERANCE, warnPct: 3, failPct: 2 },
    });
    expect(r.ok).toBe(false);
    if (!r.ok)
      expect(r.issues.map((i) => i.code).sort()).toEqual([
        "MASS_BALANCE.INVALID_PERIOD",
        "MASS_BALANCE.INVALID_TOLERANCE",
      ]);
  });
});

describe("classifyClosure — tolerance boundaries", () => {
  // Defaults warn > 0.5 %, fail > 2 % of inputs: common practice, no source.
  const base = 1_000_000;
  it.each([
    { imbalance: 0, flag: "OK" },
    { imbalance: 5_000, flag: "OK" }, // exactly 0.5 %
    { imbalance: 5_001, flag: "WARN" },
    { imbalance: -5_001, flag: "WARN" },
    { imbalance: 20_000, flag: "WARN" }, // exactly 2 %
    { imbalance: 20_001, flag: "FAIL" },
    { imbalance: -20_001, flag: "FAIL" },
  ])("$imbalance g of 1 000 000 g → $flag", ({ imbalance, flag }) => {
    expect(classifyClosure(imbalance, base, DEFAULT_CLOSURE_TOLERANCE).flag).toBe(flag);
  });

  it("uses an edited tolerance", () => {
    const tight = { ...DEFAULT_CLOSURE_TOLERANCE, warnPct: 0.1, failPct: 1, source: "site setting" };
    expect(classifyClosure(1_001, base, tight).flag).toBe("WARN");
    expect(classifyClosure(1_000, base, tight).flag).toBe("OK");
  });

  it("with no inputs, any imbalance fails and none is OK", () => {
    expect(classifyClosure(0, 0, DEFAULT_CLOSURE_TOLERANCE)).toEqual({
      imbalanceG: 0,
      baseG: 0,
      pct: null,
      flag: "OK",
    });
    expect(classifyClosure(1, 0, DEFAULT_CLOSURE_TOLERANCE).flag).toBe("FAIL");
  });

  it("the default tolerance carries its common-practice note", () => {
    expect(DEFAULT_CLOSURE_TOLERANCE.source).toContain("common practice");
  });
});

describe("compareBookToGauges", () => {
  const readings = [
    { holderId: H.tank, at: utc("2026-01-15T00:00:00Z"), massG: 2_200_000 },
    { holderId: H.tank, at: utc("2026-01-31T00:00:00Z"), massG: 2_095_000 },
    { holderId: H.methanol, at: utc("2026-01-31T00:00:00Z"), massG: 150_000 },
  ];

  it("differences per reading and over the latest reading of each tank", () => {
    const r = compareBookToGauges({ holders, moves, readings });
    expect(r.ok).toBe(true);
    if (!r.ok) return;
    const rows = r.value.rows.map((x) => [x.holderId, x.bookG, x.differenceG, x.closure.flag]);
    expect(rows).toEqual([
      [H.tank, 2_000_000 + 1_200_000 - 1_000_000, 0, "OK"],
      [H.tank, 2_100_000, -5_000, "OK"], // −0.24 %
      [H.methanol, 160_000, -10_000, "FAIL"], // −6.25 %
    ]);
    expect(r.value.total.bookG).toBe(2_100_000 + 160_000);
    expect(r.value.total.measuredG).toBe(2_095_000 + 150_000);
    expect(r.value.total.differenceG).toBe(-15_000);
    // 15 000 / 2 260 000 = 0.664 %: over 0.5 %, under 2 %
    expect(r.value.total.closure.pct).toBeCloseTo(-0.663717, 5);
    expect(r.value.total.closure.flag).toBe("WARN");
  });

  it("a movement stamped at the reading instant counts as before the reading", () => {
    const r = compareBookToGauges({
      holders,
      moves,
      readings: [{ holderId: H.tank, at: utc("2026-01-26T08:00:00Z"), massG: 2_100_000 }],
    });
    expect(r.ok && r.value.rows[0]?.bookG).toBe(2_100_000);
  });

  it("refuses a reading of a holder that keeps no stock", () => {
    const r = compareBookToGauges({
      holders,
      moves,
      readings: [{ holderId: H.shipment, at: JANUARY.endMs, massG: 1 }],
    });
    expect(r.ok).toBe(false);
    if (!r.ok)
      expect(r.issues[0]).toMatchObject({ code: "MASS_BALANCE.GAUGE_NOT_STOCK", field: "readings.0.holderId" });
  });
});

describe("property: the balance identity holds for any valid history", () => {
  const KINDS = Object.keys(DEFAULT_HOLDER_CLASSES) as HolderKind[];
  const ROLES: MoveRole[] = ["TRANSFER", "OIL", "METHANOL", "ESTER", "LOSS", "SHIPMENT", "DISPOSAL"];

  const world = fc.record({
    holders: fc.array(fc.record({ kind: fc.constantFrom(...KINDS), siteId: fc.constantFrom(1, 2) }), {
      minLength: 2,
      maxLength: 8,
    }),
    steps: fc.array(
      fc.record({
        op: fc.constantFrom("RECEIPT", "MOVE"),
        a: fc.nat(),
        b: fc.nat(),
        perMille: fc.integer({ min: 1, max: 1000 }),
        mass: fc.integer({ min: 1, max: 5_000_000 }),
        gapMs: fc.constantFrom(0, 1, 3_600_000, 86_400_000, 5 * 86_400_000),
        role: fc.constantFrom(...ROLES),
      }),
      { maxLength: 60 },
    ),
    startDay: fc.integer({ min: 0, max: 40 }),
    lengthDays: fc.integer({ min: 1, max: 60 }),
    siteId: fc.constantFrom(1, 2),
  });

  it("Σ receipts + Σ in = Σ out + Δ stock, exactly, and stock matches an independent replay", () => {
    fc.assert(
      fc.property(world, (w) => {
        const hs: BalanceHolder[] = w.holders.map((h, i) => ({ id: i + 1, kind: h.kind, siteId: h.siteId }));
        const isStock = (id: number): boolean => DEFAULT_HOLDER_CLASSES[(hs[id - 1] as BalanceHolder).kind] === "STOCK";
        const model = new Map<number, number>();
        const ms: BalanceMove[] = [];
        let t = utc("2026-01-01T00:00:00Z");
        for (const s of w.steps) {
          t += s.gapMs;
          if (s.op === "RECEIPT") {
            const to = (s.a % hs.length) + 1;
            ms.push({ id: ms.length + 1, at: t, fromHolderId: null, toHolderId: to, massG: s.mass, role: "RECEIPT" });
            model.set(to, (model.get(to) ?? 0) + s.mass);
          } else {
            // Draw only what the model says a holder has (OUT holders too: a return), so the history stays valid.
            const from = (s.a % hs.length) + 1;
            const to = (s.b % hs.length) + 1;
            const have = model.get(from) ?? 0;
            const massG = Math.max(1, Math.floor((have * s.perMille) / 1000));
            if (from === to || have <= 0) continue;
            ms.push({ id: ms.length + 1, at: t, fromHolderId: from, toHolderId: to, massG, role: s.role });
            model.set(from, have - massG);
            model.set(to, (model.get(to) ?? 0) + massG);
          }
        }
        const startMs = utc("2026-01-01T00:00:00Z") + w.startDay * 86_400_000;
        const endMs = startMs + w.lengthDays * 86_400_000;
        const r = computePeriodBalance({
          holders: hs,
          moves: ms,
          period: { startMs, endMs },
          scope: { siteId: w.siteId },
        });
        expect(r.ok).toBe(true);
        if (!r.ok) return;
        const s = r.value.stock;
        expect(s.receipts.totalG + s.transfersInG + s.returnsG - s.outputs.totalG - s.transfersOutG).toBe(
          s.closingG - s.openingG,
        );
        expect(s.imbalanceG).toBe(0);
        expect(s.negativeStock).toEqual([]);

        // Independent replay: stock in scope at an instant, and receipts into scope during the period.
        const inScope = (id: number): boolean => isStock(id) && (hs[id - 1] as BalanceHolder).siteId === w.siteId;
        const stockAt = (instant: number): number =>
          ms
            .filter((m) => m.at < instant)
            .reduce(
              (sum, m) =>
                sum +
                (inScope(m.toHolderId) ? m.massG : 0) -
                (m.fromHolderId !== null && inScope(m.fromHolderId) ? m.massG : 0),
              0,
            );
        expect(s.openingG).toBe(stockAt(startMs));
        expect(s.closingG).toBe(stockAt(endMs));
        const receipts = ms
          .filter((m) => m.fromHolderId === null && m.at >= startMs && m.at < endMs && inScope(m.toHolderId))
          .reduce((sum, m) => sum + m.massG, 0);
        expect(s.receipts.totalG).toBe(receipts);
      }),
      { numRuns: 300 },
    );
  });
});
