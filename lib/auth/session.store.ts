import "server-only";
import type { Db, Tx } from "@/lib/core/connect";
import type { SiteRole } from "@/lib/core/vocabulary";

export interface UserForSignIn {
  id: number;
  siteId: number;
  login: string;
  fullName: string;
  role: SiteRole;
  passwordHash: string | null;
  active: boolean;
  unitSystem: string;
  mustChangePassword: boolean;
}

export async function findUserByLogin(db: Db, login: string): Promise<UserForSignIn | null> {
  const u = await db.user.findUnique({
    where: { login },
    select: {
      id: true,
      siteId: true,
      login: true,
      fullName: true,
      role: true,
      passwordHash: true,
      active: true,
      unitSystem: true,
      mustChangePassword: true,
    },
  });
  return u ? { ...u, role: u.role as SiteRole } : null;
}

export async function countRecentFailures(db: Db, by: { login?: string; ip?: string }, since: Date): Promise<number> {
  return db.loginAttempt.count({
    where: { ok: false, at: { gte: since }, ...(by.login ? { login: by.login } : {}), ...(by.ip ? { ip: by.ip } : {}) },
  });
}

/** The last successful sign-in or administrator unlock of a name since `since`: failures before it no longer count. */
export async function lastClearedAt(db: Db, login: string, since: Date): Promise<Date | null> {
  const r = await db.loginAttempt.findFirst({
    where: { login, ok: true, at: { gte: since } },
    orderBy: { at: "desc" },
    select: { at: true },
  });
  return r?.at ?? null;
}

export async function recordLoginAttempt(
  db: Db | Tx,
  a: { login: string; ip: string; ok: boolean; at: Date },
): Promise<void> {
  await db.loginAttempt.create({ data: a });
}

export async function insertSession(
  db: Db,
  s: { tokenHash: string; userId: number; createdAt: Date; expiresAt: Date },
): Promise<void> {
  await db.session.create({ data: { ...s, lastSeenAt: s.createdAt } });
}

export interface SessionWithUser {
  id: number;
  createdAt: Date;
  lastSeenAt: Date;
  expiresAt: Date;
  revokedAt: Date | null;
  user: {
    id: number;
    siteId: number;
    login: string;
    fullName: string;
    role: SiteRole;
    active: boolean;
    unitSystem: string;
    mustChangePassword: boolean;
  };
}

export async function findSessionByTokenHash(db: Db, tokenHash: string): Promise<SessionWithUser | null> {
  const s = await db.session.findUnique({
    where: { tokenHash },
    select: {
      id: true,
      createdAt: true,
      lastSeenAt: true,
      expiresAt: true,
      revokedAt: true,
      user: {
        select: {
          id: true,
          siteId: true,
          login: true,
          fullName: true,
          role: true,
          active: true,
          unitSystem: true,
          mustChangePassword: true,
        },
      },
    },
  });
  return s ? { ...s, user: { ...s.user, role: s.user.role as SiteRole } } : null;
}

export async function touchSession(db: Db, id: number, now: Date): Promise<void> {
  await db.session.update({ where: { id }, data: { lastSeenAt: now } });
}

export async function revokeSession(db: Db, tokenHash: string, now: Date): Promise<void> {
  await db.session.updateMany({ where: { tokenHash, revokedAt: null }, data: { revokedAt: now } });
}

export async function revokeUserSessions(db: Db, userId: number, now: Date): Promise<number> {
  return (await db.session.updateMany({ where: { userId, revokedAt: null }, data: { revokedAt: now } })).count;
}
