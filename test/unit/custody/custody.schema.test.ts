import { describe, expect, it } from "vitest";
import {
  ClaimBookingSchema,
  ConversionStepSchema,
  CustodyBookingSchema,
  CustodySettingsSchema,
  MAX_CONVERSION_FACTOR,
} from "@/lib/custody/custody.schema";

describe("custody schemas", () => {
  it("a claim in kg becomes whole grams at an instant", () => {
    const c = ClaimBookingSchema.parse({
      kind: "CLAIM",
      id: "SH-1001",
      at: "2026-02-01T10:00:00Z",
      setKey: "SET-A",
      material: "ester",
      massKg: 480.0005,
    });
    // 480.0005 kg × 1000 = 480 000.5 g, rounded half away from zero
    expect(c).toEqual({
      kind: "CLAIM",
      id: "SH-1001",
      at: Date.parse("2026-02-01T10:00:00Z"),
      setKey: "SET-A",
      material: "ESTER",
      massG: 480_001,
    });
  });

  it("dispatches on the booking kind", () => {
    const b = CustodyBookingSchema.parse({
      kind: "CONVERSION",
      id: "CV-1",
      at: "2026-02-01T10:00:00Z",
      setKey: "SET-A",
      stepId: "TRANSESTERIFICATION",
      inputMassKg: 1000,
    });
    expect(b).toMatchObject({ kind: "CONVERSION", inputMassG: 1_000_000 });
  });

  it("a measured yield becomes grams out of grams in", () => {
    const s = ConversionStepSchema.parse({
      id: "TRANSESTERIFICATION",
      inputMaterial: "OIL",
      outputs: [{ material: "ESTER", outputMassKg: 980, inputMassKg: 1000 }],
      basis: "Q4 batches",
    });
    expect(s.outputs).toEqual([{ material: "ESTER", outputMassG: 980_000, inputMassG: 1_000_000 }]);
  });

  it("refuses a factor above the typing-error guard", () => {
    const r = ConversionStepSchema.safeParse({
      id: "TRANSESTERIFICATION",
      inputMaterial: "OIL",
      outputs: [{ material: "ESTER", outputMassKg: 1000 * MAX_CONVERSION_FACTOR + 1, inputMassKg: 1000 }],
      basis: "typo",
    });
    expect(r.success).toBe(false);
    expect(r.error?.issues[0]?.message).toContain("Conversion factor");
  });

  it.each([
    {
      name: "zero mass",
      input: { kind: "CLAIM", id: "C", at: "2026-02-01", setKey: "S", material: "ESTER", massKg: 0 },
      text: "Claimed mass (kg) must be more than 0",
    },
    {
      name: "empty set",
      input: { kind: "CLAIM", id: "C", at: "2026-02-01", setKey: " ", material: "ESTER", massKg: 1 },
      text: "Characteristic set is required",
    },
  ])("refuses $name", ({ input, text }) => {
    const r = ClaimBookingSchema.safeParse(input);
    expect(r.success).toBe(false);
    expect(r.error?.issues[0]?.message).toBe(text);
  });

  it("settings default to a January cycle start", () => {
    expect(CustodySettingsSchema.parse({ operatorType: "OTHER_OPERATOR" })).toEqual({
      operatorType: "OTHER_OPERATOR",
      periodAnchorMonth: 1,
    });
  });
});
