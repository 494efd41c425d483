import "server-only";
// The balance page's and /api/balance's answers, kept by the ledger position they were computed at: a
// wrapper around getBalanceReport (balance.service.ts), which stays as it is. The same question at the
// same position is answered from memory; any booking moves the position and the next request
// recomputes. A closed period's answer is kept across positions while its seal holds (still closed
// since the same moment, nothing back-dated before its end since). The position and the seal are read
// from the database, so several server processes on one database give the same answers.
import type { Db } from "@/lib/core/connect";
import type { Result } from "@/lib/core/result";
import { getBalanceReport } from "@/lib/mass-balance/balance.service";
import type { BalanceReport } from "@/lib/mass-balance/balance.service";
import {
  getLastGaugeId,
  readBalanceKeyParts,
  readSettledSealMarks,
  sealHolds,
  sealText,
} from "@/lib/mass-balance/balance-seal.store";
import { dialectOf } from "@/lib/core/bulk-insert";
import type { BalanceSeal } from "@/lib/mass-balance/balance-seal.store";
import { getLedgerPosition } from "@/lib/ledger/position.store";
import { closureSharesOf } from "@/lib/mass-balance/site-limits.service";
import { PositionCache, positionTag, quarterHourOf, samePosition } from "@/lib/ledger/position";
import type { LedgerPosition } from "@/lib/ledger/position";
import { SingleFlight } from "@/lib/core/single-flight";

interface Kept {
  result: Result<BalanceReport>;
  seal: BalanceSeal | null;
}

const home = globalThis as unknown as {
  tracevatBalanceCache?: PositionCache<Kept>;
  tracevatBalanceFlights?: SingleFlight<Result<BalanceReport>>;
};
const cache: PositionCache<Kept> = (home.tracevatBalanceCache ??= new PositionCache<Kept>(200));
const flights: SingleFlight<Result<BalanceReport>> = (home.tracevatBalanceFlights ??= new SingleFlight());

/** How the answer was found, for tests and the load report. */
export type BalanceCacheOutcome = "computed" | "same-position" | "sealed";

/** The question: site, its time zone, the query as typed and the quarter-hour (defaults follow the date). */
export function balanceQuestionKey(site: { id: number; timeZone: string }, input: unknown, now: Date): string {
  const entries =
    input !== null && typeof input === "object"
      ? Object.entries(input as Record<string, unknown>).sort(([a], [b]) => a.localeCompare(b))
      : [];
  return JSON.stringify([site.id, site.timeZone, quarterHourOf(now), entries]);
}

/** The seal of a closed period's answer computed having seen every movement and gauge up to these ids. */
function sealOf(report: BalanceReport, moveId: number, gaugeId: number): BalanceSeal | null {
  const p = report.accountingPeriod;
  if (p === null || p.status !== "CLOSED" || p.closedAt === null) return null;
  return { periodId: p.id, closedAtMs: p.closedAt.getTime(), endsAt: p.endsAt, moveId, gaugeId };
}

/** getBalanceReport, answered from the position cache when the books have not changed since. */
export async function getBalanceReportCached(
  db: Db,
  site: { id: number; timeZone: string },
  input: unknown,
  now: Date,
): Promise<Result<BalanceReport>> {
  return (await getBalanceReportTraced(db, site, input, now)).result;
}

/** The cached answer with how it was found. */
export async function getBalanceReportTraced(
  db: Db,
  site: { id: number; timeZone: string },
  input: unknown,
  now: Date,
): Promise<{ result: Result<BalanceReport>; outcome: BalanceCacheOutcome; position: LedgerPosition }> {
  const started = performance.now();
  // The site's tolerance is part of the question: a changed tolerance re-flags even a sealed period.
  // Read with the position in one statement, so a kept answer costs one round trip.
  const parts = await readBalanceKeyParts(db, site.id);
  const [tolerance, position] = [closureSharesOf(parts.closureJson), parts.position];
  const key = `${balanceQuestionKey(site, input, now)}|${tolerance.warnPct}/${tolerance.failPct}`;
  const sealed = cache.getSealed(key);
  const same = cache.get(key, position);
  if (same !== undefined) return { result: timed(same.result, started), outcome: "same-position", position };
  if (sealed !== undefined && sealed.value.seal !== null && (await sealHolds(db, site.id, sealed.value.seal))) {
    cache.set(key, position, sealed.value, sealed.seal);
    return { result: timed(sealed.value.result, started), outcome: "sealed", position };
  }
  // Readers asking the same question at the same position while it is computed wait for that one.
  const { value: result, first } = await flights.run(`${key}@${positionTag(position)}`, async () => {
    const gaugeId = await getLastGaugeId(db, site.id);
    const computed = await getBalanceReport(db, site, input, now);
    let kept: Kept = { result: computed, seal: computed.ok ? sealOf(computed.value, position.moveId, gaugeId) : null };
    if (kept.seal !== null && dialectOf(db) === "postgresql") kept = await settledSeal(db, site, input, now, computed);
    // Read again after computing: a booking that landed meanwhile must not be stored under the old position.
    const after = await getLedgerPosition(db, site.id);
    if (samePosition(after, position)) cache.set(key, position, kept, kept.seal === null ? null : sealText(kept.seal));
    return kept.result;
  });
  return { result: first ? result : timed(result, started), outcome: first ? "computed" : "same-position", position };
}

/** How long sealing a closed period's answer on PostgreSQL waits for bookings in flight (as 0048's settle). */
const SEAL_SETTLE_WAIT_MS = 250;

/**
 * PostgreSQL: a closed period's answer sealed through settled ids. Ids are drawn when a booking's
 * INSERT runs and become visible at its commit, so the position read before computing can already be
 * past a back-dated booking still in flight, which the seal's check (ids above the seal's) would then
 * never see. Once every id up to the settled ones has committed, the answer is computed again and
 * sealed at them: anything it did not see has a higher id. When the lock cannot be had in time the
 * answer is kept at its position only, unsealed. Once per closed question and process; a seal that
 * holds is reused across bookings after that.
 */
async function settledSeal(
  db: Db,
  site: { id: number; timeZone: string },
  input: unknown,
  now: Date,
  computed: Result<BalanceReport>,
): Promise<Kept> {
  const marks = await readSettledSealMarks(db, site.id, SEAL_SETTLE_WAIT_MS);
  if (marks === null) return { result: computed, seal: null };
  const again = await getBalanceReport(db, site, input, now);
  const seal = again.ok ? sealOf(again.value, marks.moveId, marks.gaugeId) : null;
  return { result: again, seal };
}

function timed(result: Result<BalanceReport>, started: number): Result<BalanceReport> {
  return result.ok ? { ok: true, value: { ...result.value, computeMs: performance.now() - started } } : result;
}

/** Forgets every kept balance (tests). */
export function clearBalanceCache(): void {
  cache.clear();
}
