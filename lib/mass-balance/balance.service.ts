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
  resolved: ReturnType<typeof resolveBalanceQuery>;
  period: { label: string; startMs: number; endMs: number };
  tolerance: ClosureTolerance;
}

async function resolveQuery(
  db: Db,
  site: { id: number; timeZone: string },
  input: unknown,
  now: Date,
): Promise<Result<ResolvedBalanceQuery>> {
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
  const tol = parseInput(ClosureToleranceSchema, toleranceInput(q, (await getSiteLimits(db, site.id)).closure));
  if (!tol.ok) return tol;
  return ok({ resolved, period: period.value, tolerance: tol.value });
}

/** The ledger the report is computed over: the period's own (with the books brought forward), or the whole. */
async function readLedger(
  db: Db,
  siteId: number,
  span: { startMs: number; endMs: number },
  readings: readonly GaugeReading[],
  read: BalanceLedgerRead,
): Promise<Result<{ ledger: BalanceLedger; carried?: CarriedBooks; bookOf?: (r: GaugeReading) => number }>> {
  if (read === "whole") return ok({ ledger: await loadBalanceLedger(db, siteId) });
  return loadPeriodLedger(db, siteId, span, readings);
}

async function computeBalanceReport(
  db: Db,
  site: { id: number; timeZone: string },
  input: unknown,
  now: Date,
  read: BalanceLedgerRead,
): Promise<Result<BalanceReport>> {
  const started = performance.now();
  const query = await resolveQuery(db, site, input, now);
  if (!query.ok) return query;
  const { resolved, period, tolerance } = query.value;
  const startsAt = new Date(period.startMs);
  const endsAt = new Date(period.endMs);
  const span = { startMs: period.startMs, endMs: period.endMs };
  const [readings, accountingPeriod] = await Promise.all([
    listLatestGauges(db, site.id, new Date(period.endMs - 1)),
    getAccountingPeriodExact(db, site.id, startsAt, endsAt),
  ]);
  const [loaded, events] = await Promise.all([
    readLedger(db, site.id, span, readings, read),
    accountingPeriod === null ? [] : listPeriodEvents(db, site.id, { periodId: accountingPeriod.id }),
  ]);
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
