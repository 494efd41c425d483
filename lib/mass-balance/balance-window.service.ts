import "server-only";
// The ledger a period balance needs, read without the whole history: the books brought forward to the
// period start (carried-books.service.ts), the movements dated in the period, and only the holders the
// statement can show (stock held at either end, moved in the period, found below zero, batches not
// finished before the period, gauged tanks). The whole-ledger read (loadBalanceLedger) gives the same
// report; test/integration/balance-window.test.ts compares the two.
import type { Db } from "@/lib/core/connect";
import { ok } from "@/lib/core/result";
import type { Result } from "@/lib/core/result";
import { toBalanceLedger } from "@/lib/mass-balance/balance.store";
import type { HolderParts } from "@/lib/mass-balance/balance.store";
import type { BalanceLedger, CarriedBooks } from "@/lib/mass-balance/balance-types";
import { readDatedMoves, readHolderParts } from "@/lib/mass-balance/balance-window.store";
import type { DatedMoveRow } from "@/lib/mass-balance/balance-window.store";
import { shownHolderIds } from "@/lib/mass-balance/shown-holders";
import { booksBroughtForward } from "@/lib/mass-balance/carried-books.service";
import type { GaugeReading } from "@/lib/mass-balance/period-balance";

/** Movement ids are 32-bit integers in both databases: every id is at most this. */
const LAST_POSSIBLE_ID = 2_147_483_647;

export interface PeriodLedger {
  ledger: BalanceLedger;
  carried: CarriedBooks;
  /** Book stock of each gauge reading's tank at the reading, movements at that instant included. */
  bookOf: (reading: GaugeReading) => number;
}

/** Book stock of `holderId` through `atMs` from the books at the period start and the period's movements. */
function bookFromPeriod(ledger: BalanceLedger, carried: CarriedBooks, holderId: number, atMs: number): number {
  let g = carried.stockG.get(holderId) ?? 0;
  for (const m of ledger.moves) {
    if (m.at > atMs) continue;
    if (m.toHolderId === holderId) g += m.massG;
    if (m.fromHolderId === holderId) g -= m.massG;
  }
  return g;
}

/** Book stock at readings taken before the period: from the books brought forward to just after each. */
async function booksBeforePeriod(
  db: Db,
  siteId: number,
  readings: readonly GaugeReading[],
  startMs: number,
): Promise<Result<Map<GaugeReading, number>>> {
  const out = new Map<GaugeReading, number>();
  for (const r of readings) {
    if (r.at >= startMs) continue;
    const books = await booksBroughtForward(db, siteId, r.at + 1);
    if (!books.ok) return books;
    out.set(r, books.value.stockG.get(r.holderId) ?? 0);
  }
  return ok(out);
}

/** The parts of the holders the statement can show (shownHolderIds). */
function onlyShown(parts: HolderParts, named: ReadonlySet<number>, sinceMs: number): HolderParts {
  const keep = shownHolderIds(parts.holders, parts.batches, named, sinceMs);
  const kept = <T extends { holderId: number }>(xs: T[]): T[] => xs.filter((x) => keep.has(x.holderId));
  return {
    holders: parts.holders.filter((h) => keep.has(h.id)),
    pickups: kept(parts.pickups),
    lots: kept(parts.lots),
    tanks: kept(parts.tanks),
    reagents: kept(parts.reagents),
    batches: kept(parts.batches),
    waste: kept(parts.waste),
  };
}

/** The holders the period's ledger needs, read alongside its movements (and once more if one is missing). */
async function holdersFor(
  db: Db,
  siteId: number,
  span: { startMs: number; endMs: number },
  known: ReadonlySet<number>,
  movesRead: Promise<DatedMoveRow[]>,
): Promise<{ rows: DatedMoveRow[]; parts: HolderParts }> {
  // Holders are named by the window of the movements, so this read need not wait for theirs.
  const [rows, read] = await Promise.all([movesRead, readHolderParts(db, siteId, known, span.startMs, span)]);
  const ids = new Set<number>(known);
  for (const m of rows) {
    ids.add(m.toHolderId);
    if (m.fromHolderId !== null) ids.add(m.fromHolderId);
  }
  const found = new Set(read.holders.map((h) => h.id));
  // A movement committed between the two reads can name a holder the first did not see: read again by id.
  const parts = [...ids].every((id) => found.has(id)) ? read : await readHolderParts(db, siteId, ids, span.startMs);
  return { rows, parts: onlyShown(parts, ids, span.startMs) };
}

/** The period's ledger and the books brought forward to its start. */
export async function loadPeriodLedger(
  db: Db,
  siteId: number,
  span: { startMs: number; endMs: number },
  gaugeReadings: Promise<readonly GaugeReading[]>,
): Promise<Result<PeriodLedger>> {
  const movesRead = readDatedMoves(db, siteId, { fromMs: span.startMs, toMs: span.endMs, throughId: LAST_POSSIBLE_ID });
  // Awaited below; this only keeps a failure from surfacing as unhandled while the books are read.
  movesRead.catch(() => undefined);
  const [carried, readings] = await Promise.all([booksBroughtForward(db, siteId, span.startMs), gaugeReadings]);
  if (!carried.ok) return carried;
  const books = carried.value;
  const known = new Set<number>([...books.stockG.keys(), ...readings.map((r) => r.holderId)]);
  for (const n of books.negativeStock) known.add(n.holderId);
  const { rows, parts } = await holdersFor(db, siteId, span, known, movesRead);
  const ledger = toBalanceLedger(siteId, parts, rows);
  const before = await booksBeforePeriod(db, siteId, readings, span.startMs);
  if (!before.ok) return before;
  const bookOf = (r: GaugeReading): number => before.value.get(r) ?? bookFromPeriod(ledger, books, r.holderId, r.at);
  return ok({ ledger, carried: books, bookOf });
}
