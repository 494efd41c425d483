import { z } from "zod";
import { code, massKg, tempC, text, volumeL, when } from "@/lib/core/fields";

/** How many lines one shipment may have (one per compartment load is the usual case). */
export const MAX_SHIPMENT_LINES = 12;

/**
 * One line of a shipment: finished fuel from one released product lot or one product tank. The
 * quantity is a mass in kg, or a volume in litres with its temperature (the mass then comes from the
 * fuel's density at that temperature). A volume given with a mass is recorded as stated.
 */
export const ShipmentLineSchema = z
  .object({
    fromKind: z.enum(["PRODUCT_LOT", "TANK"], { error: "Loaded from: a product lot or a product tank" }),
    fromCode: code("Loaded from"),
    massKg: massKg("Quantity").optional(),
    volumeL: volumeL("Quantity").optional(),
    tempC: tempC("Temperature").optional(),
  })
  .refine((l) => l.massKg !== undefined || l.volumeL !== undefined, {
    message: "Quantity is required (kg, or litres with the temperature)",
    path: ["massKg"],
  })
  .refine((l) => l.massKg !== undefined || l.volumeL === undefined || l.tempC !== undefined, {
    message: "Temperature (°C) is needed to turn litres into kilograms",
    path: ["tempC"],
  });
export type ShipmentLineInput = z.input<typeof ShipmentLineSchema>;
export type ShipmentLine = z.output<typeof ShipmentLineSchema>;

export const ShipmentRecordSchema = z.object({
  documentNo: code("Document number"),
  customerCode: code("Customer"),
  shippedAt: when("Shipped time"),
  vehicle: text("Vehicle", 60).default(""),
  compartment: text("Compartment", 60).default(""),
  certifiedClaim: z.boolean({ error: "Certified claim: yes or no" }).default(false),
  note: text("Note", 300).default(""),
  lines: z
    .array(ShipmentLineSchema, { error: "Lines: give at least one line" })
    .min(1, "Lines: give at least one line")
    .max(MAX_SHIPMENT_LINES, `Lines: at most ${MAX_SHIPMENT_LINES} per shipment`),
});
export type ShipmentRecordInput = z.input<typeof ShipmentRecordSchema>;
export type ShipmentRecord = z.output<typeof ShipmentRecordSchema>;
