import { z } from "zod";
import { code, id, requiredText, text, when } from "@/lib/core/fields";
import { SOURCE_KINDS } from "@/lib/core/vocabulary";
import { CAPACITY_BASES } from "@/lib/screening/capacity";
import { DISTANCE_BANDS } from "@/lib/core/vocabulary";

export const MAX_SCREEN_DAYS = 3700;
export const MAX_FRYERS = 200;
export const MAX_FRYER_LITRES = 2000;
export const MAX_CHANGES_PER_WEEK = 21;
export const MAX_LITRES_PER_MONTH = 10_000_000;

const num = (what: string, min: number, max: number, unit: string) =>
  z
    .number({ error: `${what} must be a number` })
    .min(min, `${what} must be at least ${min} ${unit}`)
    .max(max, `${what} must be at most ${max} ${unit}`);
const hour = (what: string) =>
  z
    .number({ error: `${what} must be an hour` })
    .int(`${what} must be a whole hour`)
    .min(0, `${what} must be 0–24`)
    .max(24, `${what} must be 0–24`);

/** What a source can plausibly give, as declared to compliance. */
export const SourceProfileSchema = z
  .object({
    sourceCode: code("Source"),
    kind: z.enum(SOURCE_KINDS, { error: "Kind: choose one of the listed kinds" }),
    capacityBasis: z.enum(CAPACITY_BASES, { error: "Capacity: choose fryers or a monthly volume" }).optional(),
    fryers: num("Fryers", 1, MAX_FRYERS, "fryers").int("Fryers must be a whole number").optional(),
    fryerLitres: num("Litres per fryer", 1, MAX_FRYER_LITRES, "L").optional(),
    changesPerWeek: num("Oil changes a week", 0.1, MAX_CHANGES_PER_WEEK, "a week").optional(),
    declaredLitresPerMonth: num("Declared volume", 1, MAX_LITRES_PER_MONTH, "L a month").optional(),
    capacityDeclaredAt: when("Declared on").optional(),
    capacityDeclaredBy: text("Declared by", 120).optional(),
    pickupEveryDays: num("Pickup interval", 1, 365, "days").int("Pickup interval must be whole days").optional(),
    latitude: num("Latitude", -90, 90, "°").optional(),
    longitude: num("Longitude", -180, 180, "°").optional(),
    opensHour: hour("Opens at").optional(),
    closesHour: hour("Closes at").optional(),
  })
  .refine(
    (s) =>
      s.capacityBasis !== "FRYERS" ||
      (s.fryers !== undefined && s.fryerLitres !== undefined && s.changesPerWeek !== undefined),
    {
      message: "Fryers: give the number of fryers, litres per fryer and oil changes a week",
      path: ["fryers"],
    },
  )
  .refine((s) => s.capacityBasis !== "MONTHLY" || s.declaredLitresPerMonth !== undefined, {
    message: "Declared volume: give the litres a month",
    path: ["declaredLitresPerMonth"],
  })
  .refine(
    (s) => s.capacityBasis === undefined || (s.capacityDeclaredAt !== undefined && (s.capacityDeclaredBy ?? "") !== ""),
    {
      message: "Declared by: say who declared the capacity and when",
      path: ["capacityDeclaredBy"],
    },
  )
  .refine((s) => (s.latitude === undefined) === (s.longitude === undefined), {
    message: "Longitude: give both latitude and longitude, or neither",
    path: ["longitude"],
  })
  .refine((s) => (s.opensHour === undefined) === (s.closesHour === undefined), {
    message: "Closes at: give both opening and closing hours, or neither",
    path: ["closesHour"],
  });
export type SourceProfileInput = z.input<typeof SourceProfileSchema>;
export type SourceProfile = z.output<typeof SourceProfileSchema>;

/** Screen every source over a chosen period. */
export const ScreenPeriodSchema = z
  .object({ from: when("From"), to: when("To") })
  .refine((p) => p.to > p.from, { message: "To: must be after From", path: ["to"] })
  .refine((p) => p.to.getTime() - p.from.getTime() <= MAX_SCREEN_DAYS * 86_400_000, {
    message: `To: a screen covers at most ${MAX_SCREEN_DAYS} days`,
    path: ["to"],
  });
export type ScreenPeriodInput = z.input<typeof ScreenPeriodSchema>;

/** Compliance's decision on a flag. Confirming may put the source on watch, hold its lots and withhold its certified credit. */
export const FlagDecisionSchema = z
  .object({
    flagId: id("Flag"),
    decision: z.enum(["CONFIRM", "DISMISS"], { error: "Decision: confirm or dismiss" }),
    reason: text("Reason", 500).default(""),
    watch: z.boolean().default(false),
    holdLots: z.boolean().default(false),
    withholdCredit: z.boolean().default(false),
  })
  .refine((d) => d.decision !== "DISMISS" || d.reason.trim() !== "", {
    message: "Reason: say why the flag is dismissed",
    path: ["reason"],
  });
export type FlagDecisionInput = z.input<typeof FlagDecisionSchema>;

/** Clearing a source: watch lifted, credit released, held lots returned to their status. */
export const ClearSourceSchema = z.object({ sourceCode: code("Source"), reason: requiredText("Reason", 500) });

/** The distance band the collect page sends with a pickup when the phone shared its location. */
export const DistanceBandSchema = z.enum(DISTANCE_BANDS, { error: "Distance band: not a known band" });
