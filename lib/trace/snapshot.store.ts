import "server-only";
// Monthly replay snapshots kept in the database (TraceSnapshot), so a restarted server resumes its trace
// index from them instead of replaying the whole ledger. Each is read back only if its format is the
// current one; the trace service then checks it against the ledger (moves applied, last move, mass sum)
// and drops and rebuilds any that no longer fit. Derived data: losing the rows costs one full replay.
import type { Db } from "@/lib/core/connect";
import { log } from "@/lib/log/log.service";
import { REPLAY_SNAPSHOT_FORMAT } from "@/lib/trace/replay";
import type { ReplaySnapshot } from "@/lib/trace/replay";

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
 * taken, so an object found here is exactly what that row holds; any other object must be written.
 */
const rowOf = new WeakMap<ReplaySnapshot, number>();

/** The site's stored snapshots for this order, oldest first; rows of another format or unreadable are skipped. */
export async function loadTraceSnapshots(db: Db, siteId: number, order: SnapshotOrder): Promise<ReplaySnapshot[]> {
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
      return id !== undefined && present.has(id) ? [id] : [];
    }),
  );
  const stale = stored.filter((r) => !keep.has(r.id)).map((r) => r.id);
  const missing = snapshots.filter((s) => !keep.has(rowOf.get(s) ?? -1));
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
