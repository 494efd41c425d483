import "server-only";
import { appendAudit } from "@/lib/audit/audit.store";
import type { Db } from "@/lib/core/connect";
import type { Result } from "@/lib/core/result";
import { parseInput } from "@/lib/ledger/parse";
import { reject, runInTransaction } from "@/lib/ledger/transaction.store";
import type { Actor } from "@/lib/core/actor";
import { SiteGs1Schema } from "@/lib/site/site-settings.schema";
import { getSiteGs1Prefix, updateSiteGs1Prefix } from "@/lib/site/site.store";

/** Sets or clears the site's GS1 Company Prefix; recorded in the audit trail with the reason. */
export async function setGs1CompanyPrefix(
  db: Db,
  actor: Actor,
  input: unknown,
): Promise<Result<{ gs1CompanyPrefix: string | null }>> {
  const parsed = parseInput(SiteGs1Schema, input);
  if (!parsed.ok) return parsed;
  const { gs1CompanyPrefix, reason } = parsed.value;
  return runInTransaction(db, async (tx) => {
    const before = await getSiteGs1Prefix(tx, actor.siteId);
    if (before === undefined) reject("RECORD.NOT_FOUND", "Your site is not set up", "gs1CompanyPrefix");
    await updateSiteGs1Prefix(tx, actor.siteId, gs1CompanyPrefix);
    await appendAudit(tx, actor, {
      action: "CHANGE",
      entity: "Site",
      entityKey: String(actor.siteId),
      before: { gs1CompanyPrefix: before },
      after: { gs1CompanyPrefix },
      reason,
    });
    return { gs1CompanyPrefix };
  });
}
