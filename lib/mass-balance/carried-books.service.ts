import "server-only";
// The books brought forward to an instant (carried-books.ts), kept per site so a period balance reads
// only its own movements. Kept books stand for as long as no movement dated before their instant has
// been booked since they were read: each use checks that with one indexed read of the movements booked
// since (and that the last movement read is still there unchanged, which a restored backup would break).
// The check is made in the database, so several server processes on one database agree. Missing or
// broken books are carried forward from the latest kept books that still stand, or from the start.
// On PostgreSQL a transaction can commit after another that took a higher movement id, so "booked
// since" by id could miss it: there each use also counts the movements dated before the books' instant
// (SQLite takes the write lock before a movement gets its id, so its ids are in commit order).
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
} from "@/lib/mass-balance/balance-window.store";
import type { DatedMoveRow } from "@/lib/mass-balance/balance-window.store";

type Mark = { id: number; at: number; massG: number; toHolderId: number } | null;

interface Kept {
  books: CarriedBooks;
  /** Every movement with an id up to this one was read (or checked to be dated later). */
  throughId: number;
  /** The last movement then, to notice a database that went back (a restored backup). */
  mark: Mark;
  /** How many movements dated before the books' instant they add up (checked again on PostgreSQL). */
  movesBefore: number;
}

/** Kept books per site; a few instants each (period starts asked for), the earliest kept dropped first. */
const MAX_KEPT_PER_SITE = 24;
const home = globalThis as unknown as { tracevatCarriedBooks?: Map<number, Kept[]> };
const kept: Map<number, Kept[]> = (home.tracevatCarriedBooks ??= new Map<number, Kept[]>());

function sameMark(a: Mark, b: Mark): boolean {
  return (
    a === b ||
    (a !== null && b !== null && a.id === b.id && a.at === b.at && a.massG === b.massG && a.toHolderId === b.toHolderId)
  );
}

/** Whether kept books still stand at the ledger's last movement `last`. */
async function stillStands(db: Db, siteId: number, k: Kept, last: Mark): Promise<boolean> {
  const lastId = last?.id ?? 0;
  if (lastId < k.throughId) return false;
  const [mark, backdated, movesBefore] = await Promise.all([
    k.mark === null || k.mark.id === last?.id
      ? Promise.resolve(k.mark === null ? null : last)
      : getMovementMark(db, siteId, k.mark.id),
    hasBackdatedMove(db, siteId, { afterId: k.throughId, throughId: lastId, beforeMs: k.books.atMs }),
    dialectOf(db) === "postgresql" ? countMovesBefore(db, siteId, k.books.atMs) : Promise.resolve(k.movesBefore),
  ]);
  return sameMark(mark, k.mark) && !backdated && movesBefore === k.movesBefore;
}

/** The kept books of the site nearest before `atMs` that still stand (dropping those that do not). */
async function nearestStanding(db: Db, siteId: number, atMs: number, last: Mark): Promise<Kept | null> {
  const list = kept.get(siteId) ?? [];
  const candidates = list.filter((k) => k.books.atMs <= atMs).sort((a, b) => b.books.atMs - a.books.atMs);
  for (const k of candidates) {
    if (await stillStands(db, siteId, k, last)) {
      k.throughId = last?.id ?? 0;
      k.mark = last;
      return k;
    }
    kept.set(
      siteId,
      (kept.get(siteId) ?? []).filter((x) => x !== k),
    );
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
  const last = await getLastMovement(db, siteId);
  const base = await nearestStanding(db, siteId, atMs, last);
  if (base !== null && base.books.atMs === atMs) return ok(base.books);
  const throughId = last?.id ?? 0;
  const from = base?.books ?? emptyBooks(Number.NEGATIVE_INFINITY);
  const rows = await readDatedMoves(db, siteId, { fromMs: base === null ? null : from.atMs, toMs: atMs, throughId });
  const carried = carryBooks(from, toMoves(rows), atMs, await kindsOf(db, siteId));
  if (!carried.ok) return carried;
  keep(siteId, { books: carried.value, throughId, mark: last, movesBefore: (base?.movesBefore ?? 0) + rows.length });
  return carried;
}

/** Forgets every site's kept books (tests; after a database file is replaced). */
export function clearCarriedBooks(): void {
  kept.clear();
}
