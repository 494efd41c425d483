import "server-only";
// What falls due for haul-away, for the waste-due page and GET /api/waste/due: every container on site
// with its hazard flags and due date under the active rule set, and the containers due within N days
// by stream with totals for the hauler. Built on lib/waste/waste-due (listWasteDue) and the container store.
import type { Db } from "@/lib/core/connect";
import { ok } from "@/lib/core/result";
import type { DomainIssue, Result } from "@/lib/core/result";
import type { WasteStream } from "@/lib/core/vocabulary";
import { parseInput } from "@/lib/ledger/parse";
import { getUtcOffsetMin } from "@/lib/period/site-time";
import { ASSUMPTION_NOTE, loadWasteDueInputs } from "@/lib/waste/container.store";
import { getActiveWasteRules } from "@/lib/waste/site-rules.store";
import type { ActiveWasteRules } from "@/lib/waste/site-rules";
import { assessWasteHazards, listWasteDue } from "@/lib/waste/waste-due";
import type {
  GeneratorCategory,
  HazardAssessment,
  StreamGroup,
  WasteContainerInput,
  WasteDue,
  WasteRuleSet,
} from "@/lib/waste/waste-due";
import { MAX_DUE_HORIZON_DAYS, WasteDueQuerySchema, WasteSiteSettingsSchema } from "@/lib/waste/waste.schema";
import { WasteDuePageQuerySchema } from "@/lib/api/endpoints/trace";

export { DEFAULT_DUE_DAYS } from "@/lib/api/endpoints/trace";

export interface ContainerDueRow {
  code: string;
  stream: WasteStream;
  status: string;
  massG: number;
  volumeMl: number;
  accumulationStart: Date;
  satellite: boolean;
  characterisation: {
    methanolPct: number | null;
    pH: number | null;
    flashPointC: number | null;
    waterPct: number | null;
  };
  hazard: HazardAssessment;
  due: WasteDue | null;
  daysLeft: number | null;
  overdue: boolean;
}

export interface WasteDueReport {
  query: { days: number; category: GeneratorCategory; tsdfMiles: number | null };
  /** True when the category is neither the site's choice nor typed in the form. */
  categoryAssumed: boolean;
  /** The site's chosen rule set, with who chose it and why (null: not chosen yet). */
  chosen: ActiveWasteRules["chosen"];
  assumptionNote: string;
  ruleSet: WasteRuleSet;
  localRulesNote: string;
  now: Date;
  horizonAt: Date;
  containers: ContainerDueRow[];
  groups: StreamGroup[];
  totals: { count: number; kg: number; litres: number; usGallons: number };
  noTimeLimit: WasteDue[];
  issues: DomainIssue[];
  densityNote: string;
}

const MS_PER_DAY = 86_400_000;

type OnSite = Awaited<ReturnType<typeof loadWasteDueInputs>>["rows"][number];

/** A container on site with its hazard flags; its due date is filled in from the report. */
function dueRowOf(c: OnSite, input: WasteContainerInput | undefined, rules: WasteRuleSet): ContainerDueRow {
  const characterisation = { methanolPct: c.methanolPct, pH: c.pH, flashPointC: c.flashPointC, waterPct: c.waterPct };
  return {
    code: c.code,
    stream: c.stream as WasteStream,
    status: c.status,
    massG: input?.massG ?? c.stockG,
    volumeMl: input?.volumeMl ?? 0,
    accumulationStart: c.accumulationStart,
    satellite: c.satellite,
    characterisation,
    hazard: assessWasteHazards(c.stream as WasteStream, characterisation, rules),
    due: null,
    daysLeft: null,
    overdue: false,
  };
}

function withDueDates(rows: ContainerDueRow[], report: { groups: StreamGroup[]; noTimeLimit: WasteDue[] }): void {
  const byCode = new Map<string, { due: WasteDue; daysLeft: number | null; overdue: boolean }>();
  for (const g of report.groups)
    for (const d of g.items) byCode.set(d.code, { due: d, daysLeft: d.daysLeft, overdue: d.overdue });
  for (const d of report.noTimeLimit) byCode.set(d.code, { due: d, daysLeft: null, overdue: false });
  for (const r of rows) {
    const d = byCode.get(r.code);
    if (d) Object.assign(r, d);
  }
}

function totalsOf(groups: readonly StreamGroup[]): WasteDueReport["totals"] {
  return groups.reduce(
    (t, g) => ({
      count: t.count + g.totals.count,
      kg: t.kg + g.totals.kg,
      litres: t.litres + g.totals.litres,
      usGallons: t.usGallons + g.totals.usGallons,
    }),
    { count: 0, kg: 0, litres: 0, usGallons: 0 },
  );
}

export async function getWasteDueReport(
  db: Db,
  site: { id: number; timeZone: string },
  input: unknown,
  now: Date,
): Promise<Result<WasteDueReport>> {
  const raw = parseInput(WasteDuePageQuerySchema, input);
  if (!raw.ok) return raw;
  const horizon = parseInput(WasteDueQuerySchema, { withinDays: raw.value.days });
  if (!horizon.ok) return { ok: false, issues: horizon.issues.map((i) => ({ ...i, field: "days" })) };
  const active = await getActiveWasteRules(db, site.id);
  const settings = parseInput(WasteSiteSettingsSchema, {
    generatorCategory: raw.value.category ?? active.generatorCategory,
    tsdfDistanceMiles: raw.value.tsdfMiles ?? active.tsdfDistanceMiles,
  });
  if (!settings.ok)
    return {
      ok: false,
      issues: settings.issues.map((i) => ({ ...i, field: i.field === "tsdfDistanceMiles" ? "tsdfMiles" : "category" })),
    };
  const rules = active.rules;
  const { rows: onSite, inputs } = await loadWasteDueInputs(db, site.id, rules);
  const rows = onSite.map((c, i) => dueRowOf(c, inputs[i], rules));
  const siteRules = {
    generatorCategory: settings.value.generatorCategory,
    tsdfDistanceMiles: settings.value.tsdfDistanceMiles,
    utcOffsetMin: getUtcOffsetMin(site.timeZone, now),
  };
  const report = listWasteDue({
    containers: inputs,
    site: siteRules,
    now: now.getTime(),
    withinDays: MAX_DUE_HORIZON_DAYS,
    rules,
  });
  if (!report.ok) return report;
  // Every container's due date, from the widest horizon; the stream groups are those due within N days.
  withDueDates(rows, report.value);
  const days = horizon.value.withinDays;
  const horizonAt = now.getTime() + days * MS_PER_DAY;
  const within = listWasteDue({ containers: inputs, site: siteRules, now: now.getTime(), withinDays: days, rules });
  if (!within.ok) return within;
  const dueGroups = within.value.groups;
  return ok({
    query: { days, category: settings.value.generatorCategory, tsdfMiles: settings.value.tsdfDistanceMiles },
    categoryAssumed: raw.value.category === undefined && active.chosen === null,
    chosen: active.chosen,
    assumptionNote: ASSUMPTION_NOTE,
    ruleSet: rules,
    localRulesNote: report.value.note,
    now,
    horizonAt: new Date(horizonAt),
    containers: rows.sort(
      (a, b) =>
        (a.due?.dueAt ?? Number.POSITIVE_INFINITY) - (b.due?.dueAt ?? Number.POSITIVE_INFINITY) ||
        a.code.localeCompare(b.code),
    ),
    groups: dueGroups,
    totals: totalsOf(dueGroups),
    noTimeLimit: report.value.noTimeLimit,
    issues: report.value.issues,
    densityNote:
      "Volumes are estimated from book mass at a nominal density at 15 °C for the stream (glycerol for the glycerol phase, water for wash water and other aqueous streams, methanol for methanol-rich liquid); the hauler's measurement is the one that counts.",
  });
}
