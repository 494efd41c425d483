import { describe, expect, it } from "vitest";
import type { MoveRole } from "@/lib/core/vocabulary";
import { computePeriodBalance, DEFAULT_CLOSURE_TOLERANCE } from "@/lib/mass-balance/period-balance";
import type { BalanceHolder, BalanceMove, PeriodBalance } from "@/lib/mass-balance/period-balance";

// The period closure reports what was measured against the books: the batches' unmeasured differences,
// receiving differences and book stock less gauge readings, as a share of what entered the stock.
// Before, a finished batch's remainder was typed as a loss and the only closure was the stock identity,
// which is 0 whenever every movement is recorded — it could not fail.
// Tolerance: warn above 0.5 %, fail above 2 % of inputs (common practice, no published figure).

const utc = (iso: string): number => Date.parse(iso);
const MARCH = { startMs: utc("2026-03-01T00:00:00Z"), endMs: utc("2026-04-01T00:00:00Z") };
const H = {
  pickup: 1,
  lot: 2,
  tank: 3,
  methanol: 4,
  batch: 5,
  product: 6,
  glycerol: 7,
  loss: 8,
  diff: 9,
  recovered: 10,
} as const;
const holders: BalanceHolder[] = [
  { id: H.pickup, kind: "PICKUP", siteId: 1, materialKind: "USED_COOKING_OIL" },
  { id: H.lot, kind: "LOT", siteId: 1, materialKind: "USED_COOKING_OIL" },
  { id: H.tank, kind: "TANK", siteId: 1, materialKind: "MIXED_FEEDSTOCK" },
  { id: H.methanol, kind: "REAGENT_LOT", siteId: 1, materialKind: "METHANOL" },
  { id: H.batch, kind: "BATCH", siteId: 1, materialKind: "IN_REACTION", completedAt: utc("2026-03-10T14:00:00Z") },
  { id: H.product, kind: "PRODUCT_LOT", siteId: 1, materialKind: "FAME" },
  { id: H.glycerol, kind: "WASTE_CONTAINER", siteId: 1, materialKind: "GLYCEROL_PHASE" },
  { id: H.loss, kind: "LOSS", siteId: 1 },
  { id: H.diff, kind: "DIFFERENCE", siteId: 1 },
  { id: H.recovered, kind: "TANK", siteId: 1, materialKind: "METHANOL" },
];
let id = 1;
const mv = (
  at: string,
  from: number | null,
  to: number,
  massG: number,
  role: MoveRole,
  receiving = false,
): BalanceMove => ({
  id: id++,
  at: utc(at),
  fromHolderId: from,
  toHolderId: to,
  massG,
  role,
  ...(receiving ? { receiving: true } : {}),
});

// The triolein worked example (stoichiometry of C57H104O6 + 3 CH4O → 3 C19H36O2 + C3H8O3, IUPAC standard
// atomic weights, computed): 1000 kg oil + 217.12 kg methanol → 1004.55 kg ester + 104.01 kg glycerol +
// 108.56 kg excess methanol; here the ester is weighed 1 % short, 994.505 kg, and a 2 kg spill is recorded.
const moves: BalanceMove[] = [
  mv("2026-03-02T08:00:00Z", null, H.pickup, 1_010_000, "RECEIPT"), // collector's estimate
  mv("2026-03-03T08:00:00Z", H.pickup, H.lot, 1_010_000, "TRANSFER"),
  mv("2026-03-03T08:00:00Z", H.lot, H.loss, 10_000, "LOSS", true), // the plant measured 1000 kg: 10 kg receiving shortfall
  mv("2026-03-04T08:00:00Z", H.lot, H.tank, 1_000_000, "TRANSFER"),
  mv("2026-03-05T08:00:00Z", null, H.methanol, 217_120, "RECEIPT"),
  mv("2026-03-10T10:00:00Z", H.tank, H.batch, 1_000_000, "OIL"),
  mv("2026-03-10T10:00:00Z", H.methanol, H.batch, 217_120, "METHANOL"),
  mv("2026-03-10T14:00:00Z", H.batch, H.product, 994_505, "ESTER"),
  mv("2026-03-10T14:00:00Z", H.batch, H.glycerol, 102_010, "GLYCEROL_PHASE"),
  mv("2026-03-10T14:00:00Z", H.batch, H.recovered, 108_560, "RECOVERED_METHANOL"),
  mv("2026-03-10T14:00:00Z", H.batch, H.loss, 2_000, "LOSS"), // a spill, recorded with its reason
  mv("2026-03-10T14:00:00Z", H.batch, H.diff, 10_045, "UNMEASURED"), // booked by the service, never typed
];

function balance(input: Partial<Parameters<typeof computePeriodBalance>[0]> = {}): PeriodBalance {
  const r = computePeriodBalance({
    holders,
    moves,
    period: MARCH,
    scope: { siteId: 1 },
    tolerance: DEFAULT_CLOSURE_TOLERANCE,
    ...input,
  });
  if (!r.ok) throw new Error(JSON.stringify(r.issues));
  return r.value;
}

describe("period closure over measured differences", () => {
  it("the stock identity still closes at 0 — it only proves no movement is missing", () => {
    expect(balance().stock.imbalanceG).toBe(0);
  });

  it("sums the unmeasured batch difference and the receiving shortfall, leaving the recorded spill out", () => {
    const d = balance().differences;
    expect(d.unmeasuredG).toBe(10_045);
    expect(d.receivingG).toBe(10_000);
    expect(d.gaugeG).toBe(0);
    expect(d.totalG).toBe(20_045);
    // Base: what entered the site's stock, 1 010 000 + 217 120 g.
    expect(d.baseG).toBe(1_227_120);
    expect(d.closure.pct).toBeCloseTo((20_045 * 100) / 1_227_120, 10); // 1.633 %
    expect(d.closure.flag).toBe("WARN");
  });

  it("adds book stock less the gauge reading: 5 kg less in the tank than the books say", () => {
    // The recovered-methanol tank holds 108.56 kg on the books; its gauge reads 103.56 kg.
    const d = balance({ gauges: [{ holderId: H.recovered, bookG: 108_560, measuredG: 103_560 }] }).differences;
    expect(d.gaugeG).toBe(5_000);
    expect(d.totalG).toBe(25_045);
  });

  it("a receiving surplus and an unmeasured gain count against the shortfalls (signed: + means missing)", () => {
    const extra = [
      mv("2026-03-20T08:00:00Z", null, H.lot, 4_000, "RECEIPT", true),
      mv("2026-03-10T14:00:00Z", null, H.batch, 45, "UNMEASURED"),
    ];
    const d = balance({ moves: [...moves, ...extra] }).differences;
    expect(d.receivingG).toBe(6_000);
    expect(d.unmeasuredG).toBe(10_000);
  });

  it("per material kind: the batch's difference is in reaction, the receiving shortfall with the oil's kind", () => {
    expect(balance({ scope: { siteId: 1, materialKind: "IN_REACTION" } }).differences).toMatchObject({
      unmeasuredG: 10_045,
      receivingG: 0,
    });
    expect(balance({ scope: { siteId: 1, materialKind: "USED_COOKING_OIL" } }).differences).toMatchObject({
      unmeasuredG: 0,
      receivingG: 10_000,
    });
  });

  it("the batch row reports the unmeasured difference against its charge, the spill as an output", () => {
    const [row] = balance().process.completed;
    expect(row?.inputsG).toBe(1_217_120);
    expect(row?.outputsG).toBe(994_505 + 102_010 + 108_560 + 2_000);
    expect(row?.imbalanceG).toBe(10_045);
    expect(row?.unmeasuredG).toBe(10_045);
    expect(row?.closure.flag).toBe("WARN"); // 0.825 % of the charge
  });

  it("a batch whose remainder was typed as a loss (the old rule) shows no difference: nothing measured disagrees", () => {
    const typed = moves.map((m) => (m.role === "UNMEASURED" ? { ...m, toHolderId: H.loss, role: "LOSS" as const } : m));
    const [row] = balance({ moves: typed }).process.completed;
    expect(row?.imbalanceG).toBe(0);
  });
});
