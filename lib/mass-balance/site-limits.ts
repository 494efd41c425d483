// The limits a site works to, resolved from its newest saved version or the built-in default: the
// mass-balance closure tolerance (batches, periods, material kinds, gauges) and the water limit of
// each reaction step (blend planner, recipe and acid-step warnings). Pure: rows in, limits out.
import { defineSourced } from "@/lib/chemistry/sourced-value";
import { DEFAULT_CLOSURE_TOLERANCE } from "@/lib/mass-balance/period-balance";
import type { ClosureTolerance } from "@/lib/mass-balance/period-balance";
import { WATER_LIMIT_BY_STEP } from "@/lib/recipe/recipe-defaults";
import type { WaterLimits } from "@/lib/recipe/recipe-defaults";
import type { ClosureLimit, WaterLimit } from "@/lib/mass-balance/site-limits.schema";

/** Who changed a limit, when and why. */
export interface LimitChange {
  at: Date;
  by: string;
  reason: string;
}

export interface SiteLimits {
  closure: ClosureTolerance;
  /** null: the built-in default is in force. */
  closureChange: LimitChange | null;
  water: WaterLimits;
  waterChange: LimitChange | null;
}

export const DEFAULT_SITE_LIMITS: SiteLimits = {
  closure: DEFAULT_CLOSURE_TOLERANCE,
  closureChange: null,
  water: WATER_LIMIT_BY_STEP,
  waterChange: null,
};

function siteSource(change: LimitChange): string {
  return `the site's own choice, set by ${change.by}: ${change.reason}`;
}

/** The closure tolerance a site works to: its saved version when it has one. */
export function resolveClosureTolerance(saved: { value: ClosureLimit; change: LimitChange } | null): ClosureTolerance {
  if (saved === null) return DEFAULT_CLOSURE_TOLERANCE;
  const d = DEFAULT_CLOSURE_TOLERANCE;
  return {
    warnPct: saved.value.warnPct,
    failPct: saved.value.failPct,
    source: siteSource(saved.change),
    note: `The default is warn above ${d.warnPct} %, fail above ${d.failPct} % (${d.source}).`,
  };
}

/** The water limits a site works to: its saved version when it has one. */
export function resolveWaterLimits(saved: { value: WaterLimit; change: LimitChange } | null): WaterLimits {
  if (saved === null) return WATER_LIMIT_BY_STEP;
  const source = siteSource(saved.change);
  const note = (d: { value: number; source: string }) => `default ${d.value} % (${d.source})`;
  return {
    BASE_STEP: defineSourced(
      saved.value.baseStepPct,
      WATER_LIMIT_BY_STEP.BASE_STEP.unit,
      source,
      "common practice",
      note(WATER_LIMIT_BY_STEP.BASE_STEP),
    ),
    ACID_STEP: defineSourced(
      saved.value.acidStepPct,
      WATER_LIMIT_BY_STEP.ACID_STEP.unit,
      source,
      "common practice",
      note(WATER_LIMIT_BY_STEP.ACID_STEP),
    ),
  };
}

export function resolveSiteLimits(saved: {
  closure: { value: ClosureLimit; change: LimitChange } | null;
  water: { value: WaterLimit; change: LimitChange } | null;
}): SiteLimits {
  return {
    closure: resolveClosureTolerance(saved.closure),
    closureChange: saved.closure?.change ?? null,
    water: resolveWaterLimits(saved.water),
    waterChange: saved.water?.change ?? null,
  };
}
