import "server-only";
import type { z } from "zod";
import { appendAudit } from "@/lib/audit/audit.store";
import type { Db, Tx } from "@/lib/core/connect";
import type { Result } from "@/lib/core/result";
import { parseInput } from "@/lib/ledger/parse";
import { assertPeriodOpen, createHolder, getStockG, postMovement, requireHolder } from "@/lib/ledger/ledger.store";
import { reject, Rejection, runInTransaction } from "@/lib/ledger/transaction.store";
import { markLotConsumedIfEmpty, requireDrawableHolder } from "@/lib/ledger/draw.store";
import { GaugeSchema, TankSchema, TransferSchema } from "@/lib/tank/tank.schema";
import { gaugeVsBook, massOfVolume, parseStrapping, volumeAtLevel } from "@/lib/tank/strapping";
import { toGrams, toMillilitres } from "@/lib/quantity/units";
import { DEFAULT_DENSITY_TABLE, requireDensityEntry } from "@/lib/quantity/density";
import type { Actor } from "@/lib/core/actor";
import { labelOf } from "@/lib/core/vocabulary";
import {
  bookStockAt,
  getDensityBasis,
  getTankForGauge,
  getTankServiceByHolder,
  insertGauge,
  insertTank,
  requireTankRoom,
  serviceMaterial,
} from "@/lib/tank/tank.store";

export async function createTank(db: Db, actor: Actor, input: unknown): Promise<Result<{ id: number; code: string }>> {
  const parsed = parseInput(TankSchema, input);
  if (!parsed.ok) return parsed;
  const t = parsed.value;
  return runInTransaction(db, async (tx) => {
    const holderId = await createHolder(tx, actor.siteId, "TANK", t.code);
    const strappingJson = t.strapping ? JSON.stringify(t.strapping) : "";
    const saved = await insertTank(tx, {
      siteId: actor.siteId,
      holderId,
      code: t.code,
      name: t.name,
      service: t.service,
      capacityMl: toMillilitres(t.capacityL),
      mixing: t.mixing,
      strappingJson,
    });
    await appendAudit(tx, actor, { action: "CREATE", entity: "Tank", entityKey: t.code, after: t });
    return saved;
  });
}

export type Transfer = z.output<typeof TransferSchema>;

export interface TransferBooked {
  movementId: number;
  massG: number;
  /** How a volume was turned into mass, when the move was entered as a volume. */
  fromVolume: {
    volumeL: number;
    tempC: number;
    densityKgM3: number;
    referenceDensityKgM3: number;
    referenceTempC: number;
  } | null;
}

/** Which form field a refusal names; receiving blames its own fields. */
export interface TransferFields {
  quantity?: string;
  tank?: string;
}

async function quantityOf(
  tx: Tx,
  t: Transfer,
  fromId: number,
  field: string | undefined,
): Promise<{ massG: number; field: string; fromVolume: TransferBooked["fromVolume"] }> {
  if (t.volumeL !== undefined && t.tempC !== undefined) {
    const basis = await getDensityBasis(tx, fromId);
    const m = massOfVolume({
      volumeL: t.volumeL,
      tempC: t.tempC,
      entry: requireDensityEntry(DEFAULT_DENSITY_TABLE, basis.material),
      ...(basis.densityKgM3 === undefined
        ? {}
        : { densityKgM3: basis.densityKgM3, referenceTempC: basis.referenceTempC ?? 15 }),
    });
    if (!m.ok) throw new Rejection(m.issues);
    const fromVolume = {
      volumeL: t.volumeL,
      tempC: t.tempC,
      densityKgM3: m.value.densityKgM3,
      referenceDensityKgM3: m.value.referenceDensityKgM3,
      referenceTempC: m.value.referenceTempC,
    };
    return { massG: m.value.massG, field: field ?? "volumeL", fromVolume };
  }
  if (t.all) {
    const held = await getStockG(tx, fromId);
    if (held <= 0)
      reject("LEDGER.NOTHING_TO_MOVE", `${labelOf(t.fromKind)} ${t.fromCode} holds nothing to move`, field ?? "all");
    return { massG: held, field: field ?? "all", fromVolume: null };
  }
  return { massG: toGrams(t.massKg ?? 0), field: field ?? "massKg", fromVolume: null };
}

/**
 * One move into a tank inside the caller's transaction: the source must be drawable (an accepted lot),
 * the tank of the same service and not the source itself, the draw guarded, the tank's room guarded.
 */
export async function bookTransfer(
  tx: Tx,
  actor: Actor,
  t: Transfer,
  fields: TransferFields = {},
): Promise<TransferBooked> {
  const tankField = fields.tank ?? "toTankCode";
  if (t.fromKind === "TANK" && t.fromCode === t.toTankCode)
    reject(
      "TANK.SAME_TANK",
      `Choose another tank: material cannot be moved from tank ${t.fromCode} into itself`,
      tankField,
    );
  const from = await requireDrawableHolder(tx, actor.siteId, t.fromKind, t.fromCode, "fromCode");
  const to = await requireHolder(tx, actor.siteId, "TANK", t.toTankCode, tankField);
  const toService = await getTankServiceByHolder(tx, to.id);
  const fromService =
    t.fromKind === "LOT"
      ? "FEEDSTOCK"
      : t.fromKind === "PRODUCT_LOT"
        ? "PRODUCT"
        : await getTankServiceByHolder(tx, from);
  if (fromService !== toService) {
    reject(
      "TANK.WRONG_SERVICE",
      `Tank ${t.toTankCode} is for ${labelOf(toService ?? "").toLowerCase()}, not ${labelOf(fromService ?? "").toLowerCase()}`,
      tankField,
    );
  }
  const q = await quantityOf(tx, t, from, fields.quantity);
  const room = await requireTankRoom(tx, to.id, q.massG, fields.tank ?? q.field);
  const movementId = await postMovement(tx, {
    siteId: actor.siteId,
    at: t.at,
    role: "TRANSFER",
    fromHolderId: from,
    toHolderId: to.id,
    massG: q.massG,
    note: t.note,
    recordedById: actor.userId,
    field: q.field,
    ...(q.fromVolume ? { volumeMl: toMillilitres(q.fromVolume.volumeL), tempC: q.fromVolume.tempC } : {}),
    ...(room ? { room } : {}),
  });
  await markLotConsumedIfEmpty(tx, from);
  await appendAudit(tx, actor, {
    action: "CREATE",
    entity: "Movement",
    entityKey: String(movementId),
    after: { ...t, role: "TRANSFER", massG: q.massG },
  });
  return { movementId, massG: q.massG, fromVolume: q.fromVolume };
}

/** Moves material from a lot, tank or product lot into a tank: a mass, a volume at a temperature, or all of it. */
export async function transferToTank(db: Db, actor: Actor, input: unknown): Promise<Result<TransferBooked>> {
  const parsed = parseInput(TransferSchema, input);
  if (!parsed.ok) return parsed;
  const t = parsed.value;
  return runInTransaction(db, (tx) => bookTransfer(tx, actor, t));
}

export interface GaugeSaved {
  id: number;
  massG: number;
  volumeMl: number;
  /** Book stock of the tank at the gauge time, from the ledger. */
  bookStockG: number;
  differenceG: number;
  differencePct: number | null;
  /** Density used at the gauged temperature, kg/m³. */
  densityKgM3: number;
}

/**
 * A measured tank content: the volume read directly or the level read through the tank's calibration
 * table; its mass from the measured density at 15 °C if given, else the service material's table density,
 * at the gauged temperature. The book stock at that moment is kept beside it.
 */
export async function recordGauge(db: Db, actor: Actor, input: unknown): Promise<Result<GaugeSaved>> {
  const parsed = parseInput(GaugeSchema, input);
  if (!parsed.ok) return parsed;
  const g = parsed.value;
  return runInTransaction(db, async (tx) => {
    const tank = await getTankForGauge(tx, actor.siteId, g.tankCode);
    if (!tank) reject("RECORD.NOT_FOUND", `Tank ${g.tankCode} does not exist`, "tankCode");
    await assertPeriodOpen(tx, actor.siteId, g.at, "at");
    let volumeL = g.volumeL ?? 0;
    if (g.method === "LEVEL") {
      const table = parseStrapping(tank.strappingJson);
      if (!table)
        reject(
          "TANK.NO_CALIBRATION",
          `Tank ${g.tankCode} has no calibration table on file; enter the volume read directly`,
          "levelMm",
        );
      const v = volumeAtLevel(table, g.levelMm ?? Number.NaN, "levelMm");
      if (!v.ok) throw new Rejection(v.issues);
      volumeL = v.value;
    }
    const entry = requireDensityEntry(DEFAULT_DENSITY_TABLE, serviceMaterial(tank.service));
    const m = massOfVolume({
      volumeL,
      tempC: g.tempC,
      entry,
      ...(g.densityKgM3 === undefined ? {} : { densityKgM3: g.densityKgM3, referenceTempC: 15 }),
      field: g.method === "LEVEL" ? "levelMm" : "volumeL",
    });
    if (!m.ok) throw new Rejection(m.issues);
    const bookStockG = await bookStockAt(tx, tank.holderId, g.at);
    const volumeMl = toMillilitres(volumeL);
    const saved = await insertGauge(tx, {
      tankId: tank.id,
      at: g.at,
      volumeMl,
      tempC: g.tempC,
      massG: m.value.massG,
      method: g.method,
      levelMm: g.method === "LEVEL" ? (g.levelMm ?? null) : null,
      densityKgM3: g.densityKgM3 ?? null,
      bookStockG,
      note: g.note,
      recordedById: actor.userId,
    });
    await appendAudit(tx, actor, {
      action: "CREATE",
      entity: "TankGauge",
      entityKey: g.tankCode,
      after: { ...g, volumeMl, massG: m.value.massG, bookStockG },
    });
    return {
      id: saved.id,
      massG: m.value.massG,
      volumeMl,
      bookStockG,
      ...gaugeVsBook(m.value.massG, bookStockG),
      densityKgM3: m.value.densityKgM3,
    };
  });
}
