import { z } from "zod";
import { MIXING_MODELS, TANK_SERVICES } from "@/lib/core/vocabulary";
import { code, massKg, MAX_VOLUME_L, oneOf, requiredText, tempC, text, volumeL, when } from "@/lib/core/fields";
import { MAX_DENSITY_KG_M3, MIN_DENSITY_KG_M3 } from "@/lib/quantity/density.schema";
import { strappingProblems } from "@/lib/tank/strapping";

export const TankSchema = z.object({
  code: code("Tank code"),
  name: requiredText("Tank name", 80),
  service: oneOf("Service", TANK_SERVICES),
  capacityL: volumeL("Capacity"),
  mixing: oneOf("Mixing model", MIXING_MODELS).default("MIXED"),
  /** Calibration table [[levelMm, volumeL], ...], levels ascending; absent when the tank has none. */
  strapping: z
    .array(z.array(z.number({ error: "Calibration table: each entry must be a number" })), {
      error: "Calibration table: a list of [level mm, volume L] rows",
    })
    .optional()
    .superRefine((rows, ctx) => {
      if (rows === undefined) return;
      for (const p of strappingProblems(rows)) ctx.addIssue({ code: "custom", message: `Calibration table: ${p}` });
    }),
});
export type TankInput = z.input<typeof TankSchema>;

/** Moving material from a lot or tank into a tank (or between tanks). */
export const TransferSchema = z
  .object({
    fromCode: code("From"),
    fromKind: z.enum(["LOT", "TANK", "PRODUCT_LOT"], { error: "From: a lot, tank or product lot" }),
    toTankCode: code("To tank"),
    at: when("Transfer time"),
    /** How much: a mass, or a volume observed at a temperature (converted with the source's density), or all of it. */
    massKg: massKg("Mass").optional(),
    volumeL: volumeL("Volume").optional(),
    tempC: tempC("Temperature").optional(),
    all: z.boolean({ error: "All: yes or no" }).default(false),
    note: text("Note", 300).default(""),
  })
  .superRefine((t, ctx) => {
    const given = [t.all, t.massKg !== undefined, t.volumeL !== undefined].filter(Boolean).length;
    if (given === 0)
      ctx.addIssue({
        code: "custom",
        path: ["massKg"],
        message: "Mass (kg) is required, or give a volume and its temperature, or move all of it",
      });
    if (given > 1)
      ctx.addIssue({
        code: "custom",
        path: [t.volumeL !== undefined ? "volumeL" : "massKg"],
        message: "Give one quantity: a mass, a volume at a temperature, or all of it",
      });
    if (t.volumeL !== undefined && t.tempC === undefined)
      ctx.addIssue({
        code: "custom",
        path: ["tempC"],
        message: "Temperature (°C) at which the volume was read is required",
      });
  });
export type TransferInput = z.input<typeof TransferSchema>;

export const GAUGE_METHODS = ["VOLUME", "LEVEL"] as const;
/** Bounds of a level reading (mm); a 20 m tank is beyond a small plant (common practice). */
export const MAX_LEVEL_MM = 20_000;

/**
 * A tank gauge: the volume read directly, or the level (mm) read through the tank's calibration table.
 * The earlier shape {tankCode, at, volumeL, tempC} still parses (method defaults to a direct volume).
 */
export const GaugeSchema = z
  .object({
    tankCode: code("Tank code"),
    at: when("Gauge time"),
    method: oneOf("Reading", GAUGE_METHODS).default("VOLUME"),
    volumeL: z
      .number({ error: "Gauged volume (L) must be a number" })
      .min(0, "Gauged volume must be at least 0 L")
      .max(MAX_VOLUME_L, `Gauged volume must be at most ${MAX_VOLUME_L.toLocaleString("en")} L`)
      .optional(),
    levelMm: z
      .number({ error: "Level (mm) must be a number" })
      .int("Level: whole millimetres")
      .min(0, "Level must be at least 0 mm")
      .max(MAX_LEVEL_MM, `Level must be at most ${MAX_LEVEL_MM.toLocaleString("en")} mm`)
      .optional(),
    tempC: tempC("Temperature"),
    /** Density at 15 °C measured on a sample; when absent the tank service's table density is used. */
    densityKgM3: z
      .number({ error: "Density at 15 °C (kg/m³) must be a number" })
      .min(MIN_DENSITY_KG_M3, "Density at 15 °C must be between 500 and 1,500 kg/m³")
      .max(MAX_DENSITY_KG_M3, "Density at 15 °C must be between 500 and 1,500 kg/m³")
      .optional(),
    note: text("Note", 300).default(""),
  })
  .superRefine((g, ctx) => {
    if (g.method === "VOLUME" && g.volumeL === undefined)
      ctx.addIssue({ code: "custom", path: ["volumeL"], message: "Gauged volume (L) is required" });
    if (g.method === "LEVEL" && g.levelMm === undefined)
      ctx.addIssue({ code: "custom", path: ["levelMm"], message: "Level (mm) is required" });
  });
export type GaugeInput = z.input<typeof GaugeSchema>;
