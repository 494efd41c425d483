// The waste rule set: each limit with its unit, its published source and how far that source was checked.
// The default is US federal RCRA (40 CFR Parts 261–262); local and state rules may be stricter and govern.
import type { GENERATOR_CATEGORIES } from "@/lib/waste/waste.schema";

export type GeneratorCategory = (typeof GENERATOR_CATEGORIES)[number];

export interface RuleValue {
  value: number;
  unit: string;
  source: string;
  status: string;
}

export interface WasteRuleSet {
  id: string;
  name: string;
  edition: string;
  lqgMaxDays: RuleValue;
  sqgMaxDays: RuleValue;
  sqgLongHaulMaxDays: RuleValue;
  sqgLongHaulMinMiles: RuleValue;
  sqgMaxOnSiteKg: RuleValue;
  vsqgMaxOnSiteKg: RuleValue;
  satelliteMaxUsGal: RuleValue;
  satelliteExcessDays: RuleValue;
  ignitableFlashPointBelowC: RuleValue;
  ignitableAqueousAlcoholBelowPctVol: RuleValue;
  aqueousMinWaterPctMass: RuleValue;
  corrosivePhAtMost: RuleValue;
  corrosivePhAtLeast: RuleValue;
  nonHazardousMaxStorageDays: RuleValue;
  localRulesNote: string;
}

export const LOCAL_RULES_NOTE =
  "Local and state rules may be stricter and govern; confirm with your regulator and licensed hauler.";

export const RULESET_US_FEDERAL_RCRA: WasteRuleSet = {
  id: "US_FEDERAL_RCRA",
  name: "US federal hazardous-waste generator rules (40 CFR Parts 261–262)",
  edition:
    "Generator Improvements Rule numbering (81 FR 85732, effective 30 May 2017); ignitability as amended by 85 FR 40594 (effective 8 Sep 2020)",
  lqgMaxDays: {
    value: 90,
    unit: "days",
    source: "40 CFR 262.17(a)",
    status:
      "partly verified: the 90-day text seen in the former §262.34(a), the current paragraph in secondary sources only; a 30-day extension for unforeseen circumstances exists case by case (from memory)",
  },
  sqgMaxDays: { value: 180, unit: "days", source: "40 CFR 262.16(b)", status: "verified" },
  sqgLongHaulMaxDays: {
    value: 270,
    unit: "days",
    source: "40 CFR 262.16 (paragraph (d), from memory; value seen in the former §262.34(e)/(f))",
    status: "partly verified",
  },
  sqgLongHaulMinMiles: {
    value: 200,
    unit: "miles",
    source: "40 CFR 262.16 (paragraph (d), from memory; value seen in the former §262.34(e)/(f))",
    status: "partly verified",
  },
  sqgMaxOnSiteKg: { value: 6000, unit: "kg", source: "40 CFR 262.16(b)(1)", status: "verified" },
  vsqgMaxOnSiteKg: {
    value: 1000,
    unit: "kg",
    source: "40 CFR 262.14",
    status: "verified in county and consultant summaries of the rule",
  },
  satelliteMaxUsGal: {
    value: 55,
    unit: "US gal",
    source: "40 CFR 262.15(a) (non-acute hazardous waste; acute: 1 quart liquid or 1 kg solid, not handled here)",
    status: "verified in verbatim state adoptions",
  },
  satelliteExcessDays: {
    value: 3,
    unit: "consecutive calendar days",
    source:
      "40 CFR 262.15(a)(6): remove the excess within three consecutive calendar days of exceeding the limit; wording as in EPA guidance RCRA Online 14703",
    status: "the three-consecutive-calendar-days wording seen in EPA guidance only",
  },
  ignitableFlashPointBelowC: {
    value: 60,
    unit: "°C",
    source: "40 CFR 261.21(a)(1) (140 °F; ASTM D93 or D3278 closed cup)",
    status: "verified",
  },
  ignitableAqueousAlcoholBelowPctVol: {
    value: 24,
    unit: "% alcohol by volume",
    source: "40 CFR 261.21(a)(1): aqueous solutions with less than this alcohol content are excluded",
    status: "verified",
  },
  aqueousMinWaterPctMass: {
    value: 50,
    unit: "% water by weight",
    source: "85 FR 40594 (2020): 'aqueous' for the alcohol exclusion",
    status: "from memory, unverified — whether this is codified was not seen",
  },
  corrosivePhAtMost: {
    value: 2,
    unit: "pH",
    source: "40 CFR 261.22(a)(1) (aqueous; EPA Method 9040C)",
    status: "from memory, unverified — confirm the current text in the eCFR",
  },
  corrosivePhAtLeast: {
    value: 12.5,
    unit: "pH",
    source: "40 CFR 261.22(a)(1) (aqueous; EPA Method 9040C)",
    status: "from memory, unverified — confirm the current text in the eCFR",
  },
  nonHazardousMaxStorageDays: {
    value: 90,
    unit: "days",
    source:
      "no federal time limit applies to non-hazardous waste (40 CFR Part 262 covers hazardous waste); 90 days is the site's own choice",
    status: "site's own choice — set it to your permit, contract or local rule",
  },
  localRulesNote: LOCAL_RULES_NOTE,
};
