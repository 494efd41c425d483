import { allocateByWeight } from "@/lib/quantity/allocate";
import { fail, failMany, ok } from "@/lib/core/result";
import type { DomainIssue, Result } from "@/lib/core/result";
import { solveLinearModel } from "@/lib/blend/linear-solver";
import type { LinearColumn, LinearModel, LinearOutcome, LinearRow } from "@/lib/blend/linear-solver";
import type { BlendObjective, BlendRequest } from "@/lib/blend/blend.schema";

// Linear blend: choose x_i kg from each lot, Σx = target, Σ(ffa_i − maxFfa)·x_i ≤ 0 (same for water),
// 0 ≤ x_i ≤ available. With a minimum draw every lot gets a binary "used" y_i: m·y_i ≤ x_i ≤ avail·y_i.
// Draws are then split into whole grams and re-checked against the limits.

export interface BlendOptions {
  /** Allowed excess over a limit in the final whole-gram blend (percentage points); float round-off only. */
  limitTolerancePct?: number;
  timeLimitSeconds?: number;
}

export const DEFAULT_LIMIT_TOLERANCE_PCT = 1e-9;
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

interface Prepared {
  request: BlendRequest;
  /** Indices into request.candidates of lots that can be drawn. */
  usable: number[];
  availG: number[];
  targetG: number;
  minDrawG: number;
  useBinaries: boolean;
}

function prepare(request: BlendRequest): Prepared {
  const targetG = Math.round(request.targetKg * 1000);
  const minDrawG = request.minDrawKg === undefined ? 0 : Math.ceil(request.minDrawKg * 1000 - 1e-6);
  const availAll = request.candidates.map((c) => Math.floor(c.availableKg * 1000 + 1e-6));
  const usable: number[] = [];
  request.candidates.forEach((_, i) => {
    const a = availAll[i] ?? 0;
    if (a > 0 && a >= minDrawG) usable.push(i);
  });
  return {
    request,
    usable,
    availG: usable.map((i) => availAll[i] ?? 0),
    targetG,
    minDrawG,
    useBinaries: request.minDrawKg !== undefined,
  };
}

interface ModelSpec {
  /** Per usable lot, minimised. */
  objective: number[];
  ffaLimit?: number;
  waterLimit?: number;
  extraRows?: LinearRow[];
}

function buildModel(p: Prepared, spec: ModelSpec): LinearModel {
  const n = p.usable.length;
  const width = p.useBinaries ? 2 * n : n;
  const pad = (coefs: number[]): number[] => [...coefs, ...new Array<number>(width - coefs.length).fill(0)];
  const columns: LinearColumn[] = p.availG.map((a) => ({ lower: 0, upper: a / 1000 }));
  const rows: LinearRow[] = [
    { coefs: pad(new Array<number>(n).fill(1)), lower: p.targetG / 1000, upper: p.targetG / 1000 },
  ];
  const lot = (j: number) => p.request.candidates[p.usable[j] ?? -1];
  if (spec.ffaLimit !== undefined) {
    const limit = spec.ffaLimit;
    rows.push({ coefs: pad(p.usable.map((_, j) => (lot(j)?.ffaPct ?? 0) - limit)), upper: 0 });
  }
  if (spec.waterLimit !== undefined) {
    const limit = spec.waterLimit;
    rows.push({ coefs: pad(p.usable.map((_, j) => (lot(j)?.waterPct ?? 0) - limit)), upper: 0 });
  }
  if (p.useBinaries) {
    for (let j = 0; j < n; j++) {
      columns.push({ lower: 0, upper: 1, binary: true });
      const upper = new Array<number>(width).fill(0);
      upper[j] = 1;
      upper[n + j] = -((p.availG[j] ?? 0) / 1000);
      rows.push({ coefs: upper, upper: 0 });
      const lower = new Array<number>(width).fill(0);
      lower[j] = 1;
      lower[n + j] = -(p.minDrawG / 1000);
      rows.push({ coefs: lower, lower: 0 });
    }
  }
  for (const row of spec.extraRows ?? []) rows.push({ ...row, coefs: pad([...row.coefs]) });
  return { objective: pad(spec.objective), columns, rows };
}

function primaryObjective(p: Prepared): number[] {
  const lots = p.usable.map((i) => p.request.candidates[i]);
  switch (p.request.objective) {
    case "MIN_COST":
      return lots.map((c) => c?.costPerKg ?? 0);
    case "OLDEST_FIRST":
      // Maximise kg·days drawn, i.e. the mass-weighted age of the blend.
      return lots.map((c) => -(c?.ageDays ?? 0));
    case "HIGHEST_FFA_FIRST":
      return lots.map((c) => -(c?.ffaPct ?? 0));
  }
}

interface Evaluated {
  grams: number[];
  ffaPct: number;
  waterPct: number;
}

function evaluate(p: Prepared, grams: number[]): Evaluated {
  let total = 0;
  let ffa = 0;
  let water = 0;
  grams.forEach((g, j) => {
    const c = p.request.candidates[p.usable[j] ?? -1];
    total += g;
    ffa += g * (c?.ffaPct ?? 0);
    water += g * (c?.waterPct ?? 0);
  });
  return { grams, ffaPct: total > 0 ? ffa / total : 0, waterPct: total > 0 ? water / total : 0 };
}

/** Whole grams summing to the target, each within [min draw, available] for used lots and 0 otherwise. */
function splitIntoGrams(p: Prepared, valuesKg: number[]): number[] | null {
  const n = p.usable.length;
  const used = p.usable.map((_, j) =>
    p.useBinaries ? (valuesKg[n + j] ?? 0) > 0.5 : (valuesKg[j] ?? 0) * 1000 > 1e-6,
  );
  const weights = p.usable.map((_, j): readonly [number, number] => [
    j,
    used[j] ? Math.min(Math.max((valuesKg[j] ?? 0) * 1000, 0), p.availG[j] ?? 0) : 0,
  ]);
  const grams = new Array<number>(n).fill(0);
  for (const [j, g] of allocateByWeight(p.targetG, weights)) grams[j] = g;
  const lower = used.map((u) => (u && p.useBinaries ? p.minDrawG : 0));
  const upper = used.map((u, j) => (u ? (p.availG[j] ?? 0) : 0));
  // Largest-remainder rounding can leave a lot 1 g outside its bounds; move those grams between used lots.
  for (let j = 0; j < n; j++) {
    const hi = upper[j] ?? 0;
    const lo = lower[j] ?? 0;
    let g = grams[j] ?? 0;
    for (let k = 0; k < n && g > hi; k++) {
      const room = (upper[k] ?? 0) - (grams[k] ?? 0);
      if (k === j || room <= 0 || !used[k]) continue;
      const move = Math.min(room, g - hi);
      grams[k] = (grams[k] ?? 0) + move;
      g -= move;
    }
    for (let k = 0; k < n && g < lo; k++) {
      const spare = (grams[k] ?? 0) - (lower[k] ?? 0);
      if (k === j || spare <= 0 || !used[k]) continue;
      const move = Math.min(spare, lo - g);
      grams[k] = (grams[k] ?? 0) - move;
      g += move;
    }
    if (g > hi || g < lo) return null;
    grams[j] = g;
  }
  return grams;
}

function spread(p: Prepared, key: "ffaPct" | "waterPct"): number {
  const values = p.usable.map((i) => p.request.candidates[i]?.[key] ?? 0);
  return Math.max(...values) - Math.min(...values);
}

function fmt(n: number, digits = 3): string {
  return Number(n.toFixed(digits)).toString();
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

function describeInfeasibility(request: BlendRequest, d: BlendDiagnosis, tolerance: number): DomainIssue[] {
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

async function solveOrdered(
  p: Prepared,
  margins: { ffa: number; water: number },
  options: BlendOptions,
): Promise<LinearOutcome> {
  const limits = {
    ffaLimit: p.request.limits.maxFfaPct - margins.ffa,
    waterLimit: p.request.limits.maxWaterPct - margins.water,
  };
  const primary = primaryObjective(p);
  const first = await solveLinearModel(buildModel(p, { objective: primary, ...limits }), options);
  const hasPriority = p.usable.some((i) => p.request.candidates[i]?.priority !== undefined);
  if (first.status !== "OPTIMAL" || !hasPriority) return first;
  // Priority breaks ties only: keep the primary objective at its optimum, then prefer higher priority.
  const slack = 1e-7 * Math.max(1, Math.abs(first.objective));
  const second = await solveLinearModel(
    buildModel(p, {
      objective: p.usable.map((i) => -(p.request.candidates[i]?.priority ?? 0)),
      ...limits,
      extraRows: [{ coefs: primary, upper: first.objective + slack }],
    }),
    options,
  );
  return second.status === "OPTIMAL" ? second : first;
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
