// Synthetic candidate lots for the blend optimiser: FFA 0.5–15 %, water 0.05–2 %, a price that falls
// as FFA rises (so the cheapest blend leans on the FFA limit), and an age. Seeded, so every run solves
// the same problems.
import type { BlendRequest } from "@/lib/blend/blend.schema";
import { createRandom } from "@/bench/seeded-random";

export const BENCH_BLEND_LIMITS = { maxFfaPct: 5, maxWaterPct: 0.6 } as const;
export const BENCH_BLEND_TARGET_KG = 9_000;

export function createBlendRequest(lots: number, options: { seed?: number; minDrawKg?: number } = {}): BlendRequest {
  const rand = createRandom((options.seed ?? 4_242) + lots);
  const candidates = Array.from({ length: lots }, (_, i) => {
    const ffaPct = Math.round(rand.between(0.5, 15) * 100) / 100;
    return {
      ref: `C-${String(i + 1).padStart(4, "0")}`,
      availableKg: Math.round(rand.between(500, 15_000)),
      ffaPct,
      waterPct: Math.round(rand.between(0.05, 2) * 1000) / 1000,
      costPerKg: Math.round((1.05 - 0.035 * ffaPct + rand.between(0, 0.1)) * 1000) / 1000,
      ageDays: rand.integer(0, 120),
    };
  });
  return {
    candidates,
    targetKg: BENCH_BLEND_TARGET_KG,
    limits: { ...BENCH_BLEND_LIMITS },
    objective: "MIN_COST",
    ...(options.minDrawKg === undefined ? {} : { minDrawKg: options.minDrawKg }),
  };
}
