import { describe, expect, it } from "vitest";
import { celsiusFrom, checkOnPhone, litresFrom, pickupNumber, volumeFromGauge } from "@/lib/collect/entry";
import { PickupSchema } from "@/lib/feedstock/pickup.schema";

const KNOWN = new Set(["R001", "R002"]);
const good = {
  code: "PU-261202-1A2B3C4D",
  sourceCode: "r001",
  material: "USED_COOKING_OIL",
  observedAt: "2026-12-02T08:00:00.000Z",
  containers: 2,
  containerTags: [],
  volumeL: 120,
  tempC: 18,
  idempotencyKey: "1a2b3c4d-0000-4000-8000-000000000001",
};

function fieldsOf(input: unknown): Array<string | undefined> {
  const r = checkOnPhone(input, KNOWN);
  return r.ok ? [] : r.issues.map((i) => i.field);
}

describe("phone-side check uses the server's PickupSchema", () => {
  it("accepts a good entry exactly as the server schema parses it", () => {
    const r = checkOnPhone(good, KNOWN);
    expect(r).toEqual({ ok: true, value: PickupSchema.parse(good) });
  });
  it.each([
    ["impossible volume", { volumeL: 0 }, "volumeL"],
    ["negative volume", { volumeL: -5 }, "volumeL"],
    ["volume above one truck", { volumeL: 40_001 }, "volumeL"],
    ["volume not a number (empty box)", { volumeL: Number.NaN }, "volumeL"],
    ["oil hotter than collected oil can be", { tempC: 95 }, "tempC"],
    ["colder than the schema allows", { tempC: -41 }, "tempC"],
    ["no containers", { containers: 0 }, "containers"],
    ["unknown source", { sourceCode: "R999" }, "sourceCode"],
    ["duplicate container label", { containers: 2, containerTags: ["C-1", "c-1"] }, "containerTags.1"],
  ])("refuses %s naming the field", (_n, change, field) => {
    expect(fieldsOf({ ...good, ...change })).toContain(field);
  });
  it("reports an unknown source together with other problems", () => {
    expect(fieldsOf({ ...good, sourceCode: "R999", volumeL: 0 })).toEqual(
      expect.arrayContaining(["sourceCode", "volumeL"]),
    );
  });
});

describe("units and gauge", () => {
  it("converts US gallons and °F to the stored litres and °C", () => {
    expect(litresFrom(10, "us")).toBeCloseTo(37.85411784, 8); // NIST HB 44 App. C: 1 gal = 3.785411784 L
    expect(litresFrom(10, "metric")).toBe(10);
    expect(celsiusFrom(212, "us")).toBeCloseTo(100, 10); // NIST SP 811: t/°C = (t/°F − 32)/1.8
    expect(celsiusFrom(20, "metric")).toBe(20);
  });
  it("gauge: containers × size × fill level", () => {
    expect(volumeFromGauge(3, 200, 75)).toBe(450);
    expect(volumeFromGauge(1, 120, 100)).toBe(120);
    expect(volumeFromGauge(2, 200, 0)).toBeNaN();
    expect(volumeFromGauge(2, 200, 101)).toBeNaN();
  });
  it("pickup number from the day and the key", () => {
    expect(pickupNumber("2026-12-02", "1a2b3c4d-0000-4000-8000-000000000001")).toBe("PU-261202-1A2B3C4D");
  });
});
