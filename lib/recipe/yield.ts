import { fail, ok } from "@/lib/core/result";
import type { DomainIssue, Result } from "@/lib/core/result";
import { defineSourced } from "@/lib/chemistry/sourced-value";
import type { SourcedValue } from "@/lib/chemistry/sourced-value";
import type { RecipePlan } from "@/lib/recipe/recipe";
import type { BatchActuals } from "@/lib/recipe/recipe.schema";

export interface YieldLimits {
  /** Ester above theory by more than this points to a weighing error or methanol/soap left in the ester. */
  aboveTheoryTolerancePct: SourcedValue;
  /** Catalyst or methanol off plan by more than this is flagged. */
  usageDeviationPct: SourcedValue;
}

export const DEFAULT_YIELD_LIMITS: YieldLimits = {
  aboveTheoryTolerancePct: defineSourced(0.5, "% of theory", "weighing uncertainty allowance", "common practice"),
  usageDeviationPct: defineSourced(
    5,
    "% of plan",
    "dosing deviation worth a note in the batch record",
    "common practice",
  ),
};

export interface UsageComparison {
  plannedKg: number;
  actualKg: number;
  deltaKg: number;
  /** actual / planned; null when nothing was planned. */
  ratio: number | null;
}

export interface BatchYield {
  oilChargedKg: number;
  /** Theoretical ester (100 % conversion) scaled to the oil actually charged. */
  theoreticalEsterKg: number;
  esterKg: number;
  /** esterKg / theoreticalEsterKg. */
  esterYieldVsTheory: number;
  esterPerKgOil: number;
  glycerolPhasePerKgOil: number;
  /** Pure glycerol the plan expects per kg oil, for comparison with the crude phase. */
  theoreticalGlycerolPerKgOil: number;
  catalyst: UsageComparison;
  methanol: UsageComparison;
  warnings: DomainIssue[];
}

function compareUsage(plannedKg: number, actualKg: number): UsageComparison {
  return { plannedKg, actualKg, deltaKg: actualKg - plannedKg, ratio: plannedKg > 0 ? actualKg / plannedKg : null };
}

/**
 * Compares recorded actuals with the plan. Planned catalyst and methanol are scaled to the oil actually
 * charged when it differs from the plan, since both are dosed per kg oil.
 */
export function computeBatchYield(
  plan: RecipePlan,
  actuals: BatchActuals,
  limitOverrides: Partial<YieldLimits> = {},
): Result<BatchYield> {
  const limits = { ...DEFAULT_YIELD_LIMITS, ...limitOverrides };
  const oilChargedKg = actuals.oilChargedKg ?? plan.oil.massKg;
  if (!(oilChargedKg > 0) || !(plan.oil.massKg > 0)) {
    return fail("YIELD.NO_OIL", "Oil charged must be above 0 kg.", "oilChargedKg");
  }
  const scale = oilChargedKg / plan.oil.massKg;
  const theoreticalEsterKg = plan.products.fameKg * scale;
  if (!(theoreticalEsterKg > 0)) {
    return fail("YIELD.NO_THEORY", "The plan expects no ester, so a yield cannot be computed.", "esterKg");
  }
  const esterYieldVsTheory = actuals.esterKg / theoreticalEsterKg;
  const catalyst = compareUsage(plan.catalyst.productKg * scale, actuals.catalystProductUsedKg);
  const methanol = compareUsage(plan.methanol.toAddKg * scale, actuals.methanolAddedKg);

  const warnings: DomainIssue[] = [];
  if (esterYieldVsTheory > 1 + limits.aboveTheoryTolerancePct.value / 100) {
    warnings.push({
      code: "YIELD.ABOVE_THEORY",
      message: `Ester ${actuals.esterKg} kg is ${((esterYieldVsTheory - 1) * 100).toFixed(2)} % above the theoretical ${theoreticalEsterKg.toFixed(2)} kg; check the weighing, or methanol and soap left in the ester.`,
      field: "esterKg",
    });
  }
  const deviation = limits.usageDeviationPct.value / 100;
  for (const [name, usage, field] of [
    ["Catalyst", catalyst, "catalystProductUsedKg"],
    ["Methanol", methanol, "methanolAddedKg"],
  ] as const) {
    if (usage.plannedKg > 0 ? Math.abs(usage.deltaKg) > deviation * usage.plannedKg : usage.actualKg > 0) {
      warnings.push({
        code: "YIELD.USAGE_OFF_PLAN",
        message: `${name} used ${usage.actualKg} kg differs from the planned ${usage.plannedKg.toFixed(3)} kg by more than ${limits.usageDeviationPct.value} %.`,
        field,
      });
    }
  }
  return ok({
    oilChargedKg,
    theoreticalEsterKg,
    esterKg: actuals.esterKg,
    esterYieldVsTheory,
    esterPerKgOil: actuals.esterKg / oilChargedKg,
    glycerolPhasePerKgOil: actuals.glycerolPhaseKg / oilChargedKg,
    theoreticalGlycerolPerKgOil: plan.products.glycerolKg / plan.oil.massKg,
    catalyst,
    methanol,
    warnings,
  });
}
