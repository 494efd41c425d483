import "server-only";
import type { Db, Tx } from "@/lib/core/connect";
import { StoredScreeningSettingsSchema } from "@/lib/screening/screening-settings.schema";
import type { StoredScreeningSettings } from "@/lib/screening/screening-settings.schema";

const KEY = "SCREENING";

export interface ScreeningSettingsRow {
  stored: StoredScreeningSettings;
  /** The newest change: who made it, when and why; null while the site runs on the defaults. */
  changed: { at: Date; by: string; reason: string } | null;
}

export interface ScreeningSettingHistoryRow {
  at: Date;
  by: string;
  reason: string;
  values: StoredScreeningSettings["values"];
}

/** The site's newest screening thresholds (none set: an empty set, the defaults apply). */
export async function getStoredScreeningSettings(db: Db | Tx, siteId: number): Promise<ScreeningSettingsRow> {
  const row = await db.siteSetting.findFirst({
    where: { siteId, key: KEY },
    orderBy: [{ createdAt: "desc" }, { id: "desc" }],
  });
  if (row === null) return { stored: { values: {} }, changed: null };
  const parsed = StoredScreeningSettingsSchema.safeParse(JSON.parse(row.valueJson));
  const by = await db.user.findUnique({ where: { id: row.createdById }, select: { fullName: true } });
  return {
    stored: parsed.success ? parsed.data : { values: {} },
    changed: { at: row.createdAt, by: by?.fullName ?? "", reason: row.reason },
  };
}

/** Every change the site made, newest first. */
export async function listScreeningSettingChanges(
  db: Db,
  siteId: number,
  take = 50,
): Promise<ScreeningSettingHistoryRow[]> {
  const rows = await db.siteSetting.findMany({
    where: { siteId, key: KEY },
    orderBy: [{ createdAt: "desc" }, { id: "desc" }],
    take,
    include: { site: false },
  });
  const users = new Map(
    (
      await db.user.findMany({
        where: { id: { in: [...new Set(rows.map((r) => r.createdById))] } },
        select: { id: true, fullName: true },
      })
    ).map((u) => [u.id, u.fullName]),
  );
  return rows.map((r) => {
    const parsed = StoredScreeningSettingsSchema.safeParse(JSON.parse(r.valueJson));
    return {
      at: r.createdAt,
      by: users.get(r.createdById) ?? "",
      reason: r.reason,
      values: parsed.success ? parsed.data.values : {},
    };
  });
}

export async function insertScreeningSettings(
  tx: Tx,
  row: { siteId: number; stored: StoredScreeningSettings; reason: string; createdById: number; createdAt: Date },
): Promise<number> {
  const saved = await tx.siteSetting.create({
    data: {
      siteId: row.siteId,
      key: KEY,
      valueJson: JSON.stringify(row.stored),
      reason: row.reason,
      createdById: row.createdById,
      createdAt: row.createdAt,
    },
    select: { id: true },
  });
  return saved.id;
}
