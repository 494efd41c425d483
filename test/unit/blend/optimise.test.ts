import { describe, it, expect } from "vitest";
import { diagnoseBlend, optimiseBlend } from "@/lib/blend/optimise";
import type { BlendPlan } from "@/lib/blend/optimise";
import type { BlendCandidate, BlendRequest } from "@/lib/blend/blend.schema";
import { formatLpText } from "@/lib/blend/linear-solver";

// Expected values below are worked by hand from the linear blending rule
// blend % = Σ m_i·c_i / Σ m_i (mass-weighted mean), not taken from the optimiser.

const lot = (ref: string, over: Partial<BlendCandidate>): BlendCandidate => ({
  ref,
  availableKg: 1000,
  ffaPct: 0.2,
  waterPct: 0.05,
  ageDays: 10,
  ...over,
});

async function requirePlan(req: BlendRequest): Promise<BlendPlan> {
  const r = await optimiseBlend(req);
  if (!r.ok) throw new Error(r.issues.map((i) => `${i.code}: ${i.message}`).join("; "));
  return r.value;
}

const grams = (plan: BlendPlan, ref: string) => plan.draws.find((d) => d.ref === ref)?.massG ?? 0;

describe("optimiseBlend — feasible fixtures", () => {
  it("MIN_COST mixes cheap high-FFA stock up to the FFA limit", async () => {
    const plan = await requirePlan({
      candidates: [lot("CLEAN", { ffaPct: 0.2, costPerKg: 1.0 }), lot("CHEAP", { ffaPct: 2.0, costPerKg: 0.5 })],
      targetKg: 1000,
      limits: { maxFfaPct: 1.0, maxWaterPct: 0.1 },
      objective: "MIN_COST",
    });
    // x_clean·(0.2 − 1) + x_cheap·(2 − 1) = 0 and x_clean + x_cheap = 1000 → x_clean = 1000/1.8 = 555.556 kg
    expect(Math.abs(grams(plan, "CLEAN") - 555_555.6)).toBeLessThanOrEqual(1);
    expect(Math.abs(grams(plan, "CHEAP") - 444_444.4)).toBeLessThanOrEqual(1);
    expect(plan.totalG).toBe(1_000_000);
    expect(plan.blendFfaPct).toBeLessThanOrEqual(1.0);
    // 555.556 × 1.0 + 444.444 × 0.5 = 777.78
    expect(plan.costTotal).toBeCloseTo(555.5556 + 222.2222, 2);
  });

  it("MIN_COST respects a binding water limit", async () => {
    const plan = await requirePlan({
      candidates: [lot("DRY", { waterPct: 0.02, costPerKg: 2 }), lot("WET", { waterPct: 0.5, costPerKg: 1 })],
      targetKg: 600,
      limits: { maxFfaPct: 1, maxWaterPct: 0.1 },
      objective: "MIN_COST",
    });
    // x_wet·0.4 = x_dry·0.08 → x_wet = 0.2 x_dry; x_dry + x_wet = 600 → x_dry = 500, x_wet = 100
    expect(Math.abs(grams(plan, "DRY") - 500_000)).toBeLessThanOrEqual(1);
    expect(Math.abs(grams(plan, "WET") - 100_000)).toBeLessThanOrEqual(1);
    expect(plan.blendWaterPct).toBeLessThanOrEqual(0.1);
  });

  it("OLDEST_FIRST draws the oldest lots first", async () => {
    const plan = await requirePlan({
      candidates: [
        lot("NEW", { availableKg: 1000, ageDays: 10 }),
        lot("OLD", { availableKg: 400, ageDays: 100 }),
        lot("MID", { availableKg: 400, ageDays: 50 }),
      ],
      targetKg: 600,
      limits: { maxFfaPct: 1, maxWaterPct: 0.1 },
      objective: "OLDEST_FIRST",
    });
    expect(plan.draws.map((d) => [d.ref, d.massG])).toEqual([
      ["OLD", 400_000],
      ["MID", 200_000],
    ]);
    // (400·100 + 200·50)/600
    expect(plan.meanAgeDays).toBeCloseTo(50_000 / 600, 9);
    expect(plan.costTotal).toBeNull();
  });

  it("HIGHEST_FFA_FIRST pushes the blend to the FFA limit", async () => {
    const plan = await requirePlan({
      candidates: [lot("HI", { ffaPct: 3 }), lot("LO", { ffaPct: 0.5 })],
      targetKg: 1000,
      limits: { maxFfaPct: 1.5, maxWaterPct: 0.1 },
      objective: "HIGHEST_FFA_FIRST",
    });
    // x_hi·1.5 = x_lo·1.0, x_hi + x_lo = 1000 → x_hi = 400
    expect(Math.abs(grams(plan, "HI") - 400_000)).toBeLessThanOrEqual(1);
    expect(plan.blendFfaPct).toBeLessThanOrEqual(1.5);
    expect(plan.blendFfaPct).toBeCloseTo(1.5, 5);
  });

  it("priority breaks ties without changing the primary objective", async () => {
    const candidates = [lot("A", { costPerKg: 1, priority: 1 }), lot("B", { costPerKg: 1, priority: 5 })];
    const plan = await requirePlan({
      candidates,
      targetKg: 700,
      limits: { maxFfaPct: 1, maxWaterPct: 0.1 },
      objective: "MIN_COST",
    });
    expect(plan.draws.map((d) => [d.ref, d.massG])).toEqual([["B", 700_000]]);
    expect(plan.costTotal).toBeCloseTo(700, 9);
  });

  it("a minimum draw turns the mix into a whole-lot choice (MIP)", async () => {
    const plan = await requirePlan({
      candidates: [lot("CLEAN", { ffaPct: 0.2, costPerKg: 1.0 }), lot("CHEAP", { ffaPct: 2.0, costPerKg: 0.5 })],
      targetKg: 1000,
      limits: { maxFfaPct: 1.0, maxWaterPct: 0.1 },
      objective: "MIN_COST",
      minDrawKg: 500,
    });
    // Both lots at ≥ 500 kg give FFA ≥ (500·2 + 500·0.2)/1000 = 1.1 % > 1 %, so only CLEAN alone is feasible.
    expect(plan.draws.map((d) => [d.ref, d.massG])).toEqual([["CLEAN", 1_000_000]]);
    expect(plan.costTotal).toBeCloseTo(1000, 9);
  });

  it("whole-gram rounding never pushes a tiny blend over the limit", async () => {
    const r = await optimiseBlend({
      candidates: [lot("LO", { ffaPct: 0.2, availableKg: 1 }), lot("HI", { ffaPct: 2, availableKg: 1 })],
      targetKg: 0.002,
      limits: { maxFfaPct: 1, maxWaterPct: 0.1 },
      objective: "HIGHEST_FFA_FIRST",
    });
    // The LP optimum 1.111 g LO + 0.889 g HI rounds to 1 g + 1 g = 1.1 % FFA; the only whole-gram blend within 1 % is 2 g LO.
    expect(r.ok).toBe(true);
    if (!r.ok) return;
    expect(r.value.draws.map((d) => [d.ref, d.massG])).toEqual([["LO", 2]]);
    expect(r.value.blendFfaPct).toBeLessThanOrEqual(1);
  });
});

describe("optimiseBlend — infeasible cases say which limit fails and by how much", () => {
  it("target larger than the stock", async () => {
    const req: BlendRequest = {
      candidates: [lot("A", { costPerKg: 1 }), lot("B", { costPerKg: 1 })],
      targetKg: 2500,
      limits: { maxFfaPct: 1, maxWaterPct: 0.1 },
      objective: "MIN_COST",
    };
    const r = await optimiseBlend(req);
    expect(r.ok).toBe(false);
    if (r.ok) return;
    expect(r.issues).toHaveLength(1);
    expect(r.issues[0]).toMatchObject({ code: "BLEND.INSUFFICIENT_STOCK", field: "targetKg" });
    expect(r.issues[0]?.message).toContain("by 500 kg");
    expect((await diagnoseBlend(req)).stockShortfallKg).toBeCloseTo(500, 9);
  });

  it("FFA limit below anything the stock can reach", async () => {
    const req: BlendRequest = {
      candidates: [lot("A", { ffaPct: 2, availableKg: 600 }), lot("B", { ffaPct: 4 })],
      targetKg: 1000,
      limits: { maxFfaPct: 1, maxWaterPct: 0.1 },
      objective: "OLDEST_FIRST",
    };
    const r = await optimiseBlend(req);
    expect(r.ok ? [] : r.issues.map((i) => i.code)).toEqual(["BLEND.FFA_LIMIT_UNREACHABLE"]);
    const d = await diagnoseBlend(req);
    // best: all 600 kg of A + 400 kg of B → (600·2 + 400·4)/1000 = 2.8 %; gap 1.8 points
    expect(d.minFfaPct).toBeCloseTo(2.8, 6);
    expect(d.ffaGapPct).toBeCloseTo(1.8, 6);
    expect(r.ok ? "" : r.issues[0]?.message).toContain("2.8 %");
  });

  it("water limit unreachable", async () => {
    const req: BlendRequest = {
      candidates: [lot("A", { waterPct: 0.3 }), lot("B", { waterPct: 0.5 })],
      targetKg: 1500,
      limits: { maxFfaPct: 1, maxWaterPct: 0.1 },
      objective: "OLDEST_FIRST",
    };
    const d = await diagnoseBlend(req);
    // 1000 kg at 0.3 % + 500 kg at 0.5 % → 0.3667 %; gap 0.2667
    expect(d.minWaterPct).toBeCloseTo(550 / 1500, 6);
    expect(d.waterGapPct).toBeCloseTo(550 / 1500 - 0.1, 6);
    const r = await optimiseBlend(req);
    expect(r.ok ? [] : r.issues.map((i) => [i.code, i.field])).toEqual([
      ["BLEND.WATER_LIMIT_UNREACHABLE", "limits.maxWaterPct"],
    ]);
  });

  it("each limit reachable alone, not both", async () => {
    const req: BlendRequest = {
      candidates: [
        lot("LOWFFA_WET", { ffaPct: 0.2, waterPct: 0.5 }),
        lot("HIGHFFA_DRY", { ffaPct: 2, waterPct: 0.02 }),
      ],
      targetKg: 1000,
      limits: { maxFfaPct: 1, maxWaterPct: 0.1 },
      objective: "OLDEST_FIRST",
    };
    const d = await diagnoseBlend(req);
    // water: 0.4·x_wet ≤ 0.08·x_dry → x_wet ≤ 166.67 kg → lowest FFA = (166.67·0.2 + 833.33·2)/1000 = 1.7 %
    expect(d.minFfaPctWithinWaterLimit).toBeCloseTo(1.7, 6);
    const r = await optimiseBlend(req);
    expect(r.ok ? [] : r.issues.map((i) => i.code)).toEqual(["BLEND.LIMITS_JOINTLY_UNREACHABLE"]);
    expect(r.ok ? "" : r.issues[0]?.message).toContain("0.7 points");
  });

  it("minimum-draw conflicts", async () => {
    const base = { limits: { maxFfaPct: 1, maxWaterPct: 0.1 }, objective: "OLDEST_FIRST" as const };
    const below = await optimiseBlend({ ...base, candidates: [lot("A", {})], targetKg: 50, minDrawKg: 100 });
    expect(below.ok ? [] : below.issues.map((i) => [i.code, i.field])).toEqual([
      ["BLEND.TARGET_BELOW_MIN_DRAW", "minDrawKg"],
    ]);
    // 150 kg from lots of 120 kg at ≥ 100 kg each: one lot is too small, two are too much.
    const conflict = await optimiseBlend({
      ...base,
      candidates: [lot("A", { availableKg: 120 }), lot("B", { availableKg: 120 })],
      targetKg: 150,
      minDrawKg: 100,
    });
    expect(conflict.ok ? [] : conflict.issues.map((i) => i.code)).toEqual(["BLEND.MIN_DRAW_CONFLICT"]);
  });
});

describe("LP text", () => {
  it("writes signs, equalities and binaries in CPLEX LP form", () => {
    const text = formatLpText({
      objective: [1, -2.5, 0],
      columns: [
        { lower: 0, upper: 5 },
        { lower: 0, upper: 1e-7 },
        { lower: 0, upper: 1, binary: true },
      ],
      rows: [
        { coefs: [1, 1, 0], lower: 3, upper: 3 },
        { coefs: [0.5, -1, 0], upper: 0 },
      ],
    });
    expect(text).toBe(
      [
        "Minimize",
        " obj: + 1 x0 - 2.5 x1 + 0 x2",
        "Subject To",
        " r0: + 1 x0 + 1 x1 = 3",
        " r1u: + 0.5 x0 - 1 x1 <= 0",
        "Bounds",
        " 0 <= x0 <= 5",
        " 0 <= x1 <= 1e-7",
        " 0 <= x2 <= 1",
        "Binaries",
        " x2",
        "End",
      ].join("\n"),
    );
  });
});
