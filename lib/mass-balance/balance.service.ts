import "server-only";
// The period mass balance of a site for the balance page and the JSON API: the stock identity in
// whole grams (site-wide and per material kind), the process view of the batches finished in the
// period, book stock against the latest tank gauges, and the accounting period's close/reopen record.
import type { Db } from "@/lib/core/connect";
import { fail, ok } from "@/lib/core/result";
import type { Result } from "@/lib/core/result";
import { labelOf } from "@/lib/core/vocabulary";
import type { MoveRole } from "@/lib/core/vocabulary";
import { parseInput } from "@/lib/ledger/parse";
import { getSiteLimits } from "@/lib/site/site-limits.service";
import {
  getAccountingPeriodExact,
  listLatestGauges,
  listPeriodEvents,
  loadBalanceLedger,
} from "@/lib/mass-balance/balance.store";
import type { AccountingPeriodView, BalanceHolderRef, PeriodEventView } from "@/lib/mass-balance/balance.store";
import { getLocalDate, refuseUnreasonablePeriod } from "@/lib/mass-balance/period";
import { resolvePeriodRange } from "@/lib/mass-balance/period-range";
import { compareBookToGauges, computePeriodBalance, DEFAULT_HOLDER_CLASSES } from "@/lib/mass-balance/period-balance";
import type {
  BatchBalance,
  Closure,
  ClosureTolerance,
  ProcessView,
  StockView,
} from "@/lib/mass-balance/period-balance";
import type { Differences, GaugeDifference } from "@/lib/mass-balance/differences";
import { ClosureToleranceSchema, PeriodRangeSchema } from "@/lib/mass-balance/period.schema";
import { BalanceQuerySchema } from "@/lib/mass-balance/balance-query.schema";
import type { BALANCE_PERIOD_KINDS } from "@/lib/mass-balance/balance-query.schema";
import { getUtcOffsetMin } from "@/lib/period/site-time";

export interface BalanceLine {
  key: string;
  label: string;
  grams: number;
}

export interface MaterialBalanceRow {
  materialKind: string;
  label: string;
  holders: number;
  openingG: number;
  /** Receipts, transfers in from other material kinds and returns. */
  inG: number;
  receiptsG: number;
  transfersInG: number;
  /** Shipments, disposals and losses. */
  outputsG: number;
  transfersOutG: number;
  closingG: number;
  imbalanceG: number;
  closure: Closure;
  differences: Differences;
}

export interface BatchRow extends BatchBalance {
  code: string;
}

export interface GaugeRow {
  tankCode: string;
  at: Date;
  bookG: number;
  measuredG: number;
  differenceG: number;
  closure: Closure;
}

export interface BalanceReport {
  /** The period as resolved (filled in with the defaults), for the form. */
  query: {
    period: (typeof BALANCE_PERIOD_KINDS)[number];
    year: number;
    month: number;
    quarter: number;
    start: string;
    end: string;
    warnPct: number;
    failPct: number;
  };
  period: { label: string; startsAt: Date; endsAt: Date };
  tolerance: ClosureTolerance;
  /** Site stock: opening + everything in = everything out + closing (+ imbalance, 0 when the books are complete). */
  stock: StockView;
  /** Unmeasured batch differences + receiving differences + gauge-vs-book differences, as a share of inputs. */
  differences: Differences;
  inputs: BalanceLine[];
  inputsG: number;
  outputs: BalanceLine[];
  outputsG: number;
  /** Flows between the site's own holders in the period (batch outputs, charges, transfers), by role. */
  internal: BalanceLine[];
  process: Omit<ProcessView, "completed" | "inProgress"> & { completed: BatchRow[]; inProgress: BatchRow[] };
  byMaterial: MaterialBalanceRow[];
  gauges: {
    rows: GaugeRow[];
    total: { bookG: number; measuredG: number; differenceG: number; closure: Closure };
  } | null;
  negativeStock: Array<{ holder: BalanceHolderRef | null; at: Date; moveId: number; balanceG: number }>;
  accountingPeriod: AccountingPeriodView | null;
  events: PeriodEventView[];
  computeMs: number;
}

export const MATERIAL_LABELS: Readonly<Record<string, string>> = {
  MIXED_FEEDSTOCK: "Feedstock in tanks (pooled kinds)",
  FAME: "Methyl ester (product lots and tanks)",
  IN_REACTION: "In reaction (batches)",
  METHANOL: "Methanol (reagent lots and recovered-methanol tank)",
  GLYCEROL_PHASE: "Glycerol phase",
  WASH_WATER: "Wash water",
};

export function labelMaterial(kind: string): string {
  return MATERIAL_LABELS[kind] ?? labelOf(kind);
}

const INTERNAL_LABELS: Partial<Record<MoveRole, string>> = {
  TRANSFER: "Transfers (pickups into lots, lots into tanks, product into tanks)",
  OIL: "Oil charged to batches",
  METHANOL: "Methanol charged",
  CATALYST: "Catalyst charged",
  ACID: "Acid charged",
  WATER: "Water used in washing (from water lots to the wash-water stream)",
  ESTER: "Product (methyl ester) out of batches",
  GLYCEROL_PHASE: "Glycerol phase out of batches",
  WASH_WATER: "Wash water out of batches",
  RECOVERED_METHANOL: "Methanol recovered from batches",
};

function previousMonth(now: Date, timeZone: string): { year: number; month: number } {
  const local = getLocalDate(now.getTime(), getUtcOffsetMin(timeZone, now));
  return local.month === 1 ? { year: local.year - 1, month: 12 } : { year: local.year, month: local.month - 1 };
}

function quarterOf(month: number): number {
  return Math.floor((month - 1) / 3) + 1;
}

function offsetAt(timeZone: string, y: number, m1: number, d: number): number {
  return getUtcOffsetMin(timeZone, new Date(Date.UTC(y, m1 - 1, d, 12)));
}

function pad2(n: number): string {
  return String(n).padStart(2, "0");
}

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
  const last = previousMonth(now, site.timeZone);
  const year = q.year ?? last.year;
  const month = q.month ?? (q.year === undefined ? last.month : 1);
  const quarter = q.quarter ?? quarterOf(q.year === undefined ? last.month : 1);
  const start = q.start ?? `${year}-${pad2(month)}-01`;
  const end = q.end ?? (month === 12 ? `${year + 1}-01-01` : `${year}-${pad2(month + 1)}-01`);
  const tz = site.timeZone;
  let bounds: { sy: number; sm: number; sd: number; ey: number; em: number; ed: number };
  if (q.period === "MONTH")
    bounds = {
      sy: year,
      sm: month,
      sd: 1,
      ey: month === 12 ? year + 1 : year,
      em: month === 12 ? 1 : month + 1,
      ed: 1,
    };
  else if (q.period === "QUARTER")
    bounds = {
      sy: year,
      sm: (quarter - 1) * 3 + 1,
      sd: 1,
      ey: quarter === 4 ? year + 1 : year,
      em: quarter === 4 ? 1 : quarter * 3 + 1,
      ed: 1,
    };
  else {
    const [sy = 0, sm = 1, sd = 1] = start.split("-").map(Number);
    const [ey = 0, em = 1, ed = 1] = end.split("-").map(Number);
    bounds = { sy, sm, sd, ey, em, ed };
  }
  const utcOffsetMin = offsetAt(tz, bounds.sy, bounds.sm, bounds.sd);
  const utcOffsetAtEndMin = offsetAt(tz, bounds.ey, bounds.em, bounds.ed);
  const rangeInput =
    q.period === "MONTH"
      ? { kind: "MONTH", year, month, utcOffsetMin, utcOffsetAtEndMin }
      : q.period === "QUARTER"
        ? { kind: "QUARTER", year, quarter, utcOffsetMin, utcOffsetAtEndMin }
        : { kind: "CUSTOM", startDate: start, endDate: end, utcOffsetMin, utcOffsetAtEndMin };
  const range = parseInput(PeriodRangeSchema, rangeInput);
  if (!range.ok) return range;
  const period = resolvePeriodRange(range.value);
  if (!period.ok) return period;
  const unreasonable = refuseUnreasonablePeriod(period.value, q.period, now.getTime());
  if (unreasonable) return fail("BALANCE.PERIOD_OUT_OF_RANGE", unreasonable.message, unreasonable.field);

  const siteTolerance = (await getSiteLimits(db, site.id)).closure;
  const { warnPct = siteTolerance.warnPct, failPct = siteTolerance.failPct } = q;
  const edited = warnPct !== siteTolerance.warnPct || failPct !== siteTolerance.failPct;
  const tol = parseInput(
    ClosureToleranceSchema,
    edited
      ? {
          warnPct,
          failPct,
          source: "entered with this balance",
          note: `The site works to warn above ${siteTolerance.warnPct} %, fail above ${siteTolerance.failPct} % (${siteTolerance.source}).`,
        }
      : siteTolerance,
  );
  if (!tol.ok) return tol;
  const tolerance: ClosureTolerance = tol.value;

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
  const gauges: GaugeDifference[] =
    gauge === null
      ? []
      : gauge.value.rows.map((r) => ({ holderId: r.holderId, bookG: r.bookG, measuredG: r.measuredG }));
  const whole = computePeriodBalance({
    holders: ledger.holders,
    moves: ledger.moves,
    period: span,
    scope: { siteId: site.id },
    tolerance,
    gauges,
  });
  if (!whole.ok) return whole;
  const stock = whole.value.stock;

  const materials = [
    ...new Set(
      ledger.holders
        .filter((h) => DEFAULT_HOLDER_CLASSES[h.kind] === "STOCK" && h.materialKind)
        .map((h) => h.materialKind as string),
    ),
  ].sort();
  const byMaterial: MaterialBalanceRow[] = [];
  for (const materialKind of materials) {
    const b = computePeriodBalance({
      holders: ledger.holders,
      moves: ledger.moves,
      period: span,
      scope: { siteId: site.id, materialKind },
      tolerance,
      gauges,
    });
    if (!b.ok) return b;
    const s = b.value.stock;
    if (
      s.openingG === 0 &&
      s.closingG === 0 &&
      s.receipts.totalG + s.transfersInG + s.returnsG + s.outputs.totalG + s.transfersOutG === 0
    )
      continue;
    byMaterial.push({
      materialKind,
      label: labelMaterial(materialKind),
      holders: s.byHolder.filter((h) => h.openingG !== 0 || h.closingG !== 0).length,
      openingG: s.openingG,
      inG: s.receipts.totalG + s.transfersInG + s.returnsG,
      receiptsG: s.receipts.totalG,
      transfersInG: s.transfersInG,
      outputsG: s.outputs.totalG,
      transfersOutG: s.transfersOutG,
      closingG: s.closingG,
      imbalanceG: s.imbalanceG,
      closure: s.closure,
      differences: b.value.differences,
    });
  }

  const inputs: BalanceLine[] = [
    { key: "opening", label: "Opening stock", grams: stock.openingG },
    {
      key: "feedstock",
      label: "Feedstock received (pickups, deliveries, receiving differences)",
      grams: stock.receipts.feedstockG,
    },
    {
      key: "reagents",
      label: "Reagents received (methanol, catalyst, acid, process water)",
      grams: stock.receipts.reagentG,
    },
    {
      key: "unmeasuredGains",
      label: "Unmeasured batch gains (more measured out than charged)",
      grams: stock.receipts.unmeasuredG,
    },
    { key: "otherReceipts", label: "Other receipts", grams: stock.receipts.otherG },
    { key: "returns", label: "Returns into stock", grams: stock.returnsG },
    { key: "transfersIn", label: "Transfers in from outside the scope", grams: stock.transfersInG },
  ];
  const outputs: BalanceLine[] = [
    { key: "shipments", label: "Shipped (product)", grams: stock.outputs.shipmentG },
    { key: "disposals", label: "Hauled away as waste (glycerol phase, wash water)", grams: stock.outputs.disposalG },
    {
      key: "losses",
      label: "Recorded losses (spills with a reason, receiving shortfalls)",
      grams: stock.outputs.lossG,
    },
    {
      key: "unmeasured",
      label: "Unmeasured batch differences (charged less everything measured out)",
      grams: stock.outputs.unmeasuredG,
    },
    { key: "otherOutputs", label: "Other outputs", grams: stock.outputs.otherG },
    { key: "transfersOut", label: "Transfers out of the scope", grams: stock.transfersOutG },
    { key: "closing", label: "Closing stock", grams: stock.closingG },
  ];
  const internal: BalanceLine[] = (Object.keys(INTERNAL_LABELS) as MoveRole[]).map((role) => ({
    key: role,
    label: INTERNAL_LABELS[role] ?? labelOf(role),
    grams: stock.byRole[role].internalG,
  }));
  const codeOf = (id: number) => ledger.refs.get(id)?.code ?? String(id);
  const proc = whole.value.process;
  return ok({
    query: {
      period: q.period,
      year,
      month,
      quarter,
      start,
      end,
      warnPct: tolerance.warnPct,
      failPct: tolerance.failPct,
    },
    period: { label: period.value.label, startsAt, endsAt },
    tolerance,
    stock,
    differences: whole.value.differences,
    inputs,
    inputsG: inputs.reduce((s, l) => s + l.grams, 0),
    outputs,
    outputsG: outputs.reduce((s, l) => s + l.grams, 0),
    internal,
    process: {
      ...proc,
      completed: proc.completed
        .map((b) => ({ ...b, code: codeOf(b.holderId) }))
        .sort((a, b) => a.code.localeCompare(b.code)),
      inProgress: proc.inProgress
        .map((b) => ({ ...b, code: codeOf(b.holderId) }))
        .sort((a, b) => a.code.localeCompare(b.code)),
    },
    byMaterial,
    gauges:
      gauge === null
        ? null
        : {
            rows: gauge.value.rows
              .map((r) => ({
                tankCode: codeOf(r.holderId),
                at: new Date(r.at),
                bookG: r.bookG,
                measuredG: r.measuredG,
                differenceG: r.differenceG,
                closure: r.closure,
              }))
              .sort((a, b) => a.tankCode.localeCompare(b.tankCode)),
            total: gauge.value.total,
          },
    negativeStock: stock.negativeStock.map((n) => ({
      holder: ledger.refs.get(n.holderId) ?? null,
      at: new Date(n.at),
      moveId: n.moveId,
      balanceG: n.balanceG,
    })),
    accountingPeriod,
    events,
    computeMs: performance.now() - started,
  });
}
