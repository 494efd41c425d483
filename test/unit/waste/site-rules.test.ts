import { describe, expect, it } from "vitest";
import {
  computeWasteDue,
  findSatelliteExcessSince,
  getSatelliteLimitMl,
  listWasteDue,
  RULESET_US_FEDERAL_RCRA,
} from "@/lib/waste/waste-due";
import type { WasteContainerInput } from "@/lib/waste/waste-due";
import { ASSUMED_WASTE_RULES, resolveWasteRules } from "@/lib/waste/site-rules";
import { SiteWasteRulesSchema } from "@/lib/waste/site-rules.schema";

const utc = (iso: string): number => Date.parse(iso);
const DAY = 86_400_000;
const BY = { at: new Date("2027-01-01T00:00:00Z"), by: "Compliance officer" };
const hazardous = { flashPointC: 20, aqueous: false, pH: 7 };

describe("each federal default names its paragraph", () => {
  it.each([
    ["lqgMaxDays", "40 CFR 262.17"], // 40 CFR 262.17(a): 90 days
    ["sqgMaxDays", "40 CFR 262.16"], // 40 CFR 262.16(b): 180 days
    ["vsqgMaxOnSiteKg", "40 CFR 262.14"], // 40 CFR 262.14: 1000 kg on site
    ["satelliteMaxUsGal", "40 CFR 262.15"], // 40 CFR 262.15(a): 55 US gal
    ["satelliteExcessDays", "40 CFR 262.15(a)(6)"], // 40 CFR 262.15(a)(6): three consecutive calendar days
  ] as const)("%s cites %s", (key, cite) => {
    expect(RULESET_US_FEDERAL_RCRA[key].source).toContain(cite);
  });
});

describe("the satellite area's excess date (40 CFR 262.15(a)(6): three consecutive calendar days)", () => {
  const limit = getSatelliteLimitMl(); // 55 US gal = 208 197.648 mL (NIST HB 44 App. C)
  it("is the last time the area went over and stayed over", () => {
    const events = [
      { at: utc("2027-03-01T08:00:00Z"), deltaMl: 150_000 },
      { at: utc("2027-03-02T08:00:00Z"), deltaMl: 80_000 }, // 230 000 mL > 208 198: over
      { at: utc("2027-03-03T08:00:00Z"), deltaMl: -50_000 }, // 180 000: back within
      { at: utc("2027-03-05T08:00:00Z"), deltaMl: 40_000 }, // 220 000: over again
    ];
    expect(findSatelliteExcessSince(events, limit)).toBe(utc("2027-03-05T08:00:00Z"));
    expect(findSatelliteExcessSince(events.slice(0, 3), limit)).toBeNull();
  });

  it("an over-limit area with its excess date falls due three days later, not now (before: 'due now')", () => {
    const now = utc("2027-03-06T12:00:00Z");
    const c = (id: number, over: Partial<WasteContainerInput> = {}): WasteContainerInput => ({
      id,
      code: `S-${id}`,
      stream: "METHANOL_RICH",
      massG: 100_000,
      volumeMl: 120_000,
      accumulationStartAt: utc("2027-03-01T08:00:00Z"),
      satelliteAreaId: "AREA",
      satelliteExcessSinceAt: utc("2027-03-05T08:00:00Z"),
      characterisation: hazardous,
      ...over,
    });
    const r = listWasteDue({
      containers: [c(1), c(2)],
      site: { generatorCategory: "LQG", tsdfDistanceMiles: null, utcOffsetMin: 0 },
      now,
      withinDays: 30,
    });
    expect(r.ok).toBe(true);
    const item = r.ok ? r.value.groups[0]?.items[0] : undefined;
    // 5 March 08:00 + 3 days = 8 March 08:00
    expect(item).toMatchObject({ basis: "SATELLITE_EXCESS", dueDate: "2027-03-08", overdue: false });
  });
});

describe("the site's own rule set", () => {
  const choice = SiteWasteRulesSchema.parse({
    choice: "SITE_OWN",
    generatorCategory: "SQG",
    name: "State rule for small generators",
    hazardousMaxDays: 90,
    nonHazardousMaxDays: 30,
    reason: "State permit condition 4",
  });

  it("replaces the limits it names, keeps the federal ones it does not, and marks them as the site's choice", () => {
    const active = resolveWasteRules(choice, BY);
    expect(active.rules.sqgMaxDays).toMatchObject({ value: 90, status: "site's own choice" });
    expect(active.rules.sqgMaxDays.source).toContain("State permit condition 4");
    expect(active.rules.satelliteExcessDays).toEqual(RULESET_US_FEDERAL_RCRA.satelliteExcessDays);
    expect(active.generatorCategory).toBe("SQG");
  });

  it("changes a due date: SQG 180 days (40 CFR 262.16(b)) become the site's 90", () => {
    const start = utc("2027-01-01T00:00:00Z");
    const container: WasteContainerInput = {
      id: 1,
      code: "D-1",
      stream: "METHANOL_RICH",
      massG: 1,
      volumeMl: 1,
      accumulationStartAt: start,
      characterisation: hazardous,
    };
    const site = { generatorCategory: "SQG" as const, tsdfDistanceMiles: null, utcOffsetMin: 0 };
    expect(computeWasteDue(container, site, start, false, ASSUMED_WASTE_RULES.rules).dueAt).toBe(start + 180 * DAY);
    expect(computeWasteDue(container, site, start, false, resolveWasteRules(choice, BY).rules).dueAt).toBe(
      start + 90 * DAY,
    );
  });

  it.each([
    [{ choice: "SITE_OWN", generatorCategory: "LQG", name: "", hazardousMaxDays: 30, reason: "r" }, "name"],
    [{ choice: "SITE_OWN", generatorCategory: "LQG", name: "Own", reason: "r" }, "hazardousMaxDays"],
    [{ choice: "US_FEDERAL", generatorCategory: "LQG", reason: "" }, "reason"],
    [{ choice: "US_FEDERAL", generatorCategory: "XQG", reason: "r" }, "generatorCategory"],
  ])("refuses %j at %s", (input, field) => {
    const r = SiteWasteRulesSchema.safeParse(input);
    expect(r.success ? [] : r.error.issues.map((i) => i.path.join("."))).toContain(field);
  });
});
