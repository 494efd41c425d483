import { z } from "zod";
import { MATERIAL_KINDS } from "@/lib/core/vocabulary";
import { code, oneOf, requiredText, tempC, text, volumeL, when } from "@/lib/core/fields";
import { gs1LotElement } from "@/lib/labels/gs1";

export const MIN_DENSITY_KG_M3 = 500;
export const MAX_DENSITY_KG_M3 = 1500;

const density = z
  .number({ error: "Density (kg/m³) must be a number" })
  .min(MIN_DENSITY_KG_M3, "Density must be between 0.5 and 1.5 kg/L")
  .max(MAX_DENSITY_KG_M3, "Density must be between 0.5 and 1.5 kg/L");

/**
 * A lot number must fit the GS1 symbol on its label: AI (10), at most 20 characters of GS1 character
 * set 82 (GS1 General Specifications, AI (10) and Figure 7.11-1), so a trade scanner can read it.
 */
const lotNumber = code("Lot number").superRefine((lot, ctx) => {
  const element = gs1LotElement(lot);
  if (!element.ok)
    ctx.addIssue({
      code: "custom",
      message: `${element.issues[0]?.message ?? "Lot number cannot be carried in a GS1 barcode"}, so it could not go in the label's barcode`,
    });
});

const common = {
  code: lotNumber,
  material: oneOf("Material", MATERIAL_KINDS),
  receivedAt: when("Received time"),
  observedVolumeL: volumeL("Observed volume"),
  observedTempC: tempC("Observed temperature"),
  /** Measured density at 15 °C; when absent the material's table value is used. */
  densityKgM3: density.optional(),
  certified: z.boolean().default(false),
  notes: text("Notes", 500).default(""),
};

/** A lot made of one or more of the day's pickups (pooled). */
export const LotFromPickupsSchema = z.object({
  ...common,
  pickupCodes: z.array(code("Pickup number")).min(1, "Pickups: choose at least one pickup"),
});
export type LotFromPickupsInput = z.input<typeof LotFromPickupsSchema>;

/**
 * Pickups pooled straight into a tank. Material is drawn only from an accepted lot, so the lot is
 * accepted here explicitly, by the person receiving, with a short reason (e.g. "tank sample titrated").
 */
export const LotIntoTankSchema = LotFromPickupsSchema.extend({
  tankCode: code("Tank"),
  acceptReason: requiredText("Reason for accepting", 200),
});
export type LotIntoTankInput = z.input<typeof LotIntoTankSchema>;

/** A lot delivered by a supplier (tanker or drums), not collected by our trucks. */
export const DeliveryLotSchema = z.object({
  ...common,
  supplierCode: code("Supplier code"),
  deliveryDocument: text("Delivery document", 60).min(1, "Delivery document is required"),
});
export type DeliveryLotInput = z.input<typeof DeliveryLotSchema>;

export const LabTestSchema = z.object({
  lotCode: code("Lot number"),
  testedAt: when("Test time"),
  kind: z.enum(["WATER", "INSOLUBLES", "UNSAPONIFIABLES"], {
    error: "Test: choose water, insolubles or unsaponifiables",
  }),
  method: text("Method", 80).min(1, "Method is required"),
  valuePct: z
    .number({ error: "Result (%) must be a number" })
    .min(0, "Result must be at least 0 %")
    .max(100, "Result must be at most 100 %"),
});
export type LabTestInput = z.input<typeof LabTestSchema>;

export const LotDecisionSchema = z.object({
  lotCode: code("Lot number"),
  status: z.enum(["ACCEPTED", "REJECTED"], { error: "Decision: accept or reject" }),
});
