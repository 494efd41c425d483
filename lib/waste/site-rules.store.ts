import "server-only";
import type { Db, Tx } from "@/lib/core/connect";
import { SiteWasteRulesSchema } from "@/lib/waste/site-rules.schema";
import type { SiteWasteRules } from "@/lib/waste/site-rules.schema";
import { ASSUMED_WASTE_RULES, resolveWasteRules } from "@/lib/waste/site-rules";
import type { ActiveWasteRules } from "@/lib/waste/site-rules";

const KEY = "WASTE_RULES";

/** The site's newest waste rule choice, or the federal LQG assumption when it has made none. */
export async function getActiveWasteRules(db: Db | Tx, siteId: number): Promise<ActiveWasteRules> {
  const row = await db.siteSetting.findFirst({
    where: { siteId, key: KEY },
    orderBy: [{ createdAt: "desc" }, { id: "desc" }],
  });
  if (row === null) return ASSUMED_WASTE_RULES;
  const parsed = SiteWasteRulesSchema.safeParse(JSON.parse(row.valueJson));
  if (!parsed.success) return ASSUMED_WASTE_RULES;
  const by = await db.user.findUnique({ where: { id: row.createdById }, select: { fullName: true } });
  return resolveWasteRules(parsed.data, { at: row.createdAt, by: by?.fullName ?? "" });
}

export async function insertWasteRules(
  tx: Tx,
  row: { siteId: number; value: SiteWasteRules; createdById: number; createdAt: Date },
): Promise<number> {
  const saved = await tx.siteSetting.create({
    data: {
      siteId: row.siteId,
      key: KEY,
      valueJson: JSON.stringify(row.value),
      reason: row.value.reason,
      createdById: row.createdById,
      createdAt: row.createdAt,
    },
    select: { id: true },
  });
  return saved.id;
}
