import { describe, expect, it } from "vitest";
import {
  DEFAULT_DENSITY_TABLE,
  DEFAULT_REFERENCE_TEMP_C,
  densityAt,
  requireDensityEntry,
} from "@/lib/quantity/density";
import { toTankLevel } from "@/lib/tank/tank-level";

const rhoOf = (material: Parameters<typeof requireDensityEntry>[1]) =>
  densityAt(requireDensityEntry(DEFAULT_DENSITY_TABLE, material), DEFAULT_REFERENCE_TEMP_C);

describe("a tank's fill level from its book stock", () => {
  it.each([
    ["FEEDSTOCK", "USED_COOKING_OIL"],
    ["PRODUCT", "FAME"],
    ["METHANOL", "METHANOL"],
    ["SOMETHING_ELSE", "OTHER_OIL"],
  ] as const)("a %s tank is levelled as %s", (service, material) => {
    // 10 m³ half full by mass of its nominal material: kg/m³ equals g/L.
    const capacityG = 10_000 * rhoOf(material);
    const level = toTankLevel({ code: "T-1", service, capacityMl: 10_000_000, stockG: capacityG / 2 });
    expect(level.nominalMaterial).toBe(material);
    expect(level.capacityG).toBeCloseTo(capacityG, 6);
    expect(level.fillPct).toBeCloseTo(50, 9);
    expect(level.code).toBe("T-1");
  });

  it("reads an empty-capacity tank as 0 % rather than dividing by zero", () => {
    expect(toTankLevel({ service: "PRODUCT", capacityMl: 0, stockG: 5 }).fillPct).toBe(0);
  });
});
