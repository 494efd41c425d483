import { z } from "zod";
import { emptyAsMissing as blank, MAX_MASS_KG, massKg, oneOf, requiredText, text, when } from "@/lib/core/fields";
import { CARRY_FORWARD_MODES, NEGATIVE_BALANCE_POLICIES, OPERATOR_TYPES } from "@/lib/custody/custody-balance";
import { toGrams } from "@/lib/quantity/units";

export const MAX_SET_KEY_LENGTH = 120;
export const MAX_SET_ATTRIBUTES = 20;
export const MAX_MATERIAL_LENGTH = 40;
/**
 * Upper bound on a measured conversion factor (output mass ÷ input mass). The theoretical FAME yield of
 * triolein is 1.00455 kg per kg oil (computed from IUPAC 2021 atomic weights);
 * 1.5 leaves room for other steps and is only a typing-error guard (common practice, no source).
 */
export const MAX_CONVERSION_FACTOR = 1.5;

const material = (what: string) =>
  z
    .string({ error: `${what} is required` })
    .trim()
    .toUpperCase()
    .regex(
      /^[A-Z][A-Z0-9_]{0,39}$/,
      `${what}: use 1–${MAX_MATERIAL_LENGTH} capital letters, digits or "_", starting with a letter`,
    );

const setKey = z
  .string({ error: "Characteristic set is required" })
  .trim()
  .min(1, "Characteristic set is required")
  .max(MAX_SET_KEY_LENGTH, `Characteristic set: at most ${MAX_SET_KEY_LENGTH} characters`);

const grams = (what: string) => massKg(what).transform(toGrams);

export const CharacteristicSetSchema = z.object({
  key: setKey,
  /** Scheme, certificate number, material kind, country of origin, … */
  attributes: z
    .record(
      z.string().trim().min(1, "Attribute name is required").max(40, "Attribute name: at most 40 characters"),
      z.string({ error: "Attribute value must be text" }).trim().max(200, "Attribute value: at most 200 characters"),
    )
    .refine(
      (r) => Object.keys(r).length <= MAX_SET_ATTRIBUTES,
      `Characteristic set: at most ${MAX_SET_ATTRIBUTES} attributes`,
    ),
});
export type CharacteristicSetInput = z.input<typeof CharacteristicSetSchema>;

/** A measured yield of one process step into one output: kg out of kg of the step's input material. */
export const ConversionOutputSchema = z
  .object({
    material: material("Output material"),
    outputMassKg: z
      .number({ error: "Measured output (kg) must be a number" })
      .min(0, "Measured output must be at least 0 kg")
      .max(MAX_MASS_KG, `Measured output must be at most ${MAX_MASS_KG.toLocaleString("en")} kg`)
      .transform(toGrams),
    inputMassKg: grams("Measured input"),
  })
  .refine((o) => o.outputMassKg <= o.inputMassKg * MAX_CONVERSION_FACTOR, {
    error: `Conversion factor (output ÷ input) must be at most ${MAX_CONVERSION_FACTOR}`,
    path: ["outputMassKg"],
  })
  .transform((o) => ({ material: o.material, outputMassG: o.outputMassKg, inputMassG: o.inputMassKg }));

export const ConversionStepSchema = z.object({
  id: material("Process step"),
  inputMaterial: material("Input material"),
  outputs: z.array(ConversionOutputSchema).min(1, "Process step: give at least one output with its measured yield"),
  basis: requiredText("Basis of the measured yields", 300),
});
export type ConversionStepInput = z.input<typeof ConversionStepSchema>;

const bookingBase = {
  id: requiredText("Booking number", 60),
  at: when("Booking time").transform((d) => d.getTime()),
  setKey,
  reference: text("Reference", 120).optional(),
};

export const InputBookingSchema = z
  .object({
    kind: z.literal("INPUT"),
    ...bookingBase,
    material: material("Material"),
    massKg: grams("Certified input"),
  })
  .transform(({ massKg: massG, ...rest }) => ({ ...rest, massG }));

export const ConversionBookingSchema = z
  .object({
    kind: z.literal("CONVERSION"),
    ...bookingBase,
    stepId: material("Process step"),
    inputMassKg: grams("Processed input"),
  })
  .transform(({ inputMassKg: inputMassG, ...rest }) => ({ ...rest, inputMassG }));

/** A certified output claim, e.g. a shipment declared with a characteristic set. */
export const ClaimBookingSchema = z
  .object({
    kind: z.literal("CLAIM"),
    ...bookingBase,
    material: material("Claimed material"),
    massKg: grams("Claimed mass"),
  })
  .transform(({ massKg: massG, ...rest }) => ({ ...rest, massG }));

export const CustodyBookingSchema = z.union([InputBookingSchema, ConversionBookingSchema, ClaimBookingSchema], {
  error: "Booking kind must be INPUT, CONVERSION or CLAIM",
});
export type CustodyBookingInput = z.input<typeof CustodyBookingSchema>;

/** Site choices that adjust a named rule set. */
export const CustodySettingsSchema = z.object({
  operatorType: oneOf("Operator type", OPERATOR_TYPES),
  periodAnchorMonth: z
    .number({ error: "First month of the balance cycle must be a number" })
    .int("First month of the balance cycle must be a whole number")
    .min(1, "First month of the balance cycle must be 1–12")
    .max(12, "First month of the balance cycle must be 1–12")
    .default(1),
  carryForward: oneOf("Carry-forward", CARRY_FORWARD_MODES).optional(),
  negativeBalance: oneOf("Negative-balance policy", NEGATIVE_BALANCE_POLICIES).optional(),
});
export type CustodySettingsInput = z.input<typeof CustodySettingsSchema>;

/** The chain-of-custody page's query and GET /api/custody (documented in lib/api/endpoints/trace.ts). */
export const CustodyQuerySchema = z.object({
  /** A balance period label, e.g. "2026-Q4"; default: the period containing today. */
  period: z.preprocess(
    blank,
    z
      .string()
      .trim()
      .regex(
        /^\d{4}(-Q[1-4]|-\d{2})?$|^\d{4}-\d{2}-\d{2}\.\.\d{4}-\d{2}-\d{2}$/,
        "Period: a balance period label such as 2026-Q4",
      )
      .optional(),
  ),
  operatorType: z.preprocess(
    blank,
    z
      .enum(OPERATOR_TYPES, { error: `Operator type must be one of: ${OPERATOR_TYPES.join(", ")}` })
      .default("OTHER_OPERATOR"),
  ),
  /** Try a certified claim of this many kg of methyl ester now, without saving it. */
  claimKg: z.preprocess(
    blank,
    z.coerce
      .number({ error: "Claim (kg) must be a number" })
      .positive("Claim (kg) must be more than 0")
      .max(MAX_MASS_KG, `Claim must be at most ${MAX_MASS_KG.toLocaleString("en")} kg`)
      .optional(),
  ),
  claimSet: z.preprocess(
    blank,
    z
      .string()
      .trim()
      .max(MAX_SET_KEY_LENGTH, `Characteristic set: at most ${MAX_SET_KEY_LENGTH} characters`)
      .optional(),
  ),
});
export type CustodyQuery = z.output<typeof CustodyQuerySchema>;
