import "server-only";
import type { Tx } from "@/lib/core/connect";
import { reject } from "@/lib/ledger/transaction.store";

export interface MovementToReverse {
  id: number;
  siteId: number;
  at: Date;
  role: string;
  fromHolderId: number | null;
  toHolderId: number;
  massG: number;
  reversesId: number | null;
  reversedById: number | null;
  toKind: string;
}

export async function requireMovement(tx: Tx, siteId: number, movementId: number): Promise<MovementToReverse> {
  const m = await tx.movement.findFirst({
    where: { id: movementId, siteId },
    select: {
      id: true,
      siteId: true,
      at: true,
      role: true,
      fromHolderId: true,
      toHolderId: true,
      massG: true,
      reversesId: true,
      reversedBy: { select: { id: true } },
      toHolder: { select: { kind: true } },
    },
  });
  if (!m) reject("RECORD.NOT_FOUND", `Movement ${movementId} does not exist on this site`, "movementId");
  const { reversedBy, toHolder, ...rest } = m;
  return { ...rest, reversedById: reversedBy?.id ?? null, toKind: toHolder.kind };
}

/** The status of the batch a holder belongs to, or null when it is not a batch. */
export async function getBatchStateByHolder(
  tx: Tx,
  holderId: number,
): Promise<{ code: string; status: string } | null> {
  return tx.batch.findUnique({ where: { holderId }, select: { code: true, status: true } });
}

export interface LabResultState {
  id: number;
  lotCode: string;
  testedAt: Date;
  voided: boolean;
  summary: Record<string, unknown>;
}

export async function requireLabResult(
  tx: Tx,
  siteId: number,
  kind: "TITRATION" | "LAB_TEST",
  resultId: number,
): Promise<LabResultState> {
  if (kind === "TITRATION") {
    const t = await tx.titration.findFirst({
      where: { id: resultId, lot: { siteId } },
      include: { lot: { select: { code: true } } },
    });
    if (!t) reject("RECORD.NOT_FOUND", `Titration ${resultId} does not exist on this site`, "resultId");
    return {
      id: t.id,
      lotCode: t.lot.code,
      testedAt: t.testedAt,
      voided: t.voided,
      summary: { ffaPct: t.ffaPct, acidValue: t.acidValue, titreMl: t.titreMl, basis: t.basis },
    };
  }
  const l = await tx.labTest.findFirst({
    where: { id: resultId, lot: { siteId } },
    include: { lot: { select: { code: true } } },
  });
  if (!l) reject("RECORD.NOT_FOUND", `Lab test ${resultId} does not exist on this site`, "resultId");
  return {
    id: l.id,
    lotCode: l.lot.code,
    testedAt: l.testedAt,
    voided: l.voided,
    summary: { kind: l.kind, valuePct: l.valuePct, method: l.method },
  };
}

export async function markLabResultVoided(tx: Tx, kind: "TITRATION" | "LAB_TEST", resultId: number): Promise<void> {
  if (kind === "TITRATION") await tx.titration.update({ where: { id: resultId }, data: { voided: true } });
  else await tx.labTest.update({ where: { id: resultId }, data: { voided: true } });
}
