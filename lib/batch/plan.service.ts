import "server-only";
import type { Db } from "@/lib/core/connect";
import type { Result } from "@/lib/core/result";
import { failMany, ok } from "@/lib/core/result";
import { parseInput } from "@/lib/ledger/parse";
import { planBatch } from "@/lib/batch/batch.service";
import { BatchPlanRequestSchema, draftBatchPlan } from "@/lib/batch/plan";
import type { PlanProposal, RecipeCard } from "@/lib/batch/plan";
import { listReagentStock, loadPlanStock } from "@/lib/batch/plan.store";
import type { Actor } from "@/lib/core/actor";
import { getSiteLimits } from "@/lib/mass-balance/site-limits.service";

/** Proposes draws and a recipe from the site's stock now; nothing is written. */
export async function proposeBatchPlan(db: Db, actor: Actor, input: unknown): Promise<Result<PlanProposal>> {
  const parsed = parseInput(BatchPlanRequestSchema, input);
  if (!parsed.ok) return parsed;
  const [stock, reagents, limits] = await Promise.all([
    loadPlanStock(db, actor.siteId),
    listReagentStock(db, actor.siteId),
    getSiteLimits(db, actor.siteId),
  ]);
  return ok(await draftBatchPlan(parsed.value, stock, reagents, actor.now, limits.water));
}

export interface RecordedPlan {
  code: string;
  card: RecipeCard;
}

/**
 * Plans a batch and records it as planned, with the recipe card and the proposed draws stored as its
 * recipe. The draws are proposed again from the stock at the time of recording.
 */
export async function recordPlannedBatch(db: Db, actor: Actor, input: unknown): Promise<Result<RecordedPlan>> {
  const parsed = parseInput(BatchPlanRequestSchema, input);
  if (!parsed.ok) return parsed;
  const request = parsed.value;
  if (request.code === undefined)
    return failMany([{ code: "INPUT.INVALID", message: "Batch number is required", field: "code" }]);
  const proposal = await proposeBatchPlan(db, actor, request);
  if (!proposal.ok) return proposal;
  const outcome = proposal.value.outcome;
  if (!outcome.ok) return failMany(outcome.issues);
  const saved = await planBatch(db, actor, {
    code: request.code,
    plannedAt: request.plannedAt ?? actor.now,
    targetOilKg: request.targetOilKg,
    molarRatio: request.molarRatio,
    catalyst: request.catalyst,
    reactionTempC: request.reactionTempC,
    pretreated: outcome.plan.acidStep !== null,
    recipe: { ...outcome.stored, card: { ...outcome.card, code: request.code } },
    notes: request.notes,
  });
  if (!saved.ok) return saved;
  return ok({ code: saved.value.code, card: { ...outcome.card, code: saved.value.code } });
}
