import { invariant } from "@/lib/errors";

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
