import "server-only";
import type { Db, Tx } from "@/lib/database/connect";
import { reject } from "@/lib/ledger/ledger.store";
import { densityAt, DEFAULT_DENSITY_TABLE, requireDensityEntry } from "@/lib/quantity/density";
import type { MaterialKind as DensityMaterial } from "@/lib/quantity/density";

export interface TankRow {
  id: number;
  code: string;
  name: string;
  service: string;
  mixing: string;
  capacityMl: number;
  stockG: number;
  lastGauge: { at: Date; massG: number; volumeMl: number } | null;
}

export async function listTanks(db: Db, siteId: number): Promise<TankRow[]> {
  const rows = await db.tank.findMany({
    where: { siteId },
    orderBy: { code: "asc" },
    include: { holder: { select: { stockG: true } }, gauges: { orderBy: { at: "desc" }, take: 1, select: { at: true, massG: true, volumeMl: true } } },
  });
  return rows.map((r) => ({
    id: r.id,
    code: r.code,
    name: r.name,
    service: r.service,
    mixing: r.mixing,
    capacityMl: r.capacityMl,
    stockG: r.holder.stockG,
    lastGauge: r.gauges[0] ?? null,
  }));
}


/** The material whose density turns a tank's volume capacity into a mass capacity. */
export function serviceMaterial(service: string): DensityMaterial {
  return service === "PRODUCT" ? "FAME" : service === "METHANOL" ? "METHANOL" : service === "GLYCEROL_PHASE" ? "GLYCEROL" : service === "WASH_WATER" ? "WATER" : "USED_COOKING_OIL";
}

/**
 * A tank's room for a fill (mass capacity at 15 °C), for postMovement's guarded increment; null when
 * the holder is not a tank. Refuses at once a fill that would not fit now, with the room left.
 */
export async function requireTankRoom(tx: Tx, holderId: number, addG: number, field: string): Promise<{ capacityG: number; refusal: (stockG: number) => string } | null> {
  const tank = await tx.tank.findUnique({ where: { holderId }, select: { code: true, service: true, capacityMl: true, holder: { select: { stockG: true } } } });
  if (!tank) return null;
  const rho = densityAt(requireDensityEntry(DEFAULT_DENSITY_TABLE, serviceMaterial(tank.service)), 15);
  const capacityG = Math.floor((tank.capacityMl / 1000) * rho);
  const refusal = (stockG: number) => {
    const room = Math.max(0, capacityG - stockG);
    return `Tank ${tank.code} has room for about ${(room / 1000).toLocaleString("en", { maximumFractionDigits: 0 })} kg (capacity ${(tank.capacityMl / 1000).toLocaleString("en")} L)`;
  };
  if (tank.holder.stockG + addG > capacityG) reject("TANK.OVERFILL", refusal(tank.holder.stockG), field);
  return { capacityG, refusal };
}

export async function insertTank(tx: Tx, t: { siteId: number; holderId: number; code: string; name: string; service: string; capacityMl: number; mixing: string }): Promise<{ id: number; code: string }> {
  return tx.tank.create({ data: t, select: { id: true, code: true } });
}

/** A tank's service by its holder, or null when the holder is not a tank. */
export async function getTankServiceByHolder(tx: Tx, holderId: number): Promise<string | null> {
  return (await tx.tank.findUnique({ where: { holderId }, select: { service: true } }))?.service ?? null;
}

export async function getTankByCode(tx: Tx, siteId: number, code: string): Promise<{ id: number; service: string } | null> {
  return tx.tank.findUnique({ where: { siteId_code: { siteId, code } }, select: { id: true, service: true } });
}

export async function insertGauge(tx: Tx, g: { tankId: number; at: Date; volumeMl: number; tempC: number; massG: number }): Promise<{ id: number; massG: number }> {
  return tx.tankGauge.create({ data: g, select: { id: true, massG: true } });
}
