// Robust location and scale for screening: the median and the median absolute deviation (MAD).
// Scale: σ̂ = 1.4826 × MAD, consistent for the standard deviation under normality (1.4826 ≈ 1 / 0.6745,
// the normal 75th percentile) — Hampel 1974, JASA 69:383; Rousseeuw & Croux 1993, JASA 88:1273.
// Flag rule |x − median| / σ̂ > 3.5: the modified z-score of Iglewicz & Hoaglin 1993.

/** Consistency constant that makes 1.4826 × MAD estimate σ for normal data (Rousseeuw & Croux 1993). */
export const MAD_CONSISTENCY = 1.4826;

export function median(values: readonly number[]): number {
  if (values.length === 0) return Number.NaN;
  // A typed array sorts numerically without a comparator call per pair.
  const s = Float64Array.from(values).sort();
  const mid = Math.floor(s.length / 2);
  return s.length % 2 === 1 ? (s[mid] as number) : ((s[mid - 1] as number) + (s[mid] as number)) / 2;
}

/** Median absolute deviation from the median (raw, without the consistency constant). */
export function mad(values: readonly number[]): number {
  const m = median(values);
  return median(values.map((v) => Math.abs(v - m)));
}

export interface RobustScore {
  median: number;
  /** 1.4826 × MAD, floored at floorShare × |median| so a perfectly steady history does not make every change infinite. */
  scale: number;
  /** (x − median) / scale; Infinity when the scale is zero and x differs from the median. */
  z: number;
}

/**
 * How many robust standard deviations x lies from a reference sample. The floor is proportional to the
 * median, so multiplying x and the sample by one factor leaves z unchanged.
 */
export function robustScore(x: number, sample: readonly number[], floorShare: number): RobustScore {
  const m = median(sample);
  const scale = Math.max(MAD_CONSISTENCY * mad(sample), floorShare * Math.abs(m));
  const diff = x - m;
  const z = scale > 0 ? diff / scale : diff === 0 ? 0 : diff > 0 ? Infinity : -Infinity;
  return { median: m, scale, z };
}
