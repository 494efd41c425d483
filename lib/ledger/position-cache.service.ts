import "server-only";
// An answer kept by the ledger position it was computed at (decision 0037), for reports that have no
// seal of their own: the waste-due list, the recall answer, the home page's read model, the lots list
// and the pictures drawn on the server. The same question at the same position
// is answered from memory; any booking or audited change moves the position and the next request
// computes again. The position is read again after computing, so an answer overtaken by a booking that
// landed meanwhile is handed out but not kept.
import type { Db } from "@/lib/core/connect";
import type { Result } from "@/lib/core/result";
import { getLedgerPosition } from "@/lib/ledger/position.store";
import { positionTag, samePosition } from "@/lib/ledger/position";
import { SingleFlight } from "@/lib/core/single-flight";
import type { LedgerPosition, PositionCache } from "@/lib/ledger/position";

export type KeptOutcome = "computed" | "same-position";

export interface KeptAnswer<T> {
  result: Result<T>;
  outcome: KeptOutcome;
  position: LedgerPosition;
}

export interface Kept<T> {
  value: T;
  outcome: KeptOutcome;
  position: LedgerPosition;
}

const home = globalThis as unknown as { tracevatKeptFlights?: WeakMap<object, SingleFlight<unknown>> };
const flights: WeakMap<object, SingleFlight<unknown>> = (home.tracevatKeptFlights ??= new WeakMap());

function flightOf<T>(cache: PositionCache<T>): SingleFlight<T> {
  let flight = flights.get(cache);
  if (flight === undefined) {
    flight = new SingleFlight<unknown>();
    flights.set(cache, flight);
  }
  return flight as SingleFlight<T>;
}

/**
 * Any value computed from the books, kept by the position it was computed at. Readers who ask the same
 * question at the same position while it is being computed wait for that one computation.
 */
export async function keptAtPosition<T>(
  cache: PositionCache<T>,
  db: Db,
  siteId: number,
  key: string,
  compute: () => Promise<T>,
): Promise<Kept<T>> {
  const position = await getLedgerPosition(db, siteId);
  const kept = cache.get(key, position);
  if (kept !== undefined) return { value: kept, outcome: "same-position", position };
  const { value, first } = await flightOf(cache).run(`${key}@${positionTag(position)}`, async () => {
    const computed = await compute();
    if (samePosition(await getLedgerPosition(db, siteId), position)) cache.set(key, position, computed);
    return computed;
  });
  return { value, outcome: first ? "computed" : "same-position", position };
}

export async function answerAtPosition<T>(
  cache: PositionCache<Result<T>>,
  db: Db,
  siteId: number,
  key: string,
  compute: () => Promise<Result<T>>,
): Promise<KeptAnswer<T>> {
  const { value, outcome, position } = await keptAtPosition(cache, db, siteId, key, compute);
  return { result: value, outcome, position };
}

/** A question's key: the site, the query as typed (keys sorted) and anything else the answer depends on. */
export function questionKey(siteId: number, input: unknown, ...more: ReadonlyArray<string | number | boolean>): string {
  const entries =
    input !== null && typeof input === "object"
      ? Object.entries(input as Record<string, unknown>).sort(([a], [b]) => a.localeCompare(b))
      : [];
  return JSON.stringify([siteId, entries, ...more]);
}
