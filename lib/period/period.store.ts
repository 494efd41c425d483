import "server-only";
import type { Db, Tx } from "@/lib/core/connect";

export interface PeriodRow {
  id: number;
  startsAt: Date;
  /** Exclusive: the period is [startsAt, endsAt). */
  endsAt: Date;
  status: string;
  closedAt: Date | null;
  closedBy: string | null;
  /** The latest close or reopen: what the period's state says now, with who and when. */
  lastEvent: { action: string; at: Date; by: string; reason: string } | null;
  movements: number;
}

export async function listPeriods(db: Db, siteId: number): Promise<PeriodRow[]> {
  const rows = await db.accountingPeriod.findMany({
    where: { siteId },
    orderBy: { startsAt: "desc" },
    include: {
      closedBy: { select: { fullName: true } },
      events: { orderBy: [{ at: "desc" }, { id: "desc" }], take: 1, include: { by: { select: { fullName: true } } } },
    },
  });
  const counts = await Promise.all(
    rows.map((r) => db.movement.count({ where: { siteId, at: { gte: r.startsAt, lt: r.endsAt } } })),
  );
  return rows.map((r, i) => ({
    id: r.id,
    startsAt: r.startsAt,
    endsAt: r.endsAt,
    status: r.status,
    closedAt: r.closedAt,
    closedBy: r.closedBy?.fullName ?? null,
    lastEvent: r.events[0]
      ? { action: r.events[0].action, at: r.events[0].at, by: r.events[0].by.fullName, reason: r.events[0].reason }
      : null,
    movements: counts[i] ?? 0,
  }));
}

/** The period whose half-open range [startsAt, endsAt) contains `at`, or null. */
export async function getPeriodAt(
  db: Db,
  siteId: number,
  at: Date,
): Promise<Omit<PeriodRow, "movements" | "lastEvent"> | null> {
  const r = await db.accountingPeriod.findFirst({
    where: { siteId, startsAt: { lte: at }, endsAt: { gt: at } },
    include: { closedBy: { select: { fullName: true } } },
  });
  if (!r) return null;
  return {
    id: r.id,
    startsAt: r.startsAt,
    endsAt: r.endsAt,
    status: r.status,
    closedAt: r.closedAt,
    closedBy: r.closedBy?.fullName ?? null,
  };
}

// ---- writes used by lib/period/period.service.ts

export async function findOverlappingPeriod(
  tx: Tx,
  siteId: number,
  startsAt: Date,
  endsAt: Date,
): Promise<{ id: number } | null> {
  return tx.accountingPeriod.findFirst({
    where: { siteId, startsAt: { lt: endsAt }, endsAt: { gt: startsAt } },
    select: { id: true },
  });
}

export async function insertPeriod(
  tx: Tx,
  p: { siteId: number; startsAt: Date; endsAt: Date },
): Promise<{ id: number }> {
  return tx.accountingPeriod.create({ data: { ...p, status: "OPEN" }, select: { id: true } });
}

export async function getPeriodState(
  tx: Tx,
  siteId: number,
  id: number,
): Promise<{ id: number; status: string; endsAt: Date } | null> {
  return tx.accountingPeriod.findFirst({ where: { id, siteId }, select: { id: true, status: true, endsAt: true } });
}

/** Changes a period's status and records the event (who, when, why) in the same transaction. */
export async function setPeriodStatus(
  tx: Tx,
  e: {
    periodId: number;
    status: "OPEN" | "CLOSED";
    action: "CLOSE" | "REOPEN";
    reason: string;
    byId: number;
    at: Date;
  },
): Promise<{ id: number }> {
  await tx.periodEvent.create({
    data: { periodId: e.periodId, action: e.action, reason: e.reason, byId: e.byId, at: e.at },
  });
  const closing = e.status === "CLOSED";
  return tx.accountingPeriod.update({
    where: { id: e.periodId },
    data: { status: e.status, ...(closing ? { closedAt: e.at, closedById: e.byId } : {}) },
    select: { id: true },
  });
}
