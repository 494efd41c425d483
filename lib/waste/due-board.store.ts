import "server-only";
// Due dates of the containers still on site, read under the site's chosen waste rules: the containers,
// the movements of the satellite area, and the due-date calculation of waste-due.ts.
import type { Db } from "@/lib/core/connect";
import { WASTE_STREAMS } from "@/lib/core/vocabulary";
import { findSatelliteExcessSince, getSatelliteLimitMl, listWasteDue } from "@/lib/waste/waste-due";
import type { WasteContainerInput, WasteRuleSet } from "@/lib/waste/waste-due";
import { MAX_DUE_HORIZON_DAYS } from "@/lib/waste/waste.schema";
import { getActiveWasteRules } from "@/lib/waste/site-rules.store";
import type { WasteContainerRow } from "@/lib/waste/container-row";
import { toContainerRow } from "@/lib/waste/container-row";
import type { WasteDueAssumption, WasteDueBoard } from "@/lib/waste/due-board";
import { ASSUMPTION_NOTE, dueRowsByCode, satelliteVolumeEvents, toDueInput } from "@/lib/waste/due-board";

/**
 * When the site's satellite area went over its limit, from the movements into and out of its containers
 * still on site (each at its stream's nominal density); null when it is within the limit now.
 */
async function findSatelliteExcessAt(
  db: Db,
  rows: readonly WasteContainerRow[],
  ids: ReadonlyMap<string, number>,
  rules: WasteRuleSet,
): Promise<number | null> {
  const holders = new Map<number, string>();
  for (const r of rows) {
    const id = ids.get(r.code);
    if (r.satellite && id !== undefined) holders.set(id, r.stream);
  }
  if (holders.size === 0) return null;
  const list = [...holders.keys()];
  const moves = await db.movement.findMany({
    where: { OR: [{ toHolderId: { in: list } }, { fromHolderId: { in: list } }] },
    select: { at: true, massG: true, toHolderId: true, fromHolderId: true },
  });
  return findSatelliteExcessSince(satelliteVolumeEvents(moves, holders), getSatelliteLimitMl(rules));
}

/** The containers on site as the due-date rules read them, with the satellite area's excess date when over. */
export async function loadWasteDueInputs(
  db: Db,
  siteId: number,
  rules: WasteRuleSet,
): Promise<{ rows: WasteContainerRow[]; inputs: WasteContainerInput[] }> {
  const records = await db.wasteContainer.findMany({
    where: { siteId, status: { in: ["OPEN", "FULL"] } },
    orderBy: [{ accumulationStart: "asc" }, { id: "asc" }],
    include: { holder: { select: { stockG: true } } },
  });
  const streams: ReadonlySet<string> = new Set(WASTE_STREAMS);
  const rows = records.filter((r) => streams.has(r.stream)).map(toContainerRow);
  const excessAt = await findSatelliteExcessAt(db, rows, new Map(records.map((r) => [r.code, r.holderId])), rules);
  return { rows, inputs: rows.map((c, i) => toDueInput(c, i, excessAt)) };
}

/** Due dates of the containers still on site, under the site's chosen waste rules (or the federal LQG assumption). */
export async function getWasteDueBoard(
  db: Db,
  siteId: number,
  now: Date,
  utcOffsetMin: number,
): Promise<WasteDueBoard | null> {
  const active = await getActiveWasteRules(db, siteId);
  const assumption: WasteDueAssumption = {
    generatorCategory: active.generatorCategory,
    tsdfDistanceMiles: active.tsdfDistanceMiles,
    note:
      active.chosen === null
        ? ASSUMPTION_NOTE
        : `Chosen for this site: ${active.rules.name}, ${active.generatorCategory}.`,
  };
  const { inputs: containers } = await loadWasteDueInputs(db, siteId, active.rules);
  const report = listWasteDue({
    containers,
    site: { generatorCategory: active.generatorCategory, tsdfDistanceMiles: active.tsdfDistanceMiles, utcOffsetMin },
    now: now.getTime(),
    withinDays: MAX_DUE_HORIZON_DAYS,
    rules: active.rules,
  });
  if (!report.ok) return null;
  return {
    byCode: dueRowsByCode(report.value),
    issues: report.value.issues.map((i) => i.message),
    ruleSet: report.value.ruleSet.name,
    note: report.value.note,
    assumption,
  };
}
