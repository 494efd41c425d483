// The period balance report from the computed balances: the stock identity as input and output lines,
// the internal flows by role, one balance per material kind, batches and gauges named by their codes.
import { ok } from "@/lib/core/result";
import type { Result } from "@/lib/core/result";
import { labelOf } from "@/lib/core/vocabulary";
import type { MoveRole } from "@/lib/core/vocabulary";
import type {
  AccountingPeriodView,
  BalanceHolderRef,
  BalanceLedger,
  PeriodEventView,
} from "@/lib/mass-balance/balance-types";
import type { BALANCE_PERIOD_KINDS } from "@/lib/mass-balance/balance-query.schema";
import { computePeriodBalance, DEFAULT_HOLDER_CLASSES } from "@/lib/mass-balance/period-balance";
import type {
  BatchBalance,
  CarriedBooks,
  Closure,
  ClosureTolerance,
  GaugeComparison,
  PeriodBalance,
  ProcessView,
  StockView,
} from "@/lib/mass-balance/period-balance";
import type { Differences, GaugeDifference } from "@/lib/mass-balance/differences";

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

// localeCompare's order (a collator with the default locale and options, by definition) without
// building the collation for every comparison: thousands of batch codes are sorted per report.
const byCode = new Intl.Collator().compare;

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

/** The balance lines of the stock identity: opening and everything in, everything out and closing. */
export function balanceLines(stock: StockView): {
  inputs: BalanceLine[];
  outputs: BalanceLine[];
  internal: BalanceLine[];
} {
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
  return { inputs, outputs, internal };
}

function materialRow(materialKind: string, b: PeriodBalance): MaterialBalanceRow | null {
  const s = b.stock;
  const moved = s.receipts.totalG + s.transfersInG + s.returnsG + s.outputs.totalG + s.transfersOutG;
  if (s.openingG === 0 && s.closingG === 0 && moved === 0) return null;
  return {
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
    differences: b.differences,
  };
}

export interface BalanceComputation {
  ledger: BalanceLedger;
  span: { startMs: number; endMs: number };
  siteId: number;
  tolerance: ClosureTolerance;
  gauges: GaugeDifference[];
  /** The books brought forward to the period start, when `ledger` holds only the movements from then on. */
  carried?: CarriedBooks;
}

/** One balance per material kind of the stock holders, leaving out kinds with nothing held or moved. */
export function materialRows(c: BalanceComputation): Result<MaterialBalanceRow[]> {
  const { ledger } = c;
  const materials = [
    ...new Set(
      ledger.holders
        .filter((h) => DEFAULT_HOLDER_CLASSES[h.kind] === "STOCK" && h.materialKind)
        .map((h) => h.materialKind as string),
    ),
  ].sort();
  const rows: MaterialBalanceRow[] = [];
  for (const materialKind of materials) {
    const b = computePeriodBalance({
      holders: ledger.holders,
      moves: ledger.moves,
      period: c.span,
      scope: { siteId: c.siteId, materialKind },
      tolerance: c.tolerance,
      gauges: c.gauges,
      ...(c.carried ? { carried: c.carried } : {}),
    });
    if (!b.ok) return b;
    const row = materialRow(materialKind, b.value);
    if (row !== null) rows.push(row);
  }
  return ok(rows);
}

function gaugeRows(
  gauge: { rows: GaugeComparison[]; total: NonNullable<BalanceReport["gauges"]>["total"] } | null,
  codeOf: (id: number) => string,
): BalanceReport["gauges"] {
  if (gauge === null) return null;
  return {
    rows: gauge.rows
      .map((r) => ({
        tankCode: codeOf(r.holderId),
        at: new Date(r.at),
        bookG: r.bookG,
        measuredG: r.measuredG,
        differenceG: r.differenceG,
        closure: r.closure,
      }))
      .sort((a, b) => byCode(a.tankCode, b.tankCode)),
    total: gauge.total,
  };
}

export interface BalanceReportParts {
  query: BalanceReport["query"];
  period: BalanceReport["period"];
  tolerance: ClosureTolerance;
  ledger: BalanceLedger;
  whole: PeriodBalance;
  byMaterial: MaterialBalanceRow[];
  gauge: { rows: GaugeComparison[]; total: NonNullable<BalanceReport["gauges"]>["total"] } | null;
  accountingPeriod: AccountingPeriodView | null;
  events: PeriodEventView[];
}

/** The report from the computed parts: lines, totals, batches and gauges named by code, negative stock. */
export function assembleBalanceReport(p: BalanceReportParts): Omit<BalanceReport, "computeMs"> {
  const { stock } = p.whole;
  const { inputs, outputs, internal } = balanceLines(stock);
  const codeOf = (id: number) => p.ledger.refs.get(id)?.code ?? String(id);
  const named = (rows: readonly BatchBalance[]): BatchRow[] =>
    rows.map((b) => ({ ...b, code: codeOf(b.holderId) })).sort((a, b) => byCode(a.code, b.code));
  const proc = p.whole.process;
  return {
    query: p.query,
    period: p.period,
    tolerance: p.tolerance,
    stock,
    differences: p.whole.differences,
    inputs,
    inputsG: inputs.reduce((s, l) => s + l.grams, 0),
    outputs,
    outputsG: outputs.reduce((s, l) => s + l.grams, 0),
    internal,
    process: { ...proc, completed: named(proc.completed), inProgress: named(proc.inProgress) },
    byMaterial: p.byMaterial,
    gauges: gaugeRows(p.gauge, codeOf),
    negativeStock: stock.negativeStock.map((n) => ({
      holder: p.ledger.refs.get(n.holderId) ?? null,
      at: new Date(n.at),
      moveId: n.moveId,
      balanceG: n.balanceG,
    })),
    accountingPeriod: p.accountingPeriod,
    events: p.events,
  };
}
