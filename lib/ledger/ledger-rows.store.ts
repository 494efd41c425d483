import "server-only";
// The whole ledger of a site read as one text value the database builds itself (group_concat on
// SQLite, string_agg on PostgreSQL) instead of one object per row: Prisma spends most of a 222 k-row
// read turning rows into objects (about 2 s at ten years, against 0.2 s for the aggregate and 0.1 s to
// split it). Times come back as epoch milliseconds computed by the database, so no date text is parsed.
import type { Db, Tx } from "@/lib/core/connect";
import { dialectOf } from "@/lib/core/bulk-insert";
import { invariant } from "@/lib/core/result";

import type { MoveRow } from "@/lib/ledger/ledger-chunks";

export type { MoveRow } from "@/lib/ledger/ledger-chunks";

export interface HolderRow {
  id: number;
  kind: string;
  code: string;
}

type Rows = Array<{ t: string | null }>;

// SQLite keeps a DateTime as ISO text with an offset; julianday reads it, and the rounding recovers
// the exact millisecond (a double holds a day number to about 0.02 ms). On PostgreSQL a timestamp(3)
// holds UTC: its epoch is the instant.
function queryMoves(db: Db | Tx, siteId: number, afterId: number): Promise<Rows> {
  return dialectOf(db) === "sqlite"
    ? db.$queryRaw<Rows>`SELECT group_concat(id || ',' || CAST(ROUND((julianday(at) - 2440587.5) * 86400000.0) AS INTEGER) || ',' || ifnull("fromHolderId", '') || ',' || "toHolderId" || ',' || "massG" || ',' || ifnull("reversesId", ''), ';') AS t FROM "Movement" WHERE "siteId" = ${siteId} AND id > ${afterId}`
    : db.$queryRaw<Rows>`SELECT string_agg(id || ',' || CAST(ROUND(EXTRACT(EPOCH FROM at) * 1000) AS BIGINT) || ',' || coalesce("fromHolderId"::text, '') || ',' || "toHolderId" || ',' || "massG" || ',' || coalesce("reversesId"::text, ''), ';') AS t FROM "Movement" WHERE "siteId" = ${siteId} AND id > ${afterId}`;
}

// Holder codes are free text: the id and kind go first, the code is the rest of the entry, with its
// backslashes doubled and semicolons written as \s.
function queryHolders(db: Db | Tx, siteId: number, afterId: number): Promise<Rows> {
  return dialectOf(db) === "sqlite"
    ? db.$queryRaw<Rows>`SELECT group_concat(id || ',' || kind || ',' || replace(replace(code, '\\', '\\\\'), ';', '\\s'), ';') AS t FROM "Holder" WHERE "siteId" = ${siteId} AND id > ${afterId}`
    : db.$queryRaw<Rows>`SELECT string_agg(id || ',' || kind || ',' || replace(replace(code, '\\', '\\\\'), ';', '\\s'), ';') AS t FROM "Holder" WHERE "siteId" = ${siteId} AND id > ${afterId}`;
}

async function entries(rows: Promise<Rows>): Promise<string[]> {
  const text = (await rows)[0]?.t ?? null;
  return text === null || text === "" ? [] : text.split(";");
}

function int(text: string | undefined, what: string): number {
  const n = Number(text);
  invariant(text !== undefined && text !== "" && Number.isSafeInteger(n), `ledger read: bad ${what} "${text}"`);
  return n;
}

/** The site's movements with id > afterId, in no particular order. */
export async function readMoveRows(db: Db | Tx, siteId: number, afterId = 0): Promise<MoveRow[]> {
  return (await entries(queryMoves(db, siteId, afterId))).map((entry) => {
    const [id, at, from, to, mass, reverses] = entry.split(",");
    return {
      id: int(id, "movement id"),
      at: int(at, "movement time"),
      fromHolderId: from === "" ? null : int(from, "from holder"),
      toHolderId: int(to, "to holder"),
      massG: int(mass, "mass"),
      reversesId: reverses === "" || reverses === undefined ? null : int(reverses, "reversed movement"),
    };
  });
}

/** A code as queryHolders wrote it back to itself; most codes have no backslash to undo. */
function unescapeCode(text: string): string {
  return text.includes("\\") ? text.replace(/\\(\\|s)/g, (_whole, c: string) => (c === "s" ? ";" : "\\")) : text;
}

/** The site's holders with id > afterId (id, kind, code). */
export async function readHolderRows(db: Db | Tx, siteId: number, afterId = 0): Promise<HolderRow[]> {
  return (await entries(queryHolders(db, siteId, afterId))).map((entry) => {
    const first = entry.indexOf(",");
    const second = entry.indexOf(",", first + 1);
    return {
      id: int(entry.slice(0, first), "holder id"),
      kind: entry.slice(first + 1, second),
      code: unescapeCode(entry.slice(second + 1)),
    };
  });
}
