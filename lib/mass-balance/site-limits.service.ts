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
import {
  closureSharesOfJson,
  getSavedClosureShares,
  getSavedSiteLimits,
  insertSiteLimit,
  listSiteLimitHistory,
} from "@/lib/mass-balance/site-limits.store";
import { DEFAULT_CLOSURE_TOLERANCE } from "@/lib/mass-balance/balance-rules";
import type { LimitHistoryRow } from "@/lib/mass-balance/site-limits.store";
import type { ClosureLimit, WaterLimit } from "@/lib/mass-balance/site-limits.schema";

/** The closure tolerance and water limits the site works to now (its newest saved values, else the defaults). */
export async function getSiteLimits(db: Db | Tx, siteId: number): Promise<SiteLimits> {
  return resolveSiteLimits(await getSavedSiteLimits(db, siteId));
}

type ClosureShares = { warnPct: number; failPct: number };

function sharesOrDefault(saved: ClosureShares | null): ClosureShares {
  return saved ?? { warnPct: DEFAULT_CLOSURE_TOLERANCE.warnPct, failPct: DEFAULT_CLOSURE_TOLERANCE.failPct };
}

/** The warn and fail shares of the closure tolerance in force (getSiteLimits(...).closure's), in one read. */
export async function getClosureShares(db: Db | Tx, siteId: number): Promise<ClosureShares> {
  return sharesOrDefault(await getSavedClosureShares(db, siteId));
}

/** getClosureShares from the newest saved closure tolerance's value as stored (null: none saved), read elsewhere. */
export function closureSharesOf(savedJson: string | null): ClosureShares {
  return sharesOrDefault(closureSharesOfJson(savedJson));
}

export async function getSiteLimitHistory(db: Db, siteId: number): Promise<LimitHistoryRow[]> {
  return listSiteLimitHistory(db, siteId);
}

/** Saves one new version of a limit and audits it with what it replaced, in one transaction. */
function saveLimitVersion<T extends ClosureLimit | WaterLimit>(
  db: Db,
  actor: Actor,
  key: typeof CLOSURE_TOLERANCE_KEY | typeof WATER_LIMITS_KEY,
  value: T,
  audit: { entityKey: string; before: (limits: SiteLimits) => Record<string, unknown>; after: Record<string, unknown> },
): Promise<Result<{ id: number }>> {
  return runInTransaction(db, async (tx) => {
    const before = audit.before(await getSiteLimits(tx, actor.siteId));
    const id = await insertSiteLimit(tx, {
      siteId: actor.siteId,
      key,
      value,
      createdById: actor.userId,
      createdAt: actor.now,
    });
    await appendAudit(tx, actor, {
      action: "CHANGE",
      entity: "SiteLimits",
      entityKey: audit.entityKey,
      before,
      after: { ...audit.after, id },
      reason: value.reason,
    });
    return { id };
  });
}

/** Records a new closure tolerance with its reason, audited; earlier versions stay on record. */
export async function setClosureTolerance(db: Db, actor: Actor, input: unknown): Promise<Result<{ id: number }>> {
  const parsed = parseInput(ClosureLimitSchema, input);
  if (!parsed.ok) return parsed;
  const value = parsed.value;
  return saveLimitVersion(db, actor, CLOSURE_TOLERANCE_KEY, value, {
    entityKey: "closure tolerance",
    before: (l) => ({ warnPct: l.closure.warnPct, failPct: l.closure.failPct }),
    after: { warnPct: value.warnPct, failPct: value.failPct },
  });
}

/** Records new water limits for the base-catalysed and acid steps with a reason, audited. */
export async function setWaterLimits(db: Db, actor: Actor, input: unknown): Promise<Result<{ id: number }>> {
  const parsed = parseInput(WaterLimitSchema, input);
  if (!parsed.ok) return parsed;
  const value = parsed.value;
  return saveLimitVersion(db, actor, WATER_LIMITS_KEY, value, {
    entityKey: "water limits",
    before: (l) => ({ baseStepPct: l.water.BASE_STEP.value, acidStepPct: l.water.ACID_STEP.value }),
    after: { baseStepPct: value.baseStepPct, acidStepPct: value.acidStepPct },
  });
}
