import "server-only";
// The ledger position of a site: the last movement id and the audit chain's head. Movements and audit
// events are append-only and every booking writes both (or at least the audit event, for changes that
// move no material: gauges, period close and reopen, lot and source edits), so any change a report can
// show moves the position forward. Both reads are primary-key lookups, cheap enough for every request,
// and they come from the database, so several server processes on one database agree on it.
import type { Db } from "@/lib/core/connect";
import type { LedgerPosition } from "@/lib/ledger/position";

export async function getLedgerPosition(db: Db, siteId: number): Promise<LedgerPosition> {
  const [lastMove, head] = await Promise.all([
    db.movement.findFirst({ where: { siteId }, orderBy: { id: "desc" }, select: { id: true } }),
    db.auditHead.findUnique({ where: { siteId }, select: { seq: true } }),
  ]);
  return { siteId, moveId: lastMove?.id ?? 0, auditSeq: head?.seq ?? 0 };
}
