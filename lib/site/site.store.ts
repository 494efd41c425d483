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
