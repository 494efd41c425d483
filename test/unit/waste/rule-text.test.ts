import { describe, expect, it } from "vitest";
import { confidenceOf, plainSource, plainStatus } from "@/app/waste/rule-text";
import { RULESET_US_FEDERAL_RCRA } from "@/lib/waste/waste-due";

describe("rule text on screen", () => {
  it("keeps the paragraph and drops recall notes", () => {
    expect(plainSource("40 CFR 262.17(a)")).toBe("40 CFR 262.17(a)"); // 40 CFR 262.17(a): 90 days for a large quantity generator
    expect(plainSource(RULESET_US_FEDERAL_RCRA.sqgLongHaulMaxDays.source)).toBe("40 CFR 262.16"); // 40 CFR 262.16: 270 days when the facility is 200 miles or more away
    expect(plainSource(RULESET_US_FEDERAL_RCRA.satelliteMaxUsGal.source)).toContain("40 CFR 262.15(a)"); // 40 CFR 262.15(a): 55 US gal satellite limit
  });
  it("no rule value shows a recall note on screen", () => {
    for (const v of Object.values(RULESET_US_FEDERAL_RCRA)) {
      if (typeof v !== "object") continue;
      expect(plainSource(v.source)).not.toMatch(/from memory/i);
      expect(plainStatus(v.status)).not.toMatch(/from memory/i);
    }
  });
  it("marks only checked values as published", () => {
    expect(confidenceOf(RULESET_US_FEDERAL_RCRA.sqgMaxDays.status)).toBe("published"); // 40 CFR 262.16(b): 180 days
    expect(confidenceOf(RULESET_US_FEDERAL_RCRA.lqgMaxDays.status)).toBe("check"); // 40 CFR 262.17(a): partly verified
    expect(confidenceOf(RULESET_US_FEDERAL_RCRA.nonHazardousMaxStorageDays.status)).toBe("check"); // common practice
  });
});
