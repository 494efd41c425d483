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

/** The period mass balance of a site: stock identity, process view, per material kind, gauges and the close record. */
export async function getBalanceReport(
  db: Db,
  site: { id: number; timeZone: string },
  input: unknown,
  now: Date,
): Promise<Result<BalanceReport>> {
  const started = performance.now();
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
  const tolerance = tol.value;

  const startsAt = new Date(period.value.startMs);
  const endsAt = new Date(period.value.endMs);
  const [ledger, readings, accountingPeriod] = await Promise.all([
    loadBalanceLedger(db, site.id),
    listLatestGauges(db, site.id, new Date(period.value.endMs - 1)),
    getAccountingPeriodExact(db, site.id, startsAt, endsAt),
  ]);
  const events =
    accountingPeriod === null ? [] : await listPeriodEvents(db, site.id, { periodId: accountingPeriod.id });
  const span = { startMs: period.value.startMs, endMs: period.value.endMs };
  const gauge =
    readings.length === 0
      ? null
      : compareBookToGauges({ holders: ledger.holders, moves: ledger.moves, readings, tolerance });
  if (gauge !== null && !gauge.ok) return gauge;
  const gauges = (gauge?.value.rows ?? []).map((r) => ({
    holderId: r.holderId,
    bookG: r.bookG,
    measuredG: r.measuredG,
  }));
  const computation = { ledger, span, siteId: site.id, tolerance, gauges };
  const whole = computePeriodBalance({
    holders: ledger.holders,
    moves: ledger.moves,
    period: span,
    scope: { siteId: site.id },
    tolerance,
    gauges,
  });
  if (!whole.ok) return whole;
  const byMaterial = materialRows(computation);
  if (!byMaterial.ok) return byMaterial;
  const report = assembleBalanceReport({
    query: { ...resolved, warnPct: tolerance.warnPct, failPct: tolerance.failPct },
    period: { label: period.value.label, startsAt, endsAt },
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
