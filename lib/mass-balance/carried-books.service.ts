import "server-only";
// The books brought forward to an instant (carried-books.ts), kept per site so a period balance reads
// only its own movements. Kept books stand for as long as no movement dated before their instant has
// been booked since they were read: each use checks that with one indexed read of the movements booked
// since (and that the last movement read is still there unchanged, which a restored backup would break).
// The check is made in the database, so several server processes on one database agree. Missing or
// broken books are carried forward from the latest kept books that still stand, or from the start.
// SQLite takes the write lock before a movement gets its id, so its ids are in commit order and "booked
// since" is "id above the last one read". On PostgreSQL a transaction can commit after another that
// took a higher id, so books are read through a settled id instead (every movement up to it committed,
// readSettledLastMovement) and each use looks at every id above that; when the range since grows long
// the books are settled again. When the settling lock cannot be had in time, the movements dated before
// the books' instant are counted instead, which misses nothing (decision 0048).
import type { Db } from "@/lib/core/connect";
import { ok } from "@/lib/core/result";
import type { Result } from "@/lib/core/result";
import { dialectOf } from "@/lib/core/bulk-insert";
import { findReversedPairs } from "@/lib/ledger/movement.store";
import type { BalanceMove, CarriedBooks } from "@/lib/mass-balance/balance-types";
import { carryBooks, emptyBooks } from "@/lib/mass-balance/carried-books";
import {
  countMovesBefore,
  getLastMovement,
  getMovementMark,
  hasBackdatedMove,
  listBatchAndOutHolders,
  readDatedMoves,
  readSettledLastMovement,
} from "@/lib/mass-balance/balance-window.store";
import type { DatedMoveRow, MovementMark } from "@/lib/mass-balance/balance-window.store";

type Mark = MovementMark | null;

interface Kept {
  books: CarriedBooks;
  /** The books add up every movement dated before their instant with an id up to this one, and no other. */
  throughId: number;
  /**
   * Whether every movement with an id up to throughId had committed when the books were read through
   * it, so that only higher ids can still bring one dated earlier. Always so on SQLite; on PostgreSQL
   * books read while the settling lock could not be had are not, and are checked by counting.
   */
  settled: boolean;
  /** The movement at throughId, to notice a database that went back (a restored backup). */
  mark: Mark;
  /** How many movements dated before the books' instant they add up (the count the fallback compares). */
  movesBefore: number;
}

/** Kept books per site; a few instants each (period starts asked for), the earliest kept dropped first. */
const MAX_KEPT_PER_SITE = 24;
const home = globalThis as unknown as { tracevatCarriedBooks?: Map<number, Kept[]> };
const kept: Map<number, Kept[]> = (home.tracevatCarriedBooks ??= new Map<number, Kept[]>());

/**
 * PostgreSQL: movement ids above the settled one a use looks through before the books are settled
 * again (one lock, a few milliseconds), so the indexed read behind each use stays short. Ids are
 * shared by every site, so this is an upper bound on the site's own movements in the range.
 */
const RESETTLE_AFTER_IDS = 2_000;
/** How long settling waits for bookings in flight before the use counts instead. */
const SETTLE_WAIT_MS = 250;
/** After settling could not be had, uses count for this long rather than hold bookings up again. */
const SETTLE_BACKOFF_MS = 10_000;
/** Per database handle; on globalThis like the kept books, as pages and API routes each load this module. */
const settleHome = globalThis as unknown as { tracevatSettleBlockedUntil?: WeakMap<Db, number> };
let settleBlockedUntil: WeakMap<Db, number> = (settleHome.tracevatSettleBlockedUntil ??= new WeakMap());

function sameMark(a: Mark, b: Mark): boolean {
  return (
    a === b ||
    (a !== null && b !== null && a.id === b.id && a.at === b.at && a.massG === b.massG && a.toHolderId === b.toHolderId)
  );
}

/** Whether the movement the books were read up to is still there unchanged. */
async function markStands(db: Db, siteId: number, k: Kept, last: Mark): Promise<boolean> {
  if (k.mark === null) return true;
  const now = k.mark.id === last?.id ? last : await getMovementMark(db, siteId, k.mark.id);
  return sameMark(now, k.mark);
}

/** PostgreSQL: the site's last movement read settled (see readSettledLastMovement), or null when not had in time. */
async function settle(db: Db, siteId: number): Promise<{ last: Mark } | null> {
  if ((settleBlockedUntil.get(db) ?? 0) > Date.now()) return null;
  const settled = await readSettledLastMovement(db, siteId, SETTLE_WAIT_MS);
  if (settled === null) settleBlockedUntil.set(db, Date.now() + SETTLE_BACKOFF_MS);
  return settled;
}

/** Whether kept books still stand with `last` read settled; they are then read through it. */
async function standsSettled(db: Db, siteId: number, k: Kept, last: Mark): Promise<boolean> {
  const lastId = last?.id ?? 0;
  const atMs = k.books.atMs;
  const [mark, complete] = await Promise.all([
    markStands(db, siteId, k, last),
    k.settled
      ? hasBackdatedMove(db, siteId, { afterId: k.throughId, throughId: lastId, beforeMs: atMs }).then((b) => !b)
      : countMovesBefore(db, siteId, atMs, lastId).then((n) => n === k.movesBefore),
  ]);
  if (!mark || !complete) return false;
  Object.assign(k, { throughId: lastId, settled: true, mark: last });
  return true;
}

/**
 * Whether kept books still stand at the ledger's last movement `last`, read settled (always on SQLite)
 * or not (PostgreSQL's plain read, ids above which may still commit below it).
 */
async function stillStands(db: Db, siteId: number, k: Kept, last: Mark, lastSettled: boolean): Promise<boolean> {
  const lastId = last?.id ?? 0;
  if (lastId < k.throughId) return false;
  if (lastSettled) return standsSettled(db, siteId, k, last);
  if (k.settled && lastId - k.throughId <= RESETTLE_AFTER_IDS) {
    // Ids up to throughId all committed: any movement that breaks the books has a higher id. Not
    // read through lastId, as ids below it may still commit.
    const [mark, backdated] = await Promise.all([
      markStands(db, siteId, k, last),
      hasBackdatedMove(db, siteId, { afterId: k.throughId, throughId: lastId, beforeMs: k.books.atMs }),
    ]);
    return mark && !backdated;
  }
  const settled = await settle(db, siteId);
  if (settled !== null) return standsSettled(db, siteId, k, settled.last);
  // Could not settle: every movement dated before the instant counted, committed ones all in.
  const [mark, count] = await Promise.all([
    markStands(db, siteId, k, last),
    countMovesBefore(db, siteId, k.books.atMs),
  ]);
  return mark && count === k.movesBefore;
}

function drop(siteId: number, k: Kept): void {
  kept.set(
    siteId,
    (kept.get(siteId) ?? []).filter((x) => x !== k),
  );
}

/** The kept books of the site nearest before `atMs` that still stand (dropping those that do not). */
async function nearestStanding(db: Db, siteId: number, atMs: number, last: Mark, settled: boolean) {
  const list = kept.get(siteId) ?? [];
  const candidates = list.filter((k) => k.books.atMs <= atMs).sort((a, b) => b.books.atMs - a.books.atMs);
  for (const k of candidates) {
    if (await stillStands(db, siteId, k, last, settled)) return k;
    drop(siteId, k);
  }
  return null;
}

function keep(siteId: number, k: Kept): void {
  const list = (kept.get(siteId) ?? []).filter((x) => x.books.atMs !== k.books.atMs);
  list.push(k);
  while (list.length > MAX_KEPT_PER_SITE) list.shift();
  kept.set(siteId, list);
}

function toMoves(rows: readonly DatedMoveRow[]): BalanceMove[] {
  // A reversal carries its movement's date, so both halves of a pair fall in the same window.
  const paired = findReversedPairs(rows);
  return rows
    .filter((r) => !paired.has(r.id))
    .map((r) => ({
      id: r.id,
      at: r.at,
      fromHolderId: r.fromHolderId,
      toHolderId: r.toHolderId,
      massG: r.massG,
      role: r.role,
    }));
}

/** What kinds the holders of these movements are, read after the movements (so every holder is there). */
async function kindsOf(db: Db, siteId: number) {
  const { batches, out } = await listBatchAndOutHolders(db, siteId);
  return { isStock: (id: number) => !out.has(id), isBatch: (id: number) => batches.has(id) };
}

/** The site's books brought forward to `atMs`: every movement dated before it added up. */
export async function booksBroughtForward(db: Db, siteId: number, atMs: number): Promise<Result<CarriedBooks>> {
  // SQLite's ids are in commit order, so its plain read of the last movement is a settled one.
  let settled = dialectOf(db) === "sqlite";
  let last = await getLastMovement(db, siteId);
  const exact = (kept.get(siteId) ?? []).find((k) => k.books.atMs === atMs);
  if (exact !== undefined) {
    if (await stillStands(db, siteId, exact, last, settled)) return ok(exact.books);
    drop(siteId, exact);
  }
  if (!settled) {
    // New books are read through a settled id when it can be had, so later uses need not count.
    const s = await settle(db, siteId);
    if (s !== null) [last, settled] = [s.last, true];
  }
  const base = await nearestStanding(db, siteId, atMs, last, settled);
  const throughId = last?.id ?? 0;
  const from = base?.books ?? emptyBooks(Number.NEGATIVE_INFINITY);
  const rows = await readDatedMoves(db, siteId, { fromMs: base === null ? null : from.atMs, toMs: atMs, throughId });
  const carried = carryBooks(from, toMoves(rows), atMs, await kindsOf(db, siteId));
  if (!carried.ok) return carried;
  const movesBefore = (base?.movesBefore ?? 0) + rows.length;
  keep(siteId, { books: carried.value, throughId, settled, mark: last, movesBefore });
  return carried;
}

/** Forgets every site's kept books and any wait before settling again (tests; after a database file is replaced). */
export function clearCarriedBooks(): void {
  kept.clear();
  settleBlockedUntil = settleHome.tracevatSettleBlockedUntil = new WeakMap<Db, number>();
}
