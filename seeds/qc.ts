// The demo plant's QC results for one product lot: every required property of the lot's specification
// (the built-in edition and grade new lots get), with typical B100 values well inside the limits, and one
// lot that fails on acid number. Deterministic: the values come from a generator seeded by the lot number.
import { getBuiltInSpec } from "@/lib/spec/spec";
import { DEFAULT_PRODUCT_SPEC_KEY } from "@/lib/product/spec-default";
import type { ProductDecisionInput, QcResultInput } from "@/lib/product/product.schema";

export const DEMO_LAB = "Quillmoor Fuel Works laboratory";
export const CONTRACT_LAB = "Fernbrook Fuel Analysis (contract lab)";

/** Properties the site's own lab tests; the rest go to the contract lab. */
const OWN_LAB = new Set([
  "acid-number",
  "water-sediment",
  "flash-point",
  "free-glycerin",
  "total-glycerin",
  "cloud-point",
  "viscosity-40c",
]);

/**
 * Typical values (low, high, decimals) for the demo: inside the ASTM D6751-23a Table 1 limits of the
 * No. 2-B S15 grade. The ranges are the demo's own invention ("common practice" figures for a good batch).
 */
const TYPICAL: Record<string, readonly [number, number, number]> = {
  "calcium-magnesium": [0.2, 1.6, 1],
  "sodium-potassium": [0.3, 2.4, 1],
  "flash-point": [135, 170, 1], // at least 130 °C also meets the alcohol control (ASTM D6751-23a Table 1)
  "water-sediment": [0.005, 0.03, 3],
  "viscosity-40c": [4.0, 4.8, 2],
  "sulfated-ash": [0.002, 0.012, 3],
  sulfur: [2, 9, 1],
  "copper-strip": [1, 1, 0],
  "cetane-number": [49, 56, 1],
  "cloud-point": [-2, 8, 1],
  "carbon-residue": [0.005, 0.03, 3],
  "acid-number": [0.12, 0.42, 2],
  "free-glycerin": [0.004, 0.016, 3],
  "total-glycerin": [0.08, 0.21, 3],
  monoglycerides: [0.2, 0.5, 2],
  phosphorus: [0.0001, 0.0006, 4],
  "distillation-t90": [330, 355, 0],
  "oxidation-stability": [4, 9, 1],
  "cold-soak": [80, 200, 0],
  methanol: [0.02, 0.15, 2],
};

/** The failing lot's acid number, above the 0.50 mg KOH/g maximum (ASTM D6751-23a Table 1). */
export const FAILING_ACID_NUMBER = 0.61;

function generator(seed: number): () => number {
  let a = seed >>> 0;
  return () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

function seedOf(code: string): number {
  let h = 2166136261;
  for (const ch of code) h = Math.imul(h ^ ch.charCodeAt(0), 16777619);
  return h >>> 0;
}

/** One result per required property of the default specification, all tested at `at`. */
export function demoQcResults(productLotCode: string, at: Date, fail: boolean): QcResultInput[] {
  const spec = getBuiltInSpec(DEFAULT_PRODUCT_SPEC_KEY);
  if (spec === null) throw new Error(`demo: unknown specification ${DEFAULT_PRODUCT_SPEC_KEY}`);
  const rand = generator(seedOf(productLotCode));
  return spec.properties
    .filter((p) => p.required)
    .map((p) => {
      const typical = TYPICAL[p.key];
      if (!typical) throw new Error(`demo: no typical value for ${p.key}`);
      const [lo, hi, decimals] = typical;
      const value =
        fail && p.key === "acid-number" ? FAILING_ACID_NUMBER : Number((lo + (hi - lo) * rand()).toFixed(decimals));
      return {
        productLotCode,
        property: p.key,
        value,
        lab: OWN_LAB.has(p.key) ? DEMO_LAB : CONTRACT_LAB,
        reportNo: `QR-${productLotCode}`,
        testedAt: at,
      };
    });
}

export function demoDecision(productLotCode: string, fail: boolean): ProductDecisionInput {
  return fail
    ? {
        productLotCode,
        decision: "HOLD",
        reason: `Acid number ${FAILING_ACID_NUMBER} mg KOH/g is above the 0.50 maximum; held for re-processing.`,
      }
    : { productLotCode, decision: "RELEASE", reason: "" };
}
