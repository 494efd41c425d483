import "server-only";
import type { Db, Tx } from "@/lib/core/connect";
import {
  CLOSURE_TOLERANCE_KEY,
  ClosureLimitSchema,
  WATER_LIMITS_KEY,
  WaterLimitSchema,
} from "@/lib/mass-balance/site-limits.schema";
import type { ClosureLimit, WaterLimit } from "@/lib/mass-balance/site-limits.schema";
import type { LimitChange } from "@/lib/mass-balance/site-limits";
import { getNewestSiteSettingValue, listSiteSettingVersions } from "@/lib/site/site.store";

type LimitKey = typeof CLOSURE_TOLERANCE_KEY | typeof WATER_LIMITS_KEY;

export interface SavedLimitRow {
  id: number;
  key: LimitKey;
  valueJson: string;
  change: LimitChange;
}

async function rowsOf(db: Db | Tx, siteId: number, key: LimitKey, take: number): Promise<SavedLimitRow[]> {
  return (await listSiteSettingVersions(db, siteId, key, take)).map((v) => ({
    id: v.id,
    key,
    valueJson: v.valueJson,
    change: { at: v.at, by: v.by, reason: v.reason },
  }));
}

function parsed<T>(row: SavedLimitRow | undefined, parse: (v: unknown) => T | null) {
  if (row === undefined) return null;
  const value = parse(JSON.parse(row.valueJson));
  return value === null ? null : { value, change: row.change };
}

const closureOf = (v: unknown): ClosureLimit | null => {
  const r = ClosureLimitSchema.safeParse(v);
  return r.success ? r.data : null;
};
const waterOf = (v: unknown): WaterLimit | null => {
  const r = WaterLimitSchema.safeParse(v);
  return r.success ? r.data : null;
};

/** The site's newest saved closure tolerance and water limits; null where it has saved none. */
export async function getSavedSiteLimits(db: Db | Tx, siteId: number) {
  const [closure, water] = await Promise.all([
    rowsOf(db, siteId, CLOSURE_TOLERANCE_KEY, 1),
    rowsOf(db, siteId, WATER_LIMITS_KEY, 1),
  ]);
  return { closure: parsed(closure[0], closureOf), water: parsed(water[0], waterOf) };
}

/** The warn and fail shares of the site's newest saved closure tolerance, without who saved it; null: none saved. */
export async function getSavedClosureShares(
  db: Db | Tx,
  siteId: number,
): Promise<{ warnPct: number; failPct: number } | null> {
  return closureSharesOfJson(await getNewestSiteSettingValue(db, siteId, CLOSURE_TOLERANCE_KEY));
}

/** The warn and fail shares of a saved closure tolerance's value as stored; null: none saved, or not one. */
export function closureSharesOfJson(json: string | null): { warnPct: number; failPct: number } | null {
  const value = json === null ? null : closureOf(JSON.parse(json));
  return value === null ? null : { warnPct: value.warnPct, failPct: value.failPct };
}

export interface LimitHistoryRow {
  id: number;
  key: LimitKey;
  closure: ClosureLimit | null;
  water: WaterLimit | null;
  change: LimitChange;
}

/** Every saved version of the site's limits, newest first. */
export async function listSiteLimitHistory(db: Db, siteId: number, take = 50): Promise<LimitHistoryRow[]> {
  const rows = [
    ...(await rowsOf(db, siteId, CLOSURE_TOLERANCE_KEY, take)),
    ...(await rowsOf(db, siteId, WATER_LIMITS_KEY, take)),
  ].sort((a, b) => b.change.at.getTime() - a.change.at.getTime() || b.id - a.id);
  return rows.map((r) => {
    const v: unknown = JSON.parse(r.valueJson);
    return {
      id: r.id,
      key: r.key,
      closure: r.key === CLOSURE_TOLERANCE_KEY ? closureOf(v) : null,
      water: r.key === WATER_LIMITS_KEY ? waterOf(v) : null,
      change: r.change,
    };
  });
}

export async function insertSiteLimit(
  tx: Tx,
  row: { siteId: number; key: LimitKey; value: ClosureLimit | WaterLimit; createdById: number; createdAt: Date },
): Promise<number> {
  const saved = await tx.siteSetting.create({
    data: {
      siteId: row.siteId,
      key: row.key,
      valueJson: JSON.stringify(row.value),
      reason: row.value.reason,
      createdById: row.createdById,
      createdAt: row.createdAt,
    },
    select: { id: true },
  });
  return saved.id;
}
