import "server-only";
// Reads that tell whether a closed period's balance can still be what it was: the period is still
// closed since the same moment, and nothing dated before its end was booked since the answer was made.
// Bookings dated inside the closed period are refused, but an earlier period left open can still take
// a back-dated movement or gauge, which would change this period's opening stock or gauge comparison.
import type { Db } from "@/lib/core/connect";
import type { LedgerPosition } from "@/lib/ledger/position";
import { CLOSURE_TOLERANCE_KEY } from "@/lib/mass-balance/site-limits.schema";
import { isLockTimeout } from "@/lib/mass-balance/balance-window.store";

export interface BalanceSeal {
  periodId: number;
  closedAtMs: number;
  endsAt: Date;
  /** The last movement and gauge ids of the site when the answer was computed. */
  moveId: number;
  gaugeId: number;
}

export function sealText(s: BalanceSeal): string {
  return JSON.stringify([s.periodId, s.closedAtMs, s.endsAt.getTime(), s.moveId, s.gaugeId]);
}

export async function getLastGaugeId(db: Db, siteId: number): Promise<number> {
  const g = await db.tankGauge.findFirst({
    where: { tank: { siteId } },
    orderBy: { id: "desc" },
    select: { id: true },
  });
  return g?.id ?? 0;
}

/** Whether the sealed answer still holds: three primary-key range reads, none of them over the whole ledger. */
export async function sealHolds(db: Db, siteId: number, s: BalanceSeal): Promise<boolean> {
  const [period, move, gauge] = await Promise.all([
    db.accountingPeriod.findUnique({ where: { id: s.periodId }, select: { status: true, closedAt: true } }),
    db.movement.findFirst({ where: { siteId, id: { gt: s.moveId }, at: { lt: s.endsAt } }, select: { id: true } }),
    db.tankGauge.findFirst({
      where: { tank: { siteId }, id: { gt: s.gaugeId }, at: { lt: s.endsAt } },
      select: { id: true },
    }),
  ]);
  return period?.status === "CLOSED" && period.closedAt?.getTime() === s.closedAtMs && move === null && gauge === null;
}

type KeyRow = { moveId: number | bigint | null; auditSeq: number | bigint | null; closure: string | null };

/**
 * What a kept balance answer is looked up by, in one statement: the ledger position (the site's last
 * movement id and audit sequence, as getLedgerPosition reads them) and the newest saved closure
 * tolerance's value as stored (as getNewestSiteSettingValue orders them), or null when none is saved.
 */
export async function readBalanceKeyParts(
  db: Db,
  siteId: number,
): Promise<{ position: LedgerPosition; closureJson: string | null }> {
  // Asked on every request: kept prepared on PostgreSQL (PREPARED_MARK), where planning it cost more than running it.
  const rows = await db.$queryRaw<KeyRow[]>`/* prepared */ SELECT
    (SELECT max(id) FROM "Movement" WHERE "siteId" = ${siteId}) AS "moveId",
    (SELECT seq FROM "AuditHead" WHERE "siteId" = ${siteId}) AS "auditSeq",
    (SELECT "valueJson" FROM "SiteSetting" WHERE "siteId" = ${siteId} AND key = ${CLOSURE_TOLERANCE_KEY}
      ORDER BY "createdAt" DESC, id DESC LIMIT 1) AS closure`;
  const row = rows[0];
  return {
    position: { siteId, moveId: Number(row?.moveId ?? 0), auditSeq: Number(row?.auditSeq ?? 0) },
    closureJson: row?.closure ?? null,
  };
}

type MarkRow = { moveId: number | bigint | null; gaugeId: number | bigint | null };

/**
 * PostgreSQL only: the site's last movement and gauge ids, read while none of either can be half-booked
 * (as readSettledLastMovement, decision 0048, with "TankGauge" locked as well), or null when the lock
 * could not be had within `waitMs`. Every id up to these has committed, so a balance computed after this
 * read has seen every movement and gauge up to them, and any it has not seen has a higher id.
 */
export async function readSettledSealMarks(
  db: Db,
  siteId: number,
  waitMs: number,
): Promise<{ moveId: number; gaugeId: number } | null> {
  try {
    const [, , rows] = await db.$transaction([
      db.$executeRawUnsafe(`SET LOCAL lock_timeout = '${Math.max(1, Math.round(waitMs))}ms'`),
      db.$executeRawUnsafe('LOCK TABLE "Movement", "TankGauge" IN SHARE MODE'),
      db.$queryRaw<MarkRow[]>`SELECT
        (SELECT max(id) FROM "Movement" WHERE "siteId" = ${siteId}) AS "moveId",
        (SELECT max(g.id) FROM "TankGauge" g JOIN "Tank" t ON t.id = g."tankId" WHERE t."siteId" = ${siteId}) AS "gaugeId"`,
    ]);
    const row = rows[0];
    return { moveId: Number(row?.moveId ?? 0), gaugeId: Number(row?.gaugeId ?? 0) };
  } catch (error) {
    if (isLockTimeout(error)) return null;
    throw error;
  }
}
