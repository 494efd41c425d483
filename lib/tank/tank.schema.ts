import { z } from "zod";
import { MIXING_MODELS, TANK_SERVICES } from "@/lib/ledger/kinds";
import { code, massKg, oneOf, requiredText, tempC, text, volumeL, when } from "@/lib/ledger/fields";

export const TankSchema = z.object({
  code: code("Tank code"),
  name: requiredText("Tank name", 80),
  service: oneOf("Service", TANK_SERVICES),
  capacityL: volumeL("Capacity"),
  mixing: oneOf("Mixing model", MIXING_MODELS).default("MIXED"),
});
export type TankInput = z.input<typeof TankSchema>;

/** Moving material from a lot or tank into a tank (or between tanks). */
export const TransferSchema = z.object({
  fromCode: code("From"),
  fromKind: z.enum(["LOT", "TANK", "PRODUCT_LOT"], { error: "From: a lot, tank or product lot" }),
  toTankCode: code("To tank"),
  at: when("Transfer time"),
  massKg: massKg("Mass"),
  note: text("Note", 300).default(""),
});
export type TransferInput = z.input<typeof TransferSchema>;

export const GaugeSchema = z.object({
  tankCode: code("Tank code"),
  at: when("Gauge time"),
  volumeL: z.number({ error: "Gauged volume (L) must be a number" }).min(0, "Gauged volume must be at least 0 L").max(2_000_000),
  tempC: tempC("Temperature"),
});
export type GaugeInput = z.input<typeof GaugeSchema>;
