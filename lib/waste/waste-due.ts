// Pickup due dates for waste containers under a configurable rule set (rule-set.ts; hazard flags in
// hazard.ts). The default is US federal RCRA (40 CFR Parts 261–262); local and state rules may be stricter and govern.
import { failMany, ok } from "@/lib/core/result";
import type { DomainIssue, Result } from "@/lib/core/result";
import type { WasteStream } from "@/lib/core/vocabulary";
import { WASTE_STREAMS } from "@/lib/core/vocabulary";
import { formatLocalDate } from "@/lib/mass-balance/period";
import { convertVolume, gramsToKg, millilitresToLitres } from "@/lib/quantity/units";
import type { RuleValue, WasteRuleSet } from "@/lib/waste/rule-set";
import { RULESET_US_FEDERAL_RCRA } from "@/lib/waste/rule-set";
import type { HazardAssessment } from "@/lib/waste/hazard";
import { assessWasteHazards } from "@/lib/waste/hazard";
import type { WasteContainerInput, WasteDueInput, WasteSite } from "@/lib/waste/due-input";
import { validateDueInput } from "@/lib/waste/due-input";

export type { WasteContainerInput, WasteDueInput, WasteSite } from "@/lib/waste/due-input";

export type { GeneratorCategory, RuleValue, WasteRuleSet } from "@/lib/waste/rule-set";
export { LOCAL_RULES_NOTE, RULESET_US_FEDERAL_RCRA } from "@/lib/waste/rule-set";
export type {
  HazardAssessment,
  HazardFlag,
  HazardOverall,
  HazardStatus,
  PhysicalState,
  WasteCharacterisation,
} from "@/lib/waste/hazard";
export { assessWasteHazards, DEFAULT_PHYSICAL_STATE } from "@/lib/waste/hazard";

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

/** Satellite areas holding more than their volume limit (hazardous and uncharacterised containers count). */
function areasOverLimit(
  containers: readonly WasteContainerInput[],
  site: WasteSite,
  counts: (c: WasteContainerInput) => boolean,
  rules: WasteRuleSet,
): { overLimit: Set<string>; issues: DomainIssue[] } {
  const satelliteLimitMl = getSatelliteLimitMl(rules);
  const areaVolumeMl = new Map<string, number>();
  for (const c of containers) {
    if (
      site.generatorCategory === "VSQG" ||
      c.satelliteAreaId === undefined ||
      c.satelliteAreaId === null ||
      !counts(c)
    )
      continue;
    areaVolumeMl.set(c.satelliteAreaId, (areaVolumeMl.get(c.satelliteAreaId) ?? 0) + c.volumeMl);
  }
  const overLimit = new Set<string>();
  const issues: DomainIssue[] = [];
  for (const [area, ml] of areaVolumeMl) {
    if (ml <= satelliteLimitMl) continue;
    overLimit.add(area);
    issues.push({
      code: "WASTE.SATELLITE_LIMIT_EXCEEDED",
      message: `Satellite area ${area} holds ${millilitresToLitres(ml)} L, over ${rules.satelliteMaxUsGal.value} US gal (${rules.satelliteMaxUsGal.source}): move the excess within ${rules.satelliteExcessDays.value} ${rules.satelliteExcessDays.unit}`,
      field: "containers",
    });
  }
  return { overLimit, issues };
}

/** The on-site quantity cap of a small or very small generator, when the site holds more. */
function onSiteCapIssue(hazardousG: number, site: WasteSite, rules: WasteRuleSet): DomainIssue | null {
  const cap =
    site.generatorCategory === "SQG"
      ? rules.sqgMaxOnSiteKg
      : site.generatorCategory === "VSQG"
        ? rules.vsqgMaxOnSiteKg
        : null;
  if (cap === null || gramsToKg(hazardousG) <= cap.value) return null;
  return {
    code: site.generatorCategory === "SQG" ? "WASTE.SQG_ON_SITE_CAP_EXCEEDED" : "WASTE.VSQG_ON_SITE_CAP_EXCEEDED",
    message: `${gramsToKg(hazardousG)} kg of hazardous or uncharacterised waste on site, over the ${cap.value} kg ${site.generatorCategory} limit (${cap.source}); satellite containers included`,
    field: "containers",
  };
}

/** Containers still to be characterised, and satellite excesses nobody dated. */
function dueIssues(dues: readonly WasteDue[]): DomainIssue[] {
  const issues: DomainIssue[] = [];
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
  return issues;
}

/** Due items by stream, overdue first; streams with an overdue container first, then by earliest due time. */
export function groupByStream(due: readonly DueItem[]): StreamGroup[] {
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
  return groups.sort((a, b) => {
    const ao = a.items.some((i) => i.overdue);
    const bo = b.items.some((i) => i.overdue);
    return Number(bo) - Number(ao) || (a.items[0]?.dueAt ?? 0) - (b.items[0]?.dueAt ?? 0);
  });
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
  const hazardOf = new Map(containers.map((c) => [c.id, assessWasteHazards(c.stream, c.characterisation, rules)]));
  const countsAsHazardous = (c: WasteContainerInput): boolean => hazardOf.get(c.id)?.overall !== "NON_HAZARDOUS";
  const areas = areasOverLimit(containers, site, countsAsHazardous, rules);
  const issues = [...areas.issues];
  const hazardousG = containers.filter(countsAsHazardous).reduce((s, c) => s + c.massG, 0);
  const cap = onSiteCapIssue(hazardousG, site, rules);
  if (cap) issues.push(cap);

  const inFullArea = (c: WasteContainerInput) =>
    c.satelliteAreaId !== undefined && c.satelliteAreaId !== null && areas.overLimit.has(c.satelliteAreaId);
  const dues = containers.map((c) => computeWasteDue(c, site, now, inFullArea(c), rules));
  issues.push(...dueIssues(dues));

  const due: DueItem[] = [];
  const noTimeLimit: WasteDue[] = [];
  for (const d of dues) {
    if (d.dueAt === null) noTimeLimit.push(d);
    else if (d.dueAt <= horizonAt)
      due.push({ ...d, overdue: d.dueAt <= now, daysLeft: Math.floor((d.dueAt - now) / MS_PER_DAY) });
  }

  return ok({
    now,
    horizonAt,
    groups: groupByStream(due),
    noTimeLimit,
    issues,
    ruleSet: { id: rules.id, name: rules.name, edition: rules.edition },
    note: rules.localRulesNote,
  });
}
