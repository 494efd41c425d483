import { describe, expect, it } from "vitest";
import { getBuiltInSpec, judgeValue } from "@/lib/spec/spec";
import type { Spec } from "@/lib/spec/spec";
import { applySiteLimits, changedLimits, siteLimitIssues, siteLimitsText } from "@/lib/spec/site-spec";
import { parseSiteSpecKey, siteSpecKey } from "@/lib/spec/site-spec.schema";
import { describeEditions } from "@/lib/spec/catalogue";
import { levelOf, recipeDefaults, screenText, wasteDefaults } from "@/app/references/default-sources";

function spec(key: string): Spec {
  const s = getBuiltInSpec(key);
  if (s === null) throw new Error(key);
  return s;
}
const D2 = spec("astm-d6751-23a/no-2-b-s15");
const EN = spec("en-14214-2019/fame");
const meta = { key: "site:7", name: "Buyer", version: 1, reason: "Contract" };

describe("site specification limits", () => {
  it("keeps only the limits that differ from the edition", () => {
    // ASTM D6751-23a Table 1: water and sediment 0.050 % volume max; acid number 0.50 mg KOH/g max.
    expect(
      changedLimits(D2, { "water-sediment": { min: null, max: 0.03 }, "acid-number": { min: null, max: 0.5 } }),
    ).toEqual({ "water-sediment": { min: null, max: 0.03 } });
  });
  it("allows tightening and adding a limit to a reported property, refuses loosening or removing", () => {
    expect(
      siteLimitIssues(D2, { "water-sediment": { min: null, max: 0.03 }, "cloud-point": { min: null, max: 0 } }),
    ).toEqual([]);
    expect(siteLimitIssues(D2, { "water-sediment": { min: null, max: 0.051 } }).map((i) => [i.code, i.field])).toEqual([
      ["SITESPEC.LOOSER", "limits.water-sediment.max"],
    ]);
    expect(siteLimitIssues(D2, { "flash-point": { min: null, max: null } }).map((i) => i.field)).toEqual([
      "limits.flash-point.min",
    ]); // ASTM D6751-23a: 93 °C min
    expect(siteLimitIssues(D2, { "viscosity-40c": { min: 5, max: 4 } }).map((i) => i.code)).toEqual([
      "SITESPEC.MIN_ABOVE_MAX",
    ]);
    expect(siteLimitIssues(D2, { nope: { min: null, max: 1 } }).map((i) => i.code)).toEqual([
      "SITESPEC.UNKNOWN_PROPERTY",
    ]);
  });
  it("a class scale is tightened by its worst class (ASTM D130 No. 3 → No. 1)", () => {
    expect(siteLimitIssues(D2, { "copper-strip": { min: null, max: 4 } }).map((i) => i.code)).toEqual([
      "SITESPEC.LOOSER",
    ]);
    expect(siteLimitIssues(D2, { "copper-strip": { min: null, max: 1.5 } }).map((i) => i.code)).toEqual([
      "SITESPEC.CLASS_NUMBER",
    ]);
    const s = applySiteLimits(D2, { "copper-strip": { min: null, max: 1 } }, meta);
    const cu = s.properties.find((p) => p.key === "copper-strip");
    expect(cu && judgeValue(cu, 2)).toBe("FAIL");
  });
  it("resolves to a Spec that judges with the site's limit and names its base", () => {
    const s = applySiteLimits(EN, { cfpp: { min: null, max: -10 } }, meta); // EN 14214: CFPP by climate class, site-chosen
    expect(s).toMatchObject({
      key: "site:7",
      baseKey: "en-14214-2019/fame",
      siteSpec: { name: "Buyer", version: 1, reason: "Contract" },
    });
    const cfpp = s.properties.find((p) => p.key === "cfpp");
    expect(cfpp && [judgeValue(cfpp, -10), judgeValue(cfpp, -9)]).toEqual(["PASS", "FAIL"]);
    expect(siteLimitsText(s)).toBe("Cold filter plugging point ≤ −10 °C");
  });
  it("keys a stored version as site:<id>", () => {
    expect(siteSpecKey(12)).toBe("site:12");
    expect([
      parseSiteSpecKey("site:12"),
      parseSiteSpecKey("site:0"),
      parseSiteSpecKey("site:x"),
      parseSiteSpecKey("astm-d6751-23a/no-2-b-s15"),
    ]).toEqual([12, null, null, null]);
  });
});

describe("references", () => {
  it("gives every built-in property one anchor per edition", () => {
    const anchors = describeEditions().flatMap((e) => e.properties.map((p) => p.anchor));
    expect(new Set(anchors).size).toBe(anchors.length);
    expect(anchors).toContain("astm-d6751-23a-acid-number");
    const sulfur = describeEditions()[0]?.properties.find((p) => p.key === "sulfur");
    expect(sulfur?.limits.map((l) => l.text)).toEqual(["≤ 15 ppm (µg/g)", "≤ 500 ppm (µg/g)"]); // ASTM D6751-23a Table 1
  });
  it("reads the waste and recipe defaults from their modules, with screen words for their standing", () => {
    const waste = wasteDefaults();
    expect(waste.entries.find((e) => e.anchor === "waste-sqgMaxDays")).toMatchObject({
      value: "180 days",
      level: "published",
    }); // 40 CFR 262.16(b)
    expect(recipeDefaults().entries.find((e) => e.anchor === "recipe-washes")?.level).toBe("common practice");
    expect(levelOf("partly verified")).toBe("check");
    for (const e of [...waste.entries, ...recipeDefaults().entries])
      expect(e.source).not.toMatch(/from memory|placeholder/i);
    expect(screenText("40 CFR 262.16 (paragraph (d), from memory; value seen)")).toBe(
      "40 CFR 262.16 (paragraph (d), to be confirmed; value seen)",
    );
  });
});
