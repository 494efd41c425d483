import "server-only";
import { appendAudit } from "@/lib/audit/audit.store";
import type { Db } from "@/lib/database/connect";
import type { Result } from "@/lib/errors";
import { parseInput } from "@/lib/ledger/parse";
import { createHolder, postMovement, reject, requireHolder, runInTransaction } from "@/lib/ledger/ledger.store";
import { markLotConsumedIfEmpty, requireDrawableHolder } from "@/lib/ledger/draw.store";
import { GaugeSchema, TankSchema, TransferSchema } from "@/lib/tank/tank.schema";
import { toGrams, toMillilitres } from "@/lib/quantity/units";
import { densityAt, DEFAULT_DENSITY_TABLE, requireDensityEntry } from "@/lib/quantity/density";
import type { Actor } from "@/lib/site/actor";
import { labelOf } from "@/lib/ledger/kinds";
import { getTankByCode, requireTankRoom, getTankServiceByHolder, insertGauge, insertTank, serviceMaterial } from "@/lib/tank/tank.store";

export async function createTank(db: Db, actor: Actor, input: unknown): Promise<Result<{ id: number; code: string }>> {
  const parsed = parseInput(TankSchema, input);
  if (!parsed.ok) return parsed;
  const t = parsed.value;
  return runInTransaction(db, async (tx) => {
    const holderId = await createHolder(tx, actor.siteId, "TANK", t.code);
    const saved = await insertTank(tx, { siteId: actor.siteId, holderId, code: t.code, name: t.name, service: t.service, capacityMl: toMillilitres(t.capacityL), mixing: t.mixing });
    await appendAudit(tx, actor, { action: "CREATE", entity: "Tank", entityKey: t.code, after: t });
    return saved;
  });
}

export async function transferToTank(db: Db, actor: Actor, input: unknown): Promise<Result<{ movementId: number }>> {
  const parsed = parseInput(TransferSchema, input);
  if (!parsed.ok) return parsed;
  const t = parsed.value;
  return runInTransaction(db, async (tx) => {
    const from = await requireDrawableHolder(tx, actor.siteId, t.fromKind, t.fromCode, "fromCode");
    const to = await requireHolder(tx, actor.siteId, "TANK", t.toTankCode, "toTankCode");
    const toService = await getTankServiceByHolder(tx, to.id);
    const fromService = t.fromKind === "LOT" ? "FEEDSTOCK" : t.fromKind === "PRODUCT_LOT" ? "PRODUCT" : await getTankServiceByHolder(tx, from);
    if (fromService !== toService) {
      reject("TANK.WRONG_SERVICE", `Tank ${t.toTankCode} is for ${labelOf(toService ?? "").toLowerCase()}, not ${labelOf(fromService ?? "").toLowerCase()}`, "toTankCode");
    }
    const room = await requireTankRoom(tx, to.id, toGrams(t.massKg), "massKg");
    const movementId = await postMovement(tx, { siteId: actor.siteId, at: t.at, role: "TRANSFER", fromHolderId: from, toHolderId: to.id, massG: toGrams(t.massKg), note: t.note, recordedById: actor.userId, ...(room ? { room } : {}) });
    await markLotConsumedIfEmpty(tx, from);
    await appendAudit(tx, actor, { action: "CREATE", entity: "Movement", entityKey: String(movementId), after: { ...t, role: "TRANSFER", massG: toGrams(t.massKg) } });
    return { movementId };
  });
}

/** A measured tank level; its mass uses the tank's service material at the gauged temperature. */
export async function recordGauge(db: Db, actor: Actor, input: unknown): Promise<Result<{ id: number; massG: number }>> {
  const parsed = parseInput(GaugeSchema, input);
  if (!parsed.ok) return parsed;
  const g = parsed.value;
  return runInTransaction(db, async (tx) => {
    const tank = await getTankByCode(tx, actor.siteId, g.tankCode);
    if (!tank) reject("RECORD.NOT_FOUND", `Tank ${g.tankCode} does not exist`, "tankCode");
    const rho = densityAt(requireDensityEntry(DEFAULT_DENSITY_TABLE, serviceMaterial(tank.service)), g.tempC);
    const massG = toGrams((g.volumeL * rho) / 1000);
    const saved = await insertGauge(tx, { tankId: tank.id, at: g.at, volumeMl: toMillilitres(g.volumeL), tempC: g.tempC, massG });
    await appendAudit(tx, actor, { action: "CREATE", entity: "TankGauge", entityKey: g.tankCode, after: { ...g, massG } });
    return saved;
  });
}
