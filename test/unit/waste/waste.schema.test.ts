import { describe, expect, it } from "vitest";
import {
  MAX_FLASH_POINT_C,
  MAX_METHANOL_PCT,
  MAX_PH,
  MIN_FLASH_POINT_C,
  MIN_METHANOL_PCT,
  MIN_PH,
  WasteCharacterisationSchema,
  WasteDueContainerSchema,
  WasteSiteSettingsSchema,
} from "@/lib/waste/waste.schema";

describe("WasteCharacterisationSchema limits", () => {
  it("exports the limits it checks", () => {
    expect([MIN_PH, MAX_PH, MIN_METHANOL_PCT, MAX_METHANOL_PCT, MIN_FLASH_POINT_C, MAX_FLASH_POINT_C]).toEqual([
      0, 14, 0, 100, -50, 300,
    ]);
  });

  it.each([
    { field: "pH", value: 0 },
    { field: "pH", value: 14 },
    { field: "methanolPct", value: 100 },
    { field: "flashPointC", value: -50 },
    { field: "flashPointC", value: 300 },
    { field: "waterPct", value: 0 },
  ])("accepts $field = $value at the edge", ({ field, value }) => {
    expect(WasteCharacterisationSchema.safeParse({ [field]: value }).success).toBe(true);
  });

  it.each([
    { field: "pH", value: -0.1, text: "pH must be at least 0 pH units" },
    { field: "pH", value: 14.1, text: "pH must be at most 14 pH units" },
    { field: "methanolPct", value: 100.1, text: "Methanol must be at most 100 % v/v" },
    { field: "flashPointC", value: -50.1, text: "Flash point must be at least -50 °C" },
    { field: "flashPointC", value: 300.1, text: "Flash point must be at most 300 °C" },
    { field: "waterPct", value: 101, text: "Water must be at most 100 % by weight" },
    { field: "pH", value: "7", text: "pH (pH units) must be a number" },
  ])("rejects $field = $value with a message naming the field and unit", ({ field, value, text }) => {
    const r = WasteCharacterisationSchema.safeParse({ [field]: value });
    expect(r.success).toBe(false);
    expect(r.error?.issues[0]?.path).toEqual([field]);
    expect(r.error?.issues[0]?.message).toBe(text);
  });

  it("leaves unmeasured values out rather than assuming them", () => {
    expect(WasteCharacterisationSchema.parse({})).toEqual({ listedCodes: [] });
  });

  it("normalises listed codes and rejects malformed ones", () => {
    expect(WasteCharacterisationSchema.parse({ listedCodes: ["u154"] }).listedCodes).toEqual(["U154"]);
    expect(WasteCharacterisationSchema.safeParse({ listedCodes: ["X12"] }).success).toBe(false);
  });
});

describe("WasteDueContainerSchema and WasteSiteSettingsSchema", () => {
  it("parses a container with defaults", () => {
    const c = WasteDueContainerSchema.parse({
      code: "gp-01",
      stream: "GLYCEROL_PHASE",
      massKg: 180,
      volumeL: 190,
      accumulationStart: "2026-03-01T08:00:00Z",
    });
    expect(c).toMatchObject({ code: "GP-01", satelliteAreaCode: null, characterisation: null });
    expect(c.accumulationStart.getTime()).toBe(Date.parse("2026-03-01T08:00:00Z"));
  });

  it("names the stream in its message", () => {
    const r = WasteDueContainerSchema.safeParse({
      code: "X",
      stream: "SLUDGE",
      massKg: 1,
      volumeL: 1,
      accumulationStart: "2026-03-01",
    });
    expect(r.error?.issues[0]?.message).toContain("Waste stream must be one of");
  });

  it("refuses a negative distance to the treatment facility", () => {
    const r = WasteSiteSettingsSchema.safeParse({ generatorCategory: "SQG", tsdfDistanceMiles: -1 });
    expect(r.error?.issues[0]?.message).toBe("Distance to the treatment facility must be at least 0 miles");
  });
});
