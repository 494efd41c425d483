import { describe, expect, it } from "vitest";
import { planUnmeasuredBooking, summarizeBatchClosure } from "@/lib/batch/closure";
import type { BatchFlow } from "@/lib/batch/closure";
import { DEFAULT_CLOSURE_TOLERANCE } from "@/lib/mass-balance/period-balance";

// Worked example: 1000 kg of triolein with methanol at 6:1. Stoichiometry of the methanolysis
// C57H104O6 + 3 CH4O → 3 C19H36O2 + C3H8O3 with IUPAC standard atomic weights (computed): per 1000 kg
// oil, 108.56 kg methanol reacts, 1004.55 kg methyl oleate and 104.01 kg glycerol form, and the
// 108.56 kg excess methanol is recovered — 1000 + 217.12 = 1004.55 + 104.01 + 108.56 (mass is conserved).
const TRIOLEIN_CHARGE: BatchFlow[] = [
  { role: "OIL", massG: 1_000_000, direction: "IN" },
  { role: "METHANOL", massG: 217_120, direction: "IN" },
];
const THEORY_OUT: BatchFlow[] = [
  { role: "ESTER", massG: 1_004_550, direction: "OUT" },
  { role: "GLYCEROL_PHASE", massG: 104_010, direction: "OUT" },
  { role: "RECOVERED_METHANOL", massG: 108_560, direction: "OUT" },
];

// Tolerance: warn above 0.5 %, fail above 2 % of the charge (common practice, no published figure).
const TOL = DEFAULT_CLOSURE_TOLERANCE;

describe("summarizeBatchClosure — a closure that can fail", () => {
  it("closes when everything charged is measured out (triolein stoichiometry, computed)", () => {
    const c = summarizeBatchClosure([...TRIOLEIN_CHARGE, ...THEORY_OUT], TOL);
    expect(c.chargedG).toBe(1_217_120);
    expect(c.measuredG).toBe(1_217_120);
    expect(c.differenceG).toBe(0);
    expect(c.closure.flag).toBe("OK");
  });

  it("flags an ester weighed 1 % short: 10.046 kg unmeasured = 0.825 % of the charge, above the 0.5 % warn level", () => {
    // 1 % short of 1004.55 kg (stoichiometry above) is 994.5045 kg, stored as 994 505 g (whole grams).
    const short = THEORY_OUT.map((f) => (f.role === "ESTER" ? { ...f, massG: 994_505 } : f));
    const c = summarizeBatchClosure([...TRIOLEIN_CHARGE, ...short], TOL);
    expect(c.differenceG).toBe(10_045);
    expect(c.closure.pct).toBeCloseTo((10_045 * 100) / 1_217_120, 10); // 0.8253 %
    expect(c.closure.flag).toBe("WARN");
  });

  it("keeps a recorded loss (a spill with its reason) apart from the unmeasured difference", () => {
    const spill: BatchFlow = { role: "LOSS", massG: 5_000, direction: "OUT" };
    const glycerolLess = THEORY_OUT.map((f) => (f.role === "GLYCEROL_PHASE" ? { ...f, massG: 99_010 } : f));
    const c = summarizeBatchClosure([...TRIOLEIN_CHARGE, ...glycerolLess, spill], TOL);
    expect(c.recordedLossG).toBe(5_000);
    expect(c.differenceG).toBe(0);
    expect(c.closure.flag).toBe("OK");
  });

  it("reads the booked difference net of an unmeasured gain, and never counts it as a charge or an output", () => {
    const c = summarizeBatchClosure(
      [
        ...TRIOLEIN_CHARGE,
        ...THEORY_OUT,
        { role: "UNMEASURED", massG: 3_000, direction: "OUT" },
        { role: "UNMEASURED", massG: 1_000, direction: "IN" },
      ],
      TOL,
    );
    expect(c.chargedG).toBe(1_217_120);
    expect(c.bookedG).toBe(2_000);
  });

  it("fails above 2 %: 30 kg of a 1217.12 kg charge unmeasured is 2.46 %", () => {
    const short = THEORY_OUT.map((f) => (f.role === "ESTER" ? { ...f, massG: 974_550 } : f));
    expect(summarizeBatchClosure([...TRIOLEIN_CHARGE, ...short], TOL).closure.flag).toBe("FAIL");
  });
});

describe("planUnmeasuredBooking — the reactor ends empty", () => {
  it.each([
    // [held g, measured g, gain g, difference g]
    [1_217_120, 1_207_075, 0, 10_045],
    [1_217_120, 1_217_120, 0, 0],
    [1_217_120, 1_220_000, 2_880, 0],
  ])("held %i g, measured %i g → gain %i g, difference %i g", (held, measured, gainG, differenceG) => {
    const plan = planUnmeasuredBooking(held, measured);
    expect(plan).toEqual({ gainG, differenceG });
    // Conservation: what was held plus any gain is what was measured plus the difference.
    expect(held + plan.gainG).toBe(measured + plan.differenceG);
  });
});
