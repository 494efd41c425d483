import { z } from "zod";
import { code, massKg, requiredText, text, volumeL, when } from "@/lib/core/fields";

export const ProductLotSchema = z.object({
  code: code("Product lot"),
  batchCode: code("Batch number").optional(),
  producedAt: when("Produced time"),
});
export type ProductLotInput = z.input<typeof ProductLotSchema>;

/** Lengths of the short texts on a QC result and a decision (columns are plain text; these keep them printable). */
export const QC_LAB_MAX = 80;
export const QC_REPORT_NO_MAX = 40;
export const QC_METHOD_MAX = 60;
export const DECISION_REASON_MAX = 500;

/**
 * One QC result for a product lot. The property must be one of the lot's specification; the unit and the
 * limits come from that specification, and the method too unless the lab used another one.
 */
export const QcResultSchema = z.object({
  productLotCode: code("Product lot"),
  property: requiredText("Property", 60),
  value: z.number({ error: "Result must be a number" }).finite("Result must be a finite number"),
  method: text("Test method", QC_METHOD_MAX).default(""),
  lab: text("Laboratory", QC_LAB_MAX).default(""),
  reportNo: text("Lab report number", QC_REPORT_NO_MAX).default(""),
  testedAt: when("Test date"),
});
export type QcResultInput = z.input<typeof QcResultSchema>;

/** Which specification a product lot is judged against: a built-in edition and grade, or a site specification. */
export const ChooseSpecSchema = z.object({
  productLotCode: code("Product lot"),
  specKey: requiredText("Specification", 120),
});
export type ChooseSpecInput = z.input<typeof ChooseSpecSchema>;

export const PRODUCT_DECISIONS = ["RELEASE", "RELEASE_WITH_DEVIATION", "HOLD", "REJECT"] as const;
export type ProductDecision = (typeof PRODUCT_DECISIONS)[number];

/** Release, release with a deviation, hold or reject. Every decision but a plain release needs a reason. */
export const ProductDecisionSchema = z
  .object({
    productLotCode: code("Product lot"),
    decision: z.enum(PRODUCT_DECISIONS, { error: "Decision: release, release with a deviation, hold or reject" }),
    reason: text("Reason", DECISION_REASON_MAX).default(""),
  })
  .refine((d) => d.decision === "RELEASE" || d.reason.length > 0, {
    message: "Reason is required for a deviation, a hold or a rejection",
    path: ["reason"],
  });
export type ProductDecisionInput = z.input<typeof ProductDecisionSchema>;
export type ProductDecisionValue = z.output<typeof ProductDecisionSchema>;

export const ShipmentSchema = z.object({
  documentNo: code("Document number"),
  customer: requiredText("Customer", 120),
  shippedAt: when("Shipped time"),
  fromKind: z.enum(["PRODUCT_LOT", "TANK"], { error: "Shipped from: a product lot or tank" }),
  fromCode: code("Shipped from"),
  massKg: massKg("Mass shipped"),
  volumeL: volumeL("Volume shipped"),
  certifiedClaim: z.boolean().default(false),
  note: text("Note", 300).default(""),
});
export type ShipmentInput = z.input<typeof ShipmentSchema>;
