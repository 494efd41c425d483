import { describe, expect, it } from "vitest";
import { levelOf, screenText, statusNote } from "@/lib/spec/source-text";
import { RULESET_US_FEDERAL_RCRA } from "@/lib/waste/waste-due";

// One pair of functions for every screen that shows a default's source (waste pages, references page).
describe("source text on screen", () => {
  it("keeps the paragraph and turns recall notes into 'to be confirmed'", () => {
    expect(screenText("40 CFR 262.17(a)")).toBe("40 CFR 262.17(a)"); // 40 CFR 262.17(a): 90 days for a large quantity generator
    expect(screenText(RULESET_US_FEDERAL_RCRA.sqgLongHaulMaxDays.source)).toContain("40 CFR 262.16"); // 40 CFR 262.16(d): 270 days at 200 miles or more
    expect(screenText(RULESET_US_FEDERAL_RCRA.satelliteExcessDays.source)).toContain("40 CFR 262.15(a)(6)"); // 40 CFR 262.15(a)(6): three consecutive calendar days
  });
  it("no rule value shows a recall note on screen", () => {
    for (const v of Object.values(RULESET_US_FEDERAL_RCRA)) {
      if (typeof v !== "object") continue;
      expect(screenText(v.source)).not.toMatch(/from memory/i);
      expect(statusNote(v.status)).not.toMatch(/from memory/i);
    }
  });
  it("levels: verified → published, common practice, the site's own choice, else check", () => {
    expect(levelOf(RULESET_US_FEDERAL_RCRA.sqgMaxDays.status)).toBe("published"); // 40 CFR 262.16(b): 180 days
    expect(levelOf(RULESET_US_FEDERAL_RCRA.lqgMaxDays.status)).toBe("check"); // 40 CFR 262.17(a): partly verified
    expect(levelOf(RULESET_US_FEDERAL_RCRA.nonHazardousMaxStorageDays.status)).toBe("site choice");
    expect(levelOf("common practice")).toBe("common practice");
  });
});
