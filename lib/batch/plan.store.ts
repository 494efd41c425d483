import "server-only";
import type { Db } from "@/lib/core/connect";
import { getLabResults } from "@/lib/feedstock/lab.store";
import { loadTraceLedger } from "@/lib/ledger/movement.store";
import type { PlanStock, ReagentStock } from "@/lib/batch/plan";
import { composePlanStock, lotsByEntryHolder, lotsNeeded, tankEntryShares } from "@/lib/batch/plan-stock";

/** Accepted lots with stock, and feedstock tanks with their current contents by lot and the lots' lab results. */
export async function loadPlanStock(db: Db, siteId: number): Promise<PlanStock> {
  const [lotRows, tankRows] = await Promise.all([
    db.feedstockLot.findMany({
      where: { siteId, status: "ACCEPTED", holder: { stockG: { gt: 0 } } },
      orderBy: [{ receivedAt: "asc" }, { id: "asc" }],
      select: { id: true, code: true, material: true, receivedAt: true, holder: { select: { stockG: true } } },
    }),
    db.tank.findMany({
      where: { siteId, service: "FEEDSTOCK", holder: { stockG: { gt: 0 } } },
      orderBy: { code: "asc" },
      select: { code: true, name: true, holderId: true, holder: { select: { stockG: true } } },
    }),
  ]);
  const tankShares = tankRows.length === 0 ? new Map() : tankEntryShares(await loadTraceLedger(db, siteId), tankRows);
  const [pickups, lots] = await Promise.all([
    db.pickup.findMany({ where: { siteId, lotId: { not: null } }, select: { holderId: true, lotId: true } }),
    db.feedstockLot.findMany({ where: { siteId }, select: { id: true, holderId: true, code: true, receivedAt: true } }),
  ]);
  const lotOfHolder = lotsByEntryHolder(lots, pickups);
  const results = await getLabResults(
    db,
    lotsNeeded(
      lotRows.map((l) => l.id),
      tankShares,
      lotOfHolder,
    ),
  );
  return composePlanStock({
    lots: lotRows.map((l) => ({ ...l, stockG: l.holder.stockG })),
    tanks: tankRows.map((t) => ({ code: t.code, name: t.name, stockG: t.holder.stockG })),
    tankShares,
    lotOfHolder,
    results,
  });
}

export async function listReagentStock(db: Db, siteId: number): Promise<ReagentStock[]> {
  const rows = await db.reagentLot.findMany({
    where: { siteId, holder: { stockG: { gt: 0 } } },
    orderBy: [{ receivedAt: "asc" }, { id: "asc" }],
    select: { code: true, reagent: true, strengthPct: true, receivedAt: true, holder: { select: { stockG: true } } },
  });
  return rows.map((r) => ({
    code: r.code,
    reagent: r.reagent,
    strengthPct: r.strengthPct,
    receivedAt: r.receivedAt,
    stockG: r.holder.stockG,
  }));
}

export interface OutputPlace {
  kind: "WASTE_CONTAINER" | "TANK";
  code: string;
  /** Waste stream or tank service. */
  use: string;
}

/** Where a batch's outputs can go: open waste containers and the tanks. */
export async function listOutputPlaces(db: Db, siteId: number): Promise<OutputPlace[]> {
  const [waste, tanks] = await Promise.all([
    db.wasteContainer.findMany({
      where: { siteId, status: "OPEN" },
      orderBy: { code: "asc" },
      select: { code: true, stream: true },
    }),
    db.tank.findMany({ where: { siteId }, orderBy: { code: "asc" }, select: { code: true, service: true } }),
  ]);
  return [
    ...waste.map((w) => ({ kind: "WASTE_CONTAINER" as const, code: w.code, use: w.stream })),
    ...tanks.map((t) => ({ kind: "TANK" as const, code: t.code, use: t.service })),
  ];
}
