import { z } from "zod";
import { CATALYSTS, REAGENTS } from "@/lib/core/vocabulary";
import { code, id, massKg, oneOf, percent, requiredText, tempC, text, when } from "@/lib/core/fields";

export const MIN_MOLAR_RATIO = 3;
export const MAX_MOLAR_RATIO = 40;

export const ReagentLotSchema = z.object({
  code: code("Reagent lot"),
  reagent: oneOf("Reagent", REAGENTS),
  supplier: requiredText("Supplier", 120),
  strengthPct: percent("Purity or strength").refine((v) => v > 0, "Purity or strength must be more than 0 %"),
  receivedAt: when("Received time"),
  massKg: massKg("Mass"),
});
export type ReagentLotInput = z.input<typeof ReagentLotSchema>;

export const BatchPlanSchema = z.object({
  code: code("Batch number"),
  plannedAt: when("Planned time"),
  targetOilKg: massKg("Oil to charge"),
  molarRatio: z
    .number({ error: "Methanol : oil molar ratio must be a number" })
    .min(
      MIN_MOLAR_RATIO,
      `Methanol : oil molar ratio must be at least ${MIN_MOLAR_RATIO}:1 (the stoichiometric minimum)`,
    )
    .max(MAX_MOLAR_RATIO, `Methanol : oil molar ratio must be at most ${MAX_MOLAR_RATIO}:1`)
    .default(6),
  catalyst: oneOf("Catalyst", CATALYSTS),
  reactionTempC: tempC("Reaction temperature").default(60),
  pretreated: z.boolean().default(false),
  recipe: z.record(z.string(), z.unknown()).default({}),
  notes: text("Notes", 1000).default(""),
});
export type BatchPlanInput = z.input<typeof BatchPlanSchema>;

const charge = z.object({
  fromKind: z.enum(["LOT", "TANK", "REAGENT_LOT"], { error: "Drawn from: a lot, tank or reagent lot" }),
  fromCode: code("Drawn from"),
  // Water is not an ingredient: it is used at the washing step and goes to the wash-water stream, so it
  // is recorded when the batch finishes (BatchCompleteSchema), never charged to the reactor.
  role: z.enum(["OIL", "METHANOL", "CATALYST", "ACID"], {
    error: "Charge: oil, methanol, catalyst or acid (water used for washing is recorded when the batch finishes)",
  }),
  massKg: massKg("Mass charged"),
});

/** Starting a batch: what actually went into the reactor. */
export const BatchStartSchema = z.object({
  batchCode: code("Batch number"),
  startedAt: when("Start time"),
  charges: z.array(charge).min(1, "Charges: record at least the oil charged"),
});
export type BatchStartInput = z.input<typeof BatchStartSchema>;

const reason = text("Reason", 300);

const output = z.object({
  role: z.enum(["ESTER", "GLYCEROL_PHASE", "WASH_WATER", "RECOVERED_METHANOL", "LOSS"], {
    error: "Output: ester, glycerol phase, wash water, recovered methanol or recorded loss",
  }),
  /** Product lot code (ESTER), waste container code (GLYCEROL_PHASE, WASH_WATER), or tank code; none for LOSS. */
  toCode: code("Output to").optional(),
  toKind: z.enum(["PRODUCT_LOT", "WASTE_CONTAINER", "TANK"]).optional(),
  /** What was weighed or gauged. For wash water: everything drawn off, the water used included. */
  massKg: massKg("Output mass"),
  /** A recorded loss (a spill, a leak) says what happened. */
  reason: reason.optional(),
  /** Wash water: the water used for washing and the water lot it came from. */
  waterFromCode: code("Water lot").optional(),
  waterKg: massKg("Water used").optional(),
});

/**
 * Finishing a batch: what was weighed or gauged out. The outputs need not add up to the charge: the
 * remainder is the batch's unmeasured difference, booked by the service, never typed.
 */
export const BatchCompleteSchema = z
  .object({
    batchCode: code("Batch number"),
    completedAt: when("Finish time"),
    outputs: z.array(output).min(1, "Outputs: record at least the ester"),
  })
  .superRefine((b, ctx) => {
    b.outputs.forEach((o, i) => {
      if (o.role !== "LOSS" && (o.toCode === undefined || o.toKind === undefined)) {
        ctx.addIssue({
          code: "custom",
          path: ["outputs", i, "toCode"],
          message: "Output to: say where this output went",
        });
      }
      if (o.role === "LOSS" && (o.reason ?? "").length < 3) {
        ctx.addIssue({
          code: "custom",
          path: ["outputs", i, "reason"],
          message: "Reason: say what was lost and how (a spill, a leak) — at least 3 characters",
        });
      }
      const water = o.waterFromCode !== undefined || o.waterKg !== undefined;
      if (water && o.role !== "WASH_WATER")
        ctx.addIssue({
          code: "custom",
          path: ["outputs", i, "waterKg"],
          message: "Water used: only a wash-water output records the water used for washing",
        });
      if (o.role === "WASH_WATER" && o.waterKg !== undefined && o.waterFromCode === undefined)
        ctx.addIssue({
          code: "custom",
          path: ["outputs", i, "waterFromCode"],
          message: "Water lot: say which water lot the washing water came from",
        });
      if (o.role === "WASH_WATER" && o.waterFromCode !== undefined && o.waterKg === undefined)
        ctx.addIssue({
          code: "custom",
          path: ["outputs", i, "waterKg"],
          message: "Water used: enter the kg of water used for washing",
        });
    });
  });
export type BatchCompleteInput = z.input<typeof BatchCompleteSchema>;

/** Correcting a finished batch's output typed wrong: a correcting entry with the right mass and a reason. */
export const BatchOutputCorrectionSchema = z.object({
  batchCode: code("Batch number"),
  movementId: id("Output"),
  massKg: massKg("Corrected mass"),
  reason: requiredText("Reason", 300).refine(
    (r) => r.length >= 3,
    "Reason: say in a few words what was wrong (at least 3 characters)",
  ),
});
export type BatchOutputCorrectionInput = z.input<typeof BatchOutputCorrectionSchema>;
