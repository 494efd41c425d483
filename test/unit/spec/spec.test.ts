import { describe, expect, it } from "vitest";
import { getBuiltInSpec, judgeLot, judgeValue, limitText, listBuiltInSpecs, sourceAnchor } from "@/lib/spec/spec";
import type { ResultIn, Spec, SpecProperty } from "@/lib/spec/spec";

function spec(key: string): Spec {
  const s = getBuiltInSpec(key);
  if (s === null) throw new Error(`no spec ${key}`);
  return s;
}
function prop(s: Spec, key: string): SpecProperty {
  const p = s.properties.find((q) => q.key === key);
  if (p === undefined) throw new Error(`no property ${key}`);
  return p;
}

const D2 = spec("astm-d6751-23a/no-2-b-s15");
const D1 = spec("astm-d6751-23a/no-1-b-s15");
const EN = spec("en-14214-2019/fame");
const T0 = Date.parse("2026-11-02T08:00:00Z");

/** A value inside every limit of the spec (mid-range or the report value 0). */
function goodValue(p: SpecProperty): number {
  if (p.kind === "class") return 1;
  if (p.min !== undefined && p.max !== undefined) return (p.min + p.max) / 2;
  if (p.max !== undefined) return p.max / 2;
  if (p.min !== undefined) return p.min + 1;
  return 0;
}
function goodLot(s: Spec): ResultIn[] {
  return s.properties.map((p, i) => ({ id: i + 1, property: p.key, value: goodValue(p), testedAt: new Date(T0) }));
}
function replace(rs: ResultIn[], property: string, value: number | null): ResultIn[] {
  const others = rs.filter((r) => r.property !== property);
  return value === null ? others : [...others, { id: 1000, property, value, testedAt: new Date(T0) }];
}

describe("built-in editions", () => {
  it("lists all six ASTM D6751-23a grades and EN 14214:2012+A2:2019", () => {
    expect(listBuiltInSpecs().map((s) => s.grade)).toEqual([
      "No. 1-B S15",
      "No. 1-B S15 LM",
      "No. 1-B S500",
      "No. 2-B S15",
      "No. 2-B S15 LM",
      "No. 2-B S500",
      "FAME for diesel engines",
    ]);
    expect(getBuiltInSpec("nope")).toBeNull();
  });
  it("carries the published limits per grade", () => {
    expect(prop(D2, "sulfur").max).toBe(15); // ASTM D6751-23a Table 1: S15 sulfur 0.0015 % mass (15 ppm) max
    expect(prop(spec("astm-d6751-23a/no-2-b-s500"), "sulfur").max).toBe(500); // ASTM D6751-23a Table 1: S500 0.05 % mass
    expect(prop(spec("astm-d6751-23a/no-1-b-s15-lm"), "metals-combined").max).toBe(4); // ASTM D6751-23a scope: LM Na+K+Ca+Mg 4 ppm max
    expect(D2.properties.some((p) => p.key === "metals-combined")).toBe(false);
    expect(prop(D1, "cold-soak").max).toBe(200); // ASTM D6751 (older editions) No. 1-B 200 s — marked check
    expect(prop(D1, "cold-soak").confidence).toBe("check");
    expect(prop(EN, "oxidation-stability").min).toBe(8); // EN 14214:2012+A2:2019: 8.0 h min
    expect(prop(EN, "water").max).toBe(500); // EN 14214:2012+A2:2019: 500 mg/kg max
  });
  it("names a source with its edition on every property", () => {
    for (const s of listBuiltInSpecs())
      for (const p of s.properties) expect(p.source).toMatch(/D6751-23a|14214:2012\+A2:2019/);
  });
  it("anchors sources per edition and property", () => {
    expect(sourceAnchor("astm-d6751-23a/no-2-b-s15", "acid-number")).toBe("astm-d6751-23a-acid-number");
  });
});

describe("judgeValue — limits (a value equal to the limit conforms: 'max' = not more than)", () => {
  const acid = prop(D2, "acid-number");
  it.each([
    [0.52, "FAIL"], // ASTM D6751-23a Table 1: acid number 0.50 mg KOH/g max
    [0.5, "PASS"], // ASTM D6751-23a Table 1: equal to the limit passes
    [0.49, "PASS"],
  ] as const)("acid number %s → %s", (v, verdict) => expect(judgeValue(acid, v)).toBe(verdict));
  it("flash point 93 °C min", () => {
    const fp = prop(D2, "flash-point");
    expect(judgeValue(fp, 93)).toBe("PASS"); // ASTM D6751-23a Table 1: flash point 93 °C min
    expect(judgeValue(fp, 92.9)).toBe("FAIL");
  });
  it("viscosity range 1.9–6.0 mm²/s, both ends included", () => {
    const v = prop(D2, "viscosity-40c"); // ASTM D6751-23a Table 1: 1.9–6.0 mm²/s
    expect([1.8, 1.9, 6.0, 6.1].map((x) => judgeValue(v, x))).toEqual(["FAIL", "PASS", "PASS", "FAIL"]);
    const e = prop(EN, "viscosity-40c"); // EN 14214:2012+A2:2019: 3.50–5.00 mm²/s
    expect([3.49, 3.5, 5.0, 5.01].map((x) => judgeValue(e, x))).toEqual(["FAIL", "PASS", "PASS", "FAIL"]);
  });
  it("class scales: copper strip No. 3 max (ASTM), class 1 (EN)", () => {
    expect(judgeValue(prop(D2, "copper-strip"), 3)).toBe("PASS"); // ASTM D6751-23a Table 1: No. 3 max
    expect(judgeValue(prop(D2, "copper-strip"), 4)).toBe("FAIL");
    expect(judgeValue(prop(EN, "copper-strip"), 1)).toBe("PASS"); // EN 14214:2012+A2:2019: class 1
    expect(judgeValue(prop(EN, "copper-strip"), 2)).toBe("FAIL");
  });
  it("report-only properties are reported, not judged", () => {
    expect(judgeValue(prop(D2, "cloud-point"), 40)).toBe("REPORTED"); // ASTM D6751-23a Table 1: cloud point report
    expect(judgeValue(prop(D2, "monoglycerides"), 0.9)).toBe("REPORTED"); // No. 2-B: report (from memory)
    expect(judgeValue(prop(D1, "monoglycerides"), 0.41)).toBe("FAIL"); // No. 1-B: 0.40 % mass max (from memory)
    expect(judgeValue(prop(EN, "cfpp"), -3)).toBe("REPORTED"); // EN 14214: climate-dependent, site-chosen
  });
  it("a limit row without limits, or a non-number, is not judged", () => {
    expect(judgeValue({ ...prop(D2, "acid-number"), max: undefined }, 0.1)).toBe("NOT_JUDGED");
    expect(judgeValue(prop(D2, "acid-number"), Number.NaN)).toBe("NOT_JUDGED");
  });
  it("writes limits as published", () => {
    expect(limitText(prop(D2, "acid-number"))).toBe("≤ 0.50 mg KOH/g");
    expect(limitText(prop(D2, "water-sediment"))).toBe("≤ 0.050 % volume");
    expect(limitText(prop(D2, "viscosity-40c"))).toBe("1.9 – 6.0 mm²/s");
    expect(limitText(prop(D2, "copper-strip"))).toBe("No. 3 max");
    expect(limitText(prop(D2, "cloud-point"))).toBe("report");
  });
});

describe("judgeLot", () => {
  it("a lot inside every limit is releasable", () => {
    const j = judgeLot(D2, goodLot(D2));
    expect(j).toMatchObject({ missing: [], failing: [], releasable: true });
    expect(j.rules[0]?.met).toBe(true);
  });
  it("a failing property blocks release", () => {
    const j = judgeLot(D2, replace(goodLot(D2), "acid-number", 0.52)); // ASTM D6751-23a Table 1: 0.50 max
    expect(j.failing).toEqual(["acid-number"]);
    expect(j.releasable).toBe(false);
  });
  it("a missing required property is listed and blocks release", () => {
    const j = judgeLot(D2, replace(goodLot(D2), "cetane-number", null));
    expect(j.missing).toEqual(["cetane-number"]);
    expect(j.properties.find((p) => p.property.key === "cetane-number")?.verdict).toBe("MISSING");
    expect(j.releasable).toBe(false);
  });
  describe("alcohol control (ASTM D6751-23a Table 1: methanol ≤ 0.2 % mass OR flash point ≥ 130 °C)", () => {
    it("methanol 0.3 % with flash point 135 °C: rule met, methanol reported, releasable", () => {
      const j = judgeLot(D2, replace(replace(goodLot(D2), "methanol", 0.3), "flash-point", 135));
      expect(j.rules[0]?.met).toBe(true);
      expect(j.properties.find((p) => p.property.key === "methanol")?.verdict).toBe("REPORTED");
      expect(j.releasable).toBe(true);
    });
    it("no methanol result but flash point 130 °C: methanol is not missing", () => {
      const j = judgeLot(D2, replace(replace(goodLot(D2), "methanol", null), "flash-point", 130));
      expect(j.missing).toEqual([]);
      expect(j.releasable).toBe(true);
    });
    it("methanol 0.2 % exactly, flash point 100 °C: met by methanol", () => {
      const j = judgeLot(D2, replace(replace(goodLot(D2), "methanol", 0.2), "flash-point", 100));
      expect(j.rules[0]?.met).toBe(true);
      expect(j.releasable).toBe(true);
    });
    it("methanol 0.3 % and flash point 120 °C: both alternatives fail", () => {
      const j = judgeLot(D2, replace(replace(goodLot(D2), "methanol", 0.3), "flash-point", 120));
      expect(j.rules[0]?.met).toBe(false);
      expect(j.failing).toEqual(["alcohol-control"]);
      expect(j.releasable).toBe(false);
    });
    it("no methanol result and flash point 120 °C: undecided, the rule is missing", () => {
      const j = judgeLot(D2, replace(replace(goodLot(D2), "methanol", null), "flash-point", 120));
      expect(j.rules[0]?.met).toBeNull();
      expect(j.missing).toEqual(["alcohol-control"]);
      expect(j.rules[0]?.text).toBe("Methanol content ≤ 0.2 % mass or Flash point (closed cup) ≥ 130 °C");
    });
  });
  describe("re-tests", () => {
    const base = replace(goodLot(D2), "acid-number", null);
    const first: ResultIn = { id: 501, property: "acid-number", value: 0.55, testedAt: new Date(T0) };
    it("a re-test linked by supersededBy replaces the failing result", () => {
      const retest: ResultIn = { id: 502, property: "acid-number", value: 0.45, testedAt: new Date(T0 + 3600_000) };
      const j = judgeLot(D2, [...base, { ...first, supersededBy: 502 }, retest]);
      expect(j.properties.find((p) => p.property.key === "acid-number")?.result?.id).toBe(502);
      expect(j.releasable).toBe(true);
    });
    it("a re-test linked by supersedes counts even when dated earlier", () => {
      const retest: ResultIn = {
        id: 502,
        property: "acid-number",
        value: 0.45,
        testedAt: new Date(T0 - 3600_000),
        supersedes: 501,
      };
      expect(judgeLot(D2, [...base, first, retest]).releasable).toBe(true);
    });
    it("without links, the latest test counts", () => {
      const later: ResultIn = { id: 400, property: "acid-number", value: 0.45, testedAt: new Date(T0 + 1) };
      expect(judgeLot(D2, [...base, first, later]).releasable).toBe(true);
      expect(judgeLot(D2, [...base, first, { ...later, testedAt: new Date(T0 - 1) }]).failing).toEqual(["acid-number"]);
    });
  });
  it("a report property without a result is missing when required", () => {
    const j = judgeLot(D2, replace(goodLot(D2), "cloud-point", null)); // ASTM D6751-23a: cloud point must be reported
    expect(j.missing).toEqual(["cloud-point"]);
  });
  it("an optional property without a result is not judged and not missing", () => {
    const j = judgeLot(EN, replace(goodLot(EN), "viscosity-minus-20c", null));
    expect(j.properties.find((p) => p.property.key === "viscosity-minus-20c")?.verdict).toBe("NOT_JUDGED");
    expect(j.releasable).toBe(true);
  });
});
