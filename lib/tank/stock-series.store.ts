import "server-only";
import type { Db } from "@/lib/core/connect";
import type { TankMove, TankReading } from "@/lib/tank/stock-series";

/** Every movement into and out of a tank and every gauge reading of it, for its stock picture; null for no such tank. */
export async function loadTankStockHistory(
  db: Db,
  siteId: number,
  code: string,
): Promise<{ moves: TankMove[]; readings: TankReading[] } | null> {
  const tank = await db.tank.findUnique({
    where: { siteId_code: { siteId, code } },
    select: { id: true, holderId: true },
  });
  if (!tank) return null;
  const [moves, gauges] = await Promise.all([
    db.movement.findMany({
      where: { siteId, OR: [{ fromHolderId: tank.holderId }, { toHolderId: tank.holderId }] },
      select: { at: true, massG: true, toHolderId: true },
    }),
    db.tankGauge.findMany({ where: { tankId: tank.id }, select: { at: true, massG: true } }),
  ]);
  return {
    moves: moves.map((m) => ({
      at: m.at.getTime(),
      massG: m.massG,
      direction: m.toHolderId === tank.holderId ? "IN" : "OUT",
    })),
    readings: gauges.map((g) => ({ at: g.at.getTime(), massG: g.massG })),
  };
}
