// A planned batch's figures read back from its stored recipe (current and older stored forms). Pure.
import { z } from "zod";
import { ok } from "@/lib/core/result";
import type { Result } from "@/lib/core/result";
import { CATALYSTS } from "@/lib/core/vocabulary";
import type { Catalyst } from "@/lib/core/vocabulary";
import { defineSourced } from "@/lib/chemistry/sourced-value";
import { PretreatmentInputSchema } from "@/lib/recipe/recipe.schema";
import { planPretreatment } from "@/lib/recipe/pretreatment";
import type { PretreatmentPlan } from "@/lib/recipe/pretreatment";
import { planRecipe } from "@/lib/recipe/recipe";
import type { RecipePlan } from "@/lib/recipe/recipe";
import { parseCandidateRef } from "@/lib/batch/plan-candidates";
import type { CandidateKind } from "@/lib/batch/plan-candidates";
import { CARD_FORMAT } from "@/lib/batch/plan-card";

// ---- after the batch: charges, outputs and yield ---------------------------------------------------

const StoredInputsSchema = z.object({ format: z.literal(CARD_FORMAT), inputs: PretreatmentInputSchema });

/** Recipes recorded before cards were stored (the demo's batches): the plan's headline figures only. */
const LegacyRecipeSchema = z.object({
  blendFfaPct: z.number().min(0).max(100),
  methanolKg: z.number().min(0),
  catalystKg: z.number().min(0),
  acidKg: z.number().min(0).default(0),
  pretreatMethanolKg: z.number().min(0).default(0),
  washWaterKg: z.number().min(0).default(0),
});

const FORCE_ACID_ROUTE = defineSourced(0, "% FFA", "batch recorded as pretreated", "computed");

export interface BatchFacts {
  recipeJson: string;
  pretreated: boolean;
  targetOilG: number;
  molarRatio: number;
  /** As stored; a value outside the catalyst list means no plan can be rebuilt. */
  catalyst: string;
  reactionTempC: number;
}

function toCatalyst(value: string): Catalyst | null {
  return (CATALYSTS as readonly string[]).includes(value) ? (value as Catalyst) : null;
}

/** The figures an actual batch is compared with: what to charge and what should come out. */
export interface PlannedFigures {
  basis: "card" | "legacy";
  /** Oil (feed) the plan is for, kg. */
  oilKg: number;
  /** Methanol to add over both steps, kg. */
  methanolKg: number;
  catalyst: Catalyst;
  catalystProductKg: number;
  acidProductKg: number;
  washWaterKg: number;
  expectedEsterKg: number;
  expectedGlycerolKg: number;
  /** Oil draws (card basis only). */
  draws: Array<{ kind: CandidateKind; code: string; massG: number }>;
  /** A plan in the recipe core's shape whose oil mass, ester, glycerol, catalyst and methanol are the figures above. */
  yieldPlan: RecipePlan;
  notes: string[];
}

function parseJson(json: string): unknown {
  try {
    return JSON.parse(json);
  } catch {
    return null;
  }
}

function asFeedPlan(
  plan: PretreatmentPlan,
  overrides: { methanolKg?: number; catalystProductKg?: number } = {},
): RecipePlan {
  const base = plan.baseStep;
  const feedKg = plan.acidStep?.feedKg ?? base.oil.massKg;
  const methanolKg = overrides.methanolKg ?? base.methanol.toAddKg + (plan.acidStep?.methanolKg ?? 0);
  return {
    ...base,
    oil: { ...base.oil, massKg: feedKg },
    methanol: { ...base.methanol, toAddKg: methanolKg },
    catalyst: { ...base.catalyst, productKg: overrides.catalystProductKg ?? base.catalyst.productKg },
  };
}

/** Rebuilds the plan a batch was recorded with; null when its stored recipe is in neither known form. */
export function readPlannedFigures(batch: BatchFacts): PlannedFigures | null {
  const catalyst = toCatalyst(batch.catalyst);
  if (catalyst === null) return null;
  const raw = parseJson(batch.recipeJson);
  const card = StoredInputsSchema.safeParse(raw);
  if (card.success) {
    const plan = planPretreatment(card.data.inputs);
    if (!plan.ok) return null;
    const p = plan.value;
    const yieldPlan = asFeedPlan(p);
    return {
      basis: "card",
      oilKg: yieldPlan.oil.massKg,
      methanolKg: yieldPlan.methanol.toAddKg,
      catalyst,
      catalystProductKg: p.baseStep.catalyst.productKg,
      acidProductKg: p.acidStep?.acidProductKg ?? 0,
      washWaterKg: p.baseStep.washWater.totalKg,
      expectedEsterKg: p.baseStep.products.fameKg,
      expectedGlycerolKg: p.baseStep.products.glycerolKg,
      draws: card.data.inputs.lots.flatMap((l) => {
        const ref = parseCandidateRef(l.lotRef);
        return ref === null ? [] : [{ ...ref, massG: Math.round(l.massKg * 1000) }];
      }),
      yieldPlan,
      notes: [],
    };
  }
  const legacy = LegacyRecipeSchema.safeParse(raw);
  if (!legacy.success) return null;
  const l = legacy.data;
  const lots = [{ lotRef: "batch", massKg: batch.targetOilG / 1000, ffaPct: l.blendFfaPct, waterPct: 0 }];
  const settings = { catalyst, molarRatio: batch.molarRatio, reactionTempC: batch.reactionTempC };
  let plan: Result<PretreatmentPlan>;
  if (batch.pretreated) {
    // The stored batch says it was pretreated: force the acid route whatever its FFA.
    plan = planPretreatment(
      { lots, settings },
      { directBaseMaxFfaPct: FORCE_ACID_ROUTE, baseCatalysisMaxFfaPct: FORCE_ACID_ROUTE },
    );
  } else {
    const base = planRecipe({ lots, settings });
    plan = base.ok
      ? ok({
          decision: {
            route: "DIRECT_BASE",
            ffaPct: l.blendFfaPct,
            directBaseMaxFfaPct: 0,
            baseCatalysisMaxFfaPct: 0,
            reason: "batch recorded without pretreatment",
          },
          acidStep: null,
          baseStep: base.value,
          warnings: [],
        })
      : base;
  }
  if (!plan.ok) return null;
  const methanolKg = l.methanolKg + l.pretreatMethanolKg;
  const yieldPlan = asFeedPlan(plan.value, { methanolKg, catalystProductKg: l.catalystKg });
  return {
    basis: "legacy",
    oilKg: yieldPlan.oil.massKg,
    methanolKg,
    catalyst,
    catalystProductKg: l.catalystKg,
    acidProductKg: l.acidKg,
    washWaterKg: l.washWaterKg,
    expectedEsterKg: plan.value.baseStep.products.fameKg,
    expectedGlycerolKg: plan.value.baseStep.products.glycerolKg,
    draws: [],
    yieldPlan,
    notes: [
      `Planned before recipe cards were stored: the theory is rebuilt from the batch's target oil, its recorded blend FFA ${l.blendFfaPct} % (water taken as 0 %) and its settings, with the default oil molar mass; planned methanol and catalyst are the batch's stored figures.`,
    ],
  };
}
