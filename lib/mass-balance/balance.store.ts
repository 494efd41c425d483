import "server-only";
import type { Db } from "@/lib/core/connect";
import { invariant } from "@/lib/core/result";
import { MOVE_ROLES } from "@/lib/core/vocabulary";
import type { MoveRole } from "@/lib/core/vocabulary";
import { findReversedPairs, toHolderKind } from "@/lib/ledger/movement.store";
import type { BalanceHolder, GaugeReading } from "@/lib/mass-balance/period-balance";
import type {
  AccountingPeriodView,
  BalanceHolderRef,
  BalanceLedger,
  PeriodEventView,
} from "@/lib/mass-balance/balance-types";

export type {
  AccountingPeriodView,
  BalanceHolderRef,
  BalanceLedger,
  PeriodEventView,
} from "@/lib/mass-balance/balance-types";

/**
 * The material a holder carries, for a balance per material kind: feedstock lots and pickups by their
 * material, reagent lots by reagent, waste containers by stream, tanks by service (a feedstock tank
 * pools several kinds), product lots and product tanks as methyl ester, batches as material in reaction.
 */
export const TANK_MATERIAL: Readonly<Record<string, string>> = {
  FEEDSTOCK: "MIXED_FEEDSTOCK",
  PRODUCT: "FAME",
  METHANOL: "METHANOL",
  GLYCEROL_PHASE: "GLYCEROL_PHASE",
  WASH_WATER: "WASH_WATER",
};

const ROLE_SET: ReadonlySet<string> = new Set(MOVE_ROLES);

/** The rows that describe holders: their kind and code, and the material each carries. */
export interface HolderParts {
  holders: Array<{ id: number; kind: string; code: string }>;
  pickups: Array<{ holderId: number; material: string }>;
  lots: Array<{ holderId: number; material: string; origin: string }>;
  tanks: Array<{ holderId: number; service: string }>;
  reagents: Array<{ holderId: number; reagent: string }>;
  batches: Array<{ holderId: number; completedAt: Date | null }>;
  waste: Array<{ holderId: number; stream: string }>;
}

export interface MoveRow {
  id: number;
  at: number;
  fromHolderId: number | null;
  toHolderId: number;
  massG: number;
  role: string;
  reversesId: number | null;
}

/**
 * The ledger as the balance reads it from holder and movement rows: holders with their material kind
 * and batch completion, in id order; movements less reversed pairs, receiving differences marked.
 */
export function toBalanceLedger(siteId: number, p: HolderParts, rows: readonly MoveRow[]): BalanceLedger {
  const paired = findReversedPairs(rows);
  const material = new Map<number, string>();
  for (const r of p.pickups) material.set(r.holderId, r.material);
  for (const l of p.lots) material.set(l.holderId, l.material);
  for (const t of p.tanks) material.set(t.holderId, TANK_MATERIAL[t.service] ?? t.service);
  for (const r of p.reagents) material.set(r.holderId, r.reagent);
  for (const w of p.waste) material.set(w.holderId, w.stream);
  const completed = new Map(p.batches.map((b) => [b.holderId, b.completedAt]));
  // Receiving differences (lib/feedstock/lot.service.ts): a shortfall is a loss out of a lot, a surplus a
  // receipt into a lot pooled from pickups (a delivery's receipt is the delivery itself).
  const lotHolders = new Set(p.lots.map((l) => l.holderId));
  const pooledLots = new Set(p.lots.filter((l) => l.origin !== "DELIVERY").map((l) => l.holderId));
  const isReceivingDifference = (m: MoveRow): boolean =>
    (m.role === "LOSS" && m.fromHolderId !== null && lotHolders.has(m.fromHolderId)) ||
    (m.role === "RECEIPT" && m.fromHolderId === null && pooledLots.has(m.toHolderId));
  const refs = new Map<number, BalanceHolderRef>();
  const list: BalanceHolder[] = [...p.holders]
    .sort((a, b) => a.id - b.id)
    .map((h) => {
      const kind = toHolderKind(h.kind);
      const materialKind =
        kind === "BATCH" ? "IN_REACTION" : kind === "PRODUCT_LOT" ? "FAME" : (material.get(h.id) ?? null);
      refs.set(h.id, { id: h.id, kind, code: h.code, materialKind });
      const done = completed.get(h.id);
      return {
        id: h.id,
        kind,
        siteId,
        materialKind,
        ...(kind === "BATCH" ? { completedAt: done ? done.getTime() : null } : {}),
      };
    });
  const moves = rows
    .filter((m) => !paired.has(m.id))
    .map((m) => {
      invariant(ROLE_SET.has(m.role), `unknown movement role ${m.role} in the database`);
      return {
        id: m.id,
        at: m.at,
        fromHolderId: m.fromHolderId,
        toHolderId: m.toHolderId,
        massG: m.massG,
        role: m.role as MoveRole,
        ...(isReceivingDifference(m) ? { receiving: true } : {}),
      };
    });
  return { holders: list, moves, refs };
}

/** The site's whole ledger: every holder and every movement (reversed pairs left out). */
export async function loadBalanceLedger(db: Db, siteId: number): Promise<BalanceLedger> {
  const [holders, pickups, lots, tanks, reagents, batches, waste, moves] = await Promise.all([
    db.holder.findMany({ where: { siteId }, select: { id: true, kind: true, code: true } }),
    db.pickup.findMany({ where: { siteId }, select: { holderId: true, material: true } }),
    db.feedstockLot.findMany({ where: { siteId }, select: { holderId: true, material: true, origin: true } }),
    db.tank.findMany({ where: { siteId }, select: { holderId: true, service: true } }),
    db.reagentLot.findMany({ where: { siteId }, select: { holderId: true, reagent: true } }),
    db.batch.findMany({ where: { siteId }, select: { holderId: true, completedAt: true } }),
    db.wasteContainer.findMany({ where: { siteId }, select: { holderId: true, stream: true } }),
    db.movement.findMany({
      where: { siteId },
      select: { id: true, at: true, fromHolderId: true, toHolderId: true, massG: true, role: true, reversesId: true },
    }),
  ]);
  const rows = moves.map((m) => ({ ...m, at: m.at.getTime() }));
  return toBalanceLedger(siteId, { holders, pickups, lots, tanks, reagents, batches, waste }, rows);
}

/** The latest gauge reading of each tank at or before `atOrBefore`. */
export async function listLatestGauges(db: Db, siteId: number, atOrBefore: Date): Promise<GaugeReading[]> {
  const tanks = await db.tank.findMany({
    where: { siteId },
    select: {
      holderId: true,
      gauges: {
        where: { at: { lte: atOrBefore } },
        orderBy: [{ at: "desc" }, { id: "desc" }],
        take: 1,
        select: { at: true, massG: true },
      },
    },
  });
  return tanks.flatMap((t) => {
    const g = t.gauges[0];
    return g ? [{ holderId: t.holderId, at: g.at.getTime(), massG: g.massG }] : [];
  });
}

/** The accounting period with exactly these bounds, if the site keeps one. */
export async function getAccountingPeriodExact(
  db: Db,
  siteId: number,
  startsAt: Date,
  endsAt: Date,
): Promise<AccountingPeriodView | null> {
  const p = await db.accountingPeriod.findFirst({
    where: { siteId, startsAt, endsAt },
    include: { closedBy: { select: { fullName: true } } },
  });
  return p
    ? {
        id: p.id,
        startsAt: p.startsAt,
        endsAt: p.endsAt,
        status: p.status,
        closedAt: p.closedAt,
        closedBy: p.closedBy?.fullName ?? null,
      }
    : null;
}

/** Closes and reopens, newest first; one period's or the whole site's. */
export async function listPeriodEvents(
  db: Db,
  siteId: number,
  opts: { periodId?: number; take?: number } = {},
): Promise<PeriodEventView[]> {
  const rows = await db.periodEvent.findMany({
    where: { period: { siteId }, ...(opts.periodId === undefined ? {} : { periodId: opts.periodId }) },
    orderBy: [{ at: "desc" }, { id: "desc" }],
    take: opts.take ?? 200,
    include: { by: { select: { fullName: true } }, period: { select: { startsAt: true, endsAt: true } } },
  });
  return rows.map((r) => ({
    id: r.id,
    periodId: r.periodId,
    periodStartsAt: r.period.startsAt,
    periodEndsAt: r.period.endsAt,
    action: r.action,
    reason: r.reason,
    by: r.by.fullName,
    at: r.at,
  }));
}
