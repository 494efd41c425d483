// Batch planning from the plant's stock: which lots and tanks to draw (blend optimiser), then the
// recipe for that blend (direct base step, or acid pretreatment and base step), as a printable card.
// Pure: stock, reagents and the clock come in as arguments.
import type { DomainIssue } from "@/lib/core/result";
import { parseInput } from "@/lib/ledger/parse";
import { diagnoseBlend, optimiseBlend } from "@/lib/blend/optimise";
import type { BlendDiagnosis, BlendPlan } from "@/lib/blend/optimise";
import { PretreatmentInputSchema } from "@/lib/recipe/recipe.schema";
import type { PretreatmentInput } from "@/lib/recipe/recipe.schema";
import { planPretreatment } from "@/lib/recipe/pretreatment";
import { WATER_LIMIT_BY_STEP } from "@/lib/recipe/recipe-defaults";
import type { WaterLimits } from "@/lib/recipe/recipe-defaults";
import type { PretreatmentPlan } from "@/lib/recipe/pretreatment";
import type { BatchPlanRequest } from "@/lib/batch/plan-request";
import { buildCandidates, toBlendRequest } from "@/lib/batch/plan-candidates";
import type { PlanCandidate, PlanStock, ReagentStock } from "@/lib/batch/plan-candidates";
import { pickAssay, renameFields, toPretreatmentInput } from "@/lib/batch/plan-inputs";
import type { CatalystAssay } from "@/lib/batch/plan-inputs";
import { CARD_FORMAT, composeCard } from "@/lib/batch/plan-card";
import type { RecipeCard } from "@/lib/batch/plan-card";
export * from "@/lib/batch/plan-request";
export * from "@/lib/batch/plan-candidates";
export * from "@/lib/batch/plan-inputs";
export * from "@/lib/batch/plan-cautions";
export * from "@/lib/batch/plan-card";
export * from "@/lib/batch/plan-figures";
export * from "@/lib/batch/plan-actuals";

/** What is stored with a planned batch: the recipe core's input (to recompute) and the card as printed. */
export interface StoredRecipe {
  format: typeof CARD_FORMAT;
  inputs: PretreatmentInput;
  card: RecipeCard;
}

export type PlanOutcome =
  | { ok: true; blend: BlendPlan; plan: PretreatmentPlan; card: RecipeCard; stored: StoredRecipe }
  | { ok: false; stage: "CANDIDATES" | "BLEND" | "RECIPE"; issues: DomainIssue[]; diagnosis: BlendDiagnosis | null };

export interface PlanProposal {
  request: BatchPlanRequest;
  candidates: PlanCandidate[];
  assay: CatalystAssay | null;
  acidAssay: CatalystAssay | null;
  outcome: PlanOutcome;
}

/** Candidates → blend (HiGHS) → route and recipe → card. A blend that cannot be made says which limit fails and by how much. */
export async function draftBatchPlan(
  request: BatchPlanRequest,
  stock: PlanStock,
  reagents: readonly ReagentStock[],
  now: Date,
  water: WaterLimits = WATER_LIMIT_BY_STEP,
): Promise<PlanProposal> {
  const candidates = buildCandidates(stock, request, now);
  const assay = pickAssay(request.catalyst, request.assayPct, reagents);
  const acidAssay = pickAssay("H2SO4", request.acidPurityPct, reagents);
  const done = (outcome: PlanOutcome): PlanProposal => ({ request, candidates, assay, acidAssay, outcome });
  const blendRequest = toBlendRequest(request, candidates, water);
  if (blendRequest.candidates.length === 0) {
    return done({
      ok: false,
      stage: "CANDIDATES",
      diagnosis: null,
      issues: [
        {
          code: "PLAN.NO_CANDIDATES",
          message: "No accepted lot or feedstock tank with stock and lab results is available to blend.",
          field: "targetOilKg",
        },
      ],
    });
  }
  const blend = await optimiseBlend(blendRequest);
  if (!blend.ok) {
    const diagnosis = await diagnoseBlend(blendRequest);
    return done({ ok: false, stage: "BLEND", issues: renameFields(blend.issues), diagnosis });
  }
  const inputs = toPretreatmentInput(request, blend.value.draws, candidates, assay, acidAssay);
  const parsed = parseInput(PretreatmentInputSchema, inputs);
  if (!parsed.ok) return done({ ok: false, stage: "RECIPE", issues: renameFields(parsed.issues), diagnosis: null });
  const plan = planPretreatment(
    parsed.value,
    { acidStepMaxWaterPct: water.ACID_STEP },
    { maxWaterPct: water.BASE_STEP },
  );
  if (!plan.ok) return done({ ok: false, stage: "RECIPE", issues: renameFields(plan.issues), diagnosis: null });
  const card = composeCard({ request, blend: blend.value, candidates, plan: plan.value, assay, acidAssay, water });
  return done({
    ok: true,
    blend: blend.value,
    plan: plan.value,
    card,
    stored: { format: CARD_FORMAT, inputs: parsed.value, card },
  });
}
