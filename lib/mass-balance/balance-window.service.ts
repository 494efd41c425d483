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
import type { BalanceLedger, CarriedBooks } from "@/lib/mass-balance/balance-types";
import { readDatedMoves, readHolderParts } from "@/lib/mass-balance/balance-window.store";
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

/** The period's ledger and the books brought forward to its start. */
export async function loadPeriodLedger(
  db: Db,
  siteId: number,
  span: { startMs: number; endMs: number },
  gaugeReadings: Promise<readonly GaugeReading[]>,
): Promise<Result<PeriodLedger>> {
  const [carried, rows, readings] = await Promise.all([
    booksBroughtForward(db, siteId, span.startMs),
    readDatedMoves(db, siteId, { fromMs: span.startMs, toMs: span.endMs, throughId: LAST_POSSIBLE_ID }),
    gaugeReadings,
  ]);
  if (!carried.ok) return carried;
  const books = carried.value;
  const ids = new Set<number>([...books.stockG.keys(), ...readings.map((r) => r.holderId)]);
  for (const n of books.negativeStock) ids.add(n.holderId);
  for (const m of rows) {
    ids.add(m.toHolderId);
    if (m.fromHolderId !== null) ids.add(m.fromHolderId);
  }
  const ledger = toBalanceLedger(siteId, await readHolderParts(db, siteId, ids, span.startMs), rows);
  const before = await booksBeforePeriod(db, siteId, readings, span.startMs);
  if (!before.ok) return before;
  const bookOf = (r: GaugeReading): number => before.value.get(r) ?? bookFromPeriod(ledger, books, r.holderId, r.at);
  return ok({ ledger, carried: books, bookOf });
}
