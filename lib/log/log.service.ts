import "server-only";
import { randomBytes } from "node:crypto";
import pino from "pino";

/**
 * One structured log for the server: JSON lines on standard output, one object per event. Bodies and
 * passwords never go in; an unexpected error carries its reference, the route, the user id and the stack.
 */
export const log = pino(
  {
    level: process.env.LOG_LEVEL ?? "info",
    base: { app: "tracevat" },
    redact: { paths: ["password", "*.password", "body", "*.body", "headers.cookie"], remove: true },
  },
  // Through process.stdout (not a worker transport): works inside Next's server bundle, and in order.
  process.stdout,
);

/** A short reference a person can read out over the phone: 8 letters and digits, no look-alikes. */
export function newReference(): string {
  const alphabet = "ABCDEFGHJKMNPQRSTUVWXYZ23456789";
  return Array.from(randomBytes(8), (b) => alphabet[b % alphabet.length]).join("");
}
