import "server-only";
import { appendAudit } from "@/lib/audit/audit.store";
import type { Db } from "@/lib/core/connect";
import type { Result } from "@/lib/core/result";
import { parseInput } from "@/lib/ledger/parse";
import { runInTransaction } from "@/lib/ledger/transaction.store";
import { LotIntoTankSchema } from "@/lib/feedstock/lot.schema";
import { bookLotFromPickups, measureLot } from "@/lib/feedstock/lot.service";
import type { LotSaved } from "@/lib/feedstock/lot.service";
import { setLotStatus } from "@/lib/feedstock/lot.store";
import { bookTransfer } from "@/lib/tank/tank.service";
import type { DensityTable } from "@/lib/quantity/density";
import { DEFAULT_DENSITY_TABLE } from "@/lib/quantity/density";
import type { Actor } from "@/lib/core/actor";

export interface LotIntoTankSaved extends LotSaved {
  tankCode: string;
  movementId: number;
}

/**
 * Pickups pooled straight into a tank, in ONE transaction: the lot is made (for the record and the
 * trace), accepted explicitly by the person receiving with their reason (audited), then all of it is
 * moved into the tank through the same guards as any transfer. A full tank or a closed period refuses
 * the whole thing: no lot, no acceptance, no movement is left behind.
 */
export async function receiveLotIntoTank(
  db: Db,
  actor: Actor,
  input: unknown,
  table: DensityTable = DEFAULT_DENSITY_TABLE,
): Promise<Result<LotIntoTankSaved>> {
  const parsed = parseInput(LotIntoTankSchema, input);
  if (!parsed.ok) return parsed;
  const l = parsed.value;
  const measured = measureLot(l, table);
  if (!measured.ok) return measured;
  return runInTransaction(db, async (tx) => {
    const lot = await bookLotFromPickups(tx, actor, l, measured.value);
    await setLotStatus(tx, lot.id, "ACCEPTED");
    await appendAudit(tx, actor, {
      action: "CHANGE",
      entity: "FeedstockLot",
      entityKey: l.code,
      before: { status: "QUARANTINED" },
      after: { status: "ACCEPTED", acceptedById: actor.userId, receivedIntoTank: l.tankCode },
      reason: l.acceptReason,
    });
    const moved = await bookTransfer(
      tx,
      actor,
      {
        fromKind: "LOT",
        fromCode: l.code,
        toTankCode: l.tankCode,
        at: l.receivedAt,
        all: true,
        note: `received from pickups straight into the tank; accepted: ${l.acceptReason}`,
      },
      { quantity: "tankCode", tank: "tankCode" },
    );
    return { ...lot, tankCode: l.tankCode, movementId: moved.movementId };
  });
}
