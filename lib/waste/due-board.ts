// The due board's arithmetic, without the database: container volumes at each stream's nominal density,
// the satellite area's volume changes, the containers as the due-date rules read them, and one row per
// container code of the answer.
import type { WasteStream } from "@/lib/core/vocabulary";
import {
  DEFAULT_DENSITY_TABLE,
  DEFAULT_REFERENCE_TEMP_C,
  densityAt,
  requireDensityEntry,
} from "@/lib/quantity/density";
import type { MaterialKind } from "@/lib/quantity/density";
import type { GeneratorCategory } from "@/lib/waste/rule-set";
import type { WasteContainerInput } from "@/lib/waste/due-input";
import type { WasteDueReport } from "@/lib/waste/waste-due";

export const ASSUMPTION_NOTE =
  "No waste rule set chosen for this site yet: due dates assume US federal rules for a large quantity generator, the shortest federal accumulation time.";

export interface WasteDueAssumption {
  generatorCategory: GeneratorCategory;
  tsdfDistanceMiles: number | null;
  note: string;
}

const STREAM_MATERIAL: Readonly<Record<string, MaterialKind>> = {
  GLYCEROL_PHASE: "GLYCEROL",
  WASH_WATER: "WATER",
  METHANOL_RICH: "METHANOL",
  FILTER_MEDIA: "WATER",
  OTHER: "WATER",
};

export const SATELLITE_AREA = "SITE_SATELLITE_AREA";

/** The ledger keeps grams; the satellite limit and the hauler need litres, at the stream's nominal density. */
export function estimateVolumeMl(stream: string, grams: number): number {
  const rho = densityAt(
    requireDensityEntry(DEFAULT_DENSITY_TABLE, STREAM_MATERIAL[stream] ?? "WATER"),
    DEFAULT_REFERENCE_TEMP_C,
  );
  return Math.round((grams * 1000) / rho);
}

/** Volume changes of the satellite containers (by holder id → stream) from the movements touching them. */
export function satelliteVolumeEvents(
  moves: ReadonlyArray<{ at: Date; massG: number; toHolderId: number; fromHolderId: number | null }>,
  holders: ReadonlyMap<number, string>,
): Array<{ at: number; deltaMl: number }> {
  return moves.flatMap((m) => {
    const into = holders.get(m.toHolderId);
    const from = m.fromHolderId === null ? undefined : holders.get(m.fromHolderId);
    const out: Array<{ at: number; deltaMl: number }> = [];
    if (into !== undefined) out.push({ at: m.at.getTime(), deltaMl: estimateVolumeMl(into, m.massG) });
    if (from !== undefined) out.push({ at: m.at.getTime(), deltaMl: -estimateVolumeMl(from, m.massG) });
    return out;
  });
}

export interface ContainerOnSite {
  code: string;
  stream: string;
  accumulationStart: Date;
  satellite: boolean;
  stockG: number;
  methanolPct: number | null;
  pH: number | null;
  flashPointC: number | null;
  waterPct: number | null;
}

/** A container on site as the due-date rules read it; the satellite area's excess date applies to its containers. */
export function toDueInput(c: ContainerOnSite, index: number, excessAt: number | null): WasteContainerInput {
  return {
    id: index + 1,
    code: c.code,
    stream: c.stream as WasteStream,
    massG: c.stockG,
    volumeMl: estimateVolumeMl(c.stream, c.stockG),
    accumulationStartAt: c.accumulationStart.getTime(),
    satelliteAreaId: c.satellite ? SATELLITE_AREA : null,
    satelliteExcessSinceAt: c.satellite ? excessAt : null,
    characterisation: { methanolPct: c.methanolPct, pH: c.pH, flashPointC: c.flashPointC, waterPct: c.waterPct },
  };
}

export interface WasteDueRow {
  code: string;
  basis: string;
  dueAt: Date | null;
  dueDate: string | null;
  limitDays: number | null;
  source: string;
  status: string;
  hazard: string;
  overdue: boolean;
  daysLeft: number | null;
}

export interface WasteDueBoard {
  byCode: Map<string, WasteDueRow>;
  issues: string[];
  ruleSet: string;
  note: string;
  assumption: WasteDueAssumption;
}

/** One row per container: those due within the horizon with their days left, those with no time limit without. */
export function dueRowsByCode(report: WasteDueReport): Map<string, WasteDueRow> {
  const byCode = new Map<string, WasteDueRow>();
  for (const g of report.groups) {
    for (const d of g.items) {
      byCode.set(d.code, {
        code: d.code,
        basis: d.basis,
        dueAt: d.dueAt === null ? null : new Date(d.dueAt),
        dueDate: d.dueDate,
        limitDays: d.limitDays,
        source: d.source,
        status: d.status,
        hazard: d.hazard.overall,
        overdue: d.overdue,
        daysLeft: d.daysLeft,
      });
    }
  }
  for (const d of report.noTimeLimit) {
    byCode.set(d.code, {
      code: d.code,
      basis: d.basis,
      dueAt: null,
      dueDate: null,
      limitDays: null,
      source: d.source,
      status: d.status,
      hazard: d.hazard.overall,
      overdue: false,
      daysLeft: null,
    });
  }
  return byCode;
}
