// Field builders shared by the record schemas, so every entry path shows the same messages.
import { z } from "zod";

export const MAX_MASS_KG = 2_000_000; // one record; masses are stored as integer grams in 32-bit columns
export const MAX_VOLUME_L = 2_000_000;
export const MIN_TEMP_C = -40;
export const MAX_TEMP_C = 150;
export const CODE_PATTERN = /^[A-Z0-9][A-Z0-9._/-]{0,39}$/;

export const code = (what: string) =>
  z
    .string({ error: `${what} is required` })
    .trim()
    .toUpperCase()
    .regex(CODE_PATTERN, `${what}: use 1–40 letters, digits, ".", "_", "/" or "-"`);

/** C0 control characters other than tab and line breaks, and DEL: never meant in a record, and PostgreSQL refuses NUL. */
export const CONTROL_CHARACTERS = /[\u0000-\u0008\u000B\u000C\u000E-\u001F\u007F]/;

export const text = (what: string, max = 200) =>
  z
    .string({ error: `${what} must be text` })
    .trim()
    .max(max, `${what}: at most ${max} characters`)
    .refine((v) => !CONTROL_CHARACTERS.test(v), `${what}: contains a control character (check the text's encoding)`);

export const requiredText = (what: string, max = 200) => text(what, max).min(1, `${what} is required`);

export const massKg = (what: string) =>
  z
    .number({ error: `${what} (kg) must be a number` })
    .finite(`${what} (kg) must be a finite number`)
    .positive(`${what} (kg) must be more than 0`)
    .max(MAX_MASS_KG, `${what} (kg) must be at most ${MAX_MASS_KG.toLocaleString("en")} kg`);

export const volumeL = (what: string) =>
  z
    .number({ error: `${what} (L) must be a number` })
    .finite(`${what} (L) must be a finite number`)
    .positive(`${what} (L) must be more than 0`)
    .max(MAX_VOLUME_L, `${what} (L) must be at most ${MAX_VOLUME_L.toLocaleString("en")} L`);

export const tempC = (what: string) =>
  z
    .number({ error: `${what} (°C) must be a number` })
    .min(MIN_TEMP_C, `${what} must be at least ${MIN_TEMP_C} °C`)
    .max(MAX_TEMP_C, `${what} must be at most ${MAX_TEMP_C} °C`);

export const percent = (what: string) =>
  z
    .number({ error: `${what} (%) must be a number` })
    .min(0, `${what} must be at least 0 %`)
    .max(100, `${what} must be at most 100 %`);

export const when = (what: string) =>
  z.coerce
    .date({ error: `${what} must be a date and time` })
    .refine((d) => !Number.isNaN(d.getTime()), `${what} must be a valid date`);

export const oneOf = <T extends readonly [string, ...string[]]>(what: string, values: T) =>
  z.enum(values, { error: `${what} must be one of: ${values.join(", ")}` });

/** Record numbers are 32-bit integer columns on both databases. */
export const MAX_RECORD_ID = 2_147_483_647;
export const id = (what: string) =>
  z
    .number({ error: `${what} must be a record number` })
    .int(`${what} must be a whole number`)
    .positive(`${what} must be a record number`)
    .max(MAX_RECORD_ID, `${what} is not a record number (too large)`);

/** Query strings send "" for an empty field: read it as missing (z.preprocess(emptyAsMissing, …)). */
export const emptyAsMissing = (v: unknown): unknown => (v === "" || v === null ? undefined : v);
