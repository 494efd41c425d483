import "server-only";
// The site's movement rows read from stored full chunks (LedgerChunk) plus the rows after them, instead
// of one aggregated text value for the whole ledger. Chunks are used only if the database agrees with
// them: one aggregate over the id range they cover (row count, last id, sums of grams, holder ids,
// reversed ids and whole seconds) must equal the same figures of the rows they hold; otherwise every
// chunk of the site is ignored, the ledger is read whole, and the chunks are written again.
import type { Db } from "@/lib/core/connect";
import { dialectOf } from "@/lib/core/bulk-insert";
import { log } from "@/lib/log/log.service";
import {
  addChecks,
  checkOfColumns,
  decodeChunk,
  EMPTY_CHECK,
  encodeChunk,
  LEDGER_CHUNK_FORMAT,
  LEDGER_CHUNK_ROWS,
  sameCheck,
  splitIntoChunks,
} from "@/lib/ledger/ledger-chunks";
import type { ChunkCheck, MoveColumns, MoveRow } from "@/lib/ledger/ledger-chunks";
import { readMoveRows } from "@/lib/ledger/ledger-rows.store";

type CheckRow = Array<Record<keyof ChunkCheck, string | null>>;

// Every figure comes back as text, so neither driver's big-number type is involved. Whole seconds are
// the epoch seconds rounded down: SQLite's unixepoch reads the stored time text at a third of the cost
// of the julianday arithmetic ledger-rows.store.ts needs for milliseconds (0.1 s less at ten years).
function queryCheck(db: Db, siteId: number, upTo: number): Promise<CheckRow> {
  return dialectOf(db) === "sqlite"
    ? db.$queryRaw<CheckRow>`SELECT CAST(count(*) AS TEXT) AS "count", CAST(max(id) AS TEXT) AS "lastId", CAST(sum("massG") AS TEXT) AS "massG", CAST(sum("fromHolderId") AS TEXT) AS "fromIds", CAST(sum("toHolderId") AS TEXT) AS "toIds", CAST(sum("reversesId") AS TEXT) AS "reversesIds", CAST(sum(unixepoch(at)) AS TEXT) AS "seconds" FROM "Movement" WHERE "siteId" = ${siteId} AND id <= ${upTo}`
    : db.$queryRaw<CheckRow>`SELECT count(*)::text AS "count", max(id)::text AS "lastId", sum("massG")::text AS "massG", sum("fromHolderId")::text AS "fromIds", sum("toHolderId")::text AS "toIds", sum("reversesId")::text AS "reversesIds", sum(floor(EXTRACT(EPOCH FROM at))::bigint)::text AS "seconds" FROM "Movement" WHERE "siteId" = ${siteId} AND id <= ${upTo}`;
}

async function databaseCheck(db: Db, siteId: number, upTo: number): Promise<ChunkCheck> {
  const row = (await queryCheck(db, siteId, upTo))[0];
  const n = (v: string | null | undefined) => (v === null || v === undefined ? 0 : Number(v));
  return {
    count: n(row?.count),
    lastId: n(row?.lastId),
    massG: n(row?.massG),
    fromIds: n(row?.fromIds),
    toIds: n(row?.toIds),
    reversesIds: n(row?.reversesIds),
    seconds: n(row?.seconds),
  };
}

/** Where the stored chunks that follow each other from the start of the ledger end (0: none), from their keys alone. */
async function storedRunEnd(db: Db, siteId: number): Promise<number> {
  const stored = await db.ledgerChunk.findMany({
    where: { siteId, format: LEDGER_CHUNK_FORMAT },
    orderBy: { afterId: "asc" },
    select: { afterId: true, lastId: true },
  });
  let upTo = 0;
  for (const c of stored) {
    if (c.afterId !== upTo) break;
    upTo = c.lastId;
  }
  return upTo;
}

/** The stored chunks up to `upTo` that follow each other from the start of the ledger, decoded; stops at the first gap or bad body. */
async function readChunks(
  db: Db,
  siteId: number,
  upTo: number,
): Promise<{ columns: MoveColumns[]; check: ChunkCheck }> {
  const stored = await db.ledgerChunk.findMany({
    where: { siteId, format: LEDGER_CHUNK_FORMAT, afterId: { lt: upTo } },
    orderBy: { afterId: "asc" },
    select: { afterId: true, lastId: true, rowCount: true, body: true },
  });
  const columns: MoveColumns[] = [];
  let check = EMPTY_CHECK;
  let end = 0;
  for (const c of stored) {
    if (c.afterId !== end || c.lastId > upTo) break;
    const decoded = decodeChunk(c.body, { afterId: c.afterId, lastId: c.lastId, count: c.rowCount });
    if (decoded === null) break;
    columns.push(decoded);
    check = addChecks(check, checkOfColumns(decoded));
    end = c.lastId;
  }
  return { columns, check };
}

export interface ChunkedMoveRows {
  /** The stored chunks used, in id order. */
  chunks: MoveColumns[];
  /** The site's movement rows after them, in no particular order (as readMoveRows). */
  rows: MoveRow[];
  /** Movements up to this id came from stored chunks that matched the ledger (0: none). */
  chunkedUpTo: number;
}

/**
 * The site's movement rows: the stored chunks that match the ledger, then the rows after them. Where the
 * chunks end is read from their keys first, so the chunks, the database's check figures and the rows
 * after them are read at once (on PostgreSQL the three overlap); a bad body found while decoding means
 * the check and the rows are read again from where the usable chunks end.
 */
export async function readChunkedMoveRows(db: Db, siteId: number): Promise<ChunkedMoveRows> {
  const planned = await storedRunEnd(db, siteId);
  if (planned === 0) return { chunks: [], rows: await readMoveRows(db, siteId), chunkedUpTo: 0 };
  const [chunks, plannedCheck, plannedTail] = await Promise.all([
    readChunks(db, siteId, planned),
    databaseCheck(db, siteId, planned),
    readMoveRows(db, siteId, planned),
  ]);
  const upTo = chunks.check.lastId;
  if (upTo === 0) return { chunks: [], rows: await readMoveRows(db, siteId), chunkedUpTo: 0 };
  const [inDatabase, tail] =
    upTo === planned
      ? [plannedCheck, plannedTail]
      : await Promise.all([databaseCheck(db, siteId, upTo), readMoveRows(db, siteId, upTo)]);
  if (!sameCheck(inDatabase, chunks.check)) {
    log.warn(
      { siteId, event: "ledger.chunks.mismatch" },
      "stored ledger chunks do not match the ledger; reading it whole",
    );
    return { chunks: [], rows: await readMoveRows(db, siteId), chunkedUpTo: 0 };
  }
  return { chunks: chunks.columns, rows: tail, chunkedUpTo: upTo };
}

/**
 * Stores the full chunks of the rows after `chunkedUpTo` and drops any stored chunk from there on (with
 * 0, every chunk of the site: those that did not match). Two processes saving at once may collide on
 * the unique key; the loser logs and leaves the winner's chunks, which are checked when read.
 */
export async function saveLedgerChunks(
  db: Db,
  siteId: number,
  all: ChunkedMoveRows,
  rowsPerChunk = LEDGER_CHUNK_ROWS,
): Promise<number> {
  const chunks = splitIntoChunks(all.rows, all.chunkedUpTo, rowsPerChunk);
  if (chunks.length === 0 && all.chunkedUpTo > 0) return 0;
  try {
    await db.$transaction(
      [
        db.ledgerChunk.deleteMany({ where: { siteId, afterId: { gte: all.chunkedUpTo } } }),
        ...chunks.map((c) =>
          db.ledgerChunk.create({
            data: {
              siteId,
              afterId: c.afterId,
              lastId: c.lastId,
              rowCount: c.rows.length,
              format: LEDGER_CHUNK_FORMAT,
              body: encodeChunk(c.rows) as Uint8Array<ArrayBuffer>,
            },
            select: { id: true },
          }),
        ),
      ],
      { timeout: 60_000 },
    );
  } catch (err) {
    log.warn(
      { err, siteId, event: "ledger.chunks.save" },
      "ledger chunks were not stored (another process may have stored them)",
    );
    return 0;
  }
  return chunks.length;
}

/** Forgets a site's stored chunks (tests). */
export async function deleteLedgerChunks(db: Db, siteId: number): Promise<number> {
  return (await db.ledgerChunk.deleteMany({ where: { siteId } })).count;
}
