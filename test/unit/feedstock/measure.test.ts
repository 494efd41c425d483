import { describe, expect, it } from "vitest";
import { measureObserved } from "@/lib/feedstock/measure";
import type { DensityTable, LinearDensityEntry } from "@/lib/quantity/density";
import { DEFAULT_DENSITY_TABLE } from "@/lib/quantity/density";

// A made-up oil with round numbers, so the expected figures can be worked by hand:
// ρ(t) = ρ15 + slope·(t − 15); m = V_obs·ρ(t_obs); V_ref = m / ρ(t_ref) (definition of density; ISO 91:2017 reference temperature 15 °C).
const OIL: LinearDensityEntry = {
  model: "linear",
  densityAt15KgM3: 920,
  slopeKgM3PerK: -0.64,
  status: "common practice",
  source: "test oil",
  validRangeC: { minC: 0, maxC: 110 },
};
const TABLE: DensityTable = { ...DEFAULT_DENSITY_TABLE, USED_COOKING_OIL: OIL };

describe("measureObserved: observed volume and temperature to mass and standard volume", () => {
  it("works the hand example: 1000 L at 40 °C of an oil of 920 kg/m³ at 15 °C, −0.64 kg/m³ per K", () => {
    const r = measureObserved({
      material: "USED_COOKING_OIL",
      observedVolumeL: 1000,
      observedTempC: 40,
      referenceTempC: 15,
      table: TABLE,
    });
    expect(r.ok).toBe(true);
    if (!r.ok) return;
    // ρ(40 °C) = 920 − 0.64 × 25 = 904 kg/m³ → 904 kg; V15 = 904 / 920 m³ = 982.6087 L
    expect(r.value.massG).toBe(904_000);
    expect(r.value.standardVolumeMl).toBe(982_609);
    expect(r.value.densityKgM3).toBeCloseTo(920, 9);
    expect(r.value.referenceTempC).toBe(15);
    expect(r.value.densitySource).toBe("table: test oil");
  });

  it("with the water curve: water at 20 °C weighs 998.2067 kg per m³ and fills 999.1033 L at 15 °C", () => {
    // Tanaka et al. 2001, Metrologia 38:301 (CIPM formula): 998.2067 kg/m³ at 20 °C, 999.1026 kg/m³ at 15 °C
    // The water curve put in the place of a material's entry (the table is the caller's to choose).
    const table: DensityTable = { ...DEFAULT_DENSITY_TABLE, USED_COOKING_OIL: DEFAULT_DENSITY_TABLE.WATER };
    const r = measureObserved({
      material: "USED_COOKING_OIL",
      observedVolumeL: 1000,
      observedTempC: 20,
      referenceTempC: 15,
      table,
    });
    expect(r.ok).toBe(true);
    if (!r.ok) return;
    expect(r.value.massG).toBe(998_207);
    expect(Math.abs(r.value.standardVolumeMl - 999_103)).toBeLessThanOrEqual(1);
    expect(r.value.densityKgM3).toBeCloseTo(999.1026, 3);
  });

  it("a lab density at 15 °C replaces the table's level but keeps its slope", () => {
    const r = measureObserved({
      material: "USED_COOKING_OIL",
      observedVolumeL: 1000,
      observedTempC: 40,
      measuredDensityKgM3: 910,
      referenceTempC: 15,
      table: TABLE,
    });
    expect(r.ok).toBe(true);
    if (!r.ok) return;
    // ρ(40 °C) = 910 − 0.64 × 25 = 894 kg/m³
    expect(r.value.massG).toBe(894_000);
    expect(r.value.densityKgM3).toBeCloseTo(910, 9);
    expect(r.value.densitySource).toContain("measured 910 kg/m³ at 15 °C");
  });

  it("mass does not depend on the reference temperature; the standard volume does", () => {
    const at15 = measureObserved({
      material: "USED_COOKING_OIL",
      observedVolumeL: 500,
      observedTempC: 30,
      referenceTempC: 15,
      table: TABLE,
    });
    const at20 = measureObserved({
      material: "USED_COOKING_OIL",
      observedVolumeL: 500,
      observedTempC: 30,
      referenceTempC: 20,
      table: TABLE,
    });
    expect(at15.ok && at20.ok).toBe(true);
    if (!at15.ok || !at20.ok) return;
    expect(at20.value.massG).toBe(at15.value.massG);
    // ρ20 < ρ15 for a liquid that expands when warmed, so the same mass fills more at 20 °C
    expect(at20.value.standardVolumeMl).toBeGreaterThan(at15.value.standardVolumeMl);
  });

  it("refuses a negative volume and an impossible temperature, naming both fields", () => {
    const r = measureObserved({
      material: "USED_COOKING_OIL",
      observedVolumeL: -1,
      observedTempC: Number.NaN,
      referenceTempC: 15,
      table: TABLE,
    });
    expect(r.ok).toBe(false);
    if (r.ok) return;
    const fields = r.issues.map((i) => i.field);
    expect(fields).toContain("observedVolumeL");
    expect(fields).toContain("observedTempC");
  });
});
