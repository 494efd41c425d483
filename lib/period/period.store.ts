import "server-only";
import type { Db } from "@/lib/database/connect";

export interface PeriodRow {
  id: number;
  startsAt: Date;
  /** Exclusive: the period is [startsAt, endsAt). */
  endsAt: Date;
  status: string;
  closedAt: Date | null;
  closedBy: string | null;
  movements: number;
}

export async function listPeriods(db: Db, siteId: number): Promise<PeriodRow[]> {
  const rows = await db.accountingPeriod.findMany({
    where: { siteId },
    orderBy: { startsAt: "desc" },
    include: { closedBy: { select: { fullName: true } } },
  });
  const counts = await Promise.all(rows.map((r) => db.movement.count({ where: { siteId, at: { gte: r.startsAt, lt: r.endsAt } } })));
  return rows.map((r, i) => ({
    id: r.id,
    startsAt: r.startsAt,
    endsAt: r.endsAt,
    status: r.status,
    closedAt: r.closedAt,
    closedBy: r.closedBy?.fullName ?? null,
    movements: counts[i] ?? 0,
  }));
}

/** The period whose half-open range [startsAt, endsAt) contains `at`, or null. */
export async function getPeriodAt(db: Db, siteId: number, at: Date): Promise<Omit<PeriodRow, "movements"> | null> {
  const r = await db.accountingPeriod.findFirst({
    where: { siteId, startsAt: { lte: at }, endsAt: { gt: at } },
    include: { closedBy: { select: { fullName: true } } },
  });
  if (!r) return null;
  return { id: r.id, startsAt: r.startsAt, endsAt: r.endsAt, status: r.status, closedAt: r.closedAt, closedBy: r.closedBy?.fullName ?? null };
}
