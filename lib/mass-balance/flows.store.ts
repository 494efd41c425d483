import "server-only";
import type { Db } from "@/lib/core/connect";
import { findReversedPairs, toHolderKind } from "@/lib/ledger/movement.store";
import { MOVE_ROLES } from "@/lib/core/vocabulary";
import type { MoveRole } from "@/lib/core/vocabulary";
import { invariant } from "@/lib/core/result";
import type { FlowHolder, FlowMove } from "@/lib/mass-balance/flows";

const ROLE_SET: ReadonlySet<string> = new Set(MOVE_ROLES);

/**
 * The holders of a site with what places them in the flow picture, and the movements dated in
 * [from, to) less reversed pairs (a booking error and its correction are not a flow).
 */
export async function loadFlowLedger(
  db: Db,
  siteId: number,
  range: { from: Date; to: Date },
): Promise<{ holders: FlowHolder[]; moves: FlowMove[] }> {
  const [holders, pickups, lots, tanks, reagents, waste, moves] = await Promise.all([
    db.holder.findMany({ where: { siteId }, select: { id: true, kind: true, code: true } }),
    db.pickup.findMany({
      where: { siteId },
      select: { holderId: true, material: true, source: { select: { code: true, name: true } } },
    }),
    db.feedstockLot.findMany({
      where: { siteId },
      select: { holderId: true, material: true, supplier: { select: { code: true, name: true } } },
    }),
    db.tank.findMany({ where: { siteId }, select: { holderId: true, service: true } }),
    db.reagentLot.findMany({ where: { siteId }, select: { holderId: true, reagent: true } }),
    db.wasteContainer.findMany({ where: { siteId }, select: { holderId: true, stream: true } }),
    db.movement.findMany({
      where: { siteId, at: { gte: range.from, lt: range.to } },
      select: { id: true, at: true, fromHolderId: true, toHolderId: true, massG: true, role: true, reversesId: true },
    }),
  ]);
  const extra = new Map<number, Partial<FlowHolder>>();
  for (const p of pickups) extra.set(p.holderId, { material: p.material, source: p.source });
  for (const l of lots) extra.set(l.holderId, { material: l.material, source: l.supplier });
  for (const t of tanks) extra.set(t.holderId, { service: t.service });
  for (const r of reagents) extra.set(r.holderId, { material: r.reagent });
  for (const w of waste) extra.set(w.holderId, { material: w.stream });
  // A reversal dated in the period pairs with a booking at the same instant, so both are in the range.
  const paired = findReversedPairs(moves);
  return {
    holders: holders.map((h) => ({ id: h.id, kind: toHolderKind(h.kind), code: h.code, ...extra.get(h.id) })),
    moves: moves
      .filter((m) => !paired.has(m.id))
      .map((m) => {
        invariant(ROLE_SET.has(m.role), `unknown movement role ${m.role} in the database`);
        return {
          at: m.at.getTime(),
          fromHolderId: m.fromHolderId,
          toHolderId: m.toHolderId,
          massG: m.massG,
          role: m.role as MoveRole,
        };
      }),
  };
}
