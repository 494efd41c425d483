// Books one pickup into a demo-scenario plant as production.tess, from a source that already has
// pickups, and answers the grams its receipt movement carried (the balance tests' "one more booking").
import type { Db } from "@/lib/core/connect";
import { recordPickup } from "@/lib/feedstock/pickup.service";

export async function bookDemoPickup(
  db: Db,
  at: { siteId: number; now: Date },
  pickup: { code: string; source: { code: string; material: string }; observedAt: string },
): Promise<number> {
  const tess = await db.user.findUniqueOrThrow({ where: { login: "production.tess" } });
  const saved = await recordPickup(
    db,
    { siteId: at.siteId, userId: tess.id, now: at.now },
    {
      code: pickup.code,
      sourceCode: pickup.source.code,
      material: pickup.source.material,
      observedAt: pickup.observedAt,
      containers: 1,
      volumeL: 100,
      tempC: 20,
    },
  );
  if (!saved.ok) throw new Error(`expected the pickup to be saved, got ${JSON.stringify(saved.issues)}`);
  const { holderId } = await db.pickup.findFirstOrThrow({ where: { code: pickup.code }, select: { holderId: true } });
  const receipt = await db.movement.findFirstOrThrow({
    where: { toHolderId: holderId, fromHolderId: null },
    select: { massG: true },
  });
  return receipt.massG;
}
