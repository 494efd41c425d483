import "server-only";
import type { Db } from "@/lib/core/connect";

export interface LotForLabel {
  code: string;
  material: string;
  receivedAt: Date;
  massG: number;
  certified: boolean;
}

export async function listLotsForLabels(db: Db, siteId: number, codes: string[]): Promise<LotForLabel[]> {
  const rows = await db.feedstockLot.findMany({
    where: { siteId, code: { in: codes } },
    select: { code: true, material: true, receivedAt: true, massG: true, certified: true },
  });
  const byCode = new Map(rows.map((r) => [r.code, r]));
  return codes.flatMap((c) => byCode.get(c) ?? []);
}

export async function listRecentLotCodes(
  db: Db,
  siteId: number,
  take: number,
): Promise<Array<{ code: string; material: string; receivedAt: Date }>> {
  return db.feedstockLot.findMany({
    where: { siteId },
    orderBy: [{ receivedAt: "desc" }, { id: "desc" }],
    take,
    select: { code: true, material: true, receivedAt: true },
  });
}

/** What a typed or scanned number is at this site: a lot, a pickup, a container label — or nothing. */
export async function findRecordByNumber(
  db: Db,
  siteId: number,
  code: string,
): Promise<"LOT" | "PICKUP" | "CONTAINER" | null> {
  if (await db.feedstockLot.findUnique({ where: { siteId_code: { siteId, code } }, select: { id: true } }))
    return "LOT";
  if (await db.pickup.findUnique({ where: { siteId_code: { siteId, code } }, select: { id: true } })) return "PICKUP";
  const tagged = await db.pickup.findMany({
    where: { siteId, containerTags: { contains: code } },
    select: { containerTags: true },
    take: 50,
  });
  return tagged.some((p) => p.containerTags.split(",").includes(code)) ? "CONTAINER" : null;
}
