import { z } from "zod";

export const MAX_BLEND_CANDIDATES = 200;
export const MAX_AVAILABLE_KG = 10_000_000;
export const MAX_TARGET_KG = 10_000_000;
export const MIN_FFA_PCT = 0;
export const MAX_FFA_PCT = 100;
export const MIN_WATER_PCT = 0;
export const MAX_WATER_PCT = 100;
export const MAX_COST_PER_KG = 1_000_000;
export const MAX_AGE_DAYS = 36_500;
export const MAX_PRIORITY = 1_000;
export const BLEND_OBJECTIVES = ["MIN_COST", "OLDEST_FIRST", "HIGHEST_FFA_FIRST"] as const;

const pct = (field: string, min: number, max: number) =>
  z
    .number({ error: `${field} must be a number (%)` })
    .min(min, `${field} must be at least ${min} %`)
    .max(max, `${field} must be at most ${max} %`);

export const BlendCandidateSchema = z.object({
  ref: z.string({ error: "Lot reference is required" }).trim().min(1, "Lot reference is required"),
  availableKg: z
    .number({ error: "Available mass must be a number (kg)" })
    .min(0, "Available mass must be 0 kg or more")
    .max(MAX_AVAILABLE_KG, `Available mass must be at most ${MAX_AVAILABLE_KG} kg`),
  ffaPct: pct("FFA", MIN_FFA_PCT, MAX_FFA_PCT),
  waterPct: pct("Water", MIN_WATER_PCT, MAX_WATER_PCT),
  costPerKg: z
    .number({ error: "Cost must be a number (per kg)" })
    .min(0, "Cost must be 0 per kg or more")
    .max(MAX_COST_PER_KG, `Cost must be at most ${MAX_COST_PER_KG} per kg`)
    .optional(),
  /** Higher is drawn first among equally good blends. */
  priority: z
    .number({ error: "Priority must be a number" })
    .min(-MAX_PRIORITY, `Priority must be at least ${-MAX_PRIORITY}`)
    .max(MAX_PRIORITY, `Priority must be at most ${MAX_PRIORITY}`)
    .optional(),
  ageDays: z
    .number({ error: "Age must be a number (days)" })
    .min(0, "Age must be 0 days or more")
    .max(MAX_AGE_DAYS, `Age must be at most ${MAX_AGE_DAYS} days`),
});

export const BlendLimitsSchema = z.object({
  maxFfaPct: pct("Maximum blend FFA", MIN_FFA_PCT, MAX_FFA_PCT),
  maxWaterPct: pct("Maximum blend water", MIN_WATER_PCT, MAX_WATER_PCT),
});

export const BlendRequestSchema = z
  .object({
    candidates: z
      .array(BlendCandidateSchema)
      .min(1, "At least one candidate lot is needed")
      .max(MAX_BLEND_CANDIDATES, `At most ${MAX_BLEND_CANDIDATES} candidate lots`),
    targetKg: z
      .number({ error: "Target mass must be a number (kg)" })
      .positive("Target mass must be above 0 kg")
      .max(MAX_TARGET_KG, `Target mass must be at most ${MAX_TARGET_KG} kg`),
    limits: BlendLimitsSchema,
    objective: z.enum(BLEND_OBJECTIVES, { error: `Objective must be one of ${BLEND_OBJECTIVES.join(", ")}` }),
    /** Smallest draw from any lot that is used at all (kg); makes the problem a MIP. */
    minDrawKg: z
      .number({ error: "Minimum draw must be a number (kg)" })
      .positive("Minimum draw must be above 0 kg")
      .max(MAX_TARGET_KG, `Minimum draw must be at most ${MAX_TARGET_KG} kg`)
      .optional(),
  })
  .superRefine((req, ctx) => {
    const seen = new Set<string>();
    req.candidates.forEach((c, i) => {
      if (seen.has(c.ref)) {
        ctx.addIssue({ code: "custom", message: `Lot ${c.ref} is listed twice`, path: ["candidates", i, "ref"] });
      }
      seen.add(c.ref);
      if (req.objective === "MIN_COST" && c.costPerKg === undefined) {
        ctx.addIssue({
          code: "custom",
          message: `Lot ${c.ref} has no cost per kg; MIN_COST needs a cost for every candidate`,
          path: ["candidates", i, "costPerKg"],
        });
      }
    });
  });

export type BlendCandidate = z.infer<typeof BlendCandidateSchema>;
export type BlendLimits = z.infer<typeof BlendLimitsSchema>;
export type BlendRequest = z.infer<typeof BlendRequestSchema>;
export type BlendObjective = (typeof BLEND_OBJECTIVES)[number];
