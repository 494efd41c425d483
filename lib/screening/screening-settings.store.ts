import "server-only";
import type { Db, Tx } from "@/lib/core/connect";
import { StoredScreeningSettingsSchema } from "@/lib/screening/screening-settings.schema";
import type { StoredScreeningSettings } from "@/lib/screening/screening-settings.schema";
import { listSiteSettingVersions } from "@/lib/site/site.store";

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

const storedOf = (valueJson: string): StoredScreeningSettings => {
  const parsed = StoredScreeningSettingsSchema.safeParse(JSON.parse(valueJson));
  return parsed.success ? parsed.data : { values: {} };
};

/** The site's newest screening thresholds (none set: an empty set, the defaults apply). */
export async function getStoredScreeningSettings(db: Db | Tx, siteId: number): Promise<ScreeningSettingsRow> {
  const [newest] = await listSiteSettingVersions(db, siteId, KEY, 1);
  if (newest === undefined) return { stored: { values: {} }, changed: null };
  return { stored: storedOf(newest.valueJson), changed: { at: newest.at, by: newest.by, reason: newest.reason } };
}

/** Every change the site made, newest first. */
export async function listScreeningSettingChanges(
  db: Db,
  siteId: number,
  take = 50,
): Promise<ScreeningSettingHistoryRow[]> {
  return (await listSiteSettingVersions(db, siteId, KEY, take)).map((v) => ({
    at: v.at,
    by: v.by,
    reason: v.reason,
    values: storedOf(v.valueJson).values,
  }));
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
