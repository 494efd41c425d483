import "server-only";
import type { Db, Tx } from "@/lib/database/connect";
import { listHolderMovements } from "@/lib/ledger/movement.store";
import type { MovementView } from "@/lib/ledger/movement.store";

export interface BatchRow {
  code: string;
  status: string;
  pretreated: boolean;
  plannedAt: Date;
  startedAt: Date | null;
  completedAt: Date | null;
  targetOilG: number;
  molarRatio: number;
  catalyst: string;
  reactionTempC: number;
  stockG: number;
  productLots: string[];
}

const BATCH_INCLUDE = { holder: { select: { stockG: true } }, products: { select: { code: true }, orderBy: { code: "asc" } } } as const;

function toRow(r: {
  code: string;
  status: string;
  pretreated: boolean;
  plannedAt: Date;
  startedAt: Date | null;
  completedAt: Date | null;
  targetOilG: number;
  molarRatio: number;
  catalyst: string;
  reactionTempC: number;
  holder: { stockG: number };
  products: Array<{ code: string }>;
}): BatchRow {
  return {
    code: r.code,
    status: r.status,
    pretreated: r.pretreated,
    plannedAt: r.plannedAt,
    startedAt: r.startedAt,
    completedAt: r.completedAt,
    targetOilG: r.targetOilG,
    molarRatio: r.molarRatio,
    catalyst: r.catalyst,
    reactionTempC: r.reactionTempC,
    stockG: r.holder.stockG,
    productLots: r.products.map((p) => p.code),
  };
}

export async function listBatches(
  db: Db,
  siteId: number,
  opts: { statuses?: readonly string[]; skip?: number; take?: number } = {},
): Promise<{ rows: BatchRow[]; total: number }> {
  const where = { siteId, ...(opts.statuses ? { status: { in: [...opts.statuses] } } : {}) };
  const [rows, total] = await Promise.all([
    db.batch.findMany({
      where,
      orderBy: [{ plannedAt: "desc" }, { id: "desc" }],
      skip: opts.skip ?? 0,
      take: opts.take ?? 100,
      include: BATCH_INCLUDE,
    }),
    db.batch.count({ where }),
  ]);
  return { rows: rows.map(toRow), total };
}

export interface BatchProductView {
  code: string;
  massG: number;
  status: string;
}

export interface BatchDetail extends BatchRow {
  holderId: number;
  notes: string;
  recipeJson: string;
  /** Movements into the batch: oil, methanol, catalyst, acid, water (charges taken back left out). */
  charges: MovementView[];
  /** Charges booked by mistake and taken back (each reversed by a movement out of the batch). */
  takenBack: MovementView[];
  /** Movements out of the batch: ester, glycerol phase, wash water, recovered methanol, losses (take-backs left out). */
  outputs: MovementView[];
  products: BatchProductView[];
}

export async function getBatchDetail(db: Db, siteId: number, code: string): Promise<BatchDetail | null> {
  const r = await db.batch.findUnique({
    where: { siteId_code: { siteId, code } },
    include: { holder: { select: { stockG: true } }, products: { select: { code: true, massG: true, status: true }, orderBy: { code: "asc" } } },
  });
  if (!r) return null;
  const moves = await listHolderMovements(db, r.holderId);
  return {
    ...toRow(r),
    holderId: r.holderId,
    notes: r.notes,
    recipeJson: r.recipeJson,
    charges: moves.incoming.filter((m) => m.reversedById === null),
    takenBack: moves.incoming.filter((m) => m.reversedById !== null),
    outputs: moves.outgoing.filter((m) => m.reversesId === null),
    products: r.products,
  };
}

// ---- writes used by lib/batch/batch.service.ts (inside its transaction)

export async function insertReagentLot(tx: Tx, r: { siteId: number; holderId: number; code: string; reagent: string; supplier: string; strengthPct: number; receivedAt: Date; massG: number }): Promise<{ id: number; code: string }> {
  return tx.reagentLot.create({ data: r, select: { id: true, code: true } });
}

export async function insertBatch(
  tx: Tx,
  b: { siteId: number; holderId: number; code: string; pretreated: boolean; plannedAt: Date; targetOilG: number; molarRatio: number; catalyst: string; reactionTempC: number; recipeJson: string; notes: string },
): Promise<{ id: number; code: string }> {
  return tx.batch.create({ data: { ...b, status: "PLANNED" }, select: { id: true, code: true } });
}

export interface BatchState {
  id: number;
  holderId: number;
  status: string;
  plannedAt: Date;
  startedAt: Date | null;
}

export async function getBatchState(tx: Tx, siteId: number, code: string): Promise<BatchState | null> {
  return tx.batch.findUnique({ where: { siteId_code: { siteId, code } }, select: { id: true, holderId: true, status: true, plannedAt: true, startedAt: true } });
}

export async function markBatchRunning(tx: Tx, id: number, startedAt: Date): Promise<void> {
  await tx.batch.update({ where: { id }, data: { status: "RUNNING", startedAt } });
}

export async function markBatchComplete(tx: Tx, id: number, completedAt: Date): Promise<void> {
  await tx.batch.update({ where: { id }, data: { status: "COMPLETE", completedAt } });
}
