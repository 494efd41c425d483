import "server-only";
import { appendAudit } from "@/lib/audit/audit.store";
import { REVERSIBLE_INTO, REVERSIBLE_ROLES, ReverseMovementSchema, VoidLabResultSchema } from "@/lib/correction/correction.schema";
import { markLabResultVoided, requireLabResult, requireMovement } from "@/lib/correction/correction.store";
import type { Db } from "@/lib/database/connect";
import type { Result } from "@/lib/errors";
import { assertPeriodOpen, postMovement, reject, runInTransaction } from "@/lib/ledger/ledger.store";
import { parseInput } from "@/lib/ledger/parse";
import type { Actor } from "@/lib/site/actor";

/**
 * Cancels a transfer booked by mistake with an opposite movement at the same time, linked to it. The
 * reversal is an ordinary guarded draw: it is refused when the material has since moved on (the
 * place it went to no longer holds it) or when the period is closed. Traces leave the pair out.
 */
export async function reverseMovement(db: Db, actor: Actor, input: unknown): Promise<Result<{ reversalId: number; movementId: number }>> {
  const parsed = parseInput(ReverseMovementSchema, input);
  if (!parsed.ok) return parsed;
  const { movementId, reason } = parsed.value;
  return runInTransaction(db, async (tx) => {
    const m = await requireMovement(tx, actor.siteId, movementId);
    if (m.reversesId !== null) reject("CORRECTION.IS_REVERSAL", `Movement ${movementId} is itself a reversal; book the transfer again instead`, "movementId");
    if (m.reversedById !== null) reject("CORRECTION.ALREADY_REVERSED", `Movement ${movementId} was already reversed by movement ${m.reversedById}`, "movementId");
    if (!(REVERSIBLE_ROLES as readonly string[]).includes(m.role) || m.fromHolderId === null || !(REVERSIBLE_INTO as readonly string[]).includes(m.toKind)) {
      reject("CORRECTION.NOT_REVERSIBLE", `Movement ${movementId} is not a transfer into a tank; only those are reversed here (receiving, batches and receipts are corrected on their own records)`, "movementId");
    }
    const reversalId = await postMovement(tx, {
      siteId: actor.siteId,
      at: m.at,
      role: "TRANSFER",
      fromHolderId: m.toHolderId,
      toHolderId: m.fromHolderId,
      massG: m.massG,
      note: `Reversal of movement ${movementId}: ${reason}`,
      recordedById: actor.userId,
      reversesId: movementId,
      field: "movementId",
    });
    await appendAudit(tx, actor, { action: "VOID", entity: "Movement", entityKey: String(movementId), after: { reversedBy: reversalId, massG: m.massG }, reason });
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
    if (r.voided) reject("CORRECTION.ALREADY_VOIDED", `This ${kind === "TITRATION" ? "titration" : "lab test"} is already voided`, "resultId");
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
