// Session and sign-in limits (OWASP ASVS 5.0 V6.3 / V7.3 style; the numbers are our defaults).

/** A session ends after this long without use. */
export const IDLE_TIMEOUT_MS = 12 * 3_600_000;
/** …and in any case this long after sign-in. */
export const ABSOLUTE_TIMEOUT_MS = 7 * 24 * 3_600_000;
/** Failed sign-ins for one user name within the window before further tries are refused. */
export const MAX_FAILURES_PER_LOGIN = 5;
/** Failed sign-ins from one address within the window. */
export const MAX_FAILURES_PER_IP = 20;
export const FAILURE_WINDOW_MS = 15 * 60_000;

export function isSessionLive(s: { createdAt: Date; lastSeenAt: Date; expiresAt: Date; revokedAt: Date | null }, now: Date): boolean {
  if (s.revokedAt !== null) return false;
  if (now.getTime() >= s.expiresAt.getTime()) return false;
  return now.getTime() - s.lastSeenAt.getTime() < IDLE_TIMEOUT_MS;
}
