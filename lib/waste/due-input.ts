// Checks of the due-date calculation's input: whole grams and millilitres, instants, a horizon and a
// site offset in range, and characterisation values within the form's limits — each issue naming its field.
import type { DomainIssue } from "@/lib/core/result";
import type { WasteStream } from "@/lib/core/vocabulary";
import { WASTE_STREAMS } from "@/lib/core/vocabulary";
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
import type { WasteCharacterisation } from "@/lib/waste/hazard";
import type { GeneratorCategory, WasteRuleSet } from "@/lib/waste/rule-set";

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

export interface WasteDueInput {
  containers: readonly WasteContainerInput[];
  site: WasteSite;
  now: number;
  withinDays: number;
  rules?: WasteRuleSet;
}

function inRange(v: number | null | undefined, min: number, max: number): boolean {
  return v === null || v === undefined || (Number.isFinite(v) && v >= min && v <= max);
}

function siteIssues(input: WasteDueInput): DomainIssue[] {
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
  return issues;
}

const STREAMS = new Set<string>(WASTE_STREAMS);

function containerIssues(c: WasteContainerInput, f: string): DomainIssue[] {
  const issues: DomainIssue[] = [];
  if (!STREAMS.has(c.stream))
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
  return issues;
}

/** Characterisation values outside the limits the container form accepts. */
const LIMITS: ReadonlyArray<{
  key: "pH" | "methanolPct" | "flashPointC" | "waterPct";
  code: DomainIssue["code"];
  min: number;
  max: number;
  what: string;
}> = [
  { key: "pH", code: "WASTE.INVALID_PH", min: MIN_PH, max: MAX_PH, what: `pH must be ${MIN_PH}–${MAX_PH}` },
  {
    key: "methanolPct",
    code: "WASTE.INVALID_METHANOL",
    min: MIN_METHANOL_PCT,
    max: MAX_METHANOL_PCT,
    what: `methanol must be ${MIN_METHANOL_PCT}–${MAX_METHANOL_PCT} % v/v`,
  },
  {
    key: "flashPointC",
    code: "WASTE.INVALID_FLASH_POINT",
    min: MIN_FLASH_POINT_C,
    max: MAX_FLASH_POINT_C,
    what: `flash point must be ${MIN_FLASH_POINT_C}–${MAX_FLASH_POINT_C} °C`,
  },
  {
    key: "waterPct",
    code: "WASTE.INVALID_WATER",
    min: MIN_WATER_PCT,
    max: MAX_WATER_PCT,
    what: `water must be ${MIN_WATER_PCT}–${MAX_WATER_PCT} % by weight`,
  },
];

function characterisationIssues(code: string, ch: WasteCharacterisation, f: string): DomainIssue[] {
  return LIMITS.filter((l) => !inRange(ch[l.key], l.min, l.max)).map((l) => ({
    code: l.code,
    message: `Container ${code}: ${l.what}`,
    field: `${f}.characterisation.${l.key}`,
  }));
}

/** Every problem with the input, each naming its field; empty when the calculation can run. */
export function validateDueInput(input: WasteDueInput): DomainIssue[] {
  const issues = siteIssues(input);
  input.containers.forEach((c, i) => {
    const f = `containers.${i}`;
    issues.push(...containerIssues(c, f));
    if (c.characterisation !== null) issues.push(...characterisationIssues(c.code, c.characterisation, f));
  });
  return issues;
}
