// Repeated timing with median and p95, peak resident memory per section, and plain-text tables.

export interface Timing {
  runs: number;
  medianMs: number;
  p95Ms: number;
  minMs: number;
  maxMs: number;
  /** Set when the run count was cut because one run was slow. */
  reducedFrom: number | null;
}

export interface MeasurePlan {
  runs: number;
  /** One untimed run first (JIT, caches), unless that run alone is slower than slowMs. */
  warmup?: boolean;
  /** When the first run takes longer than this, only `slowRuns` runs are made (the first one counts). */
  slowMs?: number;
  slowRuns?: number;
}

/** Nearest-rank percentile of ascending samples (p95 of 5 runs is the slowest run). */
export function getPercentile(sorted: readonly number[], p: number): number {
  const rank = Math.max(1, Math.ceil((p / 100) * sorted.length));
  return sorted[Math.min(sorted.length, rank) - 1] ?? Number.NaN;
}

function summarise(samples: number[], reducedFrom: number | null): Timing {
  const sorted = [...samples].sort((a, b) => a - b);
  return {
    runs: sorted.length,
    medianMs:
      sorted.length % 2 === 1
        ? (sorted[(sorted.length - 1) / 2] ?? Number.NaN)
        : ((sorted[sorted.length / 2 - 1] ?? 0) + (sorted[sorted.length / 2] ?? 0)) / 2,
    p95Ms: getPercentile(sorted, 95),
    minMs: sorted[0] ?? Number.NaN,
    maxMs: sorted[sorted.length - 1] ?? Number.NaN,
    reducedFrom,
  };
}

export class MemoryWatch {
  private peak = 0;

  sample(): void {
    const rss = process.memoryUsage().rss;
    if (rss > this.peak) this.peak = rss;
  }

  /** Starts a new section: the peak restarts from the current resident size. */
  reset(): void {
    this.peak = 0;
    this.sample();
  }

  get peakMb(): number {
    return this.peak / 1e6;
  }
}

export function measureSync(fn: () => void, plan: MeasurePlan, memory: MemoryWatch): Timing {
  const samples: number[] = [];
  let runs = plan.runs;
  let reducedFrom: number | null = null;
  const timeOnce = () => {
    const t0 = performance.now();
    fn();
    const ms = performance.now() - t0;
    memory.sample();
    return ms;
  };
  const first = timeOnce();
  if (plan.slowMs !== undefined && first > plan.slowMs && plan.slowRuns !== undefined && plan.slowRuns < runs) {
    reducedFrom = runs;
    runs = plan.slowRuns;
    samples.push(first);
  } else if (plan.warmup === false) {
    samples.push(first);
  }
  while (samples.length < runs) samples.push(timeOnce());
  return summarise(samples, reducedFrom);
}

/** Times `fn`; `before`, when given, runs untimed ahead of each run (e.g. a booking the run must answer after). */
export async function measureAsync(
  fn: () => Promise<void>,
  plan: MeasurePlan,
  memory: MemoryWatch,
  before?: () => Promise<void>,
): Promise<Timing> {
  const samples: number[] = [];
  const timeOnce = async () => {
    if (before) await before();
    const t0 = performance.now();
    await fn();
    const ms = performance.now() - t0;
    memory.sample();
    return ms;
  };
  const first = await timeOnce();
  if (plan.warmup === false) samples.push(first);
  while (samples.length < plan.runs) samples.push(await timeOnce());
  return summarise(samples, null);
}

export function formatMs(ms: number): string {
  if (!Number.isFinite(ms)) return "—";
  if (ms >= 1000) return ms.toFixed(0);
  if (ms >= 100) return ms.toFixed(1);
  return ms.toFixed(2);
}

export function formatRatio(r: number | null): string {
  if (r === null || !Number.isFinite(r)) return "—";
  return r >= 100 ? `${r.toFixed(0)}×` : r >= 10 ? `${r.toFixed(1)}×` : `${r.toFixed(2)}×`;
}

export function formatRuns(t: Timing): string {
  return t.reducedFrom === null ? String(t.runs) : `${t.runs}*`;
}

/** Left-aligns text columns and right-aligns the rest; the first row is the header. */
export function printTable(rows: readonly (readonly string[])[], numeric: readonly boolean[] = []): void {
  const widths: number[] = [];
  for (const row of rows) row.forEach((cell, i) => (widths[i] = Math.max(widths[i] ?? 0, cell.length)));
  const line = (row: readonly string[]) =>
    "  " +
    row
      .map((cell, i) => (numeric[i] === true ? cell.padStart(widths[i] ?? 0) : cell.padEnd(widths[i] ?? 0)))
      .join("  ")
      .trimEnd();
  const [header, ...body] = rows;
  if (header === undefined) return;
  console.log(line(header));
  console.log("  " + widths.map((w) => "-".repeat(w)).join("  "));
  for (const row of body) console.log(line(row));
}
