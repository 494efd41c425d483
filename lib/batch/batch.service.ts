import "server-only";
import { appendAudit } from "@/lib/audit/audit.store";
import type { Db, Tx } from "@/lib/database/connect";
import type { Result } from "@/lib/errors";
import { parseInput } from "@/lib/ledger/parse";
import { createHolder, getStockG, postMovement, reject, requireHolder, runInTransaction } from "@/lib/ledger/ledger.store";
import { getBatchState, insertBatch, insertReagentLot, markBatchComplete, markBatchRunning } from "@/lib/batch/batch.store";
import type { BatchState } from "@/lib/batch/batch.store";
import { insertProductLot } from "@/lib/product/product.store";
import { getContainerState } from "@/lib/waste/container.store";
import { labelOf } from "@/lib/ledger/kinds";
import { markLotConsumedIfEmpty, requireDrawableHolder } from "@/lib/ledger/draw.store";
import { siteLossHolder } from "@/lib/feedstock/lot.store";
import { BatchCompleteSchema, BatchPlanSchema, BatchStartSchema, ReagentLotSchema } from "@/lib/batch/batch.schema";
import { toGrams } from "@/lib/quantity/units";
import type { Actor } from "@/lib/site/actor";
import { getTankServiceByHolder, requireTankRoom } from "@/lib/tank/tank.store";

/** Methanol, catalyst, acid or process water enters the books as a reagent lot. */
export async function receiveReagent(db: Db, actor: Actor, input: unknown): Promise<Result<{ id: number; code: string }>> {
  const parsed = parseInput(ReagentLotSchema, input);
  if (!parsed.ok) return parsed;
  const r = parsed.value;
  return runInTransaction(db, async (tx) => {
    const holderId = await createHolder(tx, actor.siteId, "REAGENT_LOT", r.code);
    const massG = toGrams(r.massKg);
    const lot = await insertReagentLot(tx, { siteId: actor.siteId, holderId, code: r.code, reagent: r.reagent, supplier: r.supplier, strengthPct: r.strengthPct, receivedAt: r.receivedAt, massG });
    await postMovement(tx, { siteId: actor.siteId, at: r.receivedAt, role: "RECEIPT", fromHolderId: null, toHolderId: holderId, massG, recordedById: actor.userId, note: `reagent ${r.reagent} from ${r.supplier}` });
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

async function requireBatch(tx: Tx, siteId: number, code: string): Promise<BatchState> {
  const batch = await getBatchState(tx, siteId, code);
  if (!batch) reject("RECORD.NOT_FOUND", `Batch ${code} does not exist`, "batchCode");
  return batch;
}

/** Records what went into the reactor; every draw is guarded against over-drawing its lot, tank or reagent. */
export async function startBatch(db: Db, actor: Actor, input: unknown): Promise<Result<{ code: string; chargedG: number }>> {
  const parsed = parseInput(BatchStartSchema, input);
  if (!parsed.ok) return parsed;
  const s = parsed.value;
  return runInTransaction(db, async (tx) => {
    const batch = await requireBatch(tx, actor.siteId, s.batchCode);
    if (batch.status !== "PLANNED") reject("BATCH.NOT_PLANNED", `Batch ${s.batchCode} is ${batch.status.toLowerCase()}; only a planned batch can start`, "batchCode");
    if (!s.charges.some((c) => c.role === "OIL")) reject("BATCH.NO_OIL", "Charges: record the oil charged", "charges");
    let chargedG = 0;
    for (const [i, c] of s.charges.entries()) {
      const field = `charges.${i}.fromCode`;
      if (c.role === "OIL" && c.fromKind === "REAGENT_LOT") reject("BATCH.OIL_FROM_REAGENT", "Oil must come from a feedstock lot or tank", field);
      if (c.role !== "OIL" && c.fromKind === "LOT") reject("BATCH.REAGENT_FROM_FEEDSTOCK", "Methanol, catalyst, acid and water come from reagent lots (or recovered methanol from its tank)", field);
      const from = await requireDrawableHolder(tx, actor.siteId, c.fromKind, c.fromCode, field);
      if (c.fromKind === "TANK") {
        const service = (await getTankServiceByHolder(tx, from)) ?? "";
        const fits = c.role === "OIL" ? service === "FEEDSTOCK" : c.role === "METHANOL" && service === "METHANOL";
        if (!fits) reject("BATCH.WRONG_TANK", `Tank ${c.fromCode} holds ${labelOf(service).toLowerCase()}, not ${labelOf(c.role).toLowerCase()}`, field);
      }
      const massG = toGrams(c.massKg);
      await postMovement(tx, { siteId: actor.siteId, at: s.startedAt, role: c.role, fromHolderId: from, toHolderId: batch.holderId, massG, recordedById: actor.userId, field: `charges.${i}.massKg` });
      await markLotConsumedIfEmpty(tx, from);
      chargedG += massG;
    }
    await markBatchRunning(tx, batch.id, s.startedAt);
    await appendAudit(tx, actor, { action: "CHANGE", entity: "Batch", entityKey: s.batchCode, before: { status: batch.status }, after: { status: "RUNNING", startedAt: s.startedAt, charges: s.charges } });
    return { code: s.batchCode, chargedG };
  });
}

/**
 * Records what came out. The reactor must be empty afterwards: everything charged is accounted for
 * as ester, glycerol phase, wash water, recovered methanol or a recorded loss.
 */
export async function completeBatch(db: Db, actor: Actor, input: unknown): Promise<Result<{ code: string; productLots: string[] }>> {
  const parsed = parseInput(BatchCompleteSchema, input);
  if (!parsed.ok) return parsed;
  const c = parsed.value;
  return runInTransaction(db, async (tx) => {
    const batch = await requireBatch(tx, actor.siteId, c.batchCode);
    if (batch.status !== "RUNNING") reject("BATCH.NOT_RUNNING", `Batch ${c.batchCode} is ${batch.status.toLowerCase()}; only a reacting batch can finish`, "batchCode");
    if (batch.startedAt && c.completedAt < batch.startedAt) reject("BATCH.ENDS_BEFORE_START", "Finish time is before the start time", "completedAt");
    const productLots: string[] = [];
    for (const [i, o] of c.outputs.entries()) {
      const field = `outputs.${i}.toCode`;
      let to: number;
      let room: Awaited<ReturnType<typeof requireTankRoom>> = null;
      if (o.role === "LOSS") {
        to = await siteLossHolder(tx, actor.siteId);
      } else if (o.toKind === "PRODUCT_LOT" && o.toCode) {
        if (o.role !== "ESTER") reject("BATCH.WRONG_OUTPUT", "Only ester goes to a product lot", field);
        to = await createHolder(tx, actor.siteId, "PRODUCT_LOT", o.toCode, field);
        await insertProductLot(tx, { siteId: actor.siteId, holderId: to, code: o.toCode, batchId: batch.id, producedAt: c.completedAt, massG: toGrams(o.massKg) });
        productLots.push(o.toCode);
      } else if (o.toKind === "WASTE_CONTAINER" && o.toCode) {
        to = (await requireHolder(tx, actor.siteId, "WASTE_CONTAINER", o.toCode, field)).id;
        const w = await getContainerState(tx, to);
        if (w.status !== "OPEN") reject("WASTE.CONTAINER_CLOSED", `Waste container ${o.toCode} is not accepting more material`, field);
      } else if (o.toKind === "TANK" && o.toCode) {
        to = (await requireHolder(tx, actor.siteId, "TANK", o.toCode, field)).id;
        room = await requireTankRoom(tx, to, toGrams(o.massKg), `outputs.${i}.massKg`);
      } else {
        reject("BATCH.NO_DESTINATION", "Output to: say where this output went", field);
      }
      await postMovement(tx, { siteId: actor.siteId, at: c.completedAt, role: o.role, fromHolderId: batch.holderId, toHolderId: to, massG: toGrams(o.massKg), recordedById: actor.userId, field: `outputs.${i}.massKg`, ...(room ? { room } : {}) });
    }
    const left = await getStockG(tx, batch.holderId);
    if (left !== 0) {
      reject("BATCH.UNBALANCED", `${(left / 1000).toLocaleString("en", { maximumFractionDigits: 3 })} kg charged is not accounted for; record it as an output or a loss`, "outputs");
    }
    await markBatchComplete(tx, batch.id, c.completedAt);
    await appendAudit(tx, actor, { action: "CHANGE", entity: "Batch", entityKey: c.batchCode, before: { status: batch.status }, after: { status: "COMPLETE", completedAt: c.completedAt, outputs: c.outputs } });
    return { code: c.batchCode, productLots };
  });
}
