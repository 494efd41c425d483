import "server-only";
import type { Db, Tx } from "@/lib/core/connect";
import { reject } from "@/lib/ledger/transaction.store";
import { densityAt, DEFAULT_DENSITY_TABLE, MATERIAL_KINDS, requireDensityEntry } from "@/lib/quantity/density";
import type { MaterialKind as DensityMaterial } from "@/lib/quantity/density";
import { toTankLevel } from "@/lib/tank/tank-level";
import type { FillLevel } from "@/lib/tank/tank-level";

export interface TankRow {
  id: number;
  code: string;
  name: string;
  service: string;
  mixing: string;
  capacityMl: number;
  stockG: number;
  lastGauge: { at: Date; massG: number; volumeMl: number; bookStockG: number | null } | null;
}

export async function listTanks(db: Db, siteId: number): Promise<TankRow[]> {
  const rows = await db.tank.findMany({
    where: { siteId },
    orderBy: { code: "asc" },
    include: {
      holder: { select: { stockG: true } },
      gauges: {
        orderBy: [{ at: "desc" }, { id: "desc" }],
        take: 1,
        select: { at: true, massG: true, volumeMl: true, bookStockG: true },
      },
    },
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

/** A tank with its book stock as a fill level of its nominal material. */
export type TankLevel = TankRow & FillLevel;

export async function listTankLevels(db: Db, siteId: number): Promise<TankLevel[]> {
  return (await listTanks(db, siteId)).map(toTankLevel);
}

/** The material whose density turns a tank's volume capacity into a mass capacity. */
export function serviceMaterial(service: string): DensityMaterial {
  return service === "PRODUCT"
    ? "FAME"
    : service === "METHANOL"
      ? "METHANOL"
      : service === "GLYCEROL_PHASE"
        ? "GLYCEROL"
        : service === "WASH_WATER"
          ? "WATER"
          : "USED_COOKING_OIL";
}

/**
 * A tank's room for a fill (mass capacity at 15 °C), for postMovement's guarded increment; null when
 * the holder is not a tank. Refuses at once a fill that would not fit now, with the room left.
 */
export async function requireTankRoom(
  tx: Tx,
  holderId: number,
  addG: number,
  field: string,
): Promise<{ capacityG: number; refusal: (stockG: number) => string } | null> {
  const tank = await tx.tank.findUnique({
    where: { holderId },
    select: { code: true, service: true, capacityMl: true, holder: { select: { stockG: true } } },
  });
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

export async function insertTank(
  tx: Tx,
  t: {
    siteId: number;
    holderId: number;
    code: string;
    name: string;
    service: string;
    capacityMl: number;
    mixing: string;
    strappingJson: string;
  },
): Promise<{ id: number; code: string }> {
  return tx.tank.create({ data: t, select: { id: true, code: true } });
}

/** A tank's service by its holder, or null when the holder is not a tank. */
export async function getTankServiceByHolder(tx: Tx, holderId: number): Promise<string | null> {
  return (await tx.tank.findUnique({ where: { holderId }, select: { service: true } }))?.service ?? null;
}

export async function getTankByCode(
  tx: Tx,
  siteId: number,
  code: string,
): Promise<{ id: number; service: string } | null> {
  return tx.tank.findUnique({ where: { siteId_code: { siteId, code } }, select: { id: true, service: true } });
}

export interface GaugeRow {
  tankId: number;
  at: Date;
  volumeMl: number;
  tempC: number;
  massG: number;
  method: string;
  levelMm: number | null;
  densityKgM3: number | null;
  bookStockG: number;
  note: string;
  recordedById: number;
}

export async function insertGauge(tx: Tx, g: GaugeRow): Promise<{ id: number; massG: number }> {
  return tx.tankGauge.create({ data: g, select: { id: true, massG: true } });
}

/** What a gauge needs of its tank: the holder (for the book stock), the service and the calibration table. */
export async function getTankForGauge(
  tx: Tx,
  siteId: number,
  code: string,
): Promise<{ id: number; holderId: number; service: string; strappingJson: string } | null> {
  return tx.tank.findUnique({
    where: { siteId_code: { siteId, code } },
    select: { id: true, holderId: true, service: true, strappingJson: true },
  });
}

/** Book stock of a holder at an instant from the ledger: everything moved in minus everything moved out up to and including `at`. */
export async function bookStockAt(tx: Db | Tx, holderId: number, at: Date): Promise<number> {
  const [into, out] = await Promise.all([
    tx.movement.aggregate({ where: { toHolderId: holderId, at: { lte: at } }, _sum: { massG: true } }),
    tx.movement.aggregate({ where: { fromHolderId: holderId, at: { lte: at } }, _sum: { massG: true } }),
  ]);
  return (into._sum.massG ?? 0) - (out._sum.massG ?? 0);
}

function asDensityMaterial(m: string): DensityMaterial {
  return (MATERIAL_KINDS as readonly string[]).includes(m) ? (m as DensityMaterial) : "OTHER_OIL";
}

/** The density a volume drawn from a holder is converted with: a lot's own density at its reference temperature, else the tank's or product's table material. */
export async function getDensityBasis(
  tx: Tx,
  holderId: number,
): Promise<{ material: DensityMaterial; densityKgM3?: number; referenceTempC?: number }> {
  const h = await tx.holder.findUniqueOrThrow({
    where: { id: holderId },
    select: {
      kind: true,
      lot: { select: { material: true, densityKgM3: true, referenceTempC: true } },
      tank: { select: { service: true } },
    },
  });
  if (h.lot)
    return {
      material: asDensityMaterial(h.lot.material),
      densityKgM3: h.lot.densityKgM3,
      referenceTempC: h.lot.referenceTempC,
    };
  if (h.tank) return { material: serviceMaterial(h.tank.service) };
  return { material: h.kind === "PRODUCT_LOT" ? "FAME" : "USED_COOKING_OIL" };
}

export interface GaugeView {
  id: number;
  at: Date;
  method: string;
  levelMm: number | null;
  volumeMl: number;
  tempC: number;
  densityKgM3: number | null;
  massG: number;
  bookStockG: number | null;
  note: string;
  recordedBy: string | null;
}

/** A tank's gauge readings, newest first. */
export async function listGauges(db: Db, tankId: number, take = 50): Promise<GaugeView[]> {
  const rows = await db.tankGauge.findMany({ where: { tankId }, orderBy: [{ at: "desc" }, { id: "desc" }], take });
  const ids = [...new Set(rows.map((r) => r.recordedById).filter((x): x is number => x !== null))];
  const users = ids.length
    ? await db.user.findMany({ where: { id: { in: ids } }, select: { id: true, fullName: true } })
    : [];
  const name = new Map(users.map((u) => [u.id, u.fullName]));
  return rows.map((r) => ({
    id: r.id,
    at: r.at,
    method: r.method,
    levelMm: r.levelMm,
    volumeMl: r.volumeMl,
    tempC: r.tempC,
    densityKgM3: r.densityKgM3,
    massG: r.massG,
    bookStockG: r.bookStockG,
    note: r.note,
    recordedBy: r.recordedById === null ? null : (name.get(r.recordedById) ?? null),
  }));
}

/** A tank's page header needs its calibration table too. */
export async function getTankStrapping(
  db: Db,
  siteId: number,
  code: string,
): Promise<{ id: number; strappingJson: string } | null> {
  return db.tank.findUnique({ where: { siteId_code: { siteId, code } }, select: { id: true, strappingJson: true } });
}
