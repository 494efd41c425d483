import { z } from "zod";
import { MAX_PASSWORD_LENGTH, MIN_PASSWORD_LENGTH } from "@/lib/auth/password";
import { SITE_ROLES } from "@/lib/core/vocabulary";
import { oneOf, requiredText } from "@/lib/core/fields";

/** Sign-in names: lower-case letters, digits, dot, dash, underscore (what people type on a phone without surprises). */
export const LOGIN_PATTERN = /^[a-z0-9][a-z0-9._-]{2,79}$/;

const login = z
  .string({ error: "User name is required" })
  .trim()
  .toLowerCase()
  .regex(
    LOGIN_PATTERN,
    "User name: 3 to 80 characters, lower-case letters, digits, dot, dash or underscore, starting with a letter or digit",
  );

// OWASP ASVS 5.0 V6.2: length is the rule (no composition rules); spaces and any characters allowed.
const password = z
  .string({ error: "Password is required" })
  .min(MIN_PASSWORD_LENGTH, `Password: at least ${MIN_PASSWORD_LENGTH} characters`)
  .max(MAX_PASSWORD_LENGTH, `Password: at most ${MAX_PASSWORD_LENGTH} characters`);

const reason = requiredText("Reason", 300).refine(
  (r) => r.length >= 3,
  "Reason: say in a few words why (at least 3 characters)",
);

export const UserCreateSchema = z.object({
  login,
  fullName: requiredText("Full name", 120),
  role: oneOf("Role", SITE_ROLES),
  unitSystem: oneOf("Units", ["metric", "us"] as const).default("metric"),
  password,
});
export type UserCreateInput = z.input<typeof UserCreateSchema>;
export type UserCreate = z.output<typeof UserCreateSchema>;

export const UserChangeSchema = z
  .object({
    login,
    role: oneOf("Role", SITE_ROLES).optional(),
    active: z.boolean({ error: "Active must be yes or no" }).optional(),
    unitSystem: oneOf("Units", ["metric", "us"] as const).optional(),
    reason,
  })
  .refine((c) => c.role !== undefined || c.active !== undefined || c.unitSystem !== undefined, {
    message: "Change: choose a role, units or active state to change",
    path: ["role"],
  });
export type UserChangeInput = z.input<typeof UserChangeSchema>;

export const PasswordResetSchema = z.object({ login, password, reason });
export type PasswordResetInput = z.input<typeof PasswordResetSchema>;

export const RevokeSessionsSchema = z.object({ login, reason });

export const OwnUnitsSchema = z.object({ unitSystem: oneOf("Units", ["metric", "us"] as const) });

/** A user replacing the password an administrator gave them (or any time, from their settings). */
export const OwnPasswordSchema = z
  .object({
    current: z
      .string({ error: "Current password is required" })
      .min(1, "Current password is required")
      .max(MAX_PASSWORD_LENGTH, "Current password is wrong"),
    password,
    confirm: z.string({ error: "Type the new password again" }),
  })
  .refine((p) => p.password === p.confirm, { message: "The two new passwords differ", path: ["confirm"] })
  .refine((p) => p.password !== p.current, {
    message: "Choose a password different from the one you were given",
    path: ["password"],
  });
