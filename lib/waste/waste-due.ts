// Hazard flags and pickup due dates for waste containers under a configurable rule set. The default is
// US federal RCRA (40 CFR Parts 261–262); local and state rules may be stricter and govern.
import { failMany, ok } from "@/lib/core/result";
import type { DomainIssue, Result } from "@/lib/core/result";
import type { WasteStream } from "@/lib/core/vocabulary";
import { WASTE_STREAMS } from "@/lib/core/vocabulary";
import { formatLocalDate } from "@/lib/mass-balance/period";
import { convertVolume, gramsToKg, millilitresToLitres } from "@/lib/quantity/units";
import {
  MAX_DUE_HORIZON_DAYS,
  MAX_FLASH_POINT_C,
  MAX_METHANOL_PCT,
  MAX_PH,
  MAX_WATER_PCT,
  MIN_FLASH_POINT_C,
  MIN_METHANOL_PCT,
  MIN_PH,
  MIN_WATER_PCT,
} from "@/lib/waste/waste.schema";
import type { GENERATOR_CATEGORIES, PHYSICAL_STATES } from "@/lib/waste/waste.schema";

export type GeneratorCategory = (typeof GENERATOR_CATEGORIES)[number];
export type PhysicalState = (typeof PHYSICAL_STATES)[number];

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

export interface WasteCharacterisation {
  /** Alcohol content, % by volume. */
  methanolPct?: number | null;
  pH?: number | null;
  /** Closed-cup flash point, °C. */
  flashPointC?: number | null;
  /** Water content, % by weight. */
  waterPct?: number | null;
  /** Explicit determination; overrides the water content. */
  aqueous?: boolean | null;
  /** Defaults by stream when absent (see DEFAULT_PHYSICAL_STATE). */
  physicalState?: PhysicalState | null;
  /** For non-liquids, the generator's determination under 40 CFR 261.21(a)(2). */
  solidIgnitable?: boolean | null;
  listedCodes?: readonly string[];
}

export const DEFAULT_PHYSICAL_STATE: Readonly<Record<WasteStream, PhysicalState | null>> = {
  GLYCEROL_PHASE: "LIQUID",
  WASH_WATER: "LIQUID",
  METHANOL_RICH: "LIQUID",
  FILTER_MEDIA: "SOLID",
  OTHER: null,
};

export type HazardStatus = "YES" | "NO" | "UNKNOWN";

export interface HazardFlag {
  code: "D001" | "D002";
  status: HazardStatus;
  reason: string;
  source: string;
  /** Characterisation fields that would settle an UNKNOWN. */
  missing: string[];
}

export type HazardOverall = "HAZARDOUS" | "NEEDS_CHARACTERISATION" | "NON_HAZARDOUS";

export interface HazardAssessment {
  ignitable: HazardFlag;
  corrosive: HazardFlag;
  listedCodes: string[];
  /** Unknown is never non-hazardous: it is NEEDS_CHARACTERISATION and is handled as hazardous for due dates. */
  overall: HazardOverall;
}

function present(v: number | null | undefined): v is number {
  return v !== null && v !== undefined;
}

/** 40 CFR 261.21(a)(1) for liquids; (a)(2) is taken as the generator's own determination for non-liquids. */
function assessIgnitability(c: WasteCharacterisation, state: PhysicalState | null, rules: WasteRuleSet): HazardFlag {
  const source = rules.ignitableFlashPointBelowC.source;
  if (state === null) {
    return {
      code: "D001",
      status: "UNKNOWN",
      reason: "Physical state not recorded: liquid or solid decides which ignitability test applies",
      source,
      missing: ["physicalState"],
    };
  }
  if (state === "SOLID") {
    if (c.solidIgnitable === true)
      return {
        code: "D001",
        status: "YES",
        reason: "Non-liquid determined ignitable under 40 CFR 261.21(a)(2)",
        source: "40 CFR 261.21(a)(2)",
        missing: [],
      };
    if (c.solidIgnitable === false)
      return {
        code: "D001",
        status: "NO",
        reason: "Non-liquid determined not ignitable under 40 CFR 261.21(a)(2)",
        source: "40 CFR 261.21(a)(2)",
        missing: [],
      };
    return {
      code: "D001",
      status: "UNKNOWN",
      reason: "Non-liquid: needs a determination under 40 CFR 261.21(a)(2)",
      source: "40 CFR 261.21(a)(2)",
      missing: ["solidIgnitable"],
    };
  }
  const aqueous = c.aqueous ?? (present(c.waterPct) ? c.waterPct >= rules.aqueousMinWaterPctMass.value : null);
  const alcohol = present(c.methanolPct) ? c.methanolPct : null;
  const alcoholLimit = rules.ignitableAqueousAlcoholBelowPctVol.value;
  if (aqueous === true && alcohol !== null && alcohol < alcoholLimit) {
    return {
      code: "D001",
      status: "NO",
      reason: `Aqueous solution with ${alcohol} % alcohol by volume, below ${alcoholLimit} %: excluded`,
      source,
      missing: [],
    };
  }
  const exclusionMissing =
    aqueous === null ? ["aqueous or waterPct"] : aqueous === true && alcohol === null ? ["methanolPct"] : [];
  if (!present(c.flashPointC)) {
    return {
      code: "D001",
      status: "UNKNOWN",
      reason: "Liquid without a closed-cup flash point",
      source,
      missing: ["flashPointC", ...exclusionMissing],
    };
  }
  const limit = rules.ignitableFlashPointBelowC.value;
  if (c.flashPointC < limit) {
    const why =
      exclusionMissing.length > 0
        ? `; the aqueous < ${alcoholLimit} % alcohol exclusion was not established`
        : aqueous === true
          ? `; alcohol ${alcohol} % is not below ${alcoholLimit} %`
          : "";
    return {
      code: "D001",
      status: "YES",
      reason: `Liquid with flash point ${c.flashPointC} °C, below ${limit} °C${why}`,
      source,
      missing: exclusionMissing,
    };
  }
  return {
    code: "D001",
    status: "NO",
    reason: `Flash point ${c.flashPointC} °C is not below ${limit} °C`,
    source,
    missing: [],
  };
}

/** 40 CFR 261.22(a)(1): aqueous waste with pH ≤ 2 or ≥ 12.5. The steel-corrosion test of (a)(2) is not assessed. */
function assessCorrosivity(c: WasteCharacterisation, state: PhysicalState | null, rules: WasteRuleSet): HazardFlag {
  const source = rules.corrosivePhAtLeast.source;
  if (state === "SOLID") {
    return {
      code: "D002",
      status: "NO",
      reason: "Non-liquid: the pH test of 40 CFR 261.22(a)(1) applies to aqueous wastes",
      source,
      missing: [],
    };
  }
  if (c.aqueous === false) {
    return {
      code: "D002",
      status: "NO",
      reason:
        "Determined not aqueous: the pH test does not apply; the steel-corrosion test of 261.22(a)(2) is not assessed here",
      source,
      missing: [],
    };
  }
  if (!present(c.pH)) return { code: "D002", status: "UNKNOWN", reason: "No pH measured", source, missing: ["pH"] };
  const low = rules.corrosivePhAtMost.value;
  const high = rules.corrosivePhAtLeast.value;
  if (c.pH <= low)
    return { code: "D002", status: "YES", reason: `pH ${c.pH} is at or below ${low}`, source, missing: [] };
  if (c.pH >= high)
    return { code: "D002", status: "YES", reason: `pH ${c.pH} is at or above ${high}`, source, missing: [] };
  return { code: "D002", status: "NO", reason: `pH ${c.pH} is between ${low} and ${high}`, source, missing: [] };
}

export function assessWasteHazards(
  stream: WasteStream,
  characterisation: WasteCharacterisation | null,
  rules: WasteRuleSet = RULESET_US_FEDERAL_RCRA,
): HazardAssessment {
  const c = characterisation ?? {};
  const state = c.physicalState ?? DEFAULT_PHYSICAL_STATE[stream];
  const ignitable = assessIgnitability(c, state, rules);
  const corrosive = assessCorrosivity(c, state, rules);
  const listedCodes = [...(c.listedCodes ?? [])];
  const overall: HazardOverall =
    listedCodes.length > 0 || ignitable.status === "YES" || corrosive.status === "YES"
      ? "HAZARDOUS"
      : ignitable.status === "UNKNOWN" || corrosive.status === "UNKNOWN"
        ? "NEEDS_CHARACTERISATION"
        : "NON_HAZARDOUS";
  return { ignitable, corrosive, listedCodes, overall };
}

export interface WasteContainerInput {
  id: number;
  code: string;
  stream: WasteStream;
  massG: number;
  volumeMl: number;
  accumulationStartAt: number;
  /** Set when the container stands in a satellite accumulation area. */
  satelliteAreaId?: string | null;
  /** When the satellite area went over its limit, as dated on this container. */
  satelliteExcessSinceAt?: number | null;
  characterisation: WasteCharacterisation | null;
}

export interface WasteSite {
  generatorCategory: GeneratorCategory;
  /** Distance to the treatment, storage or disposal facility; null when not known. */
  tsdfDistanceMiles: number | null;
  /** Site offset from UTC in minutes, for the local due date. */
  utcOffsetMin: number;
}

export type DueBasis =
  | "LQG_ACCUMULATION"
  | "SQG_ACCUMULATION"
  | "SQG_LONG_HAUL_ACCUMULATION"
  | "VSQG_NO_TIME_LIMIT"
  | "SATELLITE_EXCESS"
  | "SATELLITE_EXCESS_NOT_DATED"
  | "SATELLITE_NO_TIME_LIMIT"
  | "NON_HAZARDOUS_SITE_RULE";

export interface WasteDue {
  containerId: number;
  code: string;
  stream: WasteStream;
  massG: number;
  volumeMl: number;
  hazard: HazardAssessment;
  basis: DueBasis;
  /** null when no time limit applies. */
  dueAt: number | null;
  /** Local calendar date of dueAt (YYYY-MM-DD). */
  dueDate: string | null;
  limitDays: number | null;
  source: string;
  status: string;
}

const MS_PER_DAY = 86_400_000;

function dueAfter(startAt: number, days: RuleValue): { dueAt: number; limitDays: number } {
  return { dueAt: startAt + days.value * MS_PER_DAY, limitDays: days.value };
}

/** Total volume limit of one satellite area in millilitres (55 US gal = 208 197.648 12 mL, NIST HB 44 App. C). */
export function getSatelliteLimitMl(rules: WasteRuleSet = RULESET_US_FEDERAL_RCRA): number {
  return convertVolume(rules.satelliteMaxUsGal.value, "gal", "mL");
}

/**
 * When a satellite area went over its volume limit and stayed over: the instant of the last upward
 * crossing, or null when it is within the limit now. `events` are volume changes of the area's containers
 * (fills positive, hauls and reversals negative). 40 CFR 262.15(a)(6) counts the three days from then.
 */
export function findSatelliteExcessSince(
  events: ReadonlyArray<{ at: number; deltaMl: number }>,
  limitMl: number,
): number | null {
  let volume = 0;
  let since: number | null = null;
  for (const e of [...events].sort((a, b) => a.at - b.at)) {
    const before = volume;
    volume += e.deltaMl;
    if (before <= limitMl && volume > limitMl) since = e.at;
    if (volume <= limitMl) since = null;
  }
  return since;
}

/**
 * The due date of one container. Days are whole 24-hour days from the accumulation start (calendar days
 * at the site's fixed UTC offset). `satelliteAreaOverLimit` says whether the container's satellite area
 * holds more than its volume limit.
 */
export function computeWasteDue(
  container: WasteContainerInput,
  site: WasteSite,
  now: number,
  satelliteAreaOverLimit: boolean,
  rules: WasteRuleSet = RULESET_US_FEDERAL_RCRA,
): WasteDue {
  const hazard = assessWasteHazards(container.stream, container.characterisation, rules);
  const base = {
    containerId: container.id,
    code: container.code,
    stream: container.stream,
    massG: container.massG,
    volumeMl: container.volumeMl,
    hazard,
  };
  const dated = (
    basis: DueBasis,
    dueAt: number | null,
    limitDays: number | null,
    v: { source: string; status: string },
  ): WasteDue => ({
    ...base,
    basis,
    dueAt,
    dueDate: dueAt === null ? null : formatLocalDate(dueAt, site.utcOffsetMin),
    limitDays,
    source: v.source,
    status: v.status,
  });

  if (hazard.overall === "NON_HAZARDOUS") {
    const d = dueAfter(container.accumulationStartAt, rules.nonHazardousMaxStorageDays);
    return dated("NON_HAZARDOUS_SITE_RULE", d.dueAt, d.limitDays, rules.nonHazardousMaxStorageDays);
  }
  if (site.generatorCategory === "VSQG") {
    return dated("VSQG_NO_TIME_LIMIT", null, null, {
      source: rules.vsqgMaxOnSiteKg.source,
      status: `no federal time limit; on-site quantity capped at ${rules.vsqgMaxOnSiteKg.value} kg`,
    });
  }
  // Satellite accumulation (40 CFR 262.15) is a provision for SQGs and LQGs (from memory, unverified); VSQGs are handled above.
  const satellite = container.satelliteAreaId !== undefined && container.satelliteAreaId !== null;
  if (satellite) {
    const since = container.satelliteExcessSinceAt ?? null;
    if (since !== null) {
      const d = dueAfter(since, rules.satelliteExcessDays);
      return dated("SATELLITE_EXCESS", d.dueAt, d.limitDays, rules.satelliteExcessDays);
    }
    if (satelliteAreaOverLimit) {
      return dated("SATELLITE_EXCESS_NOT_DATED", now, null, {
        source: rules.satelliteMaxUsGal.source,
        status: "over the satellite limit without the date it was exceeded: date the container and move the excess now",
      });
    }
    return dated("SATELLITE_NO_TIME_LIMIT", null, null, {
      source: rules.satelliteMaxUsGal.source,
      status: "no time limit below the satellite volume limit",
    });
  }
  if (site.generatorCategory === "LQG") {
    const d = dueAfter(container.accumulationStartAt, rules.lqgMaxDays);
    return dated("LQG_ACCUMULATION", d.dueAt, d.limitDays, rules.lqgMaxDays);
  }
  const longHaul = site.tsdfDistanceMiles !== null && site.tsdfDistanceMiles >= rules.sqgLongHaulMinMiles.value;
  const limit = longHaul ? rules.sqgLongHaulMaxDays : rules.sqgMaxDays;
  const d = dueAfter(container.accumulationStartAt, limit);
  return dated(longHaul ? "SQG_LONG_HAUL_ACCUMULATION" : "SQG_ACCUMULATION", d.dueAt, d.limitDays, limit);
}

export interface HaulTotals {
  count: number;
  massG: number;
  volumeMl: number;
  kg: number;
  litres: number;
  usGallons: number;
}

export interface DueItem extends WasteDue {
  overdue: boolean;
  /** Whole days from now to the due instant, rounded down (negative when overdue). */
  daysLeft: number;
}

export interface StreamGroup {
  stream: WasteStream;
  /** Overdue first, then by due time. */
  items: DueItem[];
  totals: HaulTotals;
}

export interface WasteDueReport {
  now: number;
  horizonAt: number;
  /** Streams with an overdue container first, then by earliest due time. */
  groups: StreamGroup[];
  /** Containers with no time limit (VSQG, satellite below its limit), listed so they are not forgotten. */
  noTimeLimit: WasteDue[];
  issues: DomainIssue[];
  ruleSet: { id: string; name: string; edition: string };
  note: string;
}

export interface WasteDueInput {
  containers: readonly WasteContainerInput[];
  site: WasteSite;
  now: number;
  withinDays: number;
  rules?: WasteRuleSet;
}

function totalsOf(items: ReadonlyArray<{ massG: number; volumeMl: number }>): HaulTotals {
  const massG = items.reduce((s, i) => s + i.massG, 0);
  const volumeMl = items.reduce((s, i) => s + i.volumeMl, 0);
  return {
    count: items.length,
    massG,
    volumeMl,
    kg: gramsToKg(massG),
    litres: millilitresToLitres(volumeMl),
    usGallons: convertVolume(volumeMl, "mL", "gal"),
  };
}

function inRange(v: number | null | undefined, min: number, max: number): boolean {
  return !present(v) || (Number.isFinite(v) && v >= min && v <= max);
}

function validateDueInput(input: WasteDueInput): DomainIssue[] {
  const issues: DomainIssue[] = [];
  if (!Number.isSafeInteger(input.now))
    issues.push({ code: "WASTE.INVALID_TIME", message: "Now must be an instant in milliseconds", field: "now" });
  if (!Number.isInteger(input.withinDays) || input.withinDays < 0 || input.withinDays > MAX_DUE_HORIZON_DAYS) {
    issues.push({
      code: "WASTE.INVALID_HORIZON",
      message: `Days ahead must be a whole number from 0 to ${MAX_DUE_HORIZON_DAYS}`,
      field: "withinDays",
    });
  }
  const miles = input.site.tsdfDistanceMiles;
  if (miles !== null && (!Number.isFinite(miles) || miles < 0)) {
    issues.push({
      code: "WASTE.INVALID_DISTANCE",
      message: "Distance to the treatment facility must be 0 miles or more",
      field: "site.tsdfDistanceMiles",
    });
  }
  if (!Number.isInteger(input.site.utcOffsetMin) || Math.abs(input.site.utcOffsetMin) > 14 * 60) {
    issues.push({
      code: "WASTE.INVALID_OFFSET",
      message: "UTC offset must be whole minutes between −720 and +840",
      field: "site.utcOffsetMin",
    });
  }
  const streams = new Set<string>(WASTE_STREAMS);
  input.containers.forEach((c, i) => {
    const f = `containers.${i}`;
    if (!streams.has(c.stream))
      issues.push({
        code: "WASTE.UNKNOWN_STREAM",
        message: `Container ${c.code}: unknown stream ${c.stream}`,
        field: `${f}.stream`,
      });
    if (!Number.isSafeInteger(c.massG) || c.massG < 0)
      issues.push({
        code: "WASTE.INVALID_MASS",
        message: `Container ${c.code}: mass must be whole grams, 0 or more`,
        field: `${f}.massG`,
      });
    if (!Number.isSafeInteger(c.volumeMl) || c.volumeMl < 0)
      issues.push({
        code: "WASTE.INVALID_VOLUME",
        message: `Container ${c.code}: volume must be whole millilitres, 0 or more`,
        field: `${f}.volumeMl`,
      });
    if (!Number.isSafeInteger(c.accumulationStartAt))
      issues.push({
        code: "WASTE.INVALID_TIME",
        message: `Container ${c.code}: accumulation start must be an instant`,
        field: `${f}.accumulationStartAt`,
      });
    const since = c.satelliteExcessSinceAt;
    if (since !== null && since !== undefined && !Number.isSafeInteger(since)) {
      issues.push({
        code: "WASTE.INVALID_TIME",
        message: `Container ${c.code}: satellite-excess date must be an instant`,
        field: `${f}.satelliteExcessSinceAt`,
      });
    }
    const ch = c.characterisation;
    if (ch === null) return;
    if (!inRange(ch.pH, MIN_PH, MAX_PH))
      issues.push({
        code: "WASTE.INVALID_PH",
        message: `Container ${c.code}: pH must be ${MIN_PH}–${MAX_PH}`,
        field: `${f}.characterisation.pH`,
      });
    if (!inRange(ch.methanolPct, MIN_METHANOL_PCT, MAX_METHANOL_PCT)) {
      issues.push({
        code: "WASTE.INVALID_METHANOL",
        message: `Container ${c.code}: methanol must be ${MIN_METHANOL_PCT}–${MAX_METHANOL_PCT} % v/v`,
        field: `${f}.characterisation.methanolPct`,
      });
    }
    if (!inRange(ch.flashPointC, MIN_FLASH_POINT_C, MAX_FLASH_POINT_C)) {
      issues.push({
        code: "WASTE.INVALID_FLASH_POINT",
        message: `Container ${c.code}: flash point must be ${MIN_FLASH_POINT_C}–${MAX_FLASH_POINT_C} °C`,
        field: `${f}.characterisation.flashPointC`,
      });
    }
    if (!inRange(ch.waterPct, MIN_WATER_PCT, MAX_WATER_PCT)) {
      issues.push({
        code: "WASTE.INVALID_WATER",
        message: `Container ${c.code}: water must be ${MIN_WATER_PCT}–${MAX_WATER_PCT} % by weight`,
        field: `${f}.characterisation.waterPct`,
      });
    }
  });
  return issues;
}

/**
 * What falls due within `withinDays` days of `now` (overdue included), grouped by stream with haul totals,
 * plus on-site quantity-cap and characterisation warnings.
 */
export function listWasteDue(input: WasteDueInput): Result<WasteDueReport> {
  const rules = input.rules ?? RULESET_US_FEDERAL_RCRA;
  const invalid = validateDueInput(input);
  if (invalid.length > 0) return failMany(invalid);

  const { containers, site, now } = input;
  const horizonAt = now + input.withinDays * MS_PER_DAY;
  const issues: DomainIssue[] = [];
  const hazardOf = new Map(containers.map((c) => [c.id, assessWasteHazards(c.stream, c.characterisation, rules)]));
  const countsAsHazardous = (c: WasteContainerInput): boolean => hazardOf.get(c.id)?.overall !== "NON_HAZARDOUS";

  const satelliteLimitMl = getSatelliteLimitMl(rules);
  const areaVolumeMl = new Map<string, number>();
  for (const c of containers) {
    if (
      site.generatorCategory === "VSQG" ||
      c.satelliteAreaId === undefined ||
      c.satelliteAreaId === null ||
      !countsAsHazardous(c)
    )
      continue;
    areaVolumeMl.set(c.satelliteAreaId, (areaVolumeMl.get(c.satelliteAreaId) ?? 0) + c.volumeMl);
  }
  const overLimit = new Set<string>();
  for (const [area, ml] of areaVolumeMl) {
    if (ml > satelliteLimitMl) {
      overLimit.add(area);
      issues.push({
        code: "WASTE.SATELLITE_LIMIT_EXCEEDED",
        message: `Satellite area ${area} holds ${millilitresToLitres(ml)} L, over ${rules.satelliteMaxUsGal.value} US gal (${rules.satelliteMaxUsGal.source}): move the excess within ${rules.satelliteExcessDays.value} ${rules.satelliteExcessDays.unit}`,
        field: "containers",
      });
    }
  }

  const hazardousG = containers.filter(countsAsHazardous).reduce((s, c) => s + c.massG, 0);
  const cap =
    site.generatorCategory === "SQG"
      ? rules.sqgMaxOnSiteKg
      : site.generatorCategory === "VSQG"
        ? rules.vsqgMaxOnSiteKg
        : null;
  if (cap !== null && gramsToKg(hazardousG) > cap.value) {
    issues.push({
      code: site.generatorCategory === "SQG" ? "WASTE.SQG_ON_SITE_CAP_EXCEEDED" : "WASTE.VSQG_ON_SITE_CAP_EXCEEDED",
      message: `${gramsToKg(hazardousG)} kg of hazardous or uncharacterised waste on site, over the ${cap.value} kg ${site.generatorCategory} limit (${cap.source}); satellite containers included`,
      field: "containers",
    });
  }

  const dues = containers.map((c) =>
    computeWasteDue(
      c,
      site,
      now,
      c.satelliteAreaId !== undefined && c.satelliteAreaId !== null && overLimit.has(c.satelliteAreaId),
      rules,
    ),
  );
  dues.forEach((d, i) => {
    if (d.hazard.overall === "NEEDS_CHARACTERISATION") {
      const missing = [...new Set([...d.hazard.ignitable.missing, ...d.hazard.corrosive.missing])].join(", ");
      issues.push({
        code: "WASTE.NEEDS_CHARACTERISATION",
        message: `Container ${d.code}: needs characterisation (${missing}); handled as hazardous until then`,
        field: `containers.${i}.characterisation`,
      });
    }
    if (d.basis === "SATELLITE_EXCESS_NOT_DATED") {
      issues.push({
        code: "WASTE.SATELLITE_EXCESS_NOT_DATED",
        message: `Container ${d.code}: its satellite area is over the limit and the date it was exceeded is not recorded`,
        field: `containers.${i}.satelliteExcessSinceAt`,
      });
    }
  });

  const due: DueItem[] = [];
  const noTimeLimit: WasteDue[] = [];
  for (const d of dues) {
    if (d.dueAt === null) noTimeLimit.push(d);
    else if (d.dueAt <= horizonAt)
      due.push({ ...d, overdue: d.dueAt <= now, daysLeft: Math.floor((d.dueAt - now) / MS_PER_DAY) });
  }

  const groups: StreamGroup[] = [];
  for (const stream of WASTE_STREAMS) {
    const items = due
      .filter((d) => d.stream === stream)
      .sort(
        (a, b) =>
          Number(b.overdue) - Number(a.overdue) || (a.dueAt ?? 0) - (b.dueAt ?? 0) || a.code.localeCompare(b.code),
      );
    if (items.length > 0) groups.push({ stream, items, totals: totalsOf(items) });
  }
  groups.sort((a, b) => {
    const ao = a.items.some((i) => i.overdue);
    const bo = b.items.some((i) => i.overdue);
    return Number(bo) - Number(ao) || (a.items[0]?.dueAt ?? 0) - (b.items[0]?.dueAt ?? 0);
  });

  return ok({
    now,
    horizonAt,
    groups,
    noTimeLimit,
    issues,
    ruleSet: { id: rules.id, name: rules.name, edition: rules.edition },
    note: rules.localRulesNote,
  });
}
