// A fingerprint of the books for fault tests: counts, every holder's stock against its ledger, and the
// audit chain verified. Equal fingerprints before and after a failed write mean nothing was half-written.
import type { Db } from "@/lib/core/connect";
import { loadChain } from "@/lib/audit/audit.store";
import { verifyChain } from "@/lib/audit/chain";

export interface Books {
  pickups: number;
  movements: number;
  holders: number;
  idempotencyRecords: number;
  auditEvents: number;
  auditLastHash: string;
  /** Holders whose stored stock differs from the sum of their ledger rows (must be none). */
  stockOffLedger: string[];
}

export async function fingerprint(db: Db, siteId: number): Promise<Books> {
  const holders = await db.holder.findMany({ where: { siteId }, select: { id: true, code: true, stockG: true } });
  const moves = await db.movement.findMany({
    where: { siteId },
    select: { fromHolderId: true, toHolderId: true, massG: true },
  });
  const ledger = new Map<number, number>();
  for (const m of moves) {
    ledger.set(m.toHolderId, (ledger.get(m.toHolderId) ?? 0) + m.massG);
    if (m.fromHolderId !== null) ledger.set(m.fromHolderId, (ledger.get(m.fromHolderId) ?? 0) - m.massG);
  }
  const chain = await loadChain(db, siteId);
  const verified = verifyChain(chain);
  if (!verified.ok) throw new Error(`audit chain: ${verified.issues[0]?.message ?? "broken"}`);
  return {
    pickups: await db.pickup.count({ where: { siteId } }),
    movements: moves.length,
    holders: holders.length,
    idempotencyRecords: await db.idempotencyRecord.count(),
    auditEvents: verified.value.events,
    auditLastHash: verified.value.lastHash,
    stockOffLedger: holders
      .filter((h) => h.stockG !== (ledger.get(h.id) ?? 0))
      .map((h) => `${h.code}: ${h.stockG} vs ${ledger.get(h.id) ?? 0}`),
  };
}
