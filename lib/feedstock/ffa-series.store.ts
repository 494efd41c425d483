import "server-only";
import type { Db } from "@/lib/core/connect";
import type { FfaLot } from "@/lib/feedstock/ffa-series";

/** The lots a source supplied (delivered by it, or pooled from its pickups) with their titrations, for its FFA picture. */
export async function listSourceLotsWithFfa(db: Db, siteId: number, sourceId: number): Promise<FfaLot[]> {
  const rows = await db.feedstockLot.findMany({
    where: { siteId, OR: [{ supplierId: sourceId }, { pickups: { some: { sourceId } } }] },
    select: {
      code: true,
      receivedAt: true,
      material: true,
      massG: true,
      supplier: { select: { code: true } },
      pickups: { select: { source: { select: { code: true } } } },
      titrations: { select: { testedAt: true, ffaPct: true, voided: true } },
    },
  });
  return rows.map((r) => ({
    code: r.code,
    receivedAt: r.receivedAt.getTime(),
    material: r.material,
    massG: r.massG,
    sourceCodes: [...(r.supplier ? [r.supplier.code] : []), ...r.pickups.map((p) => p.source.code)],
    titrations: r.titrations.map((t) => ({ testedAt: t.testedAt.getTime(), ffaPct: t.ffaPct, voided: t.voided })),
  }));
}
