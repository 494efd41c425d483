import "server-only";
import { appendAudit } from "@/lib/audit/audit.store";
import type { Db, Tx } from "@/lib/core/connect";
import type { Result } from "@/lib/core/result";
import { parseInput } from "@/lib/ledger/parse";
import { createHolder, getStockG, postMovement, requireHolder } from "@/lib/ledger/ledger.store";
import { reject, runInTransaction } from "@/lib/ledger/transaction.store";
import {
  getReagentOfHolder,
  listBatchOutflows,
  markBatchComplete,
  markBatchRunning,
  setProductLotMadeMass,
  sumUnmeasuredGains,
} from "@/lib/batch/batch.store";
import type { BatchState } from "@/lib/batch/batch.store";
import { insertProductLot } from "@/lib/product/product.store";
import { getContainerState } from "@/lib/waste/container.store";
import { labelOf, UNMEASURED_ROLE } from "@/lib/core/vocabulary";
import type { MoveRole } from "@/lib/core/vocabulary";
import { planUnmeasuredBooking } from "@/lib/batch/closure";
import { classifyClosure } from "@/lib/mass-balance/period-balance";
import type { Closure } from "@/lib/mass-balance/period-balance";
import { getSiteLimits } from "@/lib/mass-balance/site-limits.service";
import { markLotConsumedIfEmpty, requireDrawableHolder } from "@/lib/ledger/draw.store";
import { siteLossHolder } from "@/lib/feedstock/lot.store";
import { BatchCompleteSchema, BatchOutputCorrectionSchema, BatchStartSchema } from "@/lib/batch/batch.schema";
import type { z } from "zod";

type BatchComplete = z.output<typeof BatchCompleteSchema>;
import { toGrams } from "@/lib/quantity/units";
import {
  bookUnmeasuredDifference,
  bookUnmeasuredGain,
  requireBatch,
  reverseOutflow,
} from "@/lib/batch/batch-records.service";
import type { OutflowMove } from "@/lib/batch/batch-records.service";
export { planBatch, receiveReagent } from "@/lib/batch/batch-records.service";
import type { Actor } from "@/lib/core/actor";
import { getTankServiceByHolder, requireTankRoom } from "@/lib/tank/tank.store";

/** Records what went into the reactor; every draw is guarded against over-drawing its lot, tank or reagent. */
export async function startBatch(
  db: Db,
  actor: Actor,
  input: unknown,
): Promise<Result<{ code: string; chargedG: number }>> {
  const parsed = parseInput(BatchStartSchema, input);
  if (!parsed.ok) return parsed;
  const s = parsed.value;
  return runInTransaction(db, async (tx) => {
    const batch = await requireBatch(tx, actor.siteId, s.batchCode);
    if (batch.status !== "PLANNED")
      reject(
        "BATCH.NOT_PLANNED",
        `Batch ${s.batchCode} is ${batch.status.toLowerCase()}; only a planned batch can start`,
        "batchCode",
      );
    if (!s.charges.some((c) => c.role === "OIL")) reject("BATCH.NO_OIL", "Charges: record the oil charged", "charges");
    let chargedG = 0;
    for (const [i, c] of s.charges.entries()) {
      const field = `charges.${i}.fromCode`;
      if (c.role === "OIL" && c.fromKind === "REAGENT_LOT")
        reject("BATCH.OIL_FROM_REAGENT", "Oil must come from a feedstock lot or tank", field);
      if (c.role !== "OIL" && c.fromKind === "LOT")
        reject(
          "BATCH.REAGENT_FROM_FEEDSTOCK",
          "Methanol, catalyst, acid and water come from reagent lots (or recovered methanol from its tank)",
          field,
        );
      const from = await requireDrawableHolder(tx, actor.siteId, c.fromKind, c.fromCode, field);
      if (c.fromKind === "TANK") {
        const service = (await getTankServiceByHolder(tx, from)) ?? "";
        const fits = c.role === "OIL" ? service === "FEEDSTOCK" : c.role === "METHANOL" && service === "METHANOL";
        if (!fits)
          reject(
            "BATCH.WRONG_TANK",
            `Tank ${c.fromCode} holds ${labelOf(service).toLowerCase()}, not ${labelOf(c.role).toLowerCase()}`,
            field,
          );
      }
      const massG = toGrams(c.massKg);
      await postMovement(tx, {
        siteId: actor.siteId,
        at: s.startedAt,
        role: c.role,
        fromHolderId: from,
        toHolderId: batch.holderId,
        massG,
        recordedById: actor.userId,
        field: `charges.${i}.massKg`,
      });
      await markLotConsumedIfEmpty(tx, from);
      chargedG += massG;
    }
    await markBatchRunning(tx, batch.id, s.startedAt);
    await appendAudit(tx, actor, {
      action: "CHANGE",
      entity: "Batch",
      entityKey: s.batchCode,
      before: { status: batch.status },
      after: { status: "RUNNING", startedAt: s.startedAt, charges: s.charges },
    });
    return { code: s.batchCode, chargedG };
  });
}

type CompleteOutput = BatchComplete["outputs"][number];

/** Where an output goes: a new product lot for ester, an open waste container, or a tank with room. */
async function resolveOutputPlace(
  tx: Tx,
  actor: Actor,
  batch: BatchState,
  completedAt: Date,
  o: CompleteOutput,
  i: number,
  totalG: number,
): Promise<{ to: number; room: Room }> {
  const field = `outputs.${i}.toCode`;
  if (o.role === "LOSS") return { to: await siteLossHolder(tx, actor.siteId), room: null };
  if (o.toKind === "PRODUCT_LOT" && o.toCode) {
    if (o.role !== "ESTER") reject("BATCH.WRONG_OUTPUT", "Only ester goes to a product lot", field);
    const to = await createHolder(tx, actor.siteId, "PRODUCT_LOT", o.toCode, field);
    await insertProductLot(tx, {
      siteId: actor.siteId,
      holderId: to,
      code: o.toCode,
      batchId: batch.id,
      producedAt: completedAt,
      massG: toGrams(o.massKg),
    });
    return { to, room: null };
  }
  if (o.toKind === "WASTE_CONTAINER" && o.toCode) {
    const to = (await requireHolder(tx, actor.siteId, "WASTE_CONTAINER", o.toCode, field)).id;
    const w = await getContainerState(tx, to);
    if (w.status !== "OPEN")
      reject("WASTE.CONTAINER_CLOSED", `Waste container ${o.toCode} is not accepting more material`, field);
    return { to, room: null };
  }
  if (o.toKind === "TANK" && o.toCode) {
    const to = (await requireHolder(tx, actor.siteId, "TANK", o.toCode, field)).id;
    return { to, room: await requireTankRoom(tx, to, totalG, `outputs.${i}.massKg`) };
  }
  return reject("BATCH.NO_DESTINATION", "Output to: say where this output went", field);
}

type Room = Awaited<ReturnType<typeof requireTankRoom>>;

/** The batch's share of an output: for wash water, what was drawn off less the water used for washing. */
function batchShareG(o: CompleteOutput, i: number): number {
  const totalG = toGrams(o.massKg);
  if (o.role !== "WASH_WATER" || o.waterKg === undefined) return totalG;
  const waterG = toGrams(o.waterKg);
  if (totalG < waterG) {
    reject(
      "BATCH.WASH_BELOW_WATER",
      `Wash water drawn off (${o.massKg} kg) is less than the water used (${o.waterKg} kg): weigh or gauge it again, or correct the water used`,
      `outputs.${i}.massKg`,
    );
  }
  return totalG - waterG;
}

/** Water used for washing goes from its water lot straight to the wash-water stream, never through the reactor. */
async function bookWashWater(
  tx: Tx,
  actor: Actor,
  c: BatchComplete,
  o: CompleteOutput,
  i: number,
  place: { to: number; room: Room },
): Promise<void> {
  if (o.role !== "WASH_WATER" || o.waterFromCode === undefined || o.waterKg === undefined) return;
  const field = `outputs.${i}.waterFromCode`;
  const water = await requireDrawableHolder(tx, actor.siteId, "REAGENT_LOT", o.waterFromCode, field);
  if ((await getReagentOfHolder(tx, water)) !== "WATER")
    reject("BATCH.NOT_WATER", `Reagent lot ${o.waterFromCode} is not water`, field);
  await postMovement(tx, {
    siteId: actor.siteId,
    at: c.completedAt,
    role: "WATER",
    fromHolderId: water,
    toHolderId: place.to,
    massG: toGrams(o.waterKg),
    recordedById: actor.userId,
    note: `washing batch ${c.batchCode}`,
    field: `outputs.${i}.waterKg`,
    ...(place.room ? { room: place.room } : {}),
  });
  await markLotConsumedIfEmpty(tx, water);
}

/** Books each measured output to its place; returns the product lots made. */
async function bookOutputs(
  tx: Tx,
  actor: Actor,
  batch: BatchState,
  c: BatchComplete,
  shares: readonly number[],
): Promise<string[]> {
  const productLots: string[] = [];
  for (const [i, o] of c.outputs.entries()) {
    const place = await resolveOutputPlace(tx, actor, batch, c.completedAt, o, i, toGrams(o.massKg));
    if (o.toKind === "PRODUCT_LOT" && o.toCode) productLots.push(o.toCode);
    await bookWashWater(tx, actor, c, o, i, place);
    const massG = shares[i] ?? 0;
    if (massG === 0) continue;
    await postMovement(tx, {
      siteId: actor.siteId,
      at: c.completedAt,
      role: o.role,
      fromHolderId: batch.holderId,
      toHolderId: place.to,
      massG,
      recordedById: actor.userId,
      note: o.role === "LOSS" ? `recorded loss: ${o.reason ?? ""}` : "",
      field: `outputs.${i}.massKg`,
      ...(place.room ? { room: place.room } : {}),
    });
  }
  return productLots;
}

/**
 * Records what was weighed or gauged out. The outputs need not add up to the charge: the remainder is
 * booked as the batch's unmeasured difference (or, when more was measured than charged, an unmeasured
 * gain booked in first) and flagged against the site's closure tolerance. Water used for washing goes
 * from its water lot straight to the wash-water stream, so it is never part of a product lot.
 */
export async function completeBatch(
  db: Db,
  actor: Actor,
  input: unknown,
): Promise<Result<{ code: string; productLots: string[]; unmeasuredG: number; closure: Closure }>> {
  const parsed = parseInput(BatchCompleteSchema, input);
  if (!parsed.ok) return parsed;
  const c = parsed.value;
  return runInTransaction(db, async (tx) => {
    const batch = await requireBatch(tx, actor.siteId, c.batchCode);
    if (batch.status !== "RUNNING")
      reject(
        "BATCH.NOT_RUNNING",
        `Batch ${c.batchCode} is ${batch.status.toLowerCase()}; only a reacting batch can finish`,
        "batchCode",
      );
    if (batch.startedAt && c.completedAt < batch.startedAt)
      reject("BATCH.ENDS_BEFORE_START", "Finish time is before the start time", "completedAt");
    const shares = c.outputs.map((o, i) => batchShareG(o, i));
    const chargedG = await getStockG(tx, batch.holderId);
    const { gainG } = planUnmeasuredBooking(
      chargedG,
      shares.reduce((a, b) => a + b, 0),
    );
    const gainNote = "unmeasured difference: more measured out than charged";
    await bookUnmeasuredGain(tx, actor, batch, c.completedAt, gainG, gainNote, "outputs");
    const productLots = await bookOutputs(tx, actor, batch, c, shares);
    const booked = await bookUnmeasuredDifference(
      tx,
      actor,
      batch,
      c.completedAt,
      "unmeasured difference: charged less everything measured out",
    );
    const unmeasuredG = booked - gainG;
    await markBatchComplete(tx, batch.id, c.completedAt);
    await appendAudit(tx, actor, {
      action: "CHANGE",
      entity: "Batch",
      entityKey: c.batchCode,
      before: { status: batch.status },
      after: { status: "COMPLETE", completedAt: c.completedAt, outputs: c.outputs, unmeasuredG },
    });
    const tolerance = (await getSiteLimits(tx, actor.siteId)).closure;
    return { code: c.batchCode, productLots, unmeasuredG, closure: classifyClosure(unmeasuredG, chargedG, tolerance) };
  });
}

/**
 * Corrects a finished batch's output typed wrong, never editing it: the wrong output and the batch's
 * booked unmeasured difference are reversed (each an opposite movement linked to it, as in
 * lib/correction), the output is booked again with the right mass at the original time, and the
 * unmeasured difference is booked afresh. Refused when the output's material has moved on since.
 */
export async function correctBatchOutput(
  db: Db,
  actor: Actor,
  input: unknown,
): Promise<Result<{ code: string; unmeasuredG: number }>> {
  const parsed = parseInput(BatchOutputCorrectionSchema, input);
  if (!parsed.ok) return parsed;
  const c = parsed.value;
  return runInTransaction(db, async (tx) => {
    const batch = await requireBatch(tx, actor.siteId, c.batchCode);
    if (batch.status !== "COMPLETE" || batch.completedAt === null)
      reject(
        "BATCH.NOT_FINISHED",
        `Batch ${c.batchCode} is ${batch.status.toLowerCase()}; only a finished batch's outputs are corrected here`,
        "batchCode",
      );
    const moves = await listBatchOutflows(tx, batch.holderId);
    const m = moves.find((x) => x.id === c.movementId);
    if (!m || m.role === UNMEASURED_ROLE || m.reversesId !== null)
      reject("BATCH.NOT_AN_OUTPUT", `Movement ${c.movementId} is not an output of batch ${c.batchCode}`, "movementId");
    if (m.reversedById !== null)
      reject(
        "BATCH.OUTPUT_CORRECTED",
        `This output was already corrected (movement ${m.reversedById}); correct the new one instead`,
        "movementId",
      );
    const newG = toGrams(c.massKg);
    if (newG === m.massG) reject("BATCH.SAME_MASS", "Corrected mass: this is the mass already recorded", "massKg");
    const reverse = (x: OutflowMove) => reverseOutflow(tx, actor, x, c.reason);
    for (const u of moves.filter((x) => x.role === UNMEASURED_ROLE && x.reversedById === null && x.reversesId === null))
      await reverse(u);
    await reverse(m);
    const { gainG } = planUnmeasuredBooking(await getStockG(tx, batch.holderId), newG);
    const note = `unmeasured difference after correcting movement ${m.id}`;
    await bookUnmeasuredGain(tx, actor, batch, m.at, gainG, note, "massKg");
    const room = await requireTankRoom(tx, m.toHolderId, newG, "massKg");
    await postMovement(tx, {
      siteId: actor.siteId,
      at: m.at,
      role: m.role as MoveRole,
      fromHolderId: batch.holderId,
      toHolderId: m.toHolderId,
      massG: newG,
      recordedById: actor.userId,
      note: `Corrects movement ${m.id}: ${c.reason}`,
      field: "massKg",
      ...(room ? { room } : {}),
    });
    if (m.role === "ESTER") await setProductLotMadeMass(tx, m.toHolderId, newG);
    const booked = await bookUnmeasuredDifference(tx, actor, batch, m.at, note);
    const unmeasuredG = booked - (await sumUnmeasuredGains(tx, batch.holderId));
    await appendAudit(tx, actor, {
      action: "CHANGE",
      entity: "Batch",
      entityKey: c.batchCode,
      before: { movementId: m.id, role: m.role, massG: m.massG },
      after: { massG: newG, unmeasuredG },
      reason: c.reason,
    });
    return { code: c.batchCode, unmeasuredG };
  });
}
