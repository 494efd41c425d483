import { describe, expect, it } from "vitest";
import { applySiteSettings, withChange } from "@/lib/screening/screening-settings";
import { DEFAULT_SCREENING_SETTINGS } from "@/lib/screening/screening-defaults";

describe("a site's own source check thresholds", () => {
  it("replaces only the values the site set, and says so beside the default", () => {
    const s = applySiteSettings({ values: { capacityRatio: 1.2 } });
    expect(s.capacityRatio.value).toBe(1.2);
    expect(s.capacityRatio.note).toBe("set by this site; the default is 1.5");
    expect(s.robustZ).toEqual(DEFAULT_SCREENING_SETTINGS.robustZ);
  });

  it("drops the site's value when it is set back to the default", () => {
    const r = withChange(
      { values: { capacityRatio: 1.2, hoursMargin: 2 } },
      { setting: "capacityRatio", value: 1.5, reason: "back" },
    );
    expect(r.ok && r.value).toEqual({ values: { hoursMargin: 2 } });
  });

  it("keeps the density range a range", () => {
    const r = withChange({ values: {} }, { setting: "densityMaxKgM3", value: 890, reason: "slip" });
    expect(r.ok ? null : r.issues[0]?.code).toBe("SCREENING.SETTING_RANGE");
    const fine = withChange({ values: {} }, { setting: "densityMaxKgM3", value: 940, reason: "heavier fats" });
    expect(fine.ok && fine.value).toEqual({ values: { densityMaxKgM3: 940 } });
  });
});
