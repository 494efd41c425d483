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
import { getLastGaugeId, readBalanceKeyParts, sealHolds, sealText } from "@/lib/mass-balance/balance-seal.store";
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

function sealOf(report: BalanceReport, position: LedgerPosition, gaugeId: number): BalanceSeal | null {
  const p = report.accountingPeriod;
  if (p === null || p.status !== "CLOSED" || p.closedAt === null) return null;
  return { periodId: p.id, closedAtMs: p.closedAt.getTime(), endsAt: p.endsAt, moveId: position.moveId, gaugeId };
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
    // Read again after computing: a booking that landed meanwhile must not be stored under the old position.
    const after = await getLedgerPosition(db, site.id);
    if (samePosition(after, position)) {
      const seal = computed.ok ? sealOf(computed.value, position, gaugeId) : null;
      cache.set(key, position, { result: computed, seal }, seal === null ? null : sealText(seal));
    }
    return computed;
  });
  return { result: first ? result : timed(result, started), outcome: first ? "computed" : "same-position", position };
}

function timed(result: Result<BalanceReport>, started: number): Result<BalanceReport> {
  return result.ok ? { ok: true, value: { ...result.value, computeMs: performance.now() - started } } : result;
}

/** Forgets every kept balance (tests). */
export function clearBalanceCache(): void {
  cache.clear();
}
