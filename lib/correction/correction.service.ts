import "server-only";
import { appendAudit } from "@/lib/audit/audit.store";
import { isReversible, ReverseMovementSchema, VoidLabResultSchema } from "@/lib/correction/correction.schema";
import {
  getBatchStateByHolder,
  markLabResultVoided,
  requireLabResult,
  requireMovement,
} from "@/lib/correction/correction.store";
import type { Db } from "@/lib/core/connect";
import type { Result } from "@/lib/core/result";
import { assertPeriodOpen, postMovement } from "@/lib/ledger/ledger.store";
import { reject, runInTransaction } from "@/lib/ledger/transaction.store";
import { parseInput } from "@/lib/ledger/parse";
import type { MoveRole } from "@/lib/core/vocabulary";
import { requireTankRoom } from "@/lib/tank/tank.store";
import type { Actor } from "@/lib/core/actor";

/**
 * Cancels a transfer into a tank, or a charge into a batch that is still reacting, booked by mistake:
 * an opposite movement at the same time, linked to it. The reversal is an ordinary guarded draw: it is
 * refused when the material has since moved on (the place it went to no longer holds it) or when the
 * period is closed. Traces, balances and the chain of custody leave the pair out.
 */
export async function reverseMovement(
  db: Db,
  actor: Actor,
  input: unknown,
): Promise<Result<{ reversalId: number; movementId: number }>> {
  const parsed = parseInput(ReverseMovementSchema, input);
  if (!parsed.ok) return parsed;
  const { movementId, reason } = parsed.value;
  return runInTransaction(db, async (tx) => {
    const m = await requireMovement(tx, actor.siteId, movementId);
    if (m.reversesId !== null)
      reject(
        "CORRECTION.IS_REVERSAL",
        `Movement ${movementId} is itself a reversal; book the transfer again instead`,
        "movementId",
      );
    if (m.reversedById !== null)
      reject(
        "CORRECTION.ALREADY_REVERSED",
        `Movement ${movementId} was already reversed by movement ${m.reversedById}`,
        "movementId",
      );
    const kind = m.fromHolderId === null ? null : isReversible(m.role, m.toKind);
    if (kind === null || m.fromHolderId === null) {
      reject(
        "CORRECTION.NOT_REVERSIBLE",
        `Movement ${movementId} is neither a transfer into a tank nor a charge into a batch; only those are reversed here (receiving, outputs and receipts are corrected on their own records)`,
        "movementId",
      );
    }
    if (kind === "CHARGE") {
      const batch = await getBatchStateByHolder(tx, m.toHolderId);
      if (batch === null || batch.status !== "RUNNING") {
        reject(
          "CORRECTION.BATCH_NOT_RUNNING",
          `Batch ${batch?.code ?? ""} is ${(batch?.status ?? "unknown").toLowerCase()}; a charge can be taken back only while the batch is reacting, before its outputs are recorded`,
          "movementId",
        );
      }
    }
    // Material going back into a tank must still fit (the tank may have been filled since).
    const room = await requireTankRoom(tx, m.fromHolderId, m.massG, "movementId");
    const reversalId = await postMovement(tx, {
      siteId: actor.siteId,
      at: m.at,
      role: kind === "CHARGE" ? (m.role as MoveRole) : "TRANSFER",
      fromHolderId: m.toHolderId,
      toHolderId: m.fromHolderId,
      massG: m.massG,
      note: `Reversal of movement ${movementId}: ${reason}`,
      recordedById: actor.userId,
      reversesId: movementId,
      field: "movementId",
      ...(room ? { room } : {}),
    });
    await appendAudit(tx, actor, {
      action: "VOID",
      entity: "Movement",
      entityKey: String(movementId),
      after: { reversedBy: reversalId, massG: m.massG },
      reason,
    });
    return { reversalId, movementId };
  });
}

/** Voids a titration or lab test entered by mistake; it stays on record, marked, and no longer counts. */
export async function voidLabResult(db: Db, actor: Actor, input: unknown): Promise<Result<{ lotCode: string }>> {
  const parsed = parseInput(VoidLabResultSchema, input);
  if (!parsed.ok) return parsed;
  const { kind, resultId, reason } = parsed.value;
  return runInTransaction(db, async (tx) => {
    const r = await requireLabResult(tx, actor.siteId, kind, resultId);
    if (r.voided)
      reject(
        "CORRECTION.ALREADY_VOIDED",
        `This ${kind === "TITRATION" ? "titration" : "lab test"} is already voided`,
        "resultId",
      );
    await assertPeriodOpen(tx, actor.siteId, r.testedAt, "resultId");
    await markLabResultVoided(tx, kind, resultId);
    await appendAudit(tx, actor, {
      action: "VOID",
      entity: kind === "TITRATION" ? "Titration" : "LabTest",
      entityKey: r.lotCode,
      before: { resultId, voided: false, ...r.summary },
      after: { resultId, voided: true },
      reason,
    });
    return { lotCode: r.lotCode };
  });
}
