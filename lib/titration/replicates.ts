// Replicate titrations: their repeatability, and their mean across FFA bases by acid value. Pure.
import { fail, failMany, ok } from "@/lib/core/result";
import type { DomainIssue, Result } from "@/lib/core/result";
import type { SourceStatus } from "@/lib/quantity/density";
import { FFA_FACTORS, KOH_MOLAR_MASS_G_MOL, acidValueFromFfa } from "@/lib/titration/titration";
import type { FfaBasis } from "@/lib/titration/titration";

/** Allowed spread = max(absolute, relativeOfMean × |mean|), in the unit of the replicates. */
export interface RepeatabilityLimit {
  absolute: number;
  relativeOfMean: number;
  source: string;
  status: SourceStatus;
}

export const DEFAULT_FFA_REPEATABILITY: RepeatabilityLimit = {
  absolute: 0.1,
  relativeOfMean: 0.05,
  status: "common practice",
  source:
    "duplicate FFA titrations within 0.1 % FFA or 5 % of the mean, whichever is larger (common practice, no source)",
};

export interface ReplicateSummary {
  n: number;
  mean: number;
  min: number;
  max: number;
  /** max − min */
  spread: number;
  /** Sample standard deviation (n − 1); null for a single value. */
  sampleStdDev: number | null;
  allowedSpread: number;
  exceedsRepeatability: boolean;
}

export function summariseReplicates(
  values: readonly number[],
  limit: RepeatabilityLimit = DEFAULT_FFA_REPEATABILITY,
): Result<ReplicateSummary> {
  if (values.length === 0)
    return fail("TITRATION.NO_REPLICATES", "replicates must contain at least one value", "replicates");
  const bad = values.flatMap((v, i): DomainIssue[] =>
    Number.isFinite(v)
      ? []
      : [{ code: "TITRATION.NOT_A_NUMBER", message: `replicate ${i + 1} must be a number`, field: `replicates.${i}` }],
  );
  if (bad.length > 0) return failMany(bad);
  const min = Math.min(...values);
  const max = Math.max(...values);
  const n = values.length;
  // Averaging deviations from the minimum keeps identical replicates exact; the clamp removes the last ulp
  // of rounding, since the true mean always lies in [min, max].
  const rawMean = min + values.reduce((s, v) => s + (v - min), 0) / n;
  const mean = Math.min(max, Math.max(min, rawMean));
  const sampleStdDev = n < 2 ? null : Math.sqrt(values.reduce((s, v) => s + (v - mean) ** 2, 0) / (n - 1));
  const spread = max - min;
  const allowedSpread = Math.max(limit.absolute, limit.relativeOfMean * Math.abs(mean));
  return ok({ n, mean, min, max, spread, sampleStdDev, allowedSpread, exceedsRepeatability: spread > allowedSpread });
}

export interface FfaReading {
  ffaPct: number;
  basis: FfaBasis;
  /** The acid value computed from the same titre (EN 14104 / ISO 660 form), when stored; else from the FFA. */
  acidValueMgKohG?: number;
}

export interface CombinedFfa {
  /** Mean FFA expressed as `basis`. */
  ffaPct: number;
  basis: FfaBasis;
  /** The same mean as acid value, mg KOH/g (molar-mass conversion). */
  acidValueMgKohG: number;
  n: number;
}

/**
 * Mean of titrations that may name different bases: each is converted to acid value (mg KOH/g) before
 * averaging, since a % FFA as lauric and a % FFA as oleic count different moles of acid. The mean is
 * expressed as the readings' basis when they all share one, otherwise as `fallbackBasis` (oleic).
 */
export function combineFfaReadings(
  readings: readonly FfaReading[],
  fallbackBasis: FfaBasis = "OLEIC",
): Result<CombinedFfa> {
  if (readings.length === 0)
    return fail("TITRATION.NO_REPLICATES", "replicates must contain at least one value", "replicates");
  const avs: number[] = [];
  for (const [i, r] of readings.entries()) {
    const av =
      r.acidValueMgKohG !== undefined && Number.isFinite(r.acidValueMgKohG) && r.acidValueMgKohG >= 0
        ? ok(r.acidValueMgKohG)
        : acidValueFromFfa(r.ffaPct, { basis: r.basis });
    if (!av.ok)
      return fail(
        av.issues[0]?.code ?? "TITRATION.FFA_OUT_OF_RANGE",
        `titration ${i + 1}: ${av.issues[0]?.message ?? "bad FFA"}`,
        `replicates.${i}`,
      );
    avs.push(av.value);
  }
  const first = readings[0]?.basis ?? fallbackBasis;
  const shared = readings.every((r) => r.basis === first);
  const basis = shared ? first : fallbackBasis;
  const acidValueMgKohG = avs.reduce((s, v) => s + v, 0) / avs.length;
  // One basis: the plain mean keeps the stored figures exact; mixed: back from the mean acid value.
  const ffaPct = shared
    ? readings.reduce((s, r) => s + r.ffaPct, 0) / readings.length
    : (acidValueMgKohG * FFA_FACTORS[basis].molarMassGMol) / (10 * KOH_MOLAR_MASS_G_MOL);
  return ok({ ffaPct, basis, acidValueMgKohG, n: readings.length });
}
