import "server-only";
import { appendAudit } from "@/lib/audit/audit.store";
import { z } from "zod";
import type { Db } from "@/lib/core/connect";
import type { Result } from "@/lib/core/result";
import { failMany } from "@/lib/core/result";
import { code, when } from "@/lib/core/fields";
import { parseInput } from "@/lib/ledger/parse";
import { runInTransaction } from "@/lib/ledger/transaction.store";
import { insertTitration, requireLot } from "@/lib/feedstock/lot.store";
import { TitrationEntrySchema } from "@/lib/titration/titration.schema";
import { calculateAcidValue, calculateFfaPercent } from "@/lib/titration/titration";
import type { Actor } from "@/lib/core/actor";

export const LotTitrationSchema = z
  .object({ lotCode: code("Lot number"), testedAt: when("Test time") })
  .and(TitrationEntrySchema);
export type LotTitrationInput = z.input<typeof LotTitrationSchema>;

/** Stores a titration with its FFA % and acid value computed on the server (AOCS Ca 5a-40; EN 14104 form). */
export async function recordTitration(
  db: Db,
  actor: Actor,
  input: unknown,
): Promise<Result<{ id: number; ffaPct: number; acidValue: number }>> {
  const parsed = parseInput(LotTitrationSchema, input);
  if (!parsed.ok) return parsed;
  const t = parsed.value;
  const ffa = calculateFfaPercent(t, { basis: t.basis });
  const av = calculateAcidValue(t);
  if (!ffa.ok || !av.ok) return failMany([...(ffa.ok ? [] : ffa.issues), ...(av.ok ? [] : av.issues)]);
  return runInTransaction(db, async (tx) => {
    const lot = await requireLot(tx, actor.siteId, t.lotCode, "lotCode");
    const saved = await insertTitration(tx, {
      lotId: lot.id,
      analystId: actor.userId,
      testedAt: t.testedAt,
      sampleMassG: t.sampleMassG,
      titrant: t.titrant,
      concentrationMolL: t.concentrationMolL,
      titreMl: t.titreMl,
      blankMl: t.blankMl,
      basis: t.basis,
      ffaPct: ffa.value.ffaPct,
      acidValue: av.value.acidValueMgKohG,
    });
    await appendAudit(tx, actor, {
      action: "CREATE",
      entity: "Titration",
      entityKey: t.lotCode,
      after: { ...t, id: saved.id, ffaPct: saved.ffaPct, acidValue: saved.acidValue },
    });
    return saved;
  });
}
