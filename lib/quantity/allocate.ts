import { invariant } from "@/lib/core/result";

/**
 * Splits an integer total (grams) over weights so the parts are integers that add up to the
 * total exactly (largest-remainder method; ties go to the earlier key, so the result is
 * deterministic). Zero or negative weights get nothing.
 */
export function allocateByWeight<K>(total: number, weights: ReadonlyArray<readonly [K, number]>): Array<[K, number]> {
  invariant(Number.isSafeInteger(total) && total >= 0, `total must be a non-negative integer, got ${total}`);
  const positive = weights.filter(([, w]) => w > 0 && Number.isFinite(w));
  if (total === 0 || positive.length === 0) return positive.map(([k]) => [k, 0]);
  const sum = positive.reduce((s, [, w]) => s + w, 0);
  const raw = positive.map(([k, w], i) => {
    const exact = (total * w) / sum;
    const floor = Math.floor(exact);
    return { k, i, floor, rem: exact - floor };
  });
  let left = total - raw.reduce((s, r) => s + r.floor, 0);
  const order = [...raw].sort((a, b) => b.rem - a.rem || a.i - b.i);
  for (const r of order) {
    if (left <= 0) break;
    r.floor += 1;
    left -= 1;
  }
  return raw.map((r) => [r.k, r.floor]);
}

/**
 * allocateByWeight's rule (largest remainder, ties to the lower index) for positive integer weights
 * whose exact sum is known, without building a pair per weight: the parts come back in the weights'
 * order. For the replay's hot path, where a tank's mixture can hold thousands of origins.
 */
export function allocateWholeGrams(total: number, weights: readonly number[], sum: number): number[] {
  const out = new Float64Array(weights.length);
  allocateWholeGramsInto(total, weights, sum, out);
  return Array.from(out);
}

/** allocateWholeGrams writing the parts into out[0..weights.length) (a buffer the caller reuses). */
export function allocateWholeGramsInto(
  total: number,
  weights: readonly number[],
  sum: number,
  out: Float64Array,
): void {
  const n = weights.length;
  const rems = scratch(0, n);
  const spare = splitWholeGrams(total, weights, sum, out, rems);
  if (spare === NO_SPARE) return;
  let ties = spare.ties;
  for (let i = 0; i < n; i++) {
    const rem = rems[i] ?? 0;
    if (rem > spare.threshold || (rem === spare.threshold && ties-- > 0)) out[i] = (out[i] ?? 0) + 1;
  }
}

/** Who gets allocateWholeGrams's spare grams, once the floors are known (see splitWholeGrams). */
export interface SpareGrams {
  /** Every index whose remainder is above this gets one spare gram (+Infinity: none is). */
  threshold: number;
  /** Then this many of those whose remainder equals the threshold, lowest index first. */
  ties: number;
}

const NO_SPARE: SpareGrams = { threshold: Number.POSITIVE_INFINITY, ties: 0 };

/**
 * allocateWholeGrams in two halves, for a caller that walks the parts once anyway (a replay's draw):
 * writes floor(total·w/sum) into floors and the remainders into rems (buffers of at least
 * weights.length) and says which indexes get a spare gram. Part i is floors[i] + 1 when rems[i] >
 * threshold, or when rems[i] equals it and it is among the first `ties` such indexes; else floors[i].
 */
export function splitWholeGrams(
  total: number,
  weights: readonly number[],
  sum: number,
  floors: Float64Array,
  rems: Float64Array,
): SpareGrams {
  // The message is built only on failure: this runs once per draw of a replay.
  if (!(Number.isSafeInteger(total) && total >= 0))
    invariant(false, `total must be a non-negative integer, got ${total}`);
  const n = weights.length;
  invariant(floors.length >= n && rems.length >= n, "the output buffer is shorter than the weights");
  if (total === 0 || n === 0) {
    floors.fill(0, 0, n);
    return NO_SPARE;
  }
  invariant(sum > 0, "weights must add up to more than zero");
  bucketCounts.fill(0);
  let given = 0;
  for (let i = 0; i < n; i++) {
    const w = weights[i] ?? 0;
    if (!(w > 0)) invariant(false, `weight ${i} must be positive, got ${w}`);
    const exact = (total * w) / sum;
    const floor = Math.floor(exact);
    const rem = exact - floor;
    floors[i] = floor;
    rems[i] = rem;
    const b = (rem * BUCKETS) | 0;
    bucketCounts[b] = (bucketCounts[b] ?? 0) + 1;
    given += floor;
  }
  const left = Math.min(total - given, n);
  if (left <= 0) return NO_SPARE;
  // The spare grams go to the `left` largest remainders, the lower index first among equals: every
  // remainder above the threshold (the left-th largest) gets one, then equal ones in index order.
  const { threshold, above } = findThreshold(rems, n, n - left);
  return { threshold, ties: left - above };
}

/** Remainders lie in [0, 1): bucket b holds [b/BUCKETS, (b+1)/BUCKETS), so buckets keep their order. */
const BUCKETS = 256;
const bucketCounts = new Int32Array(BUCKETS);

/**
 * The remainder at ascending position k, as selectAscending over all of them would give, but selecting
 * only within the bucket that holds position k (bucketCounts must count rems[0..n)); and how many
 * remainders lie above it.
 */
function findThreshold(rems: Float64Array, n: number, k: number): { threshold: number; above: number } {
  let below = 0;
  let bucket = 0;
  while (bucket < BUCKETS - 1 && below + (bucketCounts[bucket] ?? 0) <= k) below += bucketCounts[bucket++] ?? 0;
  const copy = scratch(1, bucketCounts[bucket] ?? 0);
  let m = 0;
  for (let i = 0; i < n; i++) {
    const r = rems[i] ?? 0;
    if (((r * BUCKETS) | 0) === bucket) copy[m++] = r;
  }
  const threshold = selectAscending(copy, m, k - below);
  let above = n - below - m;
  for (let i = 0; i < m; i++) if ((copy[i] ?? 0) > threshold) above++;
  return { threshold, above };
}

const scratchBuffers: [Float64Array, Float64Array] = [new Float64Array(1024), new Float64Array(1024)];

/** A reusable buffer of at least n doubles (the replay splits thousands of mixtures per trace). */
function scratch(which: 0 | 1, n: number): Float64Array {
  let buf = scratchBuffers[which];
  if (buf.length < n) {
    buf = new Float64Array(Math.max(n, buf.length * 2));
    scratchBuffers[which] = buf;
  }
  return buf;
}

/**
 * The value that would sit at position k (0-based) if a[0..n) were sorted ascending; reorders a.
 * Quickselect with three-way partitioning, so long runs of equal values (many 1 g origins share a
 * remainder) stay linear.
 */
function selectAscending(a: Float64Array, n: number, k: number): number {
  let lo = 0;
  let hi = n - 1;
  while (lo < hi) {
    const x = a[lo] ?? 0;
    const y = a[(lo + hi) >>> 1] ?? 0;
    const z = a[hi] ?? 0;
    const pivot = x < y ? (y < z ? y : x < z ? z : x) : x < z ? x : y < z ? z : y;
    let lt = lo;
    let gt = hi;
    let i = lo;
    while (i <= gt) {
      const v = a[i] ?? 0;
      if (v < pivot) {
        a[i] = a[lt] ?? 0;
        a[lt] = v;
        lt++;
        i++;
      } else if (v > pivot) {
        a[i] = a[gt] ?? 0;
        a[gt] = v;
        gt--;
      } else {
        i++;
      }
    }
    if (k < lt) hi = lt - 1;
    else if (k > gt) lo = gt + 1;
    else return pivot;
  }
  return a[k] ?? 0;
}
