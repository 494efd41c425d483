import "server-only";
import type { Db } from "@/lib/database/connect";
import type { Result } from "@/lib/errors";
import { parseInput } from "@/lib/ledger/parse";
import { reject, runInTransaction } from "@/lib/ledger/ledger.store";
import { AccountingPeriodSchema } from "@/lib/period/period.schema";
import type { Actor } from "@/lib/site/actor";

export async function openPeriod(db: Db, actor: Actor, input: unknown): Promise<Result<{ id: number }>> {
  const parsed = parseInput(AccountingPeriodSchema, input);
  if (!parsed.ok) return parsed;
  const p = parsed.value;
  return runInTransaction(db, async (tx) => {
    const overlap = await tx.accountingPeriod.findFirst({ where: { siteId: actor.siteId, startsAt: { lt: p.endsAt }, endsAt: { gt: p.startsAt } }, select: { id: true } });
    if (overlap) reject("PERIOD.OVERLAP", "This period overlaps an existing one", "startsAt");
    return tx.accountingPeriod.create({ data: { siteId: actor.siteId, startsAt: p.startsAt, endsAt: p.endsAt, status: "OPEN" }, select: { id: true } });
  });
}

export async function closePeriod(db: Db, actor: Actor, periodId: number): Promise<Result<{ id: number }>> {
  return runInTransaction(db, async (tx) => {
    const p = await tx.accountingPeriod.findFirst({ where: { id: periodId, siteId: actor.siteId }, select: { id: true, status: true, endsAt: true } });
    if (!p) reject("RECORD.NOT_FOUND", "No such period", "periodId");
    if (p.status === "CLOSED") reject("PERIOD.ALREADY_CLOSED", "The period is already closed", "periodId");
    if (p.endsAt > actor.now) reject("PERIOD.NOT_ENDED", "A period can only be closed after it ends", "periodId");
    return tx.accountingPeriod.update({ where: { id: p.id }, data: { status: "CLOSED", closedAt: actor.now, closedById: actor.userId }, select: { id: true } });
  });
}
