import "server-only";
import { appendAudit } from "@/lib/audit/audit.store";
import type { Db, Tx } from "@/lib/core/connect";
import type { Actor } from "@/lib/core/actor";
import type { Result } from "@/lib/core/result";
import { parseInput } from "@/lib/ledger/parse";
import { runInTransaction } from "@/lib/ledger/transaction.store";
import { resolveSiteLimits } from "@/lib/mass-balance/site-limits";
import type { SiteLimits } from "@/lib/mass-balance/site-limits";
import {
  CLOSURE_TOLERANCE_KEY,
  ClosureLimitSchema,
  WATER_LIMITS_KEY,
  WaterLimitSchema,
} from "@/lib/mass-balance/site-limits.schema";
import { getSavedSiteLimits, insertSiteLimit, listSiteLimitHistory } from "@/lib/mass-balance/site-limits.store";
import type { LimitHistoryRow } from "@/lib/mass-balance/site-limits.store";

/** The closure tolerance and water limits the site works to now (its newest saved values, else the defaults). */
export async function getSiteLimits(db: Db | Tx, siteId: number): Promise<SiteLimits> {
  return resolveSiteLimits(await getSavedSiteLimits(db, siteId));
}

export async function getSiteLimitHistory(db: Db, siteId: number): Promise<LimitHistoryRow[]> {
  return listSiteLimitHistory(db, siteId);
}

/** Records a new closure tolerance with its reason, audited; earlier versions stay on record. */
export async function setClosureTolerance(db: Db, actor: Actor, input: unknown): Promise<Result<{ id: number }>> {
  const parsed = parseInput(ClosureLimitSchema, input);
  if (!parsed.ok) return parsed;
  const value = parsed.value;
  return runInTransaction(db, async (tx) => {
    const before = (await getSiteLimits(tx, actor.siteId)).closure;
    const id = await insertSiteLimit(tx, {
      siteId: actor.siteId,
      key: CLOSURE_TOLERANCE_KEY,
      value,
      createdById: actor.userId,
      createdAt: actor.now,
    });
    await appendAudit(tx, actor, {
      action: "CHANGE",
      entity: "SiteLimits",
      entityKey: "closure tolerance",
      before: { warnPct: before.warnPct, failPct: before.failPct },
      after: { warnPct: value.warnPct, failPct: value.failPct, id },
      reason: value.reason,
    });
    return { id };
  });
}

/** Records new water limits for the base-catalysed and acid steps with a reason, audited. */
export async function setWaterLimits(db: Db, actor: Actor, input: unknown): Promise<Result<{ id: number }>> {
  const parsed = parseInput(WaterLimitSchema, input);
  if (!parsed.ok) return parsed;
  const value = parsed.value;
  return runInTransaction(db, async (tx) => {
    const before = (await getSiteLimits(tx, actor.siteId)).water;
    const id = await insertSiteLimit(tx, {
      siteId: actor.siteId,
      key: WATER_LIMITS_KEY,
      value,
      createdById: actor.userId,
      createdAt: actor.now,
    });
    await appendAudit(tx, actor, {
      action: "CHANGE",
      entity: "SiteLimits",
      entityKey: "water limits",
      before: { baseStepPct: before.BASE_STEP.value, acidStepPct: before.ACID_STEP.value },
      after: { baseStepPct: value.baseStepPct, acidStepPct: value.acidStepPct, id },
      reason: value.reason,
    });
    return { id };
  });
}
