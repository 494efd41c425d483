import "server-only";
import type { Db, Tx } from "@/lib/core/connect";
import { WASTE_STREAMS } from "@/lib/core/vocabulary";
import type { WasteStream } from "@/lib/core/vocabulary";
import {
  DEFAULT_DENSITY_TABLE,
  DEFAULT_REFERENCE_TEMP_C,
  densityAt,
  requireDensityEntry,
} from "@/lib/quantity/density";
import type { MaterialKind } from "@/lib/quantity/density";
import { findSatelliteExcessSince, getSatelliteLimitMl, listWasteDue } from "@/lib/waste/waste-due";
import type { GeneratorCategory, WasteContainerInput, WasteRuleSet } from "@/lib/waste/waste-due";
import { MAX_DUE_HORIZON_DAYS } from "@/lib/waste/waste.schema";
import { getActiveWasteRules } from "@/lib/waste/site-rules.store";

export interface WasteContainerRow {
  code: string;
  stream: string;
  location: string;
  accumulationStart: Date;
  capacityMl: number;
  satellite: boolean;
  methanolPct: number | null;
  pH: number | null;
  flashPointC: number | null;
  waterPct: number | null;
  status: string;
  stockG: number;
  fullAt: Date | null;
  characterisedAt: Date | null;
}

/** Containers by accumulation start, oldest first; `statuses` narrows to e.g. those still on site. */
export async function listWasteContainers(
  db: Db,
  siteId: number,
  opts: { statuses?: readonly string[] } = {},
): Promise<WasteContainerRow[]> {
  const rows = await db.wasteContainer.findMany({
    where: { siteId, ...(opts.statuses ? { status: { in: [...opts.statuses] } } : {}) },
    orderBy: [{ accumulationStart: "asc" }, { id: "asc" }],
    include: { holder: { select: { stockG: true } } },
  });
  return rows.map(toContainerRow);
}

type ContainerRecord = {
  code: string;
  stream: string;
  location: string;
  accumulationStart: Date;
  capacityMl: number;
  satellite: boolean;
  methanolPct: number | null;
  pH: number | null;
  flashPointC: number | null;
  waterPct: number | null;
  status: string;
  fullAt: Date | null;
  characterisedAt: Date | null;
  holder: { stockG: number };
};

function toContainerRow(r: ContainerRecord): WasteContainerRow {
  return {
    code: r.code,
    stream: r.stream,
    location: r.location,
    accumulationStart: r.accumulationStart,
    capacityMl: r.capacityMl,
    satellite: r.satellite,
    methanolPct: r.methanolPct,
    pH: r.pH,
    flashPointC: r.flashPointC,
    waterPct: r.waterPct,
    status: r.status,
    stockG: r.holder.stockG,
    fullAt: r.fullAt,
    characterisedAt: r.characterisedAt,
  };
}

export interface ContainerMovement {
  id: number;
  at: Date;
  role: string;
  direction: "IN" | "OUT";
  massG: number;
  /** The other end: where it came from (in) or went to (out); null for a receipt. */
  otherKind: string | null;
  otherCode: string | null;
  note: string;
}

export interface DisposalOfContainer {
  documentNo: string;
  hauler: string;
  destination: string;
  disposedAt: Date;
  massG: number;
}

export interface WasteContainerDetail extends WasteContainerRow {
  movements: ContainerMovement[];
  disposals: DisposalOfContainer[];
}

/** One container with its movements in and out (oldest first) and the hauls that took from it. */
export async function getWasteContainerDetail(
  db: Db,
  siteId: number,
  code: string,
): Promise<WasteContainerDetail | null> {
  const r = await db.wasteContainer.findUnique({
    where: { siteId_code: { siteId, code } },
    include: {
      holder: {
        select: {
          stockG: true,
          incoming: {
            orderBy: [{ at: "asc" }, { id: "asc" }],
            select: {
              id: true,
              at: true,
              role: true,
              massG: true,
              note: true,
              fromHolder: { select: { kind: true, code: true } },
            },
          },
          outgoing: {
            orderBy: [{ at: "asc" }, { id: "asc" }],
            select: {
              id: true,
              at: true,
              role: true,
              massG: true,
              note: true,
              toHolder: { select: { kind: true, code: true } },
            },
          },
        },
      },
    },
  });
  if (!r) return null;
  const movements: ContainerMovement[] = [
    ...r.holder.incoming.map((m) => ({
      id: m.id,
      at: m.at,
      role: m.role,
      direction: "IN" as const,
      massG: m.massG,
      otherKind: m.fromHolder?.kind ?? null,
      otherCode: m.fromHolder?.code ?? null,
      note: m.note,
    })),
    ...r.holder.outgoing.map((m) => ({
      id: m.id,
      at: m.at,
      role: m.role,
      direction: "OUT" as const,
      massG: m.massG,
      otherKind: m.toHolder.kind,
      otherCode: m.toHolder.code,
      note: m.note,
    })),
  ].sort((a, b) => a.at.getTime() - b.at.getTime() || a.id - b.id);
  const hauledTo = r.holder.outgoing.filter((m) => m.toHolder.kind === "DISPOSAL").map((m) => m.toHolder.code);
  const disposals =
    hauledTo.length === 0
      ? []
      : await db.disposal.findMany({
          where: { siteId, documentNo: { in: hauledTo } },
          orderBy: [{ disposedAt: "asc" }, { id: "asc" }],
          select: { documentNo: true, hauler: true, destination: true, disposedAt: true, massG: true },
        });
  return { ...toContainerRow(r), movements, disposals };
}

export interface DisposalRow {
  documentNo: string;
  hauler: string;
  destination: string;
  disposedAt: Date;
  massG: number;
  /** Containers it was collected from (the sources of its incoming movements). */
  containerCodes: string[];
}

export async function listDisposals(db: Db, siteId: number): Promise<DisposalRow[]> {
  const rows = await db.disposal.findMany({
    where: { siteId },
    orderBy: [{ disposedAt: "desc" }, { id: "desc" }],
    include: {
      holder: { select: { incoming: { orderBy: { id: "asc" }, select: { fromHolder: { select: { code: true } } } } } },
    },
  });
  return rows.map((r) => ({
    documentNo: r.documentNo,
    hauler: r.hauler,
    destination: r.destination,
    disposedAt: r.disposedAt,
    massG: r.massG,
    containerCodes: [...new Set(r.holder.incoming.flatMap((m) => (m.fromHolder ? [m.fromHolder.code] : [])))],
  }));
}

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
  const events = moves.flatMap((m) => {
    const into = holders.get(m.toHolderId);
    const from = m.fromHolderId === null ? undefined : holders.get(m.fromHolderId);
    const out: Array<{ at: number; deltaMl: number }> = [];
    if (into !== undefined) out.push({ at: m.at.getTime(), deltaMl: estimateVolumeMl(into, m.massG) });
    if (from !== undefined) out.push({ at: m.at.getTime(), deltaMl: -estimateVolumeMl(from, m.massG) });
    return out;
  });
  return findSatelliteExcessSince(events, getSatelliteLimitMl(rules));
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
  const inputs = rows.map((c, i): WasteContainerInput => ({
    id: i + 1,
    code: c.code,
    stream: c.stream as WasteStream,
    massG: c.stockG,
    volumeMl: estimateVolumeMl(c.stream, c.stockG),
    accumulationStartAt: c.accumulationStart.getTime(),
    satelliteAreaId: c.satellite ? SATELLITE_AREA : null,
    satelliteExcessSinceAt: c.satellite ? excessAt : null,
    characterisation: { methanolPct: c.methanolPct, pH: c.pH, flashPointC: c.flashPointC, waterPct: c.waterPct },
  }));
  return { rows, inputs };
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
  const byCode = new Map<string, WasteDueRow>();
  for (const g of report.value.groups) {
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
  for (const d of report.value.noTimeLimit) {
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
  return {
    byCode,
    issues: report.value.issues.map((i) => i.message),
    ruleSet: report.value.ruleSet.name,
    note: report.value.note,
    assumption,
  };
}

// ---- writes used by lib/waste/container.service.ts and lib/batch/batch.service.ts

export async function insertWasteContainer(
  tx: Tx,
  w: {
    siteId: number;
    holderId: number;
    code: string;
    stream: string;
    location: string;
    accumulationStart: Date;
    capacityMl: number;
    satellite: boolean;
    methanolPct: number | null;
    pH: number | null;
    flashPointC: number | null;
    waterPct: number | null;
    characterisedAt: Date | null;
  },
): Promise<{ id: number; code: string }> {
  return tx.wasteContainer.create({ data: { ...w, status: "OPEN" }, select: { id: true, code: true } });
}

export interface ContainerState {
  id: number;
  code: string;
  status: string;
  accumulationStart: Date;
  methanolPct: number | null;
  pH: number | null;
  flashPointC: number | null;
  waterPct: number | null;
  characterisedAt: Date | null;
  fullAt: Date | null;
}

export async function getContainerState(tx: Tx, holderId: number): Promise<ContainerState> {
  return tx.wasteContainer.findUniqueOrThrow({
    where: { holderId },
    select: {
      id: true,
      code: true,
      status: true,
      accumulationStart: true,
      methanolPct: true,
      pH: true,
      flashPointC: true,
      waterPct: true,
      characterisedAt: true,
      fullAt: true,
    },
  });
}

export async function insertDisposal(
  tx: Tx,
  d: {
    siteId: number;
    holderId: number;
    hauler: string;
    documentNo: string;
    disposedAt: Date;
    massG: number;
    destination: string;
    containerCode: string;
  },
): Promise<{ id: number; documentNo: string }> {
  return tx.disposal.create({ data: d, select: { id: true, documentNo: true } });
}

export async function disposalExists(tx: Tx, siteId: number, documentNo: string): Promise<boolean> {
  return (await tx.disposal.count({ where: { siteId, documentNo } })) > 0;
}

export async function setContainerStatus(tx: Tx, id: number, status: string): Promise<void> {
  await tx.wasteContainer.update({ where: { id }, data: { status } });
}

/** The new characterisation replaces the stored values (a value not measured this time is cleared). */
export async function setCharacterisation(
  tx: Tx,
  id: number,
  c: {
    methanolPct: number | null;
    pH: number | null;
    flashPointC: number | null;
    waterPct: number | null;
    characterisedAt: Date;
  },
): Promise<void> {
  await tx.wasteContainer.update({ where: { id }, data: c });
}

/** Marks an open container full with one conditional update, so two clerks cannot both mark it. */
export async function markFullIfOpen(tx: Tx, id: number, fullAt: Date): Promise<boolean> {
  const r = await tx.wasteContainer.updateMany({ where: { id, status: "OPEN" }, data: { status: "FULL", fullAt } });
  return r.count === 1;
}
