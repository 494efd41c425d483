import "server-only";
import type { Db } from "@/lib/core/connect";
import { getLabResults } from "@/lib/feedstock/lab.store";
import type { LotLabResult } from "@/lib/feedstock/lab.store";
import { convertFfaBasis } from "@/lib/titration/titration";

/** The planner blends and compares FFA as oleic (its limits are as oleic); moles are kept (AOCS Ca 5a-40 bases). */
function ffaAsOleic(r: LotLabResult | undefined): number | null {
  return r === undefined || r.ffaPct === null ? null : convertFfaBasis(r.ffaPct, r.ffaBasis, "OLEIC");
}
import { loadTraceLedger } from "@/lib/ledger/movement.store";
import type { TraceLedger } from "@/lib/ledger/movement.store";
import { traceHolder } from "@/lib/trace/genealogy";
import type { HolderTrace } from "@/lib/trace/genealogy";
import { indexLedger } from "@/lib/ledger/moves";
import type { LedgerIndex } from "@/lib/ledger/moves";
import type { Result } from "@/lib/core/result";
import type { LotStock, PlanStock, ReagentStock, TankShare, TankStock } from "@/lib/batch/plan";

type Order = "dated" | "booked";

/** The ledger indexed once per order and reused for every tank (date order, or booking order when dates are inconsistent). */
function makeIndexer(ledger: TraceLedger): (order: Order) => Result<LedgerIndex> {
  const cache = new Map<Order, Result<LedgerIndex>>();
  return (order) => {
    let index = cache.get(order);
    if (index === undefined) {
      index = indexLedger(
        ledger.holders,
        order === "dated" ? ledger.moves : ledger.moves.map((m) => ({ ...m, at: m.id })),
      );
      cache.set(order, index);
    }
    return index;
  };
}

/** What a tank holds now, by origin: its stock composition replayed from the ledger (as the lot pages do). */
function traceStock(
  indexOf: (order: Order) => Result<LedgerIndex>,
  holderId: number,
): { index: LedgerIndex; trace: HolderTrace } | null {
  for (const order of ["dated", "booked"] as const) {
    const index = indexOf(order);
    if (!index.ok) continue;
    const trace = traceHolder(index.value, holderId);
    if (trace.ok) return { index: index.value, trace: trace.value };
  }
  return null;
}

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

  let tankShares = new Map<string, Array<{ lotHolderId: number | null; grams: number }> | null>();
  if (tankRows.length > 0) {
    const indexOf = makeIndexer(await loadTraceLedger(db, siteId));
    tankShares = new Map(
      tankRows.map((t) => {
        const traced = traceStock(indexOf, t.holderId);
        if (traced === null) return [t.code, null];
        const byHolder = new Map<number | null, number>();
        for (const o of traced.trace.stock.origins) {
          const pos = traced.index.positionOf.get(o.originId);
          const entry = pos === undefined ? undefined : traced.index.moves[pos];
          const key = entry?.toHolderId ?? null;
          byHolder.set(key, (byHolder.get(key) ?? 0) + o.grams);
        }
        return [t.code, [...byHolder].map(([lotHolderId, grams]) => ({ lotHolderId, grams }))];
      }),
    );
  }

  // Entry holders are pickups (linked to their lot) or the lot itself (deliveries, receiving differences).
  const [pickups, lots] = await Promise.all([
    db.pickup.findMany({ where: { siteId, lotId: { not: null } }, select: { holderId: true, lotId: true } }),
    db.feedstockLot.findMany({ where: { siteId }, select: { id: true, holderId: true, code: true, receivedAt: true } }),
  ]);
  const lotById = new Map(lots.map((l) => [l.id, l]));
  const lotOfHolder = new Map<number, { id: number; code: string; receivedAt: Date }>();
  for (const l of lots) lotOfHolder.set(l.holderId, l);
  for (const p of pickups) {
    const l = p.lotId === null ? undefined : lotById.get(p.lotId);
    if (l) lotOfHolder.set(p.holderId, l);
  }
  const neededLotIds = new Set<number>(lotRows.map((l) => l.id));
  for (const shares of tankShares.values()) {
    for (const s of shares ?? []) {
      const l = s.lotHolderId === null ? undefined : lotOfHolder.get(s.lotHolderId);
      if (l) neededLotIds.add(l.id);
    }
  }
  const results = await getLabResults(db, [...neededLotIds]);

  const lotStock: LotStock[] = lotRows.map((l) => ({
    code: l.code,
    material: l.material,
    receivedAt: l.receivedAt,
    stockG: l.holder.stockG,
    ffaPct: ffaAsOleic(results.get(l.id)),
    waterPct: results.get(l.id)?.waterPct ?? null,
  }));
  const tanks: TankStock[] = tankRows.map((t) => {
    const shares = tankShares.get(t.code) ?? null;
    const byLot = new Map<string, TankShare>();
    for (const s of shares ?? []) {
      const l = s.lotHolderId === null ? undefined : lotOfHolder.get(s.lotHolderId);
      const key = l ? l.code : "";
      const r = l ? results.get(l.id) : undefined;
      const share = byLot.get(key) ?? {
        lotCode: l?.code ?? null,
        grams: 0,
        ffaPct: ffaAsOleic(r),
        waterPct: r?.waterPct ?? null,
        receivedAt: l?.receivedAt ?? null,
      };
      share.grams += s.grams;
      byLot.set(key, share);
    }
    return {
      code: t.code,
      name: t.name,
      stockG: t.holder.stockG,
      contents:
        shares === null
          ? null
          : [...byLot.values()].sort((a, b) => b.grams - a.grams || (a.lotCode ?? "").localeCompare(b.lotCode ?? "")),
    };
  });
  return { lots: lotStock, tanks };
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
