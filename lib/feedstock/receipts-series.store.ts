import "server-only";
import type { Db } from "@/lib/core/connect";
import type { FeedstockReceipt } from "@/lib/feedstock/receipts-series";

/**
 * Feedstock entering the books in [from, to): receipts into pickups, deliveries, lots and tanks. A receipt
 * booked by mistake and its reversal are left out as a pair, as the period balance does.
 */
export async function listFeedstockReceipts(
  db: Db,
  siteId: number,
  range: { from: Date; to: Date },
): Promise<FeedstockReceipt[]> {
  const rows = await db.movement.findMany({
    where: {
      siteId,
      role: "RECEIPT",
      fromHolderId: null,
      at: { gte: range.from, lt: range.to },
      reversesId: null,
      reversedBy: { is: null },
      toHolder: { kind: { in: ["PICKUP", "DELIVERY", "LOT", "TANK"] } },
    },
    select: {
      at: true,
      massG: true,
      toHolder: { select: { kind: true, pickup: { select: { material: true } }, lot: { select: { material: true } } } },
    },
  });
  return rows.map((r) => ({
    at: r.at.getTime(),
    massG: r.massG,
    material: r.toHolder.pickup?.material ?? r.toHolder.lot?.material ?? "MIXED_FEEDSTOCK",
  }));
}
