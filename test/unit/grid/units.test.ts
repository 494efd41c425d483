import { describe, expect, it } from "vitest";
import fc from "fast-check";
import {
  CANONICAL,
  convertQuantity,
  decimalsFor,
  displayUnit,
  fromUnit,
  quantityOf,
  toDisplay,
  unitSymbol,
} from "@/lib/grid/units";
import type { GridUnit, Quantity } from "@/lib/grid/units";

describe("units at the grid's edge", () => {
  it("rows carry kg, L and °C; US users see lb, gal and °F", () => {
    expect(CANONICAL).toEqual({ mass: "kg", volume: "L", temperature: "°C" });
    expect((["mass", "volume", "temperature"] as Quantity[]).map((q) => displayUnit(q, "metric"))).toEqual([
      "kg",
      "L",
      "°C",
    ]);
    expect((["mass", "volume", "temperature"] as Quantity[]).map((q) => displayUnit(q, "us"))).toEqual([
      "lb",
      "gal",
      "°F",
    ]);
    expect(quantityOf("kg")).toBe("mass");
    expect(unitSymbol("°F")).toBe("°F");
  });

  it("converts with the exact defining factors", () => {
    expect(toDisplay(0.45359237, "mass", "us")).toBeCloseTo(1, 12); // NIST SP 811 (2008) B.9: 1 lb = 0.45359237 kg exactly
    expect(toDisplay(3.785411784, "volume", "us")).toBeCloseTo(1, 12); // NIST Handbook 44 (2024) App. C: 1 US gal = 231 in³ = 3.785411784 L
    expect(toDisplay(100, "temperature", "us")).toBeCloseTo(212, 9); // NIST SP 811 (2008) 4.2.1.1: t/°F = 1.8 t/°C + 32
    expect(fromUnit(-40, "temperature", "°F")).toBeCloseTo(-40, 9); // NIST SP 811 (2008) 4.2.1.1: −40 °F = −40 °C
    expect(toDisplay(812.5, "mass", "metric")).toBe(812.5);
  });

  it("round-trips any value through any pair of units of one quantity", () => {
    const pairs: Array<[Quantity, GridUnit, GridUnit]> = [
      ["mass", "kg", "lb"],
      ["volume", "L", "gal"],
      ["temperature", "°C", "°F"],
    ];
    fc.assert(
      fc.property(fc.constantFrom(...pairs), fc.double({ min: -1e6, max: 1e6, noNaN: true }), ([q, a, b], v) => {
        const back = convertQuantity(convertQuantity(v, q, a, b), q, b, a);
        expect(Math.abs(back - v)).toBeLessThanOrEqual(1e-9 * Math.max(1, Math.abs(v)));
      }),
    );
  });

  it("an exported figure with its decimals converts back to the same whole gram or millilitre", () => {
    fc.assert(
      fc.property(
        fc.integer({ min: 0, max: 2_000_000_000 }),
        fc.constantFrom<["mass" | "volume", GridUnit]>(
          ["mass", "kg"],
          ["mass", "lb"],
          ["volume", "L"],
          ["volume", "gal"],
        ),
        (grams, [q, unit]) => {
          const shown = Number(convertQuantity(grams / 1000, q, CANONICAL[q], unit).toFixed(decimalsFor(unit)));
          expect(Math.round(fromUnit(shown, q, unit) * 1000)).toBe(grams);
        },
      ),
    );
  });

  it("decimals per unit", () => {
    expect(decimalsFor("kg")).toBe(3);
    expect(decimalsFor("gal")).toBe(4);
    expect(decimalsFor("°C")).toBe(2);
  });
});
