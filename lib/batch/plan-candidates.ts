// The plant's stock as blend candidates: lots and feedstock tanks with their lab quality, and the blend request. Pure.
import type { BlendCandidate, BlendRequest } from "@/lib/blend/blend.schema";
import { DEFAULT_RECIPE_LIMITS, WATER_LIMIT_BY_STEP } from "@/lib/recipe/recipe-defaults";
import type { WaterLimits } from "@/lib/recipe/recipe-defaults";
import { MS_PER_DAY } from "@/lib/batch/plan-request";
import type { BatchPlanRequest } from "@/lib/batch/plan-request";

// ---- stock and candidates -----------------------------------------------------------------------

export interface LotStock {
  code: string;
  material: string;
  receivedAt: Date;
  stockG: number;
  /** Mean of the lot's valid titrations. */
  ffaPct: number | null;
  /** Latest valid water test. */
  waterPct: number | null;
}

/** One feedstock lot's share of what a tank holds now (lotCode null: material not traced to a lot). */
export interface TankShare {
  lotCode: string | null;
  grams: number;
  ffaPct: number | null;
  waterPct: number | null;
  receivedAt: Date | null;
}

export interface TankStock {
  code: string;
  name: string;
  stockG: number;
  /** Null when the ledger could not be replayed, so the contents are unknown. */
  contents: TankShare[] | null;
}

export interface PlanStock {
  lots: LotStock[];
  tanks: TankStock[];
}

export interface ReagentStock {
  code: string;
  reagent: string;
  strengthPct: number;
  receivedAt: Date;
  stockG: number;
}

export interface ContentQuality {
  ffaPct: number | null;
  waterPct: number | null;
  /** Share of the contents' mass with an FFA (water) result, %. */
  ffaCoveredPct: number;
  waterCoveredPct: number;
  /** Mass-weighted age of the contents with a receipt date; null when none has one. */
  ageDays: number | null;
}

function weightedMean(parts: ReadonlyArray<{ grams: number; value: number | null }>): {
  mean: number | null;
  coveredG: number;
} {
  let coveredG = 0;
  let sum = 0;
  for (const p of parts) {
    if (p.value === null || !(p.grams > 0)) continue;
    coveredG += p.grams;
    sum += p.grams * p.value;
  }
  return { mean: coveredG > 0 ? sum / coveredG : null, coveredG };
}

/** Mass-weighted FFA, water and age of a tank's contents, over the shares that have a result. */
export function summariseContents(contents: readonly TankShare[], now: Date): ContentQuality {
  const totalG = contents.reduce((s, c) => s + Math.max(0, c.grams), 0);
  const ffa = weightedMean(contents.map((c) => ({ grams: c.grams, value: c.ffaPct })));
  const water = weightedMean(contents.map((c) => ({ grams: c.grams, value: c.waterPct })));
  const age = weightedMean(
    contents.map((c) => ({
      grams: c.grams,
      value: c.receivedAt === null ? null : Math.max(0, (now.getTime() - c.receivedAt.getTime()) / MS_PER_DAY),
    })),
  );
  const share = (g: number) => (totalG > 0 ? (g * 100) / totalG : 0);
  return {
    ffaPct: ffa.mean,
    waterPct: water.mean,
    ffaCoveredPct: share(ffa.coveredG),
    waterCoveredPct: share(water.coveredG),
    ageDays: age.mean,
  };
}

export type CandidateKind = "LOT" | "TANK";

export interface PlanCandidate {
  /** "lot:<code>" or "tank:<code>": unique even when a lot and a tank share a code. */
  ref: string;
  kind: CandidateKind;
  code: string;
  /** Material (lots) or tank name. */
  label: string;
  availableG: number;
  ffaPct: number | null;
  waterPct: number | null;
  ffaCoveredPct: number;
  waterCoveredPct: number;
  ageDays: number;
  costPerKg: number;
  /** Why the candidate is not offered to the optimiser; null when it is. */
  leftOutBecause: string | null;
}

export function candidateRef(kind: CandidateKind, code: string): string {
  return `${kind === "LOT" ? "lot" : "tank"}:${code}`;
}

export function parseCandidateRef(ref: string): { kind: CandidateKind; code: string } | null {
  const m = /^(lot|tank):(.+)$/.exec(ref);
  if (!m || m[2] === undefined) return null;
  return { kind: m[1] === "lot" ? "LOT" : "TANK", code: m[2] };
}

/** Accepted lots with stock and feedstock tanks, with the quality the optimiser blends on. */
export function buildCandidates(
  stock: PlanStock,
  request: Pick<BatchPlanRequest, "costs" | "defaultCostPerKg" | "exclude">,
  now: Date,
): PlanCandidate[] {
  const excluded = new Set(request.exclude);
  const costOf = (ref: string) => request.costs[ref] ?? request.defaultCostPerKg;
  const out: PlanCandidate[] = [];
  for (const lot of stock.lots) {
    if (!(lot.stockG > 0)) continue;
    const ref = candidateRef("LOT", lot.code);
    out.push({
      ref,
      kind: "LOT",
      code: lot.code,
      label: lot.material,
      availableG: lot.stockG,
      ffaPct: lot.ffaPct,
      waterPct: lot.waterPct,
      ffaCoveredPct: lot.ffaPct === null ? 0 : 100,
      waterCoveredPct: lot.waterPct === null ? 0 : 100,
      ageDays: Math.max(0, (now.getTime() - lot.receivedAt.getTime()) / MS_PER_DAY),
      costPerKg: costOf(ref),
      leftOutBecause: excluded.has(ref)
        ? "left out by the planner"
        : lot.ffaPct === null
          ? "no FFA result"
          : lot.waterPct === null
            ? "no water result"
            : null,
    });
  }
  for (const tank of stock.tanks) {
    if (!(tank.stockG > 0)) continue;
    const ref = candidateRef("TANK", tank.code);
    const q = tank.contents === null ? null : summariseContents(tank.contents, now);
    out.push({
      ref,
      kind: "TANK",
      code: tank.code,
      label: tank.name,
      availableG: tank.stockG,
      ffaPct: q?.ffaPct ?? null,
      waterPct: q?.waterPct ?? null,
      ffaCoveredPct: q?.ffaCoveredPct ?? 0,
      waterCoveredPct: q?.waterCoveredPct ?? 0,
      ageDays: q?.ageDays ?? 0,
      costPerKg: costOf(ref),
      leftOutBecause: excluded.has(ref)
        ? "left out by the planner"
        : q === null
          ? "contents could not be traced"
          : q.ffaPct === null
            ? "no FFA result for its contents"
            : q.waterPct === null
              ? "no water result for its contents"
              : null,
    });
  }
  return out;
}

/**
 * The blend's water limit: the planner's own figure, else the site setting of the step the blend goes into
 * first — the base step when the FFA limit keeps every blend below the acid-pretreatment threshold, the
 * acid step otherwise. The recipe and pretreatment warnings use the same two settings.
 */
export function blendWaterLimit(
  request: Pick<BatchPlanRequest, "maxWaterPct" | "maxFfaPct">,
  water: WaterLimits = WATER_LIMIT_BY_STEP,
): {
  value: number;
  step: "BASE_STEP" | "ACID_STEP" | null;
} {
  if (request.maxWaterPct !== undefined) return { value: request.maxWaterPct, step: null };
  const step = request.maxFfaPct < DEFAULT_RECIPE_LIMITS.baseCatalysisMaxFfaPct.value ? "BASE_STEP" : "ACID_STEP";
  return { value: water[step].value, step };
}

export function toBlendRequest(
  request: BatchPlanRequest,
  candidates: readonly PlanCandidate[],
  water: WaterLimits = WATER_LIMIT_BY_STEP,
): BlendRequest {
  const usable = candidates.filter((c) => c.leftOutBecause === null && c.ffaPct !== null && c.waterPct !== null);
  return {
    candidates: usable.map((c): BlendCandidate => ({
      ref: c.ref,
      availableKg: c.availableG / 1000,
      ffaPct: c.ffaPct ?? 0,
      waterPct: c.waterPct ?? 0,
      costPerKg: c.costPerKg,
      ageDays: c.ageDays,
    })),
    targetKg: request.targetOilKg,
    limits: { maxFfaPct: request.maxFfaPct, maxWaterPct: blendWaterLimit(request, water).value },
    objective: request.objective,
    ...(request.minDrawKg === undefined ? {} : { minDrawKg: request.minDrawKg }),
  };
}
