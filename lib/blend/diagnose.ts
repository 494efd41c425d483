// What the stock can achieve when a blend request cannot be met: the best FFA and water, the gaps to the
// limits, and one message per reason, naming the field to change.
import type { DomainIssue } from "@/lib/core/result";
import { solveLinearModel } from "@/lib/blend/linear-solver";
import type { BlendRequest } from "@/lib/blend/blend.schema";
import type { BlendOptions, Prepared } from "@/lib/blend/blend-model";
import { buildModel, fmt, prepare } from "@/lib/blend/blend-model";

export interface BlendDiagnosis {
  targetKg: number;
  usableStockKg: number;
  /** > 0 when the usable stock cannot make the target. */
  stockShortfallKg: number;
  /** Null when the target cannot be made at all (stock or minimum draw). */
  minFfaPct: number | null;
  ffaGapPct: number;
  minWaterPct: number | null;
  waterGapPct: number;
  /** Lowest FFA among blends that meet the water limit; null when none meets it. */
  minFfaPctWithinWaterLimit: number | null;
  targetBelowMinDraw: boolean;
}

async function solveMinimum(
  p: Prepared,
  perLot: (j: number) => number,
  limits: { ffa?: number; water?: number },
  options: BlendOptions,
): Promise<number | null> {
  const model = buildModel(p, {
    objective: p.usable.map((_, j) => perLot(j)),
    ...(limits.ffa === undefined ? {} : { ffaLimit: limits.ffa }),
    ...(limits.water === undefined ? {} : { waterLimit: limits.water }),
  });
  const outcome = await solveLinearModel(model, options);
  if (outcome.status === "INFEASIBLE" || outcome.status === "FAILED") return null;
  let sum = 0;
  p.usable.forEach((_, j) => (sum += (outcome.values[j] ?? 0) * perLot(j)));
  return sum / (p.targetG / 1000);
}

/** What the stock can achieve for this target: the best FFA and water, and the gaps to the limits. */
export async function diagnoseBlend(request: BlendRequest, options: BlendOptions = {}): Promise<BlendDiagnosis> {
  const p = prepare(request);
  const usableStockKg = p.availG.reduce((s, a) => s + a, 0) / 1000;
  const targetKg = p.targetG / 1000;
  const stockShortfallKg = Math.max(0, targetKg - usableStockKg);
  const targetBelowMinDraw = p.useBinaries && p.targetG < p.minDrawG;
  const base: BlendDiagnosis = {
    targetKg,
    usableStockKg,
    stockShortfallKg,
    minFfaPct: null,
    ffaGapPct: 0,
    minWaterPct: null,
    waterGapPct: 0,
    minFfaPctWithinWaterLimit: null,
    targetBelowMinDraw,
  };
  if (stockShortfallKg > 0 || targetBelowMinDraw || p.usable.length === 0) return base;
  const ffaOf = (j: number) => request.candidates[p.usable[j] ?? -1]?.ffaPct ?? 0;
  const waterOf = (j: number) => request.candidates[p.usable[j] ?? -1]?.waterPct ?? 0;
  const minFfaPct = await solveMinimum(p, ffaOf, {}, options);
  const minWaterPct = await solveMinimum(p, waterOf, {}, options);
  const minFfaPctWithinWaterLimit = await solveMinimum(p, ffaOf, { water: request.limits.maxWaterPct }, options);
  return {
    ...base,
    minFfaPct,
    ffaGapPct: minFfaPct === null ? 0 : Math.max(0, minFfaPct - request.limits.maxFfaPct),
    minWaterPct,
    waterGapPct: minWaterPct === null ? 0 : Math.max(0, minWaterPct - request.limits.maxWaterPct),
    minFfaPctWithinWaterLimit,
  };
}

export function describeInfeasibility(request: BlendRequest, d: BlendDiagnosis, tolerance: number): DomainIssue[] {
  const issues: DomainIssue[] = [];
  if (d.stockShortfallKg > 0) {
    issues.push({
      code: "BLEND.INSUFFICIENT_STOCK",
      message: `Target ${fmt(d.targetKg)} kg exceeds the usable stock ${fmt(d.usableStockKg)} kg by ${fmt(d.stockShortfallKg)} kg.`,
      field: "targetKg",
    });
  }
  if (d.targetBelowMinDraw) {
    issues.push({
      code: "BLEND.TARGET_BELOW_MIN_DRAW",
      message: `Target ${fmt(d.targetKg)} kg is below the minimum draw ${fmt(request.minDrawKg ?? 0)} kg per lot.`,
      field: "minDrawKg",
    });
  }
  if (issues.length > 0) return issues;
  if (d.minFfaPct === null && request.minDrawKg !== undefined) {
    return [
      {
        code: "BLEND.MIN_DRAW_CONFLICT",
        message: `No set of lots drawn at ${fmt(request.minDrawKg)} kg or more each adds up to ${fmt(d.targetKg)} kg.`,
        field: "minDrawKg",
      },
    ];
  }
  const { maxFfaPct, maxWaterPct } = request.limits;
  if (d.minFfaPct !== null && d.minFfaPct > maxFfaPct + tolerance) {
    issues.push({
      code: "BLEND.FFA_LIMIT_UNREACHABLE",
      message: `The lowest FFA this stock can give for ${fmt(d.targetKg)} kg is ${fmt(d.minFfaPct)} %, ${fmt(d.ffaGapPct)} points above the limit ${fmt(maxFfaPct)} %.`,
      field: "limits.maxFfaPct",
    });
  }
  if (d.minWaterPct !== null && d.minWaterPct > maxWaterPct + tolerance) {
    issues.push({
      code: "BLEND.WATER_LIMIT_UNREACHABLE",
      message: `The lowest water this stock can give for ${fmt(d.targetKg)} kg is ${fmt(d.minWaterPct, 4)} %, ${fmt(d.waterGapPct, 4)} points above the limit ${fmt(maxWaterPct, 4)} %.`,
      field: "limits.maxWaterPct",
    });
  }
  if (
    issues.length === 0 &&
    d.minFfaPctWithinWaterLimit !== null &&
    d.minFfaPctWithinWaterLimit > maxFfaPct + tolerance
  ) {
    issues.push({
      code: "BLEND.LIMITS_JOINTLY_UNREACHABLE",
      message: `Each limit can be met alone, but not both: within the water limit ${fmt(maxWaterPct, 4)} % the lowest FFA is ${fmt(d.minFfaPctWithinWaterLimit)} %, ${fmt(d.minFfaPctWithinWaterLimit - maxFfaPct)} points above the FFA limit ${fmt(maxFfaPct)} %.`,
      field: "limits",
    });
  }
  if (issues.length === 0) {
    issues.push({
      code: "BLEND.INFEASIBLE",
      message: "No blend of the stock meets the target and limits.",
      field: "limits",
    });
  }
  return issues;
}
