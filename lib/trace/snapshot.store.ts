import "server-only";
// Monthly replay snapshots kept in the database (TraceSnapshot), so a restarted server resumes its trace
// index from them instead of replaying the whole ledger. Each is read back only if its format is the
// current one; the trace service then checks it against the ledger (moves applied, last move, mass sum)
// and drops and rebuilds any that no longer fit. Derived data: losing the rows costs one full replay.
import type { Db } from "@/lib/core/connect";
import { dialectOf } from "@/lib/core/bulk-insert";
import { log } from "@/lib/log/log.service";
import { REPLAY_SNAPSHOT_FORMAT } from "@/lib/trace/replay";
import type { ReplaySnapshot } from "@/lib/trace/replay";
import { fillBody, headOf, isUnreadable, needsBody, snapshotFromHead } from "@/lib/trace/stored-snapshot";

export type SnapshotOrder = "dated" | "booked";

function isSnapshot(v: unknown): v is ReplaySnapshot {
  if (v === null || typeof v !== "object") return false;
  const s = v as Partial<ReplaySnapshot>;
  return (
    s.format === REPLAY_SNAPSHOT_FORMAT &&
    typeof s.applied?.count === "number" &&
    typeof s.applied.massSumG === "number" &&
    Array.isArray(s.holders)
  );
}

/**
 * The stored row each snapshot object came from or was written to. A snapshot object never changes once
 * taken, so an object found here is exactly what that row holds; any other object must be written. On
 * globalThis: the server loads this module once for pages and once for API routes, which share snapshots.
 */
const rowHome = globalThis as unknown as { tracevatSnapshotRows?: WeakMap<ReplaySnapshot, number> };
const rowOf: WeakMap<ReplaySnapshot, number> = (rowHome.tracevatSnapshotRows ??= new WeakMap());

type HeadRow = Array<{ id: number; start: string | null; applied: string | null }>;

/** Characters of a body read for its head: the applied figures are about 110 characters of JSON. */
const HEAD_CHARS = 200;
const APPLIED_KEY = '"applied":';

// Only the start of every body and the text after its first "applied" key are read (a body is JSON
// written by JSON.stringify, with the format first and no string that could hold that key), so the
// bodies themselves stay in the database until a trace needs one. The database's own JSON functions
// would parse every body whole: on PostgreSQL that took longer than reading them.
function queryHeads(db: Db, siteId: number, order: SnapshotOrder): Promise<HeadRow> {
  return dialectOf(db) === "sqlite"
    ? db.$queryRaw<HeadRow>`SELECT id, substr(body, 1, 40) AS start, substr(body, instr(body, ${APPLIED_KEY}), ${HEAD_CHARS}) AS applied FROM "TraceSnapshot" WHERE "siteId" = ${siteId} AND "ledgerOrder" = ${order} AND format = ${REPLAY_SNAPSHOT_FORMAT} ORDER BY "appliedCount" ASC`
    : db.$queryRaw<HeadRow>`SELECT id, substr(body, 1, 40) AS start, substr(body, strpos(body, ${APPLIED_KEY}), ${HEAD_CHARS}) AS applied FROM "TraceSnapshot" WHERE "siteId" = ${siteId} AND "ledgerOrder" = ${order} AND format = ${REPLAY_SNAPSHOT_FORMAT} ORDER BY "appliedCount" ASC`;
}

/** The JSON object at the start of `text` (numbers and nulls only, as the applied figures are), or undefined. */
function leadingObject(text: string): unknown {
  let depth = 0;
  for (let i = 0; i < text.length; i++) {
    const c = text[i];
    if (c === "{") depth += 1;
    else if (c === "}" && --depth === 0) return JSON.parse(text.slice(0, i + 1)) as unknown;
    else if (c === '"' && depth === 0) return undefined;
  }
  return undefined;
}

function parsedHead(r: HeadRow[number]): ReplaySnapshot | null {
  if (r.start?.startsWith(`{"format":${JSON.stringify(REPLAY_SNAPSHOT_FORMAT)}`) !== true) return null;
  if (r.applied?.startsWith(APPLIED_KEY) !== true) return null;
  try {
    const head = headOf(REPLAY_SNAPSHOT_FORMAT, leadingObject(r.applied.slice(APPLIED_KEY.length)));
    return head === null ? null : snapshotFromHead(head);
  } catch {
    return null;
  }
}

/**
 * The site's stored snapshots for this order, oldest first, each with only its head read (rows of another
 * format or unreadable are skipped); the latest one's body is read too, since a restart resumes its replay
 * from it. Read any other body with loadSnapshotBody before resuming from it (the trace service does,
 * through withSnapshotBodies). If the heads cannot be read, every body is read and parsed instead.
 */
export async function loadTraceSnapshots(db: Db, siteId: number, order: SnapshotOrder): Promise<ReplaySnapshot[]> {
  let rows: HeadRow;
  try {
    rows = await queryHeads(db, siteId, order);
  } catch {
    return loadWholeSnapshots(db, siteId, order);
  }
  const out: ReplaySnapshot[] = [];
  for (const r of rows) {
    const s = parsedHead(r);
    if (s === null) continue;
    rowOf.set(s, r.id);
    out.push(s);
  }
  const latest = out[out.length - 1];
  if (latest !== undefined) await loadSnapshotBody(db, latest);
  return out;
}

/** Reads the body of a snapshot from loadTraceSnapshots; false when it cannot be resumed from (then it is rebuilt). */
export async function loadSnapshotBody(db: Db, s: ReplaySnapshot): Promise<boolean> {
  if (!needsBody(s)) return !isUnreadable(s);
  const id = rowOf.get(s);
  const row = id === undefined ? null : await db.traceSnapshot.findUnique({ where: { id }, select: { body: true } });
  return fillBody(s, row?.body ?? null);
}

async function loadWholeSnapshots(db: Db, siteId: number, order: SnapshotOrder): Promise<ReplaySnapshot[]> {
  const rows = await db.traceSnapshot.findMany({
    where: { siteId, ledgerOrder: order, format: REPLAY_SNAPSHOT_FORMAT },
    orderBy: { appliedCount: "asc" },
    select: { id: true, body: true },
  });
  const out: ReplaySnapshot[] = [];
  for (const r of rows) {
    try {
      const parsed: unknown = JSON.parse(r.body);
      if (!isSnapshot(parsed)) continue;
      rowOf.set(parsed, r.id);
      out.push(parsed);
    } catch {
      /* an unreadable row is rebuilt like a mismatched one */
    }
  }
  return out;
}

/**
 * Makes the stored rows the given snapshots: rows that are not one of them (no longer fitting the
 * ledger, of an old format, unreadable) are deleted and the snapshots without a row are written. Two
 * processes saving at once may collide on the unique key; the loser logs and leaves the winner's rows,
 * which describe the same ledger (and are checked against it when read).
 */
export async function saveTraceSnapshots(
  db: Db,
  siteId: number,
  order: SnapshotOrder,
  all: readonly ReplaySnapshot[],
): Promise<{ written: number; removed: number }> {
  // One per position: a replay resumed from a snapshot at a month start takes another at the same place;
  // the one already stored is kept.
  const byPosition = new Map<string, ReplaySnapshot>();
  for (const s of all) {
    const key = `${s.applied.count}:${s.applied.last?.moveId ?? ""}`;
    const had = byPosition.get(key);
    if (had === undefined || (!rowOf.has(had) && rowOf.has(s))) byPosition.set(key, s);
  }
  const snapshots = [...byPosition.values()];
  const stored = await db.traceSnapshot.findMany({ where: { siteId, ledgerOrder: order }, select: { id: true } });
  const present = new Set(stored.map((r) => r.id));
  const keep = new Set(
    snapshots.flatMap((s) => {
      const id = rowOf.get(s);
      return id !== undefined && present.has(id) && !isUnreadable(s) ? [id] : [];
    }),
  );
  const stale = stored.filter((r) => !keep.has(r.id)).map((r) => r.id);
  // A snapshot whose body was never read or did not hold what its head said cannot be written back.
  const missing = snapshots.filter((s) => !keep.has(rowOf.get(s) ?? -1) && !needsBody(s) && !isUnreadable(s));
  if (stale.length === 0 && missing.length === 0) return { written: 0, removed: 0 };
  try {
    const [, ...created] = await db.$transaction(
      [
        // Rows in the way of a missing snapshot's key go too: they hold an older build at that position.
        db.traceSnapshot.deleteMany({
          where: {
            OR: [
              { id: { in: stale } },
              { siteId, ledgerOrder: order, appliedCount: { in: missing.map((s) => s.applied.count) } },
            ],
          },
        }),
        ...missing.map((s) =>
          db.traceSnapshot.create({
            data: {
              siteId,
              ledgerOrder: order,
              appliedCount: s.applied.count,
              lastMoveId: s.applied.last?.moveId ?? null,
              format: s.format,
              body: JSON.stringify(s),
            },
            select: { id: true },
          }),
        ),
      ],
      // A first save writes every month (about 12 MB at ten years): on a busy machine that outlasted the
      // default 5 s, and the snapshots were lost until the next build. It runs in the background.
      { timeout: 60_000 },
    );
    missing.forEach((s, i) => {
      const row = created[i];
      if (row !== undefined) rowOf.set(s, row.id);
    });
  } catch (err) {
    log.warn(
      { err, siteId, event: "trace.snapshots.save" },
      "trace snapshots were not stored (another process may have stored them)",
    );
    return { written: 0, removed: 0 };
  }
  return { written: missing.length, removed: stale.length };
}

/** Forgets a site's stored snapshots (tests). */
export async function deleteTraceSnapshots(db: Db, siteId: number): Promise<number> {
  return (await db.traceSnapshot.deleteMany({ where: { siteId } })).count;
}
