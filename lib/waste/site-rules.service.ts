import "server-only";
import { appendAudit } from "@/lib/audit/audit.store";
import type { Db } from "@/lib/core/connect";
import type { Result } from "@/lib/core/result";
import { runInTransaction } from "@/lib/ledger/transaction.store";
import { parseInput } from "@/lib/ledger/parse";
import type { Actor } from "@/lib/core/actor";
import { SiteWasteRulesSchema } from "@/lib/waste/site-rules.schema";
import { insertWasteRules } from "@/lib/waste/site-rules.store";

/** Records the site's waste rule set as a new version with its reason, audited; the newest counts. */
export async function chooseWasteRules(db: Db, actor: Actor, input: unknown): Promise<Result<{ id: number }>> {
  const parsed = parseInput(SiteWasteRulesSchema, input);
  if (!parsed.ok) return parsed;
  const value = parsed.value;
  return runInTransaction(db, async (tx) => {
    const id = await insertWasteRules(tx, {
      siteId: actor.siteId,
      value,
      createdById: actor.userId,
      createdAt: actor.now,
    });
    await appendAudit(tx, actor, {
      action: "CHANGE",
      entity: "SiteWasteRules",
      entityKey: value.choice === "SITE_OWN" ? value.name : `US federal ${value.generatorCategory}`,
      after: { ...value, id },
    });
    return { id };
  });
}
