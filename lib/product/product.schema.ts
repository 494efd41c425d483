import { z } from "zod";
import { code, massKg, requiredText, text, volumeL, when } from "@/lib/ledger/fields";

export const ProductLotSchema = z.object({
  code: code("Product lot"),
  batchCode: code("Batch number").optional(),
  producedAt: when("Produced time"),
});
export type ProductLotInput = z.input<typeof ProductLotSchema>;

export const QcResultSchema = z
  .object({
    productLotCode: code("Product lot"),
    property: requiredText("Property", 60),
    method: requiredText("Test method", 60),
    value: z.number({ error: "Result must be a number" }).finite(),
    unit: requiredText("Unit", 20),
    limitMin: z.number().finite().optional(),
    limitMax: z.number().finite().optional(),
    specRef: requiredText("Specification", 80),
    testedAt: when("Test time"),
  })
  .refine((q) => q.limitMin === undefined || q.limitMax === undefined || q.limitMin <= q.limitMax, {
    message: "Limits: the minimum must not exceed the maximum",
    path: ["limitMin"],
  });
export type QcResultInput = z.input<typeof QcResultSchema>;

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
