// The rule set a site's waste pages work to: US federal generator rules as written, or the site's own
// named set (a state or another country's rule) that replaces some federal limits, each with its reason.
import type { GeneratorCategory, RuleValue, WasteRuleSet } from "@/lib/waste/waste-due";
import { RULESET_US_FEDERAL_RCRA } from "@/lib/waste/waste-due";
import type { SiteWasteRules } from "@/lib/waste/site-rules.schema";

export interface ActiveWasteRules {
  rules: WasteRuleSet;
  generatorCategory: GeneratorCategory;
  tsdfDistanceMiles: number | null;
  /** Who chose it and why; null when the site has not chosen (the federal LQG assumption). */
  chosen: { reason: string; at: Date; by: string } | null;
}

/** Before a site chooses: federal rules for a large quantity generator, the shortest federal accumulation time. */
export const ASSUMED_WASTE_RULES: ActiveWasteRules = {
  rules: RULESET_US_FEDERAL_RCRA,
  generatorCategory: "LQG",
  tsdfDistanceMiles: null,
  chosen: null,
};

function own(value: number | undefined, base: RuleValue, setName: string, reason: string): RuleValue {
  return value === undefined
    ? base
    : { value, unit: base.unit, source: `${setName}: ${reason}`, status: "site's own choice" };
}

/** The rule set for a site's stored choice. A site's own set keeps the federal values it does not replace. */
export function resolveWasteRules(choice: SiteWasteRules, chosen: { at: Date; by: string }): ActiveWasteRules {
  const base = RULESET_US_FEDERAL_RCRA;
  const meta = {
    generatorCategory: choice.generatorCategory,
    tsdfDistanceMiles: choice.tsdfDistanceMiles,
    chosen: { reason: choice.reason, ...chosen },
  };
  if (choice.choice === "US_FEDERAL") return { rules: base, ...meta };
  const name = choice.name.trim();
  const hazardous = (v: RuleValue) => own(choice.hazardousMaxDays, v, name, choice.reason);
  const rules: WasteRuleSet = {
    ...base,
    id: "SITE_OWN",
    name,
    edition: `the site's own rule set, built on ${base.name}`,
    lqgMaxDays: hazardous(base.lqgMaxDays),
    sqgMaxDays: hazardous(base.sqgMaxDays),
    sqgLongHaulMaxDays: hazardous(base.sqgLongHaulMaxDays),
    satelliteExcessDays: own(choice.satelliteExcessDays, base.satelliteExcessDays, name, choice.reason),
    satelliteMaxUsGal: own(choice.satelliteMaxUsGal, base.satelliteMaxUsGal, name, choice.reason),
    nonHazardousMaxStorageDays: own(choice.nonHazardousMaxDays, base.nonHazardousMaxStorageDays, name, choice.reason),
  };
  return { rules, ...meta };
}
