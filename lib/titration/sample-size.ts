// The sample to weigh for an expected FFA (AOCS Ca 5a-40 Table 1). Pure.
import { fail, ok } from "@/lib/core/result";
import type { Result } from "@/lib/core/result";
import type { SourceStatus } from "@/lib/quantity/density";
import { FFA_FACTORS } from "@/lib/titration/titration";

export interface SampleSizeRow {
  /** Expected FFA range; a row applies when minPct < FFA ≤ maxPct (the first row also takes 0). */
  minPct: number;
  maxPct: number;
  sampleMassG: number;
  sampleToleranceG: number;
  alcoholMl: number;
  /** Titrant strengths the row allows, mol/L (N for NaOH). */
  concentrationsMolL: readonly number[];
  source: string;
  status: SourceStatus;
}

const TABLE1_SOURCE =
  "AOCS Ca 5a-40 Table 1 (rows as in the matching Table 1 of ASTM D5555-95; first listed from memory)";

export const CA5A40_SAMPLE_SIZE_TABLE: readonly SampleSizeRow[] = [
  {
    minPct: 0,
    maxPct: 0.2,
    sampleMassG: 56.4,
    sampleToleranceG: 0.2,
    alcoholMl: 50,
    concentrationsMolL: [0.1],
    source: TABLE1_SOURCE,
    status: "sourced",
  },
  {
    minPct: 0.2,
    maxPct: 1.0,
    sampleMassG: 28.2,
    sampleToleranceG: 0.2,
    alcoholMl: 50,
    concentrationsMolL: [0.1],
    source: TABLE1_SOURCE,
    status: "sourced",
  },
  {
    minPct: 1.0,
    maxPct: 30.0,
    sampleMassG: 7.05,
    sampleToleranceG: 0.05,
    alcoholMl: 75,
    concentrationsMolL: [0.25],
    source: TABLE1_SOURCE,
    status: "sourced",
  },
  {
    minPct: 30.0,
    maxPct: 50.0,
    sampleMassG: 7.05,
    sampleToleranceG: 0.05,
    alcoholMl: 100,
    concentrationsMolL: [0.25, 1.0],
    source: TABLE1_SOURCE,
    status: "sourced",
  },
  {
    minPct: 50.0,
    maxPct: 100,
    sampleMassG: 3.525,
    sampleToleranceG: 0.001,
    alcoholMl: 100,
    concentrationsMolL: [1.0],
    source: TABLE1_SOURCE,
    status: "sourced",
  },
];

export interface SampleSizeSuggestion {
  row: SampleSizeRow;
  /** % FFA (oleic, method factor) per mL of titre, one per allowed concentration. */
  ffaPctPerMl: number[];
}

/** AOCS Ca 5a-40 Table 1: sample mass and titrant strength for the expected FFA. Boundaries go to the lower row (larger sample). */
export function suggestSampleSize(
  expectedFfaPct: number,
  table: readonly SampleSizeRow[] = CA5A40_SAMPLE_SIZE_TABLE,
): Result<SampleSizeSuggestion> {
  const row = Number.isFinite(expectedFfaPct)
    ? table.find(
        (r, i) => (expectedFfaPct > r.minPct || (i === 0 && expectedFfaPct >= r.minPct)) && expectedFfaPct <= r.maxPct,
      )
    : undefined;
  if (row === undefined) {
    const low = table[0]?.minPct ?? 0;
    const high = table.at(-1)?.maxPct ?? 100;
    return fail(
      "TITRATION.EXPECTED_FFA_OUT_OF_RANGE",
      `expectedFfaPct must be between ${low} and ${high} %`,
      "expectedFfaPct",
    );
  }
  const factor = FFA_FACTORS.OLEIC.methodFactor;
  return ok({ row, ffaPctPerMl: row.concentrationsMolL.map((c) => (c * factor) / row.sampleMassG) });
}
