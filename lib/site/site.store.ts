import "server-only";
import type { Db, Tx } from "@/lib/core/connect";
import type { SiteRole } from "@/lib/core/vocabulary";

export interface SiteRow {
  id: number;
  code: string;
  name: string;
  town: string;
  timeZone: string;
  gs1CompanyPrefix: string | null;
}

export async function insertSite(
  tx: Tx | Db,
  s: { code: string; name: string; town: string; timeZone: string },
): Promise<SiteRow> {
  return tx.site.create({ data: s });
}

export async function insertUser(
  tx: Tx | Db,
  u: {
    siteId: number;
    login: string;
    fullName: string;
    role: SiteRole;
    unitSystem?: "metric" | "us";
    passwordHash?: string;
  },
): Promise<{ id: number }> {
  return tx.user.create({
    data: { ...u, unitSystem: u.unitSystem ?? "metric", passwordHash: u.passwordHash ?? null },
    select: { id: true },
  });
}

/** The site shown when no one has chosen one: the first created. */
export async function getDefaultSite(db: Db): Promise<SiteRow | null> {
  return db.site.findFirst({ orderBy: { id: "asc" } });
}

export async function countSites(db: Db): Promise<number> {
  return db.site.count();
}

export async function getSiteById(db: Db, id: number): Promise<SiteRow | null> {
  return db.site.findUnique({ where: { id } });
}

/** undefined when the site does not exist. */
export async function getSiteGs1Prefix(tx: Tx | Db, siteId: number): Promise<string | null | undefined> {
  const row = await tx.site.findUnique({ where: { id: siteId }, select: { gs1CompanyPrefix: true } });
  return row === null ? undefined : row.gs1CompanyPrefix;
}

export async function updateSiteGs1Prefix(tx: Tx, siteId: number, gs1CompanyPrefix: string | null): Promise<void> {
  await tx.site.update({ where: { id: siteId }, data: { gs1CompanyPrefix } });
}

export interface SiteSettingVersion {
  id: number;
  valueJson: string;
  reason: string;
  at: Date;
  /** Full name of who saved it. */
  by: string;
}

/** The newest saved value of one site setting (its JSON text only): one indexed read, for hot paths. */
export async function getNewestSiteSettingValue(db: Db | Tx, siteId: number, key: string): Promise<string | null> {
  const row = await db.siteSetting.findFirst({
    where: { siteId, key },
    orderBy: [{ createdAt: "desc" }, { id: "desc" }],
    select: { valueJson: true },
  });
  return row?.valueJson ?? null;
}

/** Saved versions of one site setting, newest first, each with who saved it (one user read for all). */
export async function listSiteSettingVersions(
  db: Db | Tx,
  siteId: number,
  key: string,
  take: number,
): Promise<SiteSettingVersion[]> {
  const rows = await db.siteSetting.findMany({
    where: { siteId, key },
    orderBy: [{ createdAt: "desc" }, { id: "desc" }],
    take,
  });
  const ids = [...new Set(rows.map((r) => r.createdById))];
  const users = await db.user.findMany({ where: { id: { in: ids } }, select: { id: true, fullName: true } });
  const name = new Map(users.map((u) => [u.id, u.fullName]));
  return rows.map((r) => ({
    id: r.id,
    valueJson: r.valueJson,
    reason: r.reason,
    at: r.createdAt,
    by: name.get(r.createdById) ?? "",
  }));
}
