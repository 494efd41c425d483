import "server-only";
import { appendAudit } from "@/lib/audit/audit.store";
import { hashPassword, verifyPassword } from "@/lib/auth/password";
import {
  OwnPasswordSchema,
  OwnUnitsSchema,
  PasswordResetSchema,
  RevokeSessionsSchema,
  UserChangeSchema,
  UserCreateSchema,
} from "@/lib/auth/user.schema";
import {
  countActiveAdmins,
  getPasswordHash,
  insertAccount,
  requireUser,
  revokeAllSessions,
  updateUser,
} from "@/lib/auth/user.store";
import { recordLoginAttempt } from "@/lib/auth/session.store";
import { UNLOCK_ADDRESS } from "@/lib/auth/session-rules";
import type { Db } from "@/lib/core/connect";
import type { Result } from "@/lib/core/result";
import { fail } from "@/lib/core/result";
import { reject, runInTransaction } from "@/lib/ledger/transaction.store";
import { parseInput } from "@/lib/ledger/parse";
import type { Actor } from "@/lib/core/actor";

// Accounts are never deleted: a leaver is deactivated (their sessions end at once) and their name stays
// on every record they made. Every change is in the audit trail; password hashes never are.

export async function createUser(db: Db, actor: Actor, input: unknown): Promise<Result<{ id: number; login: string }>> {
  const parsed = parseInput(UserCreateSchema, input);
  if (!parsed.ok) return parsed;
  const { password, ...rest } = parsed.value;
  const passwordHash = await hashPassword(password);
  return runInTransaction(db, async (tx) => {
    // The administrator chose this password: the colleague replaces it at their first sign-in.
    const saved = await insertAccount(tx, actor.siteId, { ...rest, passwordHash, mustChangePassword: true });
    await appendAudit(tx, actor, { action: "CREATE", entity: "User", entityKey: rest.login, after: rest });
    return saved;
  });
}

export async function changeUser(
  db: Db,
  actor: Actor,
  input: unknown,
): Promise<Result<{ login: string; sessionsEnded: number }>> {
  const parsed = parseInput(UserChangeSchema, input);
  if (!parsed.ok) return parsed;
  const c = parsed.value;
  return runInTransaction(db, async (tx) => {
    const u = await requireUser(tx, actor.siteId, c.login);
    const before: Record<string, unknown> = {};
    const after: Record<string, unknown> = {};
    for (const key of ["role", "active", "unitSystem"] as const) {
      if (c[key] !== undefined && c[key] !== u[key]) {
        before[key] = u[key];
        after[key] = c[key];
      }
    }
    if (Object.keys(after).length === 0)
      reject("USER.NO_CHANGE", `Nothing to change: ${c.login} already has these settings`, "role");
    const losesAdmin = u.role === "ADMIN" && u.active && (after.role !== undefined || after.active === false);
    if (losesAdmin && (await countActiveAdmins(tx, actor.siteId)) <= 1) {
      reject(
        "USER.LAST_ADMIN",
        "The site needs at least one active administrator; make another account administrator first",
        after.role !== undefined ? "role" : "active",
      );
    }
    await updateUser(tx, u.id, {
      ...(c.role !== undefined ? { role: c.role } : {}),
      ...(c.active !== undefined ? { active: c.active } : {}),
      ...(c.unitSystem !== undefined ? { unitSystem: c.unitSystem } : {}),
    });
    // A role change or a deactivation ends the account's sessions: the next request signs in again under the new rights.
    const sessionsEnded =
      after.role !== undefined || after.active === false ? await revokeAllSessions(tx, u.id, actor.now) : 0;
    await appendAudit(tx, actor, {
      action: "CHANGE",
      entity: "User",
      entityKey: u.login,
      before,
      after: { ...after, sessionsEnded },
      reason: c.reason,
    });
    return { login: u.login, sessionsEnded };
  });
}

export async function resetPassword(
  db: Db,
  actor: Actor,
  input: unknown,
): Promise<Result<{ login: string; sessionsEnded: number }>> {
  const parsed = parseInput(PasswordResetSchema, input);
  if (!parsed.ok) return parsed;
  const passwordHash = await hashPassword(parsed.value.password);
  return runInTransaction(db, async (tx) => {
    const u = await requireUser(tx, actor.siteId, parsed.value.login);
    await updateUser(tx, u.id, { passwordHash, mustChangePassword: true });
    const sessionsEnded = await revokeAllSessions(tx, u.id, actor.now);
    await appendAudit(tx, actor, {
      action: "CHANGE",
      entity: "User",
      entityKey: u.login,
      after: { password: "reset", sessionsEnded },
      reason: parsed.value.reason,
    });
    return { login: u.login, sessionsEnded };
  });
}

export async function endSessions(
  db: Db,
  actor: Actor,
  input: unknown,
): Promise<Result<{ login: string; sessionsEnded: number }>> {
  const parsed = parseInput(RevokeSessionsSchema, input);
  if (!parsed.ok) return parsed;
  return runInTransaction(db, async (tx) => {
    const u = await requireUser(tx, actor.siteId, parsed.value.login);
    const sessionsEnded = await revokeAllSessions(tx, u.id, actor.now);
    await appendAudit(tx, actor, {
      action: "CHANGE",
      entity: "User",
      entityKey: u.login,
      after: { sessionsEnded },
      reason: parsed.value.reason,
    });
    return { login: u.login, sessionsEnded };
  });
}

/** Lets a name locked by failed sign-ins try again at once; recorded in the sign-in log and the audit trail. */
export async function unlockSignIn(db: Db, actor: Actor, input: unknown): Promise<Result<{ login: string }>> {
  const parsed = parseInput(RevokeSessionsSchema, input);
  if (!parsed.ok) return parsed;
  return runInTransaction(db, async (tx) => {
    const u = await requireUser(tx, actor.siteId, parsed.value.login);
    await recordLoginAttempt(tx, { login: u.login, ip: UNLOCK_ADDRESS, ok: true, at: actor.now });
    await appendAudit(tx, actor, {
      action: "CHANGE",
      entity: "User",
      entityKey: u.login,
      after: { signIn: "unlocked" },
      reason: parsed.value.reason,
    });
    return { login: u.login };
  });
}

/** Anyone may choose their own units (display and entry); it is recorded like any account change. */
export async function setOwnUnits(db: Db, actor: Actor, input: unknown): Promise<Result<{ unitSystem: string }>> {
  const parsed = parseInput(OwnUnitsSchema, input);
  if (!parsed.ok) return parsed;
  return runInTransaction(db, async (tx) => {
    const me = await requireUser(tx, actor.siteId, { id: actor.userId });
    if (me.unitSystem !== parsed.value.unitSystem) {
      await updateUser(tx, me.id, { unitSystem: parsed.value.unitSystem });
      await appendAudit(tx, actor, {
        action: "CHANGE",
        entity: "User",
        entityKey: me.login,
        before: { unitSystem: me.unitSystem },
        after: { unitSystem: parsed.value.unitSystem },
        reason: "own preference",
      });
    }
    return { unitSystem: parsed.value.unitSystem };
  });
}

/** The signed-in user sets their own password; the current one must be typed. Ends the first-sign-in hold. */
export async function changeOwnPassword(db: Db, actor: Actor, input: unknown): Promise<Result<{ login: string }>> {
  const parsed = parseInput(OwnPasswordSchema, input);
  if (!parsed.ok) return parsed;
  const passwordHash = await hashPassword(parsed.value.password);
  const stored = await getPasswordHash(db, actor.userId);
  if (stored === null || !(await verifyPassword(stored, parsed.value.current)))
    return fail("USER.WRONG_PASSWORD", "Current password is wrong", "current");
  return runInTransaction(db, async (tx) => {
    const me = await requireUser(tx, actor.siteId, { id: actor.userId });
    await updateUser(tx, me.id, { passwordHash, mustChangePassword: false });
    await appendAudit(tx, actor, {
      action: "CHANGE",
      entity: "User",
      entityKey: me.login,
      after: { password: "changed by its owner" },
      reason: "own password",
    });
    return { login: me.login };
  });
}
