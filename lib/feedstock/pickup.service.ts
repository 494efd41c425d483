import "server-only";
import { appendAudit } from "@/lib/audit/audit.store";
import type { Db } from "@/lib/database/connect";
import type { Result } from "@/lib/errors";
import { fail, ok } from "@/lib/errors";
import { parseInput } from "@/lib/ledger/parse";
import { createHolder, postMovement, runInTransaction } from "@/lib/ledger/ledger.store";
import { measureObserved } from "@/lib/feedstock/measure";
import { PickupSchema } from "@/lib/feedstock/pickup.schema";
import { findPickupByKey, insertPickup } from "@/lib/feedstock/pickup.store";
import { requireSourceId } from "@/lib/source/source.store";
import type { DensityTable } from "@/lib/quantity/density";
import { DEFAULT_DENSITY_TABLE } from "@/lib/quantity/density";
import type { Actor } from "@/lib/site/actor";

export interface PickupSaved {
  id: number;
  code: string;
  massG: number;
  receivedAt: Date;
}

/**
 * Records a pickup as observed at the source: its oil enters the books here (a RECEIPT movement
 * into the pickup). A retried submission with the same idempotency key gets the first answer back.
 */
export async function recordPickup(db: Db, actor: Actor, input: unknown, table: DensityTable = DEFAULT_DENSITY_TABLE): Promise<Result<PickupSaved>> {
  const parsed = parseInput(PickupSchema, input);
  if (!parsed.ok) return parsed;
  const p = parsed.value;
  if (p.idempotencyKey) {
    const earlier = await findPickupByKey(db, p.idempotencyKey);
    if (earlier) return ok(earlier);
  }
  const measured = measureObserved({ material: p.material, observedVolumeL: p.volumeL, observedTempC: p.tempC, referenceTempC: 15, table });
  if (!measured.ok) return fail("PICKUP.UNMEASURABLE", measured.issues.map((i) => i.message).join("; "), "volumeL");
  return runInTransaction(db, async (tx) => {
    const sourceId = await requireSourceId(tx, actor.siteId, p.sourceCode, "sourceCode");
    const holderId = await createHolder(tx, actor.siteId, "PICKUP", p.code);
    const saved = await insertPickup(tx, {
      siteId: actor.siteId,
      holderId,
      sourceId,
      collectorId: actor.userId,
      receivedAt: actor.now,
      massG: measured.value.massG,
      pickup: p,
    });
    await postMovement(tx, {
      siteId: actor.siteId,
      at: p.observedAt,
      role: "RECEIPT",
      fromHolderId: null,
      toHolderId: holderId,
      massG: measured.value.massG,
      volumeMl: Math.round(p.volumeL * 1000),
      tempC: p.tempC,
      recordedById: actor.userId,
      field: "volumeL",
    });
    await appendAudit(tx, actor, { action: "CREATE", entity: "Pickup", entityKey: p.code, after: { ...p, massG: measured.value.massG } });
    return saved;
  });
}
