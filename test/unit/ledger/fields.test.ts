import { describe, expect, it } from "vitest";
import type { ZodType } from "zod";
import {
  code,
  emptyAsMissing,
  id,
  massKg,
  MAX_MASS_KG,
  MAX_RECORD_ID,
  oneOf,
  percent,
  requiredText,
  tempC,
  text,
  volumeL,
  when,
} from "@/lib/core/fields";

/** The first message a field builder gives for a value, or null when it accepts it. */
function refusal(schema: ZodType, value: unknown): string | null {
  const r = schema.safeParse(value);
  return r.success ? null : (r.error.issues[0]?.message ?? "?");
}

describe("field builders shared by every entry path", () => {
  it("codes are trimmed and upper-cased, and only letters, digits and . _ / - are kept", () => {
    expect(code("Lot number").parse("  l-0042 ")).toBe("L-0042");
    expect(refusal(code("Lot number"), "L 42")).toBe('Lot number: use 1–40 letters, digits, ".", "_", "/" or "-"');
    expect(refusal(code("Lot number"), "-L42")).not.toBeNull();
    expect(refusal(code("Lot number"), "A".repeat(40))).toBeNull();
    expect(refusal(code("Lot number"), "A".repeat(41))).not.toBeNull();
    expect(refusal(code("Lot number"), undefined)).toBe("Lot number is required");
  });

  it("text refuses control characters but keeps tabs and line breaks", () => {
    expect(text("Notes").parse(" a\tb\nc ")).toBe("a\tb\nc");
    expect(refusal(text("Notes"), "a\u0000b")).toBe("Notes: contains a control character (check the text's encoding)");
    expect(refusal(text("Notes", 5), "abcdef")).toBe("Notes: at most 5 characters");
    expect(refusal(requiredText("Name"), "   ")).toBe("Name is required");
  });

  it("masses and volumes are positive, finite and bounded, with the unit in the message", () => {
    expect(refusal(massKg("Mass"), 0)).toBe("Mass (kg) must be more than 0");
    expect(refusal(massKg("Mass"), MAX_MASS_KG)).toBeNull();
    expect(refusal(massKg("Mass"), MAX_MASS_KG + 0.001)).toBe("Mass (kg) must be at most 2,000,000 kg");
    expect(refusal(massKg("Mass"), "12")).toBe("Mass (kg) must be a number");
    expect(refusal(volumeL("Volume"), Number.POSITIVE_INFINITY)).not.toBeNull();
    expect(refusal(volumeL("Volume"), 0.001)).toBeNull();
  });

  it("temperatures lie between −40 and 150 °C, percentages between 0 and 100", () => {
    expect(refusal(tempC("Oil temperature"), -40)).toBeNull();
    expect(refusal(tempC("Oil temperature"), 150.1)).toBe("Oil temperature must be at most 150 °C");
    expect(refusal(percent("Water"), -0.1)).toBe("Water must be at least 0 %");
    expect(refusal(percent("Water"), 100)).toBeNull();
  });

  it("dates accept ISO text and refuse what is not a date", () => {
    expect(when("Observed").parse("2026-12-01T08:00:00Z").toISOString()).toBe("2026-12-01T08:00:00.000Z");
    expect(refusal(when("Observed"), "yesterday")).not.toBeNull();
  });

  it("record numbers are positive 32-bit integers", () => {
    expect(refusal(id("Movement"), 1)).toBeNull();
    expect(refusal(id("Movement"), MAX_RECORD_ID + 1)).toBe("Movement is not a record number (too large)");
    expect(refusal(id("Movement"), 1.5)).toBe("Movement must be a whole number");
    expect(refusal(id("Movement"), 0)).toBe("Movement must be a record number");
  });

  it("a choice names the allowed values", () => {
    expect(refusal(oneOf("Look", ["NONE", "TRACE"] as const), "LOTS")).toBe("Look must be one of: NONE, TRACE");
  });

  it("an empty query-string field reads as missing", () => {
    expect(emptyAsMissing("")).toBeUndefined();
    expect(emptyAsMissing(null)).toBeUndefined();
    expect(emptyAsMissing("0")).toBe("0");
    expect(emptyAsMissing(0)).toBe(0);
  });
});
