import "server-only";
import type { Db, Tx } from "@/lib/core/connect";
import { reject } from "@/lib/ledger/transaction.store";

export interface UserRow {
  id: number;
  login: string;
  fullName: string;
  role: string;
  unitSystem: string;
  active: boolean;
  createdAt: Date;
  liveSessions: number;
  lastSignIn: Date | null;
}

/** The site's accounts with their live sessions (not revoked, not past their absolute expiry). */
export async function listUsers(db: Db, siteId: number, now: Date): Promise<UserRow[]> {
  const users = await db.user.findMany({ where: { siteId }, orderBy: { login: "asc" } });
  const sessions = await db.session.findMany({
    where: { userId: { in: users.map((u) => u.id) } },
    select: { userId: true, createdAt: true, expiresAt: true, revokedAt: true },
  });
  return users.map((u) => {
    const mine = sessions.filter((s) => s.userId === u.id);
    return {
      id: u.id,
      login: u.login,
      fullName: u.fullName,
      role: u.role,
      unitSystem: u.unitSystem,
      active: u.active,
      createdAt: u.createdAt,
      liveSessions: mine.filter((s) => s.revokedAt === null && s.expiresAt > now).length,
      lastSignIn: mine.reduce<Date | null>((m, s) => (m === null || s.createdAt > m ? s.createdAt : m), null),
    };
  });
}

export interface UserState {
  id: number;
  login: string;
  fullName: string;
  role: string;
  unitSystem: string;
  active: boolean;
}

const USER_STATE = { id: true, login: true, fullName: true, role: true, unitSystem: true, active: true } as const;

/** An account of this site by login or by id; refused naming the login field when absent. */
export async function requireUser(tx: Tx, siteId: number, who: string | { id: number }): Promise<UserState> {
  const u = await tx.user.findFirst({
    where: { siteId, ...(typeof who === "string" ? { login: who } : { id: who.id }) },
    select: USER_STATE,
  });
  if (!u)
    reject(
      "RECORD.NOT_FOUND",
      typeof who === "string" ? `User ${who} does not exist on this site` : "Your account was not found on this site",
      "login",
    );
  return u;
}

export async function insertAccount(
  tx: Tx,
  siteId: number,
  u: {
    login: string;
    fullName: string;
    role: string;
    unitSystem: string;
    passwordHash: string;
    mustChangePassword: boolean;
  },
): Promise<{ id: number; login: string }> {
  const clash = await tx.user.findUnique({ where: { login: u.login }, select: { id: true } });
  if (clash) reject("RECORD.DUPLICATE", `User name ${u.login} is already taken`, "login");
  return tx.user.create({ data: { siteId, ...u }, select: { id: true, login: true } });
}

export async function updateUser(
  tx: Tx,
  id: number,
  data: { role?: string; active?: boolean; unitSystem?: string; passwordHash?: string; mustChangePassword?: boolean },
): Promise<void> {
  await tx.user.update({ where: { id }, data });
}

export async function revokeAllSessions(tx: Tx, userId: number, now: Date): Promise<number> {
  return (await tx.session.updateMany({ where: { userId, revokedAt: null }, data: { revokedAt: now } })).count;
}

export async function countActiveAdmins(tx: Tx, siteId: number): Promise<number> {
  return tx.user.count({ where: { siteId, role: "ADMIN", active: true } });
}

export async function getPasswordHash(tx: Db | Tx, userId: number): Promise<string | null> {
  return (await tx.user.findUnique({ where: { id: userId }, select: { passwordHash: true } }))?.passwordHash ?? null;
}
