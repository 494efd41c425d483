import "server-only";
// Reads for a balance computed from the books brought forward (carried-books.ts) instead of the whole
// ledger: the movements dated in a window, read as one text value the database builds (as
// lib/ledger/ledger-rows.store.ts does for the trace: Prisma spends most of a large read building row
// objects), which holders are batches or outside the stock, the site's last movement, and whether a
// movement was booked since with a date before a given instant.
import type { Db } from "@/lib/core/connect";
import { dialectOf } from "@/lib/core/bulk-insert";
import { invariant } from "@/lib/core/result";
import { MOVE_ROLES } from "@/lib/core/vocabulary";
import type { MoveRole } from "@/lib/core/vocabulary";
import { DEFAULT_HOLDER_CLASSES } from "@/lib/mass-balance/balance-rules";
import type { HolderParts } from "@/lib/mass-balance/balance.store";

export interface DatedMoveRow {
  id: number;
  at: number;
  fromHolderId: number | null;
  toHolderId: number;
  massG: number;
  role: MoveRole;
  reversesId: number | null;
}

type Rows = Array<{ t: string | null }>;

const ROLE_SET: ReadonlySet<string> = new Set(MOVE_ROLES);

/** An instant as the column holds it: on SQLite the adapter's ISO text with +00:00, on PostgreSQL UTC. */
function stored(db: Db, ms: number): string {
  const iso = new Date(ms).toISOString();
  return dialectOf(db) === "sqlite" ? `${iso.slice(0, -1)}+00:00` : iso;
}

// SQLite keeps a DateTime as ISO text with an offset (compared as text, which orders it); julianday
// reads it and the rounding recovers the exact millisecond. On PostgreSQL a timestamp(3) holds UTC.
function queryDated(db: Db, siteId: number, fromMs: number | null, toMs: number, throughId: number): Promise<Rows> {
  const to = stored(db, toMs);
  if (dialectOf(db) === "sqlite") {
    const from = fromMs === null ? "" : stored(db, fromMs);
    return db.$queryRaw<Rows>`SELECT group_concat(id || ',' || CAST(ROUND((julianday(at) - 2440587.5) * 86400000.0) AS INTEGER) || ',' || ifnull("fromHolderId", '') || ',' || "toHolderId" || ',' || "massG" || ',' || ifnull("reversesId", '') || ',' || role, ';') AS t FROM "Movement" WHERE "siteId" = ${siteId} AND at >= ${from} AND at < ${to} AND id <= ${throughId}`;
  }
  const from = fromMs === null ? "-infinity" : stored(db, fromMs);
  return db.$queryRaw<Rows>`SELECT string_agg(id || ',' || CAST(ROUND(EXTRACT(EPOCH FROM at) * 1000) AS BIGINT) || ',' || coalesce("fromHolderId"::text, '') || ',' || "toHolderId" || ',' || "massG" || ',' || coalesce("reversesId"::text, '') || ',' || role, ';') AS t FROM "Movement" WHERE "siteId" = ${siteId} AND at >= ${from}::timestamp AND at < ${to}::timestamp AND id <= ${throughId}`;
}

function int(text: string | undefined, what: string): number {
  const n = Number(text);
  invariant(text !== undefined && text !== "" && Number.isSafeInteger(n), `balance read: bad ${what} "${text}"`);
  return n;
}

/**
 * The site's movements dated in [fromMs, toMs) (from the first when fromMs is null) with id up to
 * throughId, in no particular order; reversed pairs are still in.
 */
export async function readDatedMoves(
  db: Db,
  siteId: number,
  range: { fromMs: number | null; toMs: number; throughId: number },
): Promise<DatedMoveRow[]> {
  const text = (await queryDated(db, siteId, range.fromMs, range.toMs, range.throughId))[0]?.t ?? null;
  if (text === null || text === "") return [];
  return text.split(";").map((entry) => {
    const [id, at, from, to, mass, reverses, role] = entry.split(",");
    invariant(role !== undefined && ROLE_SET.has(role), `unknown movement role ${role} in the database`);
    return {
      id: int(id, "movement id"),
      at: int(at, "movement time"),
      fromHolderId: from === "" ? null : int(from, "from holder"),
      toHolderId: int(to, "to holder"),
      massG: int(mass, "mass"),
      role: role as MoveRole,
      reversesId: reverses === "" || reverses === undefined ? null : int(reverses, "reversed movement"),
    };
  });
}

const OUT_KINDS = Object.entries(DEFAULT_HOLDER_CLASSES)
  .filter(([, c]) => c === "OUT")
  .map(([k]) => k);

/** The site's batches and its holders outside the stock (shipments, disposals, losses, differences). */
export async function listBatchAndOutHolders(
  db: Db,
  siteId: number,
): Promise<{ batches: Set<number>; out: Set<number> }> {
  const rows = await db.holder.findMany({
    where: { siteId, kind: { in: ["BATCH", ...OUT_KINDS] } },
    select: { id: true, kind: true },
  });
  return {
    batches: new Set(rows.filter((r) => r.kind === "BATCH").map((r) => r.id)),
    out: new Set(rows.filter((r) => r.kind !== "BATCH").map((r) => r.id)),
  };
}

/** A movement as the books brought forward remember it: id, time, mass, receiving holder. */
export interface MovementMark {
  id: number;
  at: number;
  massG: number;
  toHolderId: number;
}

function lastMovementQuery(db: Db, siteId: number) {
  return db.movement.findFirst({
    where: { siteId },
    orderBy: { id: "desc" },
    select: { id: true, at: true, massG: true, toHolderId: true },
  });
}

type MarkRow = Awaited<ReturnType<typeof lastMovementQuery>>;

function toMark(m: MarkRow): MovementMark | null {
  return m === null ? null : { id: m.id, at: m.at.getTime(), massG: m.massG, toHolderId: m.toHolderId };
}

/** The site's last movement: what the books brought forward were read up to. */
export async function getLastMovement(db: Db, siteId: number): Promise<MovementMark | null> {
  return toMark(await lastMovementQuery(db, siteId));
}

/** The movement with this id, if it is still the site's. */
export async function getMovementMark(db: Db, siteId: number, id: number): Promise<MovementMark | null> {
  const m = await db.movement.findUnique({
    where: { id },
    select: { siteId: true, at: true, massG: true, toHolderId: true },
  });
  return m === null || m.siteId !== siteId
    ? null
    : { id, at: m.at.getTime(), massG: m.massG, toHolderId: m.toHolderId };
}

/** SQLSTATE 55P03 lock_not_available: lock_timeout passed (PostgreSQL manual, Appendix A). */
export function isLockTimeout(error: unknown): boolean {
  const cause = (error as { meta?: { driverAdapterError?: { cause?: { originalCode?: unknown } } } }).meta
    ?.driverAdapterError?.cause?.originalCode;
  return cause === "55P03";
}

/**
 * PostgreSQL only: the site's last movement, read while no movement can be half-booked, or null when
 * that could not be had within `waitMs`. SHARE on "Movement" waits for every transaction holding ROW
 * EXCLUSIVE on it, which an INSERT takes before its id default (nextval) runs, and keeps new ones out
 * until this transaction ends: every movement id handed out so far is then committed (visible to the
 * read that follows) or rolled back, and any later one is higher, the sequence having CACHE 1.
 */
export async function readSettledLastMovement(
  db: Db,
  siteId: number,
  waitMs: number,
): Promise<{ last: MovementMark | null } | null> {
  try {
    // At any isolation level the read after LOCK TABLE takes its snapshot once the lock is held.
    const [, , last] = await db.$transaction([
      db.$executeRawUnsafe(`SET LOCAL lock_timeout = '${Math.max(1, Math.round(waitMs))}ms'`),
      db.$executeRawUnsafe('LOCK TABLE "Movement" IN SHARE MODE'),
      lastMovementQuery(db, siteId),
    ]);
    return { last: toMark(last) };
  } catch (error) {
    if (isLockTimeout(error)) return null;
    throw error;
  }
}

/** How many of the site's movements with id up to `throughId` are dated before `beforeMs` (a range count on (siteId, at)). */
export function countMovesBefore(db: Db, siteId: number, beforeMs: number, throughId?: number): Promise<number> {
  return db.movement.count({
    where: { siteId, at: { lt: new Date(beforeMs) }, ...(throughId === undefined ? {} : { id: { lte: throughId } }) },
  });
}

/** Whether a movement with id in (afterId, throughId] is dated before `beforeMs`: booked later with an earlier date. */
export async function hasBackdatedMove(
  db: Db,
  siteId: number,
  range: { afterId: number; throughId: number; beforeMs: number },
): Promise<boolean> {
  if (range.throughId <= range.afterId) return false;
  const m = await db.movement.findFirst({
    where: { siteId, id: { gt: range.afterId, lte: range.throughId }, at: { lt: new Date(range.beforeMs) } },
    select: { id: true },
  });
  return m !== null;
}

// One JSON array per holder: id, kind, code, pickup material, lot material and origin, tank service,
// reagent, waste stream, whether it has a batch record, and the batch's completion in epoch ms.
type HolderJson = [number, string, string, ...Array<string | number | boolean | null>];

function queryHolders(db: Db, siteId: number, ids: string, since: string): Promise<Rows> {
  return dialectOf(db) === "sqlite"
    ? db.$queryRaw<Rows>`SELECT json_group_array(json_array(h.id, h.kind, h.code, p.material, l.material, l.origin, t.service, r.reagent, w.stream, b.id IS NOT NULL, CASE WHEN b."completedAt" IS NULL THEN NULL ELSE CAST(ROUND((julianday(b."completedAt") - 2440587.5) * 86400000.0) AS INTEGER) END)) AS t
        FROM "Holder" h
        LEFT JOIN "Pickup" p ON p."holderId" = h.id AND p."siteId" = h."siteId"
        LEFT JOIN "FeedstockLot" l ON l."holderId" = h.id AND l."siteId" = h."siteId"
        LEFT JOIN "Tank" t ON t."holderId" = h.id AND t."siteId" = h."siteId"
        LEFT JOIN "ReagentLot" r ON r."holderId" = h.id AND r."siteId" = h."siteId"
        LEFT JOIN "WasteContainer" w ON w."holderId" = h.id AND w."siteId" = h."siteId"
        LEFT JOIN "Batch" b ON b."holderId" = h.id AND b."siteId" = h."siteId"
        WHERE h."siteId" = ${siteId} AND h.id IN (
          SELECT value FROM json_each(${ids})
          UNION SELECT h2.id FROM "Holder" h2 LEFT JOIN "Batch" b2 ON b2."holderId" = h2.id AND b2."siteId" = h2."siteId"
          WHERE h2."siteId" = ${siteId} AND h2.kind = 'BATCH' AND (b2."completedAt" IS NULL OR b2."completedAt" >= ${since}))`
    : db.$queryRaw<Rows>`SELECT json_agg(json_build_array(h.id, h.kind, h.code, p.material, l.material, l.origin, t.service, r.reagent, w.stream, b.id IS NOT NULL, ROUND(EXTRACT(EPOCH FROM b."completedAt") * 1000)))::text AS t
        FROM "Holder" h
        LEFT JOIN "Pickup" p ON p."holderId" = h.id AND p."siteId" = h."siteId"
        LEFT JOIN "FeedstockLot" l ON l."holderId" = h.id AND l."siteId" = h."siteId"
        LEFT JOIN "Tank" t ON t."holderId" = h.id AND t."siteId" = h."siteId"
        LEFT JOIN "ReagentLot" r ON r."holderId" = h.id AND r."siteId" = h."siteId"
        LEFT JOIN "WasteContainer" w ON w."holderId" = h.id AND w."siteId" = h."siteId"
        LEFT JOIN "Batch" b ON b."holderId" = h.id AND b."siteId" = h."siteId"
        WHERE h."siteId" = ${siteId} AND h.id IN (
          SELECT value::int FROM json_array_elements_text(${ids}::json)
          UNION SELECT h2.id FROM "Holder" h2 LEFT JOIN "Batch" b2 ON b2."holderId" = h2.id AND b2."siteId" = h2."siteId"
          WHERE h2."siteId" = ${siteId} AND h2.kind = 'BATCH' AND (b2."completedAt" IS NULL OR b2."completedAt" >= ${since}::timestamp))`;
}

const text = (v: unknown): string | null => (typeof v === "string" ? v : null);

/**
 * The site's holders with these ids, and every batch not finished before `since` (still running,
 * finished since, or without a batch record), with what describes them, in one read.
 */
export async function readHolderParts(
  db: Db,
  siteId: number,
  ids: Iterable<number>,
  since: number,
): Promise<HolderParts> {
  const rows = await queryHolders(db, siteId, JSON.stringify([...ids]), stored(db, since));
  const json = rows[0]?.t ?? null;
  const parts: HolderParts = { holders: [], pickups: [], lots: [], tanks: [], reagents: [], batches: [], waste: [] };
  for (const [id, kind, code, pickup, lot, origin, service, reagent, stream, batch, done] of (json === null
    ? []
    : JSON.parse(json)) as HolderJson[]) {
    parts.holders.push({ id, kind, code });
    if (text(pickup) !== null) parts.pickups.push({ holderId: id, material: pickup as string });
    if (text(lot) !== null) parts.lots.push({ holderId: id, material: lot as string, origin: text(origin) ?? "" });
    if (text(service) !== null) parts.tanks.push({ holderId: id, service: service as string });
    if (text(reagent) !== null) parts.reagents.push({ holderId: id, reagent: reagent as string });
    if (text(stream) !== null) parts.waste.push({ holderId: id, stream: stream as string });
    if (batch === true || batch === 1)
      parts.batches.push({ holderId: id, completedAt: typeof done === "number" ? new Date(done) : null });
  }
  return parts;
}
