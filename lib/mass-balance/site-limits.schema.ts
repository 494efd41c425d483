import { z } from "zod";

// The limits a site keeps for itself: the mass-balance closure tolerance and the water limit of each
// reaction step. Each change is a new version with its reason; the newest counts.

export const CLOSURE_TOLERANCE_KEY = "CLOSURE_TOLERANCE";
export const WATER_LIMITS_KEY = "WATER_LIMITS";

export const MIN_CLOSURE_PCT = 0.01;
export const MAX_CLOSURE_PCT = 20;
export const MIN_WATER_LIMIT_PCT = 0.01;
export const MAX_WATER_LIMIT_PCT = 5;

const pct = (what: string, min: number, max: number, unit: string) =>
  z
    .number({ error: `${what} must be a number (${unit})` })
    .finite(`${what} must be a number (${unit})`)
    .min(min, `${what} must be at least ${min} ${unit}`)
    .max(max, `${what} must be at most ${max} ${unit}`);

const reason = z
  .string({ error: "Reason is required" })
  .trim()
  .min(5, "Reason: say why the limit changes (at least 5 characters)")
  .max(300, "Reason: at most 300 characters");

export const ClosureLimitSchema = z
  .object({
    warnPct: pct("Warn above", MIN_CLOSURE_PCT, MAX_CLOSURE_PCT, "% of inputs"),
    failPct: pct("Fail above", MIN_CLOSURE_PCT, MAX_CLOSURE_PCT, "% of inputs"),
    reason,
  })
  .refine((t) => t.warnPct < t.failPct, {
    error: "Warn above must be below the fail level",
    path: ["warnPct"],
  });
export type ClosureLimit = z.output<typeof ClosureLimitSchema>;

export const WaterLimitSchema = z.object({
  baseStepPct: pct("Water limit for the base-catalysed step", MIN_WATER_LIMIT_PCT, MAX_WATER_LIMIT_PCT, "% w/w"),
  acidStepPct: pct("Water limit for the acid step", MIN_WATER_LIMIT_PCT, MAX_WATER_LIMIT_PCT, "% w/w"),
  reason,
});
export type WaterLimit = z.output<typeof WaterLimitSchema>;
