import { z } from "zod";
import { MAX_PASSWORD_LENGTH } from "@/lib/auth/password";

export const SignInSchema = z.object({
  login: z
    .string({ error: "User name is required" })
    .trim()
    .toLowerCase()
    .min(1, "User name is required")
    .max(80, "User name: at most 80 characters"),
  password: z
    .string({ error: "Password is required" })
    .min(1, "Password is required")
    .max(MAX_PASSWORD_LENGTH, `Password: at most ${MAX_PASSWORD_LENGTH} characters`),
});
export type SignInInput = z.input<typeof SignInSchema>;
