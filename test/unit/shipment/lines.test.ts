import { describe, expect, it } from "vitest";
import { lineQuantity, shipmentTotals } from "@/lib/shipment/lines";
import type { LinearDensityEntry } from "@/lib/quantity/density";

// A round-number density model for hand arithmetic: 880 kg/m³ at 15 °C, −0.7 kg/m³ per K
// (the linear model of lib/quantity/density.ts; the numbers are chosen for the test, not a published value).
const fuel: LinearDensityEntry = {
  model: "linear",
  densityAt15KgM3: 880,
  slopeKgM3PerK: -0.7,
  status: "common practice",
  source: "test",
};

describe("lineQuantity", () => {
  it("takes a mass as given and finds its volume at 15 °C", () => {
    const q = lineQuantity({ massKg: 880 }, fuel);
    // 880 kg / 880 kg/m³ = 1 m³ = 1000 L (hand arithmetic)
    expect(q).toEqual({ ok: true, value: { massG: 880_000, volumeMl: 1_000_000, tempC: null, basis: "MASS" } });
  });

  it("records a stated volume with a mass as stated", () => {
    expect(lineQuantity({ massKg: 100, volumeL: 113.6 }, fuel)).toEqual({
      ok: true,
      value: { massG: 100_000, volumeMl: 113_600, tempC: null, basis: "MASS" },
    });
  });

  it("turns litres at a temperature into a mass and litres at 15 °C", () => {
    // ρ(25 °C) = 880 − 0.7 × 10 = 873 kg/m³; 1000 L × 0.873 kg/L = 873 kg; V15 = 1000 × 873/880 = 992.045 L (hand arithmetic)
    const q = lineQuantity({ volumeL: 1000, tempC: 25 }, fuel);
    expect(q).toEqual({ ok: true, value: { massG: 873_000, volumeMl: 992_045, tempC: 25, basis: "VOLUME" } });
  });

  it("names the field when the temperature or the quantity is missing", () => {
    expect(lineQuantity({ volumeL: 10 }, fuel)).toMatchObject({ ok: false, issues: [{ field: "tempC" }] });
    expect(lineQuantity({}, fuel)).toMatchObject({ ok: false, issues: [{ field: "massKg" }] });
  });
});

describe("shipmentTotals", () => {
  it("adds the lines' grams and millilitres exactly", () => {
    expect(
      shipmentTotals([
        { massG: 873_000, volumeMl: 992_045 },
        { massG: 1, volumeMl: 2 },
      ]),
    ).toEqual({ massG: 873_001, volumeMl: 992_047 });
    expect(shipmentTotals([])).toEqual({ massG: 0, volumeMl: 0 });
  });
});
