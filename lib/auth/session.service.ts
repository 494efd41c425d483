import "server-only";
import { createHash, randomBytes } from "node:crypto";
import type { Db } from "@/lib/core/connect";
import type { Result } from "@/lib/core/result";
import { fail, ok } from "@/lib/core/result";
import { parseInput } from "@/lib/ledger/parse";
import type { SiteRole } from "@/lib/core/vocabulary";
import { verifyPassword } from "@/lib/auth/password";
import { SignInSchema } from "@/lib/auth/session.schema";
import {
  ABSOLUTE_TIMEOUT_MS,
  FAILURE_WINDOW_MS,
  isSessionLive,
  MAX_FAILURES_PER_IP,
  MAX_FAILURES_PER_LOGIN,
  MAX_FAILURES_PER_LOGIN_AND_IP,
} from "@/lib/auth/session-rules";
import {
  countRecentFailures,
  lastClearedAt,
  findSessionByTokenHash,
  findUserByLogin,
  insertSession,
  recordLoginAttempt,
  revokeSession,
  touchSession,
} from "@/lib/auth/session.store";

export interface SessionUser {
  siteId: number;
  userId: number;
  login: string;
  fullName: string;
  role: SiteRole;
  unitSystem: "metric" | "us";
  /** An administrator chose the password; nothing else opens until the user has chosen their own. */
  mustChangePassword: boolean;
}

export function hashToken(token: string): string {
  return createHash("sha256").update(token).digest("hex");
}

// A fixed hash to verify against when the user name is unknown, so timing does not reveal which names exist.
const DUMMY_HASH = "$argon2id$v=19$m=19456,t=2,p=1$nIrd+IzQrgV+EZy19JsjtA$FRA9JMj1F2Ekv5W8A1gGcDApx7N16Fg/dwM5cML1IDE";

/** Checks the password, throttles repeated failures per user name and per address, and opens a session. */
export async function signIn(
  db: Db,
  input: unknown,
  ctx: { ip: string; now: Date },
): Promise<Result<{ token: string; expiresAt: Date; user: SessionUser }>> {
  const parsed = parseInput(SignInSchema, input);
  if (!parsed.ok) return parsed;
  const { login, password } = parsed.value;
  const windowStart = new Date(ctx.now.getTime() - FAILURE_WINDOW_MS);
  const since = (await lastClearedAt(db, login, windowStart)) ?? windowStart;
  const limited =
    (await countRecentFailures(db, { login, ip: ctx.ip }, since)) >= MAX_FAILURES_PER_LOGIN_AND_IP ||
    (await countRecentFailures(db, { ip: ctx.ip }, windowStart)) >= MAX_FAILURES_PER_IP ||
    (await countRecentFailures(db, { login }, since)) >= MAX_FAILURES_PER_LOGIN;
  if (limited)
    return fail("AUTH.RATE_LIMITED", "Too many failed sign-ins; wait 15 minutes or ask the administrator", "password");
  const user = await findUserByLogin(db, login);
  const good = await verifyPassword(user?.passwordHash ?? DUMMY_HASH, password);
  await recordLoginAttempt(db, { login, ip: ctx.ip, ok: good && !!user?.active, at: ctx.now });
  if (!user || !good || !user.passwordHash)
    return fail("AUTH.BAD_CREDENTIALS", "User name or password is wrong", "password");
  if (!user.active) return fail("AUTH.DISABLED", "This account is disabled; ask the administrator", "login");
  const token = randomBytes(32).toString("base64url");
  const expiresAt = new Date(ctx.now.getTime() + ABSOLUTE_TIMEOUT_MS);
  await insertSession(db, { tokenHash: hashToken(token), userId: user.id, createdAt: ctx.now, expiresAt });
  return ok({
    token,
    expiresAt,
    user: {
      siteId: user.siteId,
      userId: user.id,
      login: user.login,
      fullName: user.fullName,
      role: user.role,
      unitSystem: user.unitSystem === "us" ? "us" : "metric",
      mustChangePassword: user.mustChangePassword,
    },
  });
}

/** The signed-in user for a session token, or null when the session is unknown, revoked, expired or idle. */
export async function resolveSession(db: Db, token: string, now: Date): Promise<SessionUser | null> {
  const s = await findSessionByTokenHash(db, hashToken(token));
  if (!s || !s.user.active || !isSessionLive(s, now)) return null;
  if (now.getTime() - s.lastSeenAt.getTime() > 60_000) await touchSession(db, s.id, now);
  return {
    siteId: s.user.siteId,
    userId: s.user.id,
    login: s.user.login,
    fullName: s.user.fullName,
    role: s.user.role,
    unitSystem: s.user.unitSystem === "us" ? "us" : "metric",
    mustChangePassword: s.user.mustChangePassword,
  };
}

export async function signOut(db: Db, token: string, now: Date): Promise<void> {
  await revokeSession(db, hashToken(token), now);
}
