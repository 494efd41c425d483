import { z } from "zod";
import { MATERIAL_KINDS } from "@/lib/core/vocabulary";
import { code, oneOf, tempC, text, volumeL, when } from "@/lib/core/fields";
import { DISTANCE_BANDS } from "@/lib/core/vocabulary";

export const MAX_CONTAINERS = 200;
/** One pickup fills at most a collection truck; larger figures are typing errors. */
export const MAX_PICKUP_VOLUME_L = 40_000;
export const LOOKS = ["NONE", "TRACE", "LAYER"] as const;

export const PickupSchema = z
  .object({
    code: code("Pickup number"),
    sourceCode: code("Source code"),
    material: oneOf("Material", MATERIAL_KINDS),
    observedAt: when("Observed time"),
    containers: z
      .number({ error: "Containers must be a number" })
      .int("Containers must be a whole number")
      .min(1, "Containers must be at least 1")
      .max(MAX_CONTAINERS, `Containers must be at most ${MAX_CONTAINERS}`),
    containerTags: z.array(code("Container label")).max(MAX_CONTAINERS).default([]),
    volumeL: volumeL("Volume").max(
      MAX_PICKUP_VOLUME_L,
      `Volume (L) must be at most ${MAX_PICKUP_VOLUME_L.toLocaleString("en")} L for one pickup`,
    ),
    tempC: tempC("Oil temperature").max(90, "Oil temperature must be at most 90 °C for collected oil"),
    waterLook: z.enum(LOOKS, { error: "Water: choose none, trace or layer" }).default("NONE"),
    solidsLook: z.enum(LOOKS, { error: "Solids: choose none, trace or layer" }).default("NONE"),
    notes: text("Notes", 500).default(""),
    idempotencyKey: z.string().uuid("Idempotency key must be a UUID").optional(),
    /** How far the phone was from the source's address, as a band only, when the collector agreed to share it. */
    phoneDistanceBand: z.enum(DISTANCE_BANDS, { error: "Phone distance: not a known distance band" }).optional(),
  })
  .superRefine((p, ctx) => {
    const seen = new Set<string>();
    p.containerTags.forEach((tag, i) => {
      if (seen.has(tag))
        ctx.addIssue({
          code: "custom",
          path: ["containerTags", i],
          message: `Container label ${tag} appears twice in this pickup`,
        });
      seen.add(tag);
    });
    if (p.containerTags.length > 0 && p.containerTags.length !== p.containers) {
      ctx.addIssue({
        code: "custom",
        path: ["containerTags"],
        message: `Container labels: ${p.containerTags.length} given for ${p.containers} containers`,
      });
    }
  });
export type PickupInput = z.input<typeof PickupSchema>;
export type Pickup = z.output<typeof PickupSchema>;
