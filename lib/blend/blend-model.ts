// The blend's linear model and its whole-gram split, shared by the optimiser (optimise.ts) and the
// diagnosis of an infeasible request (diagnose.ts).
// Linear blend: choose x_i kg from each lot, Σx = target, Σ(ffa_i − maxFfa)·x_i ≤ 0 (same for water),
// 0 ≤ x_i ≤ available. With a minimum draw every lot gets a binary "used" y_i: m·y_i ≤ x_i ≤ avail·y_i.
// Draws are then split into whole grams and re-checked against the limits.
import { allocateByWeight } from "@/lib/quantity/allocate";
import { solveLinearModel } from "@/lib/blend/linear-solver";
import type { LinearColumn, LinearModel, LinearOutcome, LinearRow } from "@/lib/blend/linear-solver";
import type { BlendRequest } from "@/lib/blend/blend.schema";

export interface BlendOptions {
  /** Allowed excess over a limit in the final whole-gram blend (percentage points); float round-off only. */
  limitTolerancePct?: number;
  timeLimitSeconds?: number;
}

export const DEFAULT_LIMIT_TOLERANCE_PCT = 1e-9;
export interface Prepared {
  request: BlendRequest;
  /** Indices into request.candidates of lots that can be drawn. */
  usable: number[];
  availG: number[];
  targetG: number;
  minDrawG: number;
  useBinaries: boolean;
}

export function prepare(request: BlendRequest): Prepared {
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

export interface ModelSpec {
  /** Per usable lot, minimised. */
  objective: number[];
  ffaLimit?: number;
  waterLimit?: number;
  extraRows?: LinearRow[];
}

export function buildModel(p: Prepared, spec: ModelSpec): LinearModel {
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

export function primaryObjective(p: Prepared): number[] {
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

export interface Evaluated {
  grams: number[];
  ffaPct: number;
  waterPct: number;
}

export function evaluate(p: Prepared, grams: number[]): Evaluated {
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
export function splitIntoGrams(p: Prepared, valuesKg: number[]): number[] | null {
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

export function spread(p: Prepared, key: "ffaPct" | "waterPct"): number {
  const values = p.usable.map((i) => p.request.candidates[i]?.[key] ?? 0);
  return Math.max(...values) - Math.min(...values);
}

export function fmt(n: number, digits = 3): string {
  return Number(n.toFixed(digits)).toString();
}

export async function solveOrdered(
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
