import { z } from "zod";
import { MATERIAL_KINDS, SOURCE_KINDS } from "@/lib/core/vocabulary";
import { code, oneOf, requiredText, text, when } from "@/lib/core/fields";

export const MAX_PICKUP_INTERVAL_DAYS = 365;

export const SourceSchema = z
  .object({
    code: code("Source code"),
    name: requiredText("Source name", 120),
    kind: oneOf("Source kind", SOURCE_KINDS),
    materials: z
      .array(oneOf("Material", MATERIAL_KINDS))
      .min(1, "Materials: name at least one material this source supplies"),
    address: text("Address", 200).default(""),
    certificateNo: text("Certificate number", 60).optional(),
    certificateScheme: text("Certificate scheme", 60).optional(),
    certificateExpires: when("Certificate expiry").optional(),
    pickupEveryDays: z
      .number({ error: "Pickup interval (days) must be a number" })
      .int("Pickup interval must be whole days")
      .min(1, "Pickup interval must be at least 1 day")
      .max(MAX_PICKUP_INTERVAL_DAYS, `Pickup interval must be at most ${MAX_PICKUP_INTERVAL_DAYS} days`)
      .optional(),
    collectorNote: text("Note for the collector", 500).default(""),
  })
  .refine((s) => (s.certificateNo === undefined) === (s.certificateExpires === undefined), {
    message: "Certificate expiry: give both a certificate number and its expiry date, or neither",
    path: ["certificateExpires"],
  });
export type SourceInput = z.input<typeof SourceSchema>;
export type Source = z.output<typeof SourceSchema>;
