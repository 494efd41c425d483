import { z } from "zod";
import { WASTE_STREAMS } from "@/lib/ledger/kinds";
import { code, massKg, oneOf, percent, requiredText, volumeL, when } from "@/lib/ledger/fields";

export const WasteContainerSchema = z.object({
  code: code("Container code"),
  stream: oneOf("Stream", WASTE_STREAMS),
  accumulationStart: when("Accumulation start"),
  capacityL: volumeL("Capacity"),
  satellite: z.boolean().default(false),
  methanolPct: percent("Methanol").optional(),
  pH: z.number({ error: "pH must be a number" }).min(0, "pH must be between 0 and 14").max(14, "pH must be between 0 and 14").optional(),
  flashPointC: z
    .number({ error: "Flash point (°C) must be a number" })
    .min(-50, "Flash point must be at least −50 °C")
    .max(300, "Flash point must be at most 300 °C")
    .optional(),
  waterPct: percent("Water").optional(),
});
export type WasteContainerInput = z.input<typeof WasteContainerSchema>;

export const DisposalSchema = z.object({
  documentNo: code("Manifest or document number"),
  hauler: requiredText("Hauler", 120),
  disposedAt: when("Collected time"),
  containerCode: code("Container code"),
  massKg: massKg("Mass collected"),
});
export type DisposalInput = z.input<typeof DisposalSchema>;
