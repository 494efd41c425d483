import "server-only";
import type { Db } from "@/lib/core/connect";
import { listBatches } from "@/lib/batch/batch.store";
import type { BatchRow } from "@/lib/batch/batch.store";
import { listLots } from "@/lib/feedstock/lot.store";
import type { LotRow } from "@/lib/feedstock/lot.store";
import { getPeriodAt } from "@/lib/period/period.store";
import type { PeriodRow } from "@/lib/period/period.store";
import { getLocalDate, getMonthPeriod } from "@/lib/mass-balance/period";
import {
  DEFAULT_DENSITY_TABLE,
  DEFAULT_REFERENCE_TEMP_C,
  densityAt,
  requireDensityEntry,
} from "@/lib/quantity/density";
import type { MaterialKind } from "@/lib/quantity/density";
import { listTanks } from "@/lib/tank/tank.store";
import type { TankRow } from "@/lib/tank/tank.store";
import { listWasteContainers } from "@/lib/waste/container.store";
import type { WasteContainerRow } from "@/lib/waste/container.store";

/** The material a tank's service is assumed to hold when its book mass is turned into a level. */
export const SERVICE_MATERIAL: Readonly<Record<string, MaterialKind>> = {
  FEEDSTOCK: "USED_COOKING_OIL",
  PRODUCT: "FAME",
  GLYCEROL_PHASE: "GLYCEROL",
  WASH_WATER: "WATER",
  METHANOL: "METHANOL",
};

export interface TankLevel extends TankRow {
  nominalMaterial: MaterialKind;
  /** Density of the nominal material at the reference temperature, kg/m³ (the default table's value). */
  nominalDensityKgM3: number;
  nominalDensityStatus: string;
  /** Book mass the tank would hold when full of its nominal material, grams. */
  capacityG: number;
  /** Book stock ÷ capacityG × 100; an estimate, not a gauge. */
  fillPct: number;
}

export function toTankLevel(t: TankRow): TankLevel {
  const material = SERVICE_MATERIAL[t.service] ?? "OTHER_OIL";
  const entry = requireDensityEntry(DEFAULT_DENSITY_TABLE, material);
  const rho = densityAt(entry, DEFAULT_REFERENCE_TEMP_C);
  // kg/m³ equals g/L, so grams = millilitres × ρ / 1000.
  const capacityG = (t.capacityMl * rho) / 1000;
  return {
    ...t,
    nominalMaterial: material,
    nominalDensityKgM3: rho,
    nominalDensityStatus: entry.status,
    capacityG,
    fillPct: capacityG > 0 ? (t.stockG * 100) / capacityG : 0,
  };
}

export async function listTankLevels(db: Db, siteId: number): Promise<TankLevel[]> {
  return (await listTanks(db, siteId)).map(toTankLevel);
}

import { getUtcOffsetMin } from "@/lib/period/site-time";
export { getUtcOffsetMin };

export interface Dashboard {
  tanks: TankLevel[];
  quarantinedLots: LotRow[];
  quarantinedTotal: number;
  batchesInProgress: BatchRow[];
  batchesInProgressTotal: number;
  /** Containers still on site (filling or full), oldest accumulation start first. */
  wasteOnSite: WasteContainerRow[];
  currentPeriod: Omit<PeriodRow, "movements" | "lastEvent"> | null;
  month: { label: string; startsAt: Date; endsAt: Date };
  counts: {
    sources: number;
    pickupsThisMonth: number;
    lots: number;
    batches: number;
    productLots: number;
    shipments: number;
  };
}

export async function getDashboard(db: Db, site: { id: number; timeZone: string }, now: Date): Promise<Dashboard> {
  const siteId = site.id;
  const offset = getUtcOffsetMin(site.timeZone, now);
  const local = getLocalDate(now.getTime(), offset);
  const month = getMonthPeriod(local.year, local.month, offset);
  const monthRange = { gte: new Date(month.startMs), lt: new Date(month.endMs) };
  const [
    tanks,
    quarantined,
    inProgress,
    wasteOnSite,
    currentPeriod,
    sources,
    pickupsThisMonth,
    lots,
    batches,
    productLots,
    shipments,
  ] = await Promise.all([
    listTankLevels(db, siteId),
    listLots(db, siteId, { status: "QUARANTINED", take: 15 }),
    listBatches(db, siteId, { statuses: ["PLANNED", "RUNNING"], take: 15 }),
    listWasteContainers(db, siteId, { statuses: ["OPEN", "FULL"] }),
    getPeriodAt(db, siteId, now),
    db.source.count({ where: { siteId } }),
    db.pickup.count({ where: { siteId, observedAt: monthRange } }),
    db.feedstockLot.count({ where: { siteId } }),
    db.batch.count({ where: { siteId } }),
    db.productLot.count({ where: { siteId } }),
    db.shipment.count({ where: { siteId } }),
  ]);
  return {
    tanks,
    quarantinedLots: quarantined.rows,
    quarantinedTotal: quarantined.total,
    batchesInProgress: inProgress.rows,
    batchesInProgressTotal: inProgress.total,
    wasteOnSite,
    currentPeriod,
    month: { label: month.label, startsAt: new Date(month.startMs), endsAt: new Date(month.endMs) },
    counts: { sources, pickupsThisMonth, lots, batches, productLots, shipments },
  };
}
