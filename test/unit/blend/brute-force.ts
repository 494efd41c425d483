// Independent reference for the blend optimiser: exact LP optimum by vertex enumeration (a bounded
// non-empty polytope attains its minimum at a vertex), and for a minimum draw, enumeration of the
// sets of lots used. Only for 1–4 lots.

export interface BruteLot {
  availableKg: number;
  ffaPct: number;
  waterPct: number;
}

export interface BruteProblem {
  lots: BruteLot[];
  targetKg: number;
  maxFfaPct: number;
  maxWaterPct: number;
  minDrawKg?: number;
  /** Per-lot objective coefficient, minimised. */
  objective: number[];
}

export interface BruteResult {
  value: number;
  x: number[];
}

function solveSquare(a: number[][], b: number[]): number[] | null {
  const n = b.length;
  const m = a.map((row, i) => [...row, b[i] ?? 0]);
  for (let col = 0; col < n; col++) {
    let pivot = col;
    for (let r = col + 1; r < n; r++) if (Math.abs(m[r]?.[col] ?? 0) > Math.abs(m[pivot]?.[col] ?? 0)) pivot = r;
    const pr = m[pivot];
    if (pr === undefined || Math.abs(pr[col] ?? 0) < 1e-12) return null;
    [m[col], m[pivot]] = [pr, m[col] ?? pr];
    const prow = m[col] ?? [];
    for (let r = 0; r < n; r++) {
      if (r === col) continue;
      const row = m[r] ?? [];
      const f = (row[col] ?? 0) / (prow[col] ?? 1);
      for (let c = col; c <= n; c++) row[c] = (row[c] ?? 0) - f * (prow[c] ?? 0);
    }
  }
  return m.map((row, i) => (row[n] ?? 0) / (row[i] ?? 1));
}

function combinations(n: number, k: number): number[][] {
  if (k === 0) return [[]];
  const out: number[][] = [];
  const rec = (start: number, acc: number[]) => {
    if (acc.length === k) {
      out.push([...acc]);
      return;
    }
    for (let i = start; i < n; i++) rec(i + 1, [...acc, i]);
  };
  rec(0, []);
  return out;
}

/** Minimum over the LP restricted to `idx` lots with bounds lower..upper; null when infeasible. */
function solveSubset(p: BruteProblem, idx: number[], lower: number[], feasTol: number): BruteResult | null {
  const k = idx.length;
  // Inequalities as (coefs, rhs) meaning coefs·x ≤ rhs.
  const ineq: Array<[number[], number]> = [];
  ineq.push([idx.map((i) => (p.lots[i]?.ffaPct ?? 0) - p.maxFfaPct), 0]);
  ineq.push([idx.map((i) => (p.lots[i]?.waterPct ?? 0) - p.maxWaterPct), 0]);
  idx.forEach((i, j) => {
    const unit = idx.map((_, jj) => (jj === j ? 1 : 0));
    ineq.push([unit, p.lots[i]?.availableKg ?? 0]);
    ineq.push([unit.map((u) => -u), -(lower[j] ?? 0)]);
  });
  let best: BruteResult | null = null;
  for (const active of combinations(ineq.length, k - 1)) {
    const a = [idx.map(() => 1), ...active.map((r) => ineq[r]?.[0] ?? [])];
    const b = [p.targetKg, ...active.map((r) => ineq[r]?.[1] ?? 0)];
    const x = solveSquare(a, b);
    if (x === null) continue;
    const ok = ineq.every(([c, rhs]) => c.reduce((s, v, j) => s + v * (x[j] ?? 0), 0) <= rhs + feasTol);
    if (!ok) continue;
    const value = idx.reduce((s, i, j) => s + (p.objective[i] ?? 0) * (x[j] ?? 0), 0);
    if (best === null || value < best.value) {
      const full = p.lots.map(() => 0);
      idx.forEach((i, j) => (full[i] = x[j] ?? 0));
      best = { value, x: full };
    }
  }
  return best;
}

export function bruteForceBlend(p: BruteProblem, feasTol = 1e-7): BruteResult | null {
  const n = p.lots.length;
  let best: BruteResult | null = null;
  const consider = (r: BruteResult | null) => {
    if (r !== null && (best === null || r.value < best.value)) best = r;
  };
  if (p.minDrawKg === undefined) {
    consider(solveSubset(p, [...Array(n).keys()], new Array<number>(n).fill(0), feasTol));
    return best;
  }
  for (let mask = 1; mask < 1 << n; mask++) {
    const idx = [...Array(n).keys()].filter((i) => (mask >> i) & 1);
    if (idx.some((i) => (p.lots[i]?.availableKg ?? 0) < (p.minDrawKg ?? 0))) continue;
    consider(
      solveSubset(
        p,
        idx,
        idx.map(() => p.minDrawKg ?? 0),
        feasTol,
      ),
    );
  }
  return best;
}
