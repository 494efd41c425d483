import "server-only";
// The home page's read model: one look at every domain the plant's day touches (tanks, lots waiting
// for the lab, batches in progress, waste on site, the accounting period, this month's counts). It
// spans domains, so it lives beside the page that shows it and reads each domain through its store.
import type { Db } from "@/lib/core/connect";
import { listBatches } from "@/lib/batch/batch.store";
import type { BatchRow } from "@/lib/batch/batch.store";
import { countPickupsBetween } from "@/lib/feedstock/pickup.store";
import { listLots } from "@/lib/feedstock/lot.store";
import type { LotRow } from "@/lib/feedstock/lot.store";
import { getLocalDate, getMonthPeriod } from "@/lib/mass-balance/period";
import { getPeriodAt } from "@/lib/period/period.store";
import type { PeriodRow } from "@/lib/period/period.store";
import { getUtcOffsetMin } from "@/lib/period/site-time";
import { listProductLots } from "@/lib/product/product.store";
import { listShipmentRows } from "@/lib/shipment/shipment.store";
import { countSources } from "@/lib/source/source.store";
import { listTankLevels } from "@/lib/tank/tank.store";
import type { TankLevel } from "@/lib/tank/tank.store";
import { listWasteContainers } from "@/lib/waste/container.store";
import type { WasteContainerRow } from "@/lib/waste/container.store";

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
  const startsAt = new Date(month.startMs);
  const endsAt = new Date(month.endMs);
  // take 0: only the totals of these lists.
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
    countSources(db, siteId),
    countPickupsBetween(db, siteId, startsAt, endsAt),
    listLots(db, siteId, { take: 0 }),
    listBatches(db, siteId, { take: 0 }),
    listProductLots(db, siteId, { take: 0 }),
    listShipmentRows(db, siteId, { take: 0 }),
  ]);
  return {
    tanks,
    quarantinedLots: quarantined.rows,
    quarantinedTotal: quarantined.total,
    batchesInProgress: inProgress.rows,
    batchesInProgressTotal: inProgress.total,
    wasteOnSite,
    currentPeriod,
    month: { label: month.label, startsAt, endsAt },
    counts: {
      sources,
      pickupsThisMonth,
      lots: lots.total,
      batches: batches.total,
      productLots: productLots.total,
      shipments: shipments.total,
    },
  };
}
