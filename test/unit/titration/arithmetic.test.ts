import { describe, expect, it } from "vitest";
import { workTitration } from "@/lib/titration/arithmetic";

// Worked examples: each figure is the published formula evaluated by hand with the readings shown.
describe("a titration's arithmetic, written out", () => {
  it("oleic: 2.00 mL of 0.25 mol/L on 7.05 g", () => {
    const w = workTitration({ sampleMassG: 7.05, concentrationMolL: 0.25, titreMl: 2, blankMl: 0 }, "OLEIC");
    if (!w.ok) throw new Error("expected a result");
    expect(w.value.acidValueMgKohG).toBeCloseTo(3.97872, 4); // ISO 660 / AOCS Cd 3d-63: 2 × 0.25 × 56.1 / 7.05
    expect(w.value.ffaPct).toBeCloseTo(2.0, 6); // AOCS Ca 5a-40: 2 × 0.25 × 28.2 / 7.05
    expect(w.value.ffaFromAcidValuePct).toBeCloseTo(2.00313, 4); // 3.97872 × 282.468 / 561.053 (IUPAC 2021 molar masses)
    expect(w.value.lines[1]).toContain("2.00 mL × 0.2500 mol/L × 56.1 ÷ 7.050 g = 3.98 mg KOH/g");
    expect(w.value.lines[2]).toContain("× 28.2 ÷ 7.050 g = 2.00 %");
    expect(w.value.lines[3]).toContain("= 2.00 % as oleic");
  });

  it("palmitic: 5.00 mL of 0.25 mol/L on 7.05 g", () => {
    const w = workTitration({ sampleMassG: 7.05, concentrationMolL: 0.25, titreMl: 5 }, "PALMITIC");
    if (!w.ok) throw new Error("expected a result");
    expect(w.value.acidValueMgKohG).toBeCloseTo(9.94681, 4); // ISO 660: 5 × 0.25 × 56.1 / 7.05
    expect(w.value.ffaPct).toBeCloseTo(4.53901, 4); // AOCS Ca 5a-40: 5 × 0.25 × 25.6 / 7.05
    expect(w.value.ffaFromAcidValuePct).toBeCloseTo(4.5462, 4); // 9.94681 × 256.43 / 561.053 (IUPAC 2021)
    expect(w.value.lines[3]).toContain("as palmitic");
  });

  it("lauric with a blank: 5.00 − 0.10 mL of 0.1 mol/L on 10 g", () => {
    const w = workTitration({ sampleMassG: 10, concentrationMolL: 0.1, titreMl: 5, blankMl: 0.1 }, "LAURIC");
    if (!w.ok) throw new Error("expected a result");
    expect(w.value.netTitreMl).toBeCloseTo(4.9, 9);
    expect(w.value.acidValueMgKohG).toBeCloseTo(2.7489, 4); // AOCS Cd 3d-63: (5 − 0.1) × 0.1 × 56.1 / 10
    expect(w.value.ffaPct).toBeCloseTo(0.98, 6); // AOCS Ca 5a-40: 4.9 × 0.1 × 20.0 / 10
    expect(w.value.ffaFromAcidValuePct).toBeCloseTo(0.98148, 4); // 2.7489 × 200.322 / 561.053 (IUPAC 2021)
    expect(w.value.lines[0]).toBe("Net titre = titre − blank = 5.00 − 0.10 = 4.90 mL");
  });

  it("refuses readings that cannot give a result, naming the reading", () => {
    const w = workTitration({ sampleMassG: 0, concentrationMolL: 0.1, titreMl: 1 }, "OLEIC");
    expect(w.ok).toBe(false);
    if (!w.ok) expect(w.issues.map((i) => i.field)).toContain("sampleMassG");
  });
});
