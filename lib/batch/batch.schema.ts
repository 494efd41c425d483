import { z } from "zod";
import { CATALYSTS, REAGENTS } from "@/lib/ledger/kinds";
import { code, massKg, oneOf, percent, requiredText, tempC, text, when } from "@/lib/ledger/fields";

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
    .min(MIN_MOLAR_RATIO, `Methanol : oil molar ratio must be at least ${MIN_MOLAR_RATIO}:1 (the stoichiometric minimum)`)
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
  role: z.enum(["OIL", "METHANOL", "CATALYST", "ACID", "WATER"], { error: "Charge: oil, methanol, catalyst, acid or water" }),
  massKg: massKg("Mass charged"),
});

/** Starting a batch: what actually went into the reactor. */
export const BatchStartSchema = z.object({
  batchCode: code("Batch number"),
  startedAt: when("Start time"),
  charges: z.array(charge).min(1, "Charges: record at least the oil charged"),
});
export type BatchStartInput = z.input<typeof BatchStartSchema>;

const output = z.object({
  role: z.enum(["ESTER", "GLYCEROL_PHASE", "WASH_WATER", "RECOVERED_METHANOL", "LOSS"], { error: "Output: ester, glycerol phase, wash water, recovered methanol or loss" }),
  /** Product lot code (ESTER), waste container code (GLYCEROL_PHASE, WASH_WATER), or tank code; none for LOSS. */
  toCode: code("Output to").optional(),
  toKind: z.enum(["PRODUCT_LOT", "WASTE_CONTAINER", "TANK"]).optional(),
  massKg: massKg("Output mass"),
});

/** Finishing a batch: what came out. Whatever is left in the reactor afterwards is refused. */
export const BatchCompleteSchema = z
  .object({
    batchCode: code("Batch number"),
    completedAt: when("Finish time"),
    outputs: z.array(output).min(1, "Outputs: record at least the ester"),
  })
  .superRefine((b, ctx) => {
    b.outputs.forEach((o, i) => {
      if (o.role !== "LOSS" && (o.toCode === undefined || o.toKind === undefined)) {
        ctx.addIssue({ code: "custom", path: ["outputs", i, "toCode"], message: "Output to: say where this output went" });
      }
    });
  });
export type BatchCompleteInput = z.input<typeof BatchCompleteSchema>;
