import "server-only";
import { appendAudit } from "@/lib/audit/audit.store";
import type { z } from "zod";
import type { Db, Tx } from "@/lib/core/connect";
import type { Result } from "@/lib/core/result";
import { failMany } from "@/lib/core/result";
import { parseInput } from "@/lib/ledger/parse";
import { createHolder, postMovement } from "@/lib/ledger/ledger.store";
import { reject, runInTransaction } from "@/lib/ledger/transaction.store";
import { measureObserved } from "@/lib/feedstock/measure";
import type { Measured } from "@/lib/feedstock/measure";
import { DeliveryLotSchema, LabTestSchema, LotDecisionSchema, LotFromPickupsSchema } from "@/lib/feedstock/lot.schema";
import {
  countValidTitrations,
  findPickupsByCode,
  insertLabTest,
  insertLot,
  linkPickupToLot,
  requireLot,
  setLotStatus,
  siteLossHolder,
} from "@/lib/feedstock/lot.store";
import { requireSourceId } from "@/lib/source/source.store";
import type { DensityTable } from "@/lib/quantity/density";
import { DEFAULT_DENSITY_TABLE } from "@/lib/quantity/density";
import type { Actor } from "@/lib/core/actor";

export interface LotSaved {
  id: number;
  code: string;
  massG: number;
  /** Plant measurement minus the pickups' kerbside estimates, booked as a receiving difference. */
  receivingDifferenceG: number;
}

export function measureLot(
  l: {
    material: Parameters<typeof measureObserved>[0]["material"];
    observedVolumeL: number;
    observedTempC: number;
    densityKgM3?: number | undefined;
  },
  table: DensityTable,
): Result<Measured> {
  const m = measureObserved({
    material: l.material,
    observedVolumeL: l.observedVolumeL,
    observedTempC: l.observedTempC,
    measuredDensityKgM3: l.densityKgM3,
    referenceTempC: 15,
    table,
  });
  return m.ok ? m : failMany(m.issues.map((i) => ({ ...i, field: "observedVolumeL" })));
}

/**
 * Pools one or more pickups into a lot. Each pickup's book mass moves into the lot; the plant's own
 * measurement of the lot is the truth, so any difference is booked openly: a shortfall as a recorded
 * loss, a surplus as a receipt noted as a receiving difference.
 */
export async function receiveLotFromPickups(
  db: Db,
  actor: Actor,
  input: unknown,
  table: DensityTable = DEFAULT_DENSITY_TABLE,
): Promise<Result<LotSaved>> {
  const parsed = parseInput(LotFromPickupsSchema, input);
  if (!parsed.ok) return parsed;
  const l = parsed.value;
  const measured = measureLot(l, table);
  if (!measured.ok) return measured;
  return runInTransaction(db, (tx) => bookLotFromPickups(tx, actor, l, measured.value));
}

export type LotFromPickups = z.output<typeof LotFromPickupsSchema>;

/** The pooling itself, inside the caller's transaction (receiving into a tank adds more to the same one). */
export async function bookLotFromPickups(
  tx: Tx,
  actor: Actor,
  l: LotFromPickups,
  measured: Measured,
): Promise<LotSaved & { holderId: number }> {
  const pickups = await findPickupsByCode(tx, actor.siteId, l.pickupCodes);
  l.pickupCodes.forEach((code, i) => {
    const p = pickups.find((x) => x.code === code);
    if (!p) reject("RECORD.NOT_FOUND", `Pickup ${code} does not exist`, `pickupCodes.${i}`);
    if (p.lotId !== null) reject("PICKUP.ALREADY_RECEIVED", `Pickup ${code} is already in a lot`, `pickupCodes.${i}`);
    if (p.observedAt > l.receivedAt)
      reject("LOT.BEFORE_PICKUP", `Pickup ${code} was collected after the lot's received time`, "receivedAt");
  });
  const holderId = await createHolder(tx, actor.siteId, "LOT", l.code);
  const lot = await insertLot(tx, { siteId: actor.siteId, holderId, origin: "PICKUPS", input: l, measured });
  let booked = 0;
  for (const p of pickups) {
    await linkPickupToLot(tx, p.id, lot.id);
    if (p.stockG === 0) continue;
    booked += p.stockG;
    await postMovement(tx, {
      siteId: actor.siteId,
      at: l.receivedAt,
      role: "TRANSFER",
      fromHolderId: p.holderId,
      toHolderId: holderId,
      massG: p.stockG,
      recordedById: actor.userId,
      note: `pickup ${p.code} received`,
    });
  }
  const difference = measured.massG - booked;
  if (difference < 0) {
    const loss = await siteLossHolder(tx, actor.siteId);
    await postMovement(tx, {
      siteId: actor.siteId,
      at: l.receivedAt,
      role: "LOSS",
      fromHolderId: holderId,
      toHolderId: loss,
      massG: -difference,
      recordedById: actor.userId,
      note: "receiving difference: plant measurement below pickup estimates",
    });
  } else if (difference > 0) {
    await postMovement(tx, {
      siteId: actor.siteId,
      at: l.receivedAt,
      role: "RECEIPT",
      fromHolderId: null,
      toHolderId: holderId,
      massG: difference,
      recordedById: actor.userId,
      note: "receiving difference: plant measurement above pickup estimates",
    });
  }
  await appendAudit(tx, actor, {
    action: "CREATE",
    entity: "FeedstockLot",
    entityKey: l.code,
    after: { ...l, massG: measured.massG, densityKgM3: measured.densityKgM3, receivingDifferenceG: difference },
  });
  return { id: lot.id, holderId, code: lot.code, massG: measured.massG, receivingDifferenceG: difference };
}

/** A supplier's delivery: the oil enters the books directly in the lot. */
export async function receiveDelivery(
  db: Db,
  actor: Actor,
  input: unknown,
  table: DensityTable = DEFAULT_DENSITY_TABLE,
): Promise<Result<LotSaved>> {
  const parsed = parseInput(DeliveryLotSchema, input);
  if (!parsed.ok) return parsed;
  const l = parsed.value;
  const measured = measureLot(l, table);
  if (!measured.ok) return measured;
  return runInTransaction(db, async (tx) => {
    const supplierId = await requireSourceId(tx, actor.siteId, l.supplierCode, "supplierCode");
    const holderId = await createHolder(tx, actor.siteId, "LOT", l.code);
    const lot = await insertLot(tx, {
      siteId: actor.siteId,
      holderId,
      origin: "DELIVERY",
      supplierId,
      deliveryDocument: l.deliveryDocument,
      input: l,
      measured: measured.value,
    });
    await postMovement(tx, {
      siteId: actor.siteId,
      at: l.receivedAt,
      role: "RECEIPT",
      fromHolderId: null,
      toHolderId: holderId,
      massG: measured.value.massG,
      volumeMl: Math.round(l.observedVolumeL * 1000),
      tempC: l.observedTempC,
      recordedById: actor.userId,
      note: `delivery ${l.deliveryDocument}`,
      field: "observedVolumeL",
    });
    await appendAudit(tx, actor, {
      action: "CREATE",
      entity: "FeedstockLot",
      entityKey: l.code,
      after: { ...l, massG: measured.value.massG, densityKgM3: measured.value.densityKgM3 },
    });
    return { id: lot.id, code: lot.code, massG: measured.value.massG, receivingDifferenceG: 0 };
  });
}

export async function recordLabTest(db: Db, actor: Actor, input: unknown): Promise<Result<{ id: number }>> {
  const parsed = parseInput(LabTestSchema, input);
  if (!parsed.ok) return parsed;
  const t = parsed.value;
  return runInTransaction(db, async (tx) => {
    const lot = await requireLot(tx, actor.siteId, t.lotCode, "lotCode");
    const saved = await insertLabTest(tx, {
      lotId: lot.id,
      analystId: actor.userId,
      testedAt: t.testedAt,
      kind: t.kind,
      method: t.method,
      valuePct: t.valuePct,
    });
    await appendAudit(tx, actor, {
      action: "CREATE",
      entity: "LabTest",
      entityKey: t.lotCode,
      after: { ...t, id: saved.id },
    });
    return saved;
  });
}

/** Accept a lot for production or reject it; a lot can only be accepted once it has an FFA result. */
export async function decideLot(
  db: Db,
  actor: Actor,
  input: unknown,
): Promise<Result<{ code: string; status: string }>> {
  const parsed = parseInput(LotDecisionSchema, input);
  if (!parsed.ok) return parsed;
  const d = parsed.value;
  return runInTransaction(db, async (tx) => {
    const lot = await requireLot(tx, actor.siteId, d.lotCode, "lotCode");
    if (lot.status !== "QUARANTINED")
      reject("LOT.ALREADY_DECIDED", `Lot ${d.lotCode} is already ${lot.status.toLowerCase()}`, "status");
    if (d.status === "ACCEPTED" && lot.screeningHold)
      reject(
        "LOT.SCREENING_HOLD",
        `Lot ${d.lotCode} is held after a confirmed source check; compliance clears the source before it can be accepted`,
        "status",
      );
    if (d.status === "ACCEPTED") {
      const titrations = await countValidTitrations(tx, lot.id);
      if (titrations === 0)
        reject("LOT.NO_FFA", `Lot ${d.lotCode} has no FFA titration yet; titrate before accepting`, "status");
    }
    await setLotStatus(tx, lot.id, d.status);
    await appendAudit(tx, actor, {
      action: "CHANGE",
      entity: "FeedstockLot",
      entityKey: d.lotCode,
      before: { status: lot.status },
      after: { status: d.status },
    });
    return { code: d.lotCode, status: d.status };
  });
}
