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
  // The message is built only on failure: this runs once per draw of a replay.
  if (!(Number.isSafeInteger(total) && total >= 0))
    invariant(false, `total must be a non-negative integer, got ${total}`);
  const n = weights.length;
  invariant(out.length >= n, "the output buffer is shorter than the weights");
  if (total === 0 || n === 0) {
    out.fill(0, 0, n);
    return;
  }
  invariant(sum > 0, "weights must add up to more than zero");
  const rems = scratch(0, n);
  bucketCounts.fill(0);
  let given = 0;
  for (let i = 0; i < n; i++) {
    const w = weights[i] ?? 0;
    if (!(w > 0)) invariant(false, `weight ${i} must be positive, got ${w}`);
    const exact = (total * w) / sum;
    const floor = Math.floor(exact);
    const rem = exact - floor;
    out[i] = floor;
    rems[i] = rem;
    const b = (rem * BUCKETS) | 0;
    bucketCounts[b] = (bucketCounts[b] ?? 0) + 1;
    given += floor;
  }
  let left = Math.min(total - given, n);
  if (left <= 0) return;
  // The spare grams go to the `left` largest remainders, the lower index first among equals: every
  // remainder above the threshold (the left-th largest) gets one, then equal ones in index order.
  const threshold = findThreshold(rems, n, n - left);
  for (let i = 0; i < n && left > 0; i++) {
    if ((rems[i] ?? 0) > threshold) {
      out[i] = (out[i] ?? 0) + 1;
      left--;
    }
  }
  for (let i = 0; i < n && left > 0; i++) {
    if (rems[i] === threshold) {
      out[i] = (out[i] ?? 0) + 1;
      left--;
    }
  }
}

/** Remainders lie in [0, 1): bucket b holds [b/BUCKETS, (b+1)/BUCKETS), so buckets keep their order. */
const BUCKETS = 256;
const bucketCounts = new Int32Array(BUCKETS);

/**
 * The remainder at ascending position k, as selectAscending over all of them would give, but selecting
 * only within the bucket that holds position k (bucketCounts must count rems[0..n)).
 */
function findThreshold(rems: Float64Array, n: number, k: number): number {
  let below = 0;
  let bucket = 0;
  while (bucket < BUCKETS - 1 && below + (bucketCounts[bucket] ?? 0) <= k) below += bucketCounts[bucket++] ?? 0;
  const copy = scratch(1, bucketCounts[bucket] ?? 0);
  let m = 0;
  for (let i = 0; i < n; i++) {
    const r = rems[i] ?? 0;
    if (((r * BUCKETS) | 0) === bucket) copy[m++] = r;
  }
  return selectAscending(copy, m, k - below);
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
