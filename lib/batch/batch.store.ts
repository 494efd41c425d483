import "server-only";
import type { Db, Tx } from "@/lib/core/connect";
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

const BATCH_INCLUDE = {
  holder: { select: { stockG: true } },
  products: { select: { code: true }, orderBy: { code: "asc" } },
} as const;

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
  /** Movements out of the batch as they stand: ester, glycerol phase, wash water, recovered methanol, recorded losses. */
  outputs: MovementView[];
  /** Outputs typed wrong and corrected (each reversed, then booked again with the right mass). */
  corrected: MovementView[];
  /** The booked unmeasured difference: out to the site's difference account, or an unmeasured gain in. */
  unmeasured: MovementView[];
  products: BatchProductView[];
}

export async function getBatchDetail(db: Db, siteId: number, code: string): Promise<BatchDetail | null> {
  const r = await db.batch.findUnique({
    where: { siteId_code: { siteId, code } },
    include: {
      holder: { select: { stockG: true } },
      products: { select: { code: true, massG: true, status: true }, orderBy: { code: "asc" } },
    },
  });
  if (!r) return null;
  const moves = await listHolderMovements(db, r.holderId);
  return {
    ...toRow(r),
    holderId: r.holderId,
    notes: r.notes,
    recipeJson: r.recipeJson,
    charges: moves.incoming.filter((m) => m.reversedById === null && m.reversesId === null && m.role !== "UNMEASURED"),
    takenBack: moves.incoming.filter((m) => m.reversedById !== null),
    outputs: moves.outgoing.filter((m) => m.reversesId === null && m.reversedById === null && m.role !== "UNMEASURED"),
    corrected: moves.outgoing.filter((m) => m.reversedById !== null && m.role !== "UNMEASURED"),
    unmeasured: [...moves.incoming, ...moves.outgoing].filter(
      (m) => m.role === "UNMEASURED" && m.reversesId === null && m.reversedById === null,
    ),
    products: r.products,
  };
}

// ---- writes used by lib/batch/batch.service.ts (inside its transaction)

export async function insertReagentLot(
  tx: Tx,
  r: {
    siteId: number;
    holderId: number;
    code: string;
    reagent: string;
    supplier: string;
    strengthPct: number;
    receivedAt: Date;
    massG: number;
  },
): Promise<{ id: number; code: string }> {
  return tx.reagentLot.create({ data: r, select: { id: true, code: true } });
}

export async function insertBatch(
  tx: Tx,
  b: {
    siteId: number;
    holderId: number;
    code: string;
    pretreated: boolean;
    plannedAt: Date;
    targetOilG: number;
    molarRatio: number;
    catalyst: string;
    reactionTempC: number;
    recipeJson: string;
    notes: string;
  },
): Promise<{ id: number; code: string }> {
  return tx.batch.create({ data: { ...b, status: "PLANNED" }, select: { id: true, code: true } });
}

export interface BatchState {
  id: number;
  holderId: number;
  status: string;
  plannedAt: Date;
  startedAt: Date | null;
  completedAt: Date | null;
}

export async function getBatchState(tx: Tx, siteId: number, code: string): Promise<BatchState | null> {
  return tx.batch.findUnique({
    where: { siteId_code: { siteId, code } },
    select: { id: true, holderId: true, status: true, plannedAt: true, startedAt: true, completedAt: true },
  });
}

/** The site's account of unmeasured batch differences (one per site, created on first use). */
export async function siteDifferenceHolder(tx: Tx, siteId: number): Promise<number> {
  const found = await tx.holder.findUnique({
    where: { siteId_kind_code: { siteId, kind: "DIFFERENCE", code: "UNMEASURED" } },
    select: { id: true },
  });
  if (found) return found.id;
  return (await tx.holder.create({ data: { siteId, kind: "DIFFERENCE", code: "UNMEASURED" }, select: { id: true } }))
    .id;
}

export async function getReagentOfHolder(tx: Tx, holderId: number): Promise<string | null> {
  return (await tx.reagentLot.findUnique({ where: { holderId }, select: { reagent: true } }))?.reagent ?? null;
}

export interface BatchOutflow {
  id: number;
  at: Date;
  role: string;
  fromHolderId: number;
  toHolderId: number;
  massG: number;
  reversesId: number | null;
  reversedById: number | null;
}

/** Every movement out of a batch holder (outputs, booked differences, reversals of charges). */
export async function listBatchOutflows(tx: Tx, holderId: number): Promise<BatchOutflow[]> {
  const rows = await tx.movement.findMany({
    where: { fromHolderId: holderId },
    orderBy: [{ at: "asc" }, { id: "asc" }],
    select: {
      id: true,
      at: true,
      role: true,
      toHolderId: true,
      massG: true,
      reversesId: true,
      reversedBy: { select: { id: true } },
    },
  });
  return rows.map(({ reversedBy, ...r }) => ({ ...r, fromHolderId: holderId, reversedById: reversedBy?.id ?? null }));
}

/** Unmeasured gains booked into a batch (entering the books there), in grams. */
export async function sumUnmeasuredGains(tx: Tx, holderId: number): Promise<number> {
  const r = await tx.movement.aggregate({
    where: { toHolderId: holderId, fromHolderId: null, role: "UNMEASURED" },
    _sum: { massG: true },
  });
  return r._sum.massG ?? 0;
}

/** A product lot's "mass made" follows its batch's corrected ester output (the ledger keeps both entries). */
export async function setProductLotMadeMass(tx: Tx, holderId: number, massG: number): Promise<void> {
  await tx.productLot.update({ where: { holderId }, data: { massG } });
}

export async function markBatchRunning(tx: Tx, id: number, startedAt: Date): Promise<void> {
  await tx.batch.update({ where: { id }, data: { status: "RUNNING", startedAt } });
}

export async function markBatchComplete(tx: Tx, id: number, completedAt: Date): Promise<void> {
  await tx.batch.update({ where: { id }, data: { status: "COMPLETE", completedAt } });
}
