import { fail, failMany, ok } from "@/lib/core/result";
import type { DomainIssue, Result } from "@/lib/core/result";
import type { BlendObjective, BlendRequest } from "@/lib/blend/blend.schema";
import type { BlendOptions, Evaluated, Prepared } from "@/lib/blend/blend-model";
import {
  DEFAULT_LIMIT_TOLERANCE_PCT,
  evaluate,
  prepare,
  solveOrdered,
  splitIntoGrams,
  spread,
} from "@/lib/blend/blend-model";
import { describeInfeasibility, diagnoseBlend } from "@/lib/blend/diagnose";

// Linear blend: choose x_i kg from each lot, Σx = target, Σ(ffa_i − maxFfa)·x_i ≤ 0 (same for water),
// 0 ≤ x_i ≤ available. With a minimum draw every lot gets a binary "used" y_i: m·y_i ≤ x_i ≤ avail·y_i.
// Draws are then split into whole grams and re-checked against the limits.

export type { BlendOptions } from "@/lib/blend/blend-model";
export { DEFAULT_LIMIT_TOLERANCE_PCT } from "@/lib/blend/blend-model";
export type { BlendDiagnosis } from "@/lib/blend/diagnose";
export { diagnoseBlend } from "@/lib/blend/diagnose";

const MAX_ROUNDING_ATTEMPTS = 16;

export interface BlendDraw {
  ref: string;
  /** Solver value, before splitting into grams. */
  massKg: number;
  massG: number;
}

export interface BlendPlan {
  objective: BlendObjective;
  draws: BlendDraw[];
  totalG: number;
  blendFfaPct: number;
  blendWaterPct: number;
  /** Null when a drawn lot has no cost. */
  costTotal: number | null;
  meanAgeDays: number;
  warnings: DomainIssue[];
}

/**
 * Chooses how much to draw from each candidate lot to make the target blend within the FFA and water
 * limits, by the requested objective. Input is expected to have passed BlendRequestSchema.
 */
export async function optimiseBlend(request: BlendRequest, options: BlendOptions = {}): Promise<Result<BlendPlan>> {
  const tolerance = options.limitTolerancePct ?? DEFAULT_LIMIT_TOLERANCE_PCT;
  const p = prepare(request);
  if (p.targetG <= 0) return fail("BLEND.TARGET_TOO_SMALL", "Target must be at least 1 g.", "targetKg");
  const diagnoseAndFail = async (): Promise<Result<BlendPlan>> =>
    failMany(describeInfeasibility(request, await diagnoseBlend(request, options), tolerance));
  if (p.usable.length === 0) return diagnoseAndFail();

  // Whole-gram splitting can push a blend that sits on a limit just over it. Then re-solve with the
  // limits tightened by t grams' worth of shift (t·spread/target): grow t ×4 until the split passes,
  // and bisect back when the tightened model has no solution.
  const perGram = { ffa: spread(p, "ffaPct") / p.targetG, water: spread(p, "waterPct") / p.targetG };
  let t = 0;
  let infeasibleT = Number.POSITIVE_INFINITY;
  let violatingT = 0;
  const warnings: DomainIssue[] = [];
  for (let attempt = 0; attempt < MAX_ROUNDING_ATTEMPTS; attempt++) {
    const outcome = await solveOrdered(p, { ffa: t * perGram.ffa, water: t * perGram.water }, options);
    if (outcome.status === "INFEASIBLE") {
      if (attempt === 0) return diagnoseAndFail();
      infeasibleT = t;
      t = (violatingT + infeasibleT) / 2;
      continue;
    }
    if (outcome.status === "FAILED") {
      return fail("BLEND.SOLVER_FAILED", `The blend solver stopped without a solution (${outcome.detail}).`);
    }
    const grams = splitIntoGrams(p, outcome.values);
    if (grams === null) {
      return fail(
        "BLEND.ROUNDING_BREAKS_LIMIT",
        "The draws cannot be split into whole grams within the lot bounds.",
        "minDrawKg",
      );
    }
    const checked = evaluate(p, grams);
    const ffaExcess = checked.ffaPct - request.limits.maxFfaPct;
    const waterExcess = checked.waterPct - request.limits.maxWaterPct;
    if (ffaExcess <= tolerance && waterExcess <= tolerance) {
      if (outcome.status === "LIMIT_WITH_SOLUTION") {
        warnings.push({
          code: "BLEND.NOT_PROVEN_OPTIMAL",
          message: "The solver hit its time limit; the blend meets the limits but may not be the best one.",
        });
      }
      return ok(toPlan(p, outcome.values, checked, warnings));
    }
    violatingT = t;
    const needed = Math.max(
      perGram.ffa > 0 ? (2 * ffaExcess) / perGram.ffa : 0,
      perGram.water > 0 ? (2 * waterExcess) / perGram.water : 0,
    );
    t = Number.isFinite(infeasibleT) ? (violatingT + infeasibleT) / 2 : Math.max(4 * t, needed);
  }
  return fail(
    "BLEND.ROUNDING_BREAKS_LIMIT",
    "The limits can be met only by draws finer than whole grams; relax a limit slightly or change the target.",
    "limits",
  );
}

function toPlan(p: Prepared, valuesKg: number[], checked: Evaluated, warnings: DomainIssue[]): BlendPlan {
  const draws: BlendDraw[] = [];
  let cost = 0;
  let costKnown = true;
  let ageSum = 0;
  let totalG = 0;
  p.usable.forEach((i, j) => {
    const g = checked.grams[j] ?? 0;
    const c = p.request.candidates[i];
    if (g <= 0 || c === undefined) return;
    draws.push({ ref: c.ref, massKg: valuesKg[j] ?? 0, massG: g });
    totalG += g;
    ageSum += g * c.ageDays;
    if (c.costPerKg === undefined) costKnown = false;
    else cost += (g / 1000) * c.costPerKg;
  });
  return {
    objective: p.request.objective,
    draws,
    totalG,
    blendFfaPct: checked.ffaPct,
    blendWaterPct: checked.waterPct,
    costTotal: costKnown ? cost : null,
    meanAgeDays: totalG > 0 ? ageSum / totalG : 0,
    warnings,
  };
}
