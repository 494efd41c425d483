import "server-only";
import type { Db, Tx } from "@/lib/core/connect";
import { invariant } from "@/lib/core/result";
import { HOLDER_KINDS, MOVE_ROLES } from "@/lib/core/vocabulary";
import type { HolderKind, MoveRole } from "@/lib/core/vocabulary";
import type { TraceHolder, TraceMove } from "@/lib/ledger/moves";
import type { HolderRef, TraceLedger } from "@/lib/ledger/holder-ref";
import { readHolderRows, readMoveRows } from "@/lib/ledger/ledger-rows.store";
import { withChanges } from "@/lib/ledger/overlay-map";
import type { MoveRow } from "@/lib/ledger/ledger-rows.store";
import { readChunkedMoveRows } from "@/lib/ledger/ledger-chunks.store";
import type { ChunkedMoveRows } from "@/lib/ledger/ledger-chunks.store";
import { NO_ID } from "@/lib/ledger/ledger-chunks";
import type { MoveColumns } from "@/lib/ledger/ledger-chunks";

export type { HolderRef, TraceLedger } from "@/lib/ledger/holder-ref";

export interface MovementView {
  id: number;
  at: Date;
  role: MoveRole;
  from: HolderRef | null;
  to: HolderRef;
  massG: number;
  volumeMl: number | null;
  tempC: number | null;
  note: string;
  recordedBy: string;
  /** The movement this one cancels, if it is a reversal. */
  reversesId: number | null;
  /** Id of the movement that cancels this one, if any. */
  reversedById: number | null;
}

const KIND_SET: ReadonlySet<string> = new Set(HOLDER_KINDS);
const ROLE_SET: ReadonlySet<string> = new Set(MOVE_ROLES);

export function toHolderKind(kind: string): HolderKind {
  invariant(KIND_SET.has(kind), `unknown holder kind ${kind} in the database`);
  return kind as HolderKind;
}

function toMoveRole(role: string): MoveRole {
  invariant(ROLE_SET.has(role), `unknown movement role ${role} in the database`);
  return role as MoveRole;
}

const HOLDER_SELECT = { id: true, kind: true, code: true } as const;
const MOVEMENT_INCLUDE = {
  fromHolder: { select: HOLDER_SELECT },
  toHolder: { select: HOLDER_SELECT },
  recordedBy: { select: { fullName: true } },
  reversedBy: { select: { id: true } },
} as const;

interface HolderRow {
  id: number;
  kind: string;
  code: string;
}

function toRef(h: HolderRow): HolderRef {
  return { id: h.id, kind: toHolderKind(h.kind), code: h.code };
}

function toView(r: {
  id: number;
  at: Date;
  role: string;
  fromHolder: HolderRow | null;
  toHolder: HolderRow;
  massG: number;
  volumeMl: number | null;
  tempC: number | null;
  note: string;
  recordedBy: { fullName: string };
  reversesId: number | null;
  reversedBy: { id: number } | null;
}): MovementView {
  return {
    id: r.id,
    at: r.at,
    role: toMoveRole(r.role),
    from: r.fromHolder ? toRef(r.fromHolder) : null,
    to: toRef(r.toHolder),
    massG: r.massG,
    volumeMl: r.volumeMl,
    tempC: r.tempC,
    note: r.note,
    recordedBy: r.recordedBy.fullName,
    reversesId: r.reversesId,
    reversedById: r.reversedBy?.id ?? null,
  };
}

/** The ledger newest first, one page at a time. */
export async function listMovementPage(
  db: Db,
  siteId: number,
  opts: { skip?: number; take?: number } = {},
): Promise<{ rows: MovementView[]; total: number }> {
  const where = { siteId };
  const [rows, total] = await Promise.all([
    db.movement.findMany({
      where,
      orderBy: [{ at: "desc" }, { id: "desc" }],
      skip: opts.skip ?? 0,
      take: opts.take ?? 100,
      include: MOVEMENT_INCLUDE,
    }),
    db.movement.count({ where }),
  ]);
  return { rows: rows.map(toView), total };
}

export interface HolderMovements {
  incoming: MovementView[];
  outgoing: MovementView[];
  incomingTotal: number;
  outgoingTotal: number;
}

/** Movements into and out of one holder, oldest first; at most `take` of each direction. */
export async function listHolderMovements(
  db: Db,
  holderId: number,
  opts: { take?: number } = {},
): Promise<HolderMovements> {
  const take = opts.take ?? 500;
  const [incoming, outgoing, incomingTotal, outgoingTotal] = await Promise.all([
    db.movement.findMany({
      where: { toHolderId: holderId },
      orderBy: [{ at: "asc" }, { id: "asc" }],
      take,
      include: MOVEMENT_INCLUDE,
    }),
    db.movement.findMany({
      where: { fromHolderId: holderId },
      orderBy: [{ at: "asc" }, { id: "asc" }],
      take,
      include: MOVEMENT_INCLUDE,
    }),
    db.movement.count({ where: { toHolderId: holderId } }),
    db.movement.count({ where: { fromHolderId: holderId } }),
  ]);
  return { incoming: incoming.map(toView), outgoing: outgoing.map(toView), incomingTotal, outgoingTotal };
}

export async function getHolderRef(
  db: Db,
  siteId: number,
  kind: HolderKind,
  code: string,
): Promise<(HolderRef & { stockG: number }) | null> {
  const h = await db.holder.findUnique({
    where: { siteId_kind_code: { siteId, kind, code } },
    select: { ...HOLDER_SELECT, stockG: true },
  });
  return h ? { ...toRef(h), stockG: h.stockG } : null;
}

/** Ids of every movement that reverses another or is reversed: a booking error and its correction, left out as a pair. */
export function findReversedPairs(rows: ReadonlyArray<{ id: number; reversesId: number | null }>): Set<number> {
  const paired = new Set<number>();
  for (const m of rows) {
    if (m.reversesId !== null) {
      paired.add(m.id);
      paired.add(m.reversesId);
    }
  }
  return paired;
}

/**
 * The whole site ledger in the trace core's shape. Reversed pairs are left out: a reversal corrects a
 * booking, it is not a physical flow (see indexLedger).
 */
export async function loadTraceLedger(db: Db | Tx, siteId: number): Promise<TraceLedger> {
  return ledgerOf(
    db,
    siteId,
    readMoveRows(db, siteId).then((rows) => ({ chunks: [], rows })),
  );
}

/**
 * The same ledger read through the stored chunks (ledger-chunks.store.ts): what a restarted server
 * reads. `chunks` is what saveLedgerChunks needs to store the full chunks not stored yet.
 */
export async function loadChunkedTraceLedger(
  db: Db,
  siteId: number,
): Promise<{ ledger: TraceLedger; chunks: ChunkedMoveRows }> {
  const read = readChunkedMoveRows(db, siteId);
  const ledger = await ledgerOf(db, siteId, read);
  return { ledger, chunks: await read };
}

type MoveRead = Promise<{ chunks: readonly MoveColumns[]; rows: readonly MoveRow[] }>;

async function ledgerOf(db: Db | Tx, siteId: number, readMoves: MoveRead): Promise<TraceLedger> {
  // One aggregated text value per table: a fraction of what Prisma takes to build an object per row.
  const [holderRows, tanks, { chunks, rows }] = await Promise.all([
    readHolderRows(db, siteId),
    db.tank.findMany({ where: { siteId }, select: { holderId: true, mixing: true } }),
    readMoves,
  ]);
  const fifo = new Set(tanks.filter((t) => t.mixing === "FIFO").map((t) => t.holderId));
  const refs = new Map<number, HolderRef>();
  const holders: TraceHolder[] = [];
  for (const row of holderRows) {
    const kind = toHolderKind(row.kind);
    refs.set(row.id, { id: row.id, kind, code: row.code });
    holders.push({ id: row.id, kind, mixing: fifo.has(row.id) ? "FIFO" : "MIXED" });
  }
  const paired = findReversedPairs(rows);
  for (const c of chunks)
    for (let i = 0; i < c.count; i++) {
      const reverses = c.reverses[i] ?? NO_ID;
      if (reverses !== NO_ID) paired.add(reverses).add(c.id[i] ?? 0);
    }
  const moves: TraceMove[] = [];
  let lastMoveId = 0;
  let rowsRead = rows.length;
  for (const c of chunks) {
    rowsRead += c.count;
    for (let i = 0; i < c.count; i++) {
      const id = c.id[i] ?? 0;
      const from = c.from[i] ?? NO_ID;
      lastMoveId = Math.max(lastMoveId, id);
      if (paired.size === 0 || !paired.has(id))
        moves.push({
          id,
          at: c.at[i] ?? 0,
          fromHolderId: from === NO_ID ? null : from,
          toHolderId: c.to[i] ?? 0,
          massG: c.mass[i] ?? 0,
        });
    }
  }
  for (const m of rows) {
    lastMoveId = Math.max(lastMoveId, m.id);
    if (paired.size === 0 || !paired.has(m.id))
      moves.push({ id: m.id, at: m.at, fromHolderId: m.fromHolderId, toHolderId: m.toHolderId, massG: m.massG });
  }
  return { holders, moves, refs, reversedPairsLeftOut: paired.size, rowsRead, lastMoveId };
}

/**
 * The ledger after more bookings, reading only what is new: holders and movements with higher ids
 * (both are append-only) and the tanks' mixing models. Returns null when the earlier ledger cannot be
 * extended and must be read whole: a tank changed its mixing model, a new movement reverses an earlier
 * one (the pair leaves the trace), or the movement count does not add up (e.g. a restored backup).
 */
export async function extendTraceLedger(
  db: Db | Tx,
  siteId: number,
  ledger: TraceLedger,
  movementCount: number,
): Promise<TraceLedger | null> {
  let lastHolderId = 0;
  for (const h of ledger.holders) lastHolderId = Math.max(lastHolderId, h.id);
  const [holderRows, tanks, moveRows] = await Promise.all([
    readHolderRows(db, siteId, lastHolderId),
    db.tank.findMany({ where: { siteId }, select: { holderId: true, mixing: true } }),
    readMoveRows(db, siteId, ledger.lastMoveId),
  ]);
  if (ledger.rowsRead + moveRows.length !== movementCount) return null;
  if (moveRows.some((m) => m.reversesId !== null)) return null;
  const fifo = new Set(tanks.filter((t) => t.mixing === "FIFO").map((t) => t.holderId));
  if (ledger.holders.some((h) => (h.mixing === "FIFO") !== fifo.has(h.id))) return null;
  const holders = [...ledger.holders];
  const added: Array<[number, HolderRef]> = [];
  for (const row of holderRows) {
    const ref = toRef(row);
    added.push([ref.id, ref]);
    holders.push({ id: ref.id, kind: ref.kind, mixing: fifo.has(ref.id) ? "FIFO" : "MIXED" });
  }
  // Layered over the previous names rather than copied: a booking adds a holder or two to a hundred thousand.
  const refs = withChanges(ledger.refs, added);
  // A holder committed late under a lower id than one already read: start over rather than miss it.
  if (moveRows.some((m) => !refs.has(m.toHolderId) || (m.fromHolderId !== null && !refs.has(m.fromHolderId))))
    return null;
  const moves = [...ledger.moves];
  for (const m of moveRows)
    moves.push({ id: m.id, at: m.at, fromHolderId: m.fromHolderId, toHolderId: m.toHolderId, massG: m.massG });
  return {
    holders,
    moves,
    refs,
    reversedPairsLeftOut: ledger.reversedPairsLeftOut,
    rowsRead: movementCount,
    lastMoveId: moveRows.reduce((m, r) => Math.max(m, r.id), ledger.lastMoveId),
  };
}

/** Movements by id with their holders, for naming the moves a trace reports. */
export async function listMovementsById(
  db: Db,
  siteId: number,
  ids: readonly number[],
): Promise<Map<number, MovementView>> {
  const found = new Map<number, MovementView>();
  // Chunked so a long trace stays under SQLite's bound-parameter limit.
  for (let i = 0; i < ids.length; i += 500) {
    const rows = await db.movement.findMany({
      where: { siteId, id: { in: ids.slice(i, i + 500) } },
      include: MOVEMENT_INCLUDE,
    });
    for (const r of rows) found.set(r.id, toView(r));
  }
  return found;
}

export interface HolderStock {
  kind: string;
  code: string;
  stockG: number;
}

export async function getHolderStock(db: Db, siteId: number, kind: string, code: string): Promise<HolderStock | null> {
  return db.holder.findUnique({
    where: { siteId_kind_code: { siteId, kind, code } },
    select: { kind: true, code: true, stockG: true },
  });
}
