import "server-only";
// The period mass balance of a site for the balance page and the JSON API: the stock identity in
// whole grams (site-wide and per material kind), the process view of the batches finished in the
// period, book stock against the latest tank gauges, and the accounting period's close/reopen record.
import type { Db } from "@/lib/core/connect";
import { fail, ok } from "@/lib/core/result";
import type { Result } from "@/lib/core/result";
import { parseInput } from "@/lib/ledger/parse";
import { getSiteLimits } from "@/lib/mass-balance/site-limits.service";
import {
  getAccountingPeriodExact,
  listLatestGauges,
  listPeriodEvents,
  loadBalanceLedger,
} from "@/lib/mass-balance/balance.store";
import type { BalanceLedger, CarriedBooks, ClosureTolerance } from "@/lib/mass-balance/balance-types";
import { loadPeriodLedger } from "@/lib/mass-balance/balance-window.service";
import type { GaugeReading } from "@/lib/mass-balance/period-balance";
import { refuseUnreasonablePeriod } from "@/lib/mass-balance/period";
import { resolvePeriodRange } from "@/lib/mass-balance/period-range";
import { compareBookToGauges, computePeriodBalance } from "@/lib/mass-balance/period-balance";
import { ClosureToleranceSchema, PeriodRangeSchema } from "@/lib/mass-balance/period.schema";
import { BalanceQuerySchema } from "@/lib/mass-balance/balance-query.schema";
import type { BalanceQuery } from "@/lib/mass-balance/balance-query.schema";
import { periodRangeInput, resolveBalanceQuery, toleranceInput } from "@/lib/mass-balance/balance-period-query";
import { assembleBalanceReport, materialRows } from "@/lib/mass-balance/balance-report";
import type { BalanceReport } from "@/lib/mass-balance/balance-report";

export { labelMaterial, MATERIAL_LABELS } from "@/lib/mass-balance/balance-report";
export type {
  BalanceLine,
  BalanceReport,
  BatchRow,
  GaugeRow,
  MaterialBalanceRow,
} from "@/lib/mass-balance/balance-report";

/** How the ledger is read: from the books brought forward to the period start (the usual way), or whole. */
export type BalanceLedgerRead = "period" | "whole";

/** The period mass balance of a site: stock identity, process view, per material kind, gauges and the close record. */
export function getBalanceReport(
  db: Db,
  site: { id: number; timeZone: string },
  input: unknown,
  now: Date,
): Promise<Result<BalanceReport>> {
  return computeBalanceReport(db, site, input, now, "period");
}

/** The same report from the whole ledger read and walked from its first movement (tests and the bench compare). */
export function getBalanceReportFromWholeLedger(
  db: Db,
  site: { id: number; timeZone: string },
  input: unknown,
  now: Date,
): Promise<Result<BalanceReport>> {
  return computeBalanceReport(db, site, input, now, "whole");
}

interface ResolvedBalanceQuery {
  query: BalanceQuery;
  resolved: ReturnType<typeof resolveBalanceQuery>;
  period: { label: string; startMs: number; endMs: number };
}

function resolveQuery(site: { timeZone: string }, input: unknown, now: Date): Result<ResolvedBalanceQuery> {
  const parsed = parseInput(BalanceQuerySchema, input);
  if (!parsed.ok) return parsed;
  const q = parsed.value;
  const resolved = resolveBalanceQuery(q, now.getTime(), site.timeZone);
  const range = parseInput(PeriodRangeSchema, periodRangeInput(resolved, site.timeZone));
  if (!range.ok) return range;
  const period = resolvePeriodRange(range.value);
  if (!period.ok) return period;
  const unreasonable = refuseUnreasonablePeriod(period.value, q.period, now.getTime());
  if (unreasonable) return fail("BALANCE.PERIOD_OUT_OF_RANGE", unreasonable.message, unreasonable.field);
  return ok({ query: q, resolved, period: period.value });
}

/** The tolerance the report flags against: the one typed in the query, else the site's. */
async function toleranceOf(db: Db, siteId: number, q: BalanceQuery): Promise<Result<ClosureTolerance>> {
  return parseInput(ClosureToleranceSchema, toleranceInput(q, (await getSiteLimits(db, siteId)).closure));
}

/** The ledger the report is computed over: the period's own (with the books brought forward), or the whole. */
async function readLedger(
  db: Db,
  siteId: number,
  span: { startMs: number; endMs: number },
  readings: Promise<readonly GaugeReading[]>,
  read: BalanceLedgerRead,
): Promise<Result<{ ledger: BalanceLedger; carried?: CarriedBooks; bookOf?: (r: GaugeReading) => number }>> {
  if (read === "whole") return ok({ ledger: await loadBalanceLedger(db, siteId) });
  return loadPeriodLedger(db, siteId, span, readings);
}

/** The accounting period with exactly these bounds, and its closes and reopens. */
async function periodRecord(db: Db, siteId: number, startsAt: Date, endsAt: Date) {
  const accountingPeriod = await getAccountingPeriodExact(db, siteId, startsAt, endsAt);
  const events = accountingPeriod === null ? [] : await listPeriodEvents(db, siteId, { periodId: accountingPeriod.id });
  return { accountingPeriod, events };
}

async function computeBalanceReport(
  db: Db,
  site: { id: number; timeZone: string },
  input: unknown,
  now: Date,
  read: BalanceLedgerRead,
): Promise<Result<BalanceReport>> {
  const started = performance.now();
  const query = resolveQuery(site, input, now);
  if (!query.ok) return query;
  const { resolved, period } = query.value;
  const startsAt = new Date(period.startMs);
  const endsAt = new Date(period.endMs);
  const span = { startMs: period.startMs, endMs: period.endMs };
  // Every read that does not need another's answer goes out at once.
  const gaugesRead = listLatestGauges(db, site.id, new Date(period.endMs - 1));
  const [tol, loaded, readings, { accountingPeriod, events }] = await Promise.all([
    toleranceOf(db, site.id, query.value.query),
    readLedger(db, site.id, span, gaugesRead, read),
    gaugesRead,
    periodRecord(db, site.id, startsAt, endsAt),
  ]);
  if (!tol.ok) return tol;
  const tolerance = tol.value;
  if (!loaded.ok) return loaded;
  const { ledger, carried, bookOf } = loaded.value;
  const gauge =
    readings.length === 0
      ? null
      : compareBookToGauges({
          holders: ledger.holders,
          moves: ledger.moves,
          readings,
          tolerance,
          ...(bookOf ? { bookOf } : {}),
        });
  if (gauge !== null && !gauge.ok) return gauge;
  const gauges = (gauge?.value.rows ?? []).map((r) => ({
    holderId: r.holderId,
    bookG: r.bookG,
    measuredG: r.measuredG,
  }));
  const from = carried ? { carried } : {};
  const whole = computePeriodBalance({
    holders: ledger.holders,
    moves: ledger.moves,
    period: span,
    scope: { siteId: site.id },
    tolerance,
    gauges,
    ...from,
  });
  if (!whole.ok) return whole;
  const byMaterial = materialRows({ ledger, span, siteId: site.id, tolerance, gauges, ...from });
  if (!byMaterial.ok) return byMaterial;
  const report = assembleBalanceReport({
    query: { ...resolved, warnPct: tolerance.warnPct, failPct: tolerance.failPct },
    period: { label: period.label, startsAt, endsAt },
    tolerance,
    ledger,
    whole: whole.value,
    byMaterial: byMaterial.value,
    gauge: gauge === null ? null : gauge.value,
    accountingPeriod,
    events,
  });
  return ok({ ...report, computeMs: performance.now() - started });
}
