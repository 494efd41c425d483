// Session and sign-in limits (OWASP ASVS 5.0 V6.3 / V7.3 style; the numbers are our defaults).

/** A session ends after this long without use. */
export const IDLE_TIMEOUT_MS = 12 * 3_600_000;
/** …and in any case this long after sign-in. */
export const ABSOLUTE_TIMEOUT_MS = 7 * 24 * 3_600_000;
/**
 * Failed sign-ins for one user name from one address within the window before that address is refused
 * for that name: a stranger guessing from elsewhere cannot lock staff out of their own account.
 */
export const MAX_FAILURES_PER_LOGIN_AND_IP = 5;
/** Failed sign-ins from one address, for any names, within the window. */
export const MAX_FAILURES_PER_IP = 20;
/** Failed sign-ins for one user name from every address together (guessing spread over many addresses). */
export const MAX_FAILURES_PER_LOGIN = 50;
/** What an administrator's unlock is recorded as in the sign-in log (it clears the count like a sign-in). */
export const UNLOCK_ADDRESS = "administrator unlock";
export const FAILURE_WINDOW_MS = 15 * 60_000;

export function isSessionLive(
  s: { createdAt: Date; lastSeenAt: Date; expiresAt: Date; revokedAt: Date | null },
  now: Date,
): boolean {
  if (s.revokedAt !== null) return false;
  if (now.getTime() >= s.expiresAt.getTime()) return false;
  return now.getTime() - s.lastSeenAt.getTime() < IDLE_TIMEOUT_MS;
}
