import "server-only";
import type { Db } from "@/lib/core/connect";
import { invariant } from "@/lib/core/result";
import { MOVE_ROLES } from "@/lib/core/vocabulary";
import type { MoveRole } from "@/lib/core/vocabulary";
import { findReversedPairs, toHolderKind } from "@/lib/ledger/movement.store";
import type { EpcisHolder, EpcisMove } from "@/lib/epcis/epcis";

/** Tanks pool what they hold; their material is named by service (as in the period balance). */
const TANK_MATERIAL: Readonly<Record<string, string>> = {
  FEEDSTOCK: "MIXED_FEEDSTOCK",
  PRODUCT: "FAME",
  METHANOL: "METHANOL",
  GLYCEROL_PHASE: "GLYCEROL_PHASE",
  WASH_WATER: "WASH_WATER",
};
const ROLE_SET: ReadonlySet<string> = new Set(MOVE_ROLES);

export interface EpcisLedger {
  holders: EpcisHolder[];
  /** Every movement except reversed pairs (a booking made by mistake and its reversal). */
  moves: EpcisMove[];
}

/** The site's holders with what they carry, who supplied them and (when asked) the customer of each shipment. */
export async function loadEpcisLedger(db: Db, siteId: number, opts: { withCustomers: boolean }): Promise<EpcisLedger> {
  const [holders, pickups, lots, tanks, reagents, waste, shipments, moves] = await Promise.all([
    db.holder.findMany({ where: { siteId }, select: { id: true, kind: true, code: true } }),
    db.pickup.findMany({
      where: { siteId },
      select: { holderId: true, material: true, source: { select: { code: true } } },
    }),
    db.feedstockLot.findMany({
      where: { siteId },
      select: { holderId: true, material: true, supplier: { select: { code: true } } },
    }),
    db.tank.findMany({ where: { siteId }, select: { holderId: true, service: true } }),
    db.reagentLot.findMany({ where: { siteId }, select: { holderId: true, reagent: true } }),
    db.wasteContainer.findMany({ where: { siteId }, select: { holderId: true, stream: true } }),
    db.shipment.findMany({ where: { siteId }, select: { holderId: true, customerRef: { select: { code: true } } } }),
    db.movement.findMany({
      where: { siteId },
      select: { id: true, at: true, fromHolderId: true, toHolderId: true, massG: true, role: true, reversesId: true },
      orderBy: [{ at: "asc" }, { id: "asc" }],
    }),
  ]);
  const material = new Map<number, string>();
  const source = new Map<number, string>();
  for (const p of pickups) {
    material.set(p.holderId, p.material);
    source.set(p.holderId, p.source.code);
  }
  for (const l of lots) {
    material.set(l.holderId, l.material);
    if (l.supplier) source.set(l.holderId, l.supplier.code);
  }
  for (const t of tanks) material.set(t.holderId, TANK_MATERIAL[t.service] ?? t.service);
  for (const r of reagents) material.set(r.holderId, r.reagent);
  for (const w of waste) material.set(w.holderId, w.stream);
  const customer = new Map<number, string>();
  if (opts.withCustomers) for (const s of shipments) if (s.customerRef) customer.set(s.holderId, s.customerRef.code);
  const paired = findReversedPairs(moves);
  return {
    holders: holders.map((h) => {
      const kind = toHolderKind(h.kind);
      const m = kind === "PRODUCT_LOT" || kind === "SHIPMENT" ? "FAME" : (material.get(h.id) ?? null);
      return {
        id: h.id,
        kind,
        code: h.code,
        material: m,
        sourceCode: source.get(h.id) ?? null,
        customerCode: customer.get(h.id) ?? null,
      };
    }),
    moves: moves
      .filter((m) => !paired.has(m.id))
      .map((m) => {
        invariant(ROLE_SET.has(m.role), `unknown movement role ${m.role} in the database`);
        return {
          id: m.id,
          at: m.at.getTime(),
          fromHolderId: m.fromHolderId,
          toHolderId: m.toHolderId,
          massG: m.massG,
          role: m.role as MoveRole,
        };
      }),
  };
}
