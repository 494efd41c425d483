import "server-only";
import { z } from "zod";
import type { Db } from "@/lib/database/connect";
import type { Result } from "@/lib/errors";
import { id } from "@/lib/ledger/fields";
import { parseInput } from "@/lib/ledger/parse";
import { reject, runInTransaction } from "@/lib/ledger/ledger.store";
import { AccountingPeriodSchema } from "@/lib/period/period.schema";
import type { Actor } from "@/lib/site/actor";

export const PeriodCloseSchema = z.object({
  periodId: id("Period"),
  reason: z.string().trim().max(500, "Reason: at most 500 characters").default("period end"),
});
export const PeriodReopenSchema = z.object({
  periodId: id("Period"),
  reason: z.string({ error: "Reason is required to reopen a period" }).trim().min(5, "Reason: say why the period is reopened (at least 5 characters)").max(500, "Reason: at most 500 characters"),
});

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

/** Closing locks every record dated in the period; it is recorded with who, when and why. */
export async function closePeriod(db: Db, actor: Actor, input: unknown): Promise<Result<{ id: number }>> {
  const parsed = parseInput(PeriodCloseSchema, input);
  if (!parsed.ok) return parsed;
  const c = parsed.value;
  return runInTransaction(db, async (tx) => {
    const p = await tx.accountingPeriod.findFirst({ where: { id: c.periodId, siteId: actor.siteId }, select: { id: true, status: true, endsAt: true } });
    if (!p) reject("RECORD.NOT_FOUND", "No such period", "periodId");
    if (p.status === "CLOSED") reject("PERIOD.ALREADY_CLOSED", "The period is already closed", "periodId");
    if (p.endsAt > actor.now) reject("PERIOD.NOT_ENDED", "A period can only be closed after it ends", "periodId");
    await tx.periodEvent.create({ data: { periodId: p.id, action: "CLOSE", reason: c.reason, byId: actor.userId, at: actor.now } });
    return tx.accountingPeriod.update({ where: { id: p.id }, data: { status: "CLOSED", closedAt: actor.now, closedById: actor.userId }, select: { id: true } });
  });
}

/** Reopening needs a reason; the event stays on record beside the close it undoes. */
export async function reopenPeriod(db: Db, actor: Actor, input: unknown): Promise<Result<{ id: number }>> {
  const parsed = parseInput(PeriodReopenSchema, input);
  if (!parsed.ok) return parsed;
  const r = parsed.value;
  return runInTransaction(db, async (tx) => {
    const p = await tx.accountingPeriod.findFirst({ where: { id: r.periodId, siteId: actor.siteId }, select: { id: true, status: true } });
    if (!p) reject("RECORD.NOT_FOUND", "No such period", "periodId");
    if (p.status !== "CLOSED") reject("PERIOD.NOT_CLOSED", "Only a closed period can be reopened", "periodId");
    await tx.periodEvent.create({ data: { periodId: p.id, action: "REOPEN", reason: r.reason, byId: actor.userId, at: actor.now } });
    return tx.accountingPeriod.update({ where: { id: p.id }, data: { status: "OPEN" }, select: { id: true } });
  });
}
