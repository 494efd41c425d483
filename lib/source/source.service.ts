import "server-only";
import { appendAudit } from "@/lib/audit/audit.store";
import type { Db } from "@/lib/core/connect";
import type { Result } from "@/lib/core/result";
import { parseInput } from "@/lib/ledger/parse";
import { runInTransaction } from "@/lib/ledger/transaction.store";
import { SourceSchema } from "@/lib/source/source.schema";
import { insertSource } from "@/lib/source/source.store";
import type { Actor } from "@/lib/core/actor";

export async function createSource(
  db: Db,
  actor: Actor,
  input: unknown,
): Promise<Result<{ id: number; code: string }>> {
  const parsed = parseInput(SourceSchema, input);
  if (!parsed.ok) return parsed;
  return runInTransaction(db, async (tx) => {
    const saved = await insertSource(tx, actor.siteId, parsed.value);
    await appendAudit(tx, actor, {
      action: "CREATE",
      entity: "Source",
      entityKey: parsed.value.code,
      after: parsed.value,
    });
    return saved;
  });
}
