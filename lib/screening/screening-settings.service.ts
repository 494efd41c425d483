import "server-only";
import { appendAudit } from "@/lib/audit/audit.store";
import type { Actor } from "@/lib/core/actor";
import type { Db } from "@/lib/core/connect";
import type { Result } from "@/lib/core/result";
import { parseInput } from "@/lib/ledger/parse";
import { reject, runInTransaction } from "@/lib/ledger/transaction.store";
import type { ScreeningSettings } from "@/lib/screening/screening-defaults";
import { SCREENING_SETTING_LABELS } from "@/lib/screening/screening-defaults";
import { applySiteSettings, withChange } from "@/lib/screening/screening-settings";
import { ScreeningSettingChangeSchema } from "@/lib/screening/screening-settings.schema";
import { getStoredScreeningSettings, insertScreeningSettings } from "@/lib/screening/screening-settings.store";

/** The thresholds the site's screens run with. */
export async function getScreeningSettings(db: Db, siteId: number): Promise<ScreeningSettings> {
  return applySiteSettings((await getStoredScreeningSettings(db, siteId)).stored);
}

/** Changes one threshold as a new version with its reason, audited; the newest version counts. */
export async function changeScreeningSetting(db: Db, actor: Actor, input: unknown): Promise<Result<{ id: number }>> {
  const parsed = parseInput(ScreeningSettingChangeSchema, input);
  if (!parsed.ok) return parsed;
  const change = parsed.value;
  return runInTransaction(db, async (tx) => {
    const before = await getStoredScreeningSettings(tx, actor.siteId);
    const next = withChange(before.stored, change);
    if (!next.ok) reject(next.issues[0]!.code, next.issues[0]!.message, next.issues[0]!.field);
    const id = await insertScreeningSettings(tx, {
      siteId: actor.siteId,
      stored: next.value,
      reason: change.reason,
      createdById: actor.userId,
      createdAt: actor.now,
    });
    await appendAudit(tx, actor, {
      action: "CHANGE",
      entity: "ScreeningThreshold",
      entityKey: SCREENING_SETTING_LABELS[change.setting],
      before: { value: before.stored.values[change.setting] ?? null },
      after: { value: change.value, reason: change.reason, id },
    });
    return { id };
  });
}
