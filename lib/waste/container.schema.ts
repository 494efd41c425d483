import { z } from "zod";
import { WASTE_STREAMS } from "@/lib/core/vocabulary";
import { code, massKg, percent, requiredText, text, volumeL, when } from "@/lib/core/fields";
import { MAX_FLASH_POINT_C, MAX_PH, MIN_FLASH_POINT_C, MIN_PH } from "@/lib/waste/waste.schema";

const pH = z
  .number({ error: "pH must be a number" })
  .min(MIN_PH, `pH must be between ${MIN_PH} and ${MAX_PH}`)
  .max(MAX_PH, `pH must be between ${MIN_PH} and ${MAX_PH}`);
const flashPointC = z
  .number({ error: "Flash point (°C) must be a number" })
  .min(MIN_FLASH_POINT_C, `Flash point must be at least ${MIN_FLASH_POINT_C} °C`)
  .max(MAX_FLASH_POINT_C, `Flash point must be at most ${MAX_FLASH_POINT_C} °C`);

const stream = z.enum(WASTE_STREAMS, {
  error: "Stream: choose glycerol phase, wash water, spent filter media, methanol-rich liquid or other",
});

export const WasteContainerSchema = z.object({
  code: code("Container code"),
  stream,
  /** Where the container stands (a bay, a pad, a satellite area near the reactor). */
  location: text("Location", 120).default(""),
  accumulationStart: when("Accumulation start"),
  capacityL: volumeL("Capacity"),
  satellite: z.boolean({ error: "Satellite area must be yes or no" }).default(false),
  methanolPct: percent("Methanol").optional(),
  pH: pH.optional(),
  flashPointC: flashPointC.optional(),
  waterPct: percent("Water").optional(),
});
export type WasteContainerInput = z.input<typeof WasteContainerSchema>;

/**
 * A lab characterisation of a container's contents. Each value is optional (never assumed), but at
 * least one must be given; the values replace the container's current ones.
 */
export const WasteCharacterisationEntrySchema = z
  .object({
    containerCode: code("Container code"),
    testedAt: when("Test date"),
    /** Alcohol content, % by volume. */
    methanolPct: percent("Methanol").optional(),
    pH: pH.optional(),
    /** Closed-cup flash point. */
    flashPointC: flashPointC.optional(),
    /** Water content, % by weight. */
    waterPct: percent("Water").optional(),
  })
  .refine(
    (c) => c.methanolPct !== undefined || c.pH !== undefined || c.flashPointC !== undefined || c.waterPct !== undefined,
    {
      message: "Enter at least one result: methanol, pH, flash point or water",
      path: ["methanolPct"],
    },
  );
export type WasteCharacterisationEntryInput = z.input<typeof WasteCharacterisationEntrySchema>;

export const MarkContainerFullSchema = z.object({
  containerCode: code("Container code"),
  fullAt: when("Full on"),
});
export type MarkContainerFullInput = z.input<typeof MarkContainerFullSchema>;

export const DisposalSchema = z.object({
  documentNo: code("Manifest or document number"),
  hauler: requiredText("Hauler", 120),
  disposedAt: when("Collected time"),
  containerCode: code("Container code"),
  massKg: massKg("Mass collected"),
  /** The receiving treatment, recycling or disposal facility. */
  destination: requiredText("Destination facility", 160),
});
export type DisposalInput = z.input<typeof DisposalSchema>;
