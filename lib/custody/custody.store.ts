import "server-only";
import type { Db } from "@/lib/core/connect";

import type { BatchMoveRow, CustodyLedgerRows } from "@/lib/custody/custody-rows";

export type {
  BatchMoveRow,
  CustodyBatchRow,
  CustodyLedgerRows,
  CustodyShipmentRow,
  EntryMoveRow,
} from "@/lib/custody/custody-rows";

/** What the chain-of-custody ledger is built from; a reversed movement and its reversal are both left out. */
export async function loadCustodyRows(db: Db, siteId: number): Promise<CustodyLedgerRows> {
  const select = {
    id: true,
    at: true,
    role: true,
    fromHolderId: true,
    toHolderId: true,
    massG: true,
    reversesId: true,
    reversedBy: { select: { id: true } },
  } as const;
  const [entries, batchMoves, lotLosses, batches, shipments] = await Promise.all([
    db.movement.findMany({ where: { siteId, fromHolderId: null }, select, orderBy: [{ at: "asc" }, { id: "asc" }] }),
    db.movement.findMany({
      where: { siteId, role: { in: ["OIL", "ESTER"] } },
      select,
      orderBy: [{ at: "asc" }, { id: "asc" }],
    }),
    db.movement.findMany({
      where: { siteId, role: "LOSS", fromHolder: { kind: "LOT" } },
      select,
      orderBy: [{ at: "asc" }, { id: "asc" }],
    }),
    db.batch.findMany({
      where: { siteId },
      select: { holderId: true, code: true, completedAt: true },
      orderBy: { code: "asc" },
    }),
    db.shipment.findMany({
      where: { siteId },
      select: { holderId: true, documentNo: true, customer: true, shippedAt: true, massG: true, certifiedClaim: true },
      orderBy: [{ shippedAt: "asc" }, { id: "asc" }],
    }),
  ]);
  const kept = <T extends { reversesId: number | null; reversedBy: { id: number } | null }>(rows: T[]) =>
    rows.filter((m) => m.reversesId === null && m.reversedBy === null);
  const plain = (m: {
    id: number;
    at: Date;
    role: string;
    fromHolderId: number | null;
    toHolderId: number;
    massG: number;
  }): BatchMoveRow => ({
    id: m.id,
    at: m.at,
    role: m.role,
    fromHolderId: m.fromHolderId,
    toHolderId: m.toHolderId,
    massG: m.massG,
  });
  return {
    entries: kept(entries).map((m) => ({ id: m.id, at: m.at, toHolderId: m.toHolderId, massG: m.massG })),
    batchMoves: kept(batchMoves).map(plain),
    lotLosses: kept(lotLosses).map(plain),
    batches,
    shipments,
  };
}
