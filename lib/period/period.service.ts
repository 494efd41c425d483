import "server-only";
import { appendAudit } from "@/lib/audit/audit.store";
import { z } from "zod";
import type { Db } from "@/lib/core/connect";
import type { Result } from "@/lib/core/result";
import { id } from "@/lib/core/fields";
import { parseInput } from "@/lib/ledger/parse";
import { reject, runInTransaction } from "@/lib/ledger/transaction.store";
import { AccountingPeriodSchema } from "@/lib/period/period.schema";
import type { Actor } from "@/lib/core/actor";
import { findOverlappingPeriod, getPeriodState, insertPeriod, setPeriodStatus } from "@/lib/period/period.store";

export const PeriodCloseSchema = z.object({
  periodId: id("Period"),
  reason: z.string().trim().max(500, "Reason: at most 500 characters").default("period end"),
});
export const PeriodReopenSchema = z.object({
  periodId: id("Period"),
  reason: z
    .string({ error: "Reason is required to reopen a period" })
    .trim()
    .min(5, "Reason: say why the period is reopened (at least 5 characters)")
    .max(500, "Reason: at most 500 characters"),
});

export async function openPeriod(db: Db, actor: Actor, input: unknown): Promise<Result<{ id: number }>> {
  const parsed = parseInput(AccountingPeriodSchema, input);
  if (!parsed.ok) return parsed;
  const p = parsed.value;
  return runInTransaction(db, async (tx) => {
    if (await findOverlappingPeriod(tx, actor.siteId, p.startsAt, p.endsAt))
      reject("PERIOD.OVERLAP", "This period overlaps an existing one", "startsAt");
    const saved = await insertPeriod(tx, { siteId: actor.siteId, startsAt: p.startsAt, endsAt: p.endsAt });
    await appendAudit(tx, actor, {
      action: "CREATE",
      entity: "AccountingPeriod",
      entityKey: String(saved.id),
      after: p,
    });
    return saved;
  });
}

/** Closing locks every record dated in the period; it is recorded with who, when and why. */
export async function closePeriod(db: Db, actor: Actor, input: unknown): Promise<Result<{ id: number }>> {
  const parsed = parseInput(PeriodCloseSchema, input);
  if (!parsed.ok) return parsed;
  const c = parsed.value;
  return runInTransaction(db, async (tx) => {
    const p = await getPeriodState(tx, actor.siteId, c.periodId);
    if (!p) reject("RECORD.NOT_FOUND", "No such period", "periodId");
    if (p.status === "CLOSED") reject("PERIOD.ALREADY_CLOSED", "The period is already closed", "periodId");
    if (p.endsAt > actor.now) reject("PERIOD.NOT_ENDED", "A period can only be closed after it ends", "periodId");
    await appendAudit(tx, actor, {
      action: "CLOSE",
      entity: "AccountingPeriod",
      entityKey: String(p.id),
      before: { status: p.status },
      after: { status: "CLOSED" },
      reason: c.reason,
    });
    return setPeriodStatus(tx, {
      periodId: p.id,
      status: "CLOSED",
      action: "CLOSE",
      reason: c.reason,
      byId: actor.userId,
      at: actor.now,
    });
  });
}

/** Reopening needs a reason; the event stays on record beside the close it undoes. */
export async function reopenPeriod(db: Db, actor: Actor, input: unknown): Promise<Result<{ id: number }>> {
  const parsed = parseInput(PeriodReopenSchema, input);
  if (!parsed.ok) return parsed;
  const r = parsed.value;
  return runInTransaction(db, async (tx) => {
    const p = await getPeriodState(tx, actor.siteId, r.periodId);
    if (!p) reject("RECORD.NOT_FOUND", "No such period", "periodId");
    if (p.status !== "CLOSED") reject("PERIOD.NOT_CLOSED", "Only a closed period can be reopened", "periodId");
    await appendAudit(tx, actor, {
      action: "REOPEN",
      entity: "AccountingPeriod",
      entityKey: String(p.id),
      before: { status: p.status },
      after: { status: "OPEN" },
      reason: r.reason,
    });
    return setPeriodStatus(tx, {
      periodId: p.id,
      status: "OPEN",
      action: "REOPEN",
      reason: r.reason,
      byId: actor.userId,
      at: actor.now,
    });
  });
}
