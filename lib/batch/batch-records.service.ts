import "server-only";
// The batch's own bookings that reach no other domain: reagent lots received, batches planned, and the
// unmeasured difference booked and reversed. batch.service.ts re-exports what callers use.
import { appendAudit } from "@/lib/audit/audit.store";
import type { Db, Tx } from "@/lib/core/connect";
import type { Actor } from "@/lib/core/actor";
import type { Result } from "@/lib/core/result";
import type { MoveRole } from "@/lib/core/vocabulary";
import { UNMEASURED_ROLE } from "@/lib/core/vocabulary";
import { parseInput } from "@/lib/ledger/parse";
import { createHolder, getStockG, postMovement } from "@/lib/ledger/ledger.store";
import { reject, runInTransaction } from "@/lib/ledger/transaction.store";
import { getBatchState, insertBatch, insertReagentLot, siteDifferenceHolder } from "@/lib/batch/batch.store";
import type { BatchState } from "@/lib/batch/batch.store";
import { BatchPlanSchema, ReagentLotSchema } from "@/lib/batch/batch.schema";
import { toGrams } from "@/lib/quantity/units";

/** Methanol, catalyst, acid or process water enters the books as a reagent lot. */
export async function receiveReagent(
  db: Db,
  actor: Actor,
  input: unknown,
): Promise<Result<{ id: number; code: string }>> {
  const parsed = parseInput(ReagentLotSchema, input);
  if (!parsed.ok) return parsed;
  const r = parsed.value;
  return runInTransaction(db, async (tx) => {
    const holderId = await createHolder(tx, actor.siteId, "REAGENT_LOT", r.code);
    const massG = toGrams(r.massKg);
    const lot = await insertReagentLot(tx, {
      siteId: actor.siteId,
      holderId,
      code: r.code,
      reagent: r.reagent,
      supplier: r.supplier,
      strengthPct: r.strengthPct,
      receivedAt: r.receivedAt,
      massG,
    });
    await postMovement(tx, {
      siteId: actor.siteId,
      at: r.receivedAt,
      role: "RECEIPT",
      fromHolderId: null,
      toHolderId: holderId,
      massG,
      recordedById: actor.userId,
      note: `reagent ${r.reagent} from ${r.supplier}`,
    });
    await appendAudit(tx, actor, { action: "CREATE", entity: "ReagentLot", entityKey: r.code, after: { ...r, massG } });
    return lot;
  });
}

export async function planBatch(db: Db, actor: Actor, input: unknown): Promise<Result<{ id: number; code: string }>> {
  const parsed = parseInput(BatchPlanSchema, input);
  if (!parsed.ok) return parsed;
  const b = parsed.value;
  return runInTransaction(db, async (tx) => {
    const holderId = await createHolder(tx, actor.siteId, "BATCH", b.code);
    const saved = await insertBatch(tx, {
      siteId: actor.siteId,
      holderId,
      code: b.code,
      pretreated: b.pretreated,
      plannedAt: b.plannedAt,
      targetOilG: toGrams(b.targetOilKg),
      molarRatio: b.molarRatio,
      catalyst: b.catalyst,
      reactionTempC: b.reactionTempC,
      recipeJson: JSON.stringify(b.recipe),
      notes: b.notes,
    });
    await appendAudit(tx, actor, { action: "CREATE", entity: "Batch", entityKey: b.code, after: b });
    return saved;
  });
}

export async function requireBatch(tx: Tx, siteId: number, code: string): Promise<BatchState> {
  const batch = await getBatchState(tx, siteId, code);
  if (!batch) reject("RECORD.NOT_FOUND", `Batch ${code} does not exist`, "batchCode");
  return batch;
}

/**
 * Books the batch's unmeasured difference so the reactor ends empty: whatever is still held after the
 * measured outputs goes to the site's difference account. Returns the grams booked.
 */
export async function bookUnmeasuredDifference(
  tx: Tx,
  actor: Actor,
  batch: BatchState,
  at: Date,
  note: string,
): Promise<number> {
  const left = await getStockG(tx, batch.holderId);
  if (left <= 0) return 0;
  const sink = await siteDifferenceHolder(tx, actor.siteId);
  await postMovement(tx, {
    siteId: actor.siteId,
    at,
    role: UNMEASURED_ROLE,
    fromHolderId: batch.holderId,
    toHolderId: sink,
    massG: left,
    recordedById: actor.userId,
    note,
    field: "outputs",
  });
  return left;
}

/** More measured out than was charged: the excess is booked into the batch first as an unmeasured gain. */
export async function bookUnmeasuredGain(
  tx: Tx,
  actor: Actor,
  batch: BatchState,
  at: Date,
  gainG: number,
  note: string,
  field: string,
): Promise<void> {
  if (gainG <= 0) return;
  await postMovement(tx, {
    siteId: actor.siteId,
    at,
    role: UNMEASURED_ROLE,
    fromHolderId: null,
    toHolderId: batch.holderId,
    massG: gainG,
    recordedById: actor.userId,
    note,
    field,
  });
}

export interface OutflowMove {
  id: number;
  at: Date;
  role: string;
  fromHolderId: number;
  toHolderId: number;
  massG: number;
}

/** An opposite movement linked to the one it reverses (as in lib/correction). */
export async function reverseOutflow(tx: Tx, actor: Actor, x: OutflowMove, reason: string): Promise<void> {
  await postMovement(tx, {
    siteId: actor.siteId,
    at: x.at,
    role: x.role as MoveRole,
    fromHolderId: x.toHolderId,
    toHolderId: x.fromHolderId,
    massG: x.massG,
    recordedById: actor.userId,
    reversesId: x.id,
    note: `Reversal of movement ${x.id}: ${reason}`,
    field: "massKg",
  });
}
