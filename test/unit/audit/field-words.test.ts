import { describe, expect, it } from "vitest";
import { fieldWords, valueWords } from "@/lib/audit/field-words";

describe("history fields read as words", () => {
  it.each([
    ["massG", "Mass (kg)"],
    ["volumeMl", "Volume (L)"],
    ["ffaPct", "FFA (%)"],
    ["status", "Status"],
    ["sourceId", "Source"],
    ["lot.massG", "Lot: mass (kg)"],
    ["observedAt", "Observed"],
    ["tempC", "Temperature (°C)"],
  ])("%s → %s", (path, words) => {
    expect(fieldWords(path)).toBe(words);
  });
  it("never shows a stored name with its unit suffix glued on", () => {
    expect(fieldWords("grossMassG")).toBe("Gross mass (kg)");
  });
});

describe("history values read as the screens show them", () => {
  it("grams as kilograms, to the gram", () => {
    expect(valueWords("massG", "812345")).toBe("812.345");
  });
  it("codes as labels; unknown words as written", () => {
    expect(valueWords("status", "QUARANTINED")).not.toBe("QUARANTINED");
    expect(valueWords("material", "USED_COOKING_OIL")).toBe("Used cooking oil");
    expect(valueWords("name", "Harbour Fryhouse")).toBe("Harbour Fryhouse");
  });
  it("yes/no for flags, empty stays empty", () => {
    expect(valueWords("active", "true")).toBe("yes");
    expect(valueWords("active", null)).toBeNull();
  });
});
