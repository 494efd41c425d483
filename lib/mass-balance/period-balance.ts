// Period mass balance over the movement ledger, in integer grams so every identity is exact:
//   stock view:   opening + receipts + transfers in + returns = outputs + transfers out + closing
//   process view: batch inputs (oil + reagents) = batch outputs (ester, glycerol phase, wash water,
//                 recovered methanol, recorded losses) + unaccounted
// and book stock against measured tank gauges.
// The pieces: balance-rules (defaults, closure flag), ledger-slots (checks and the stock walk),
// process-view (batches), gauges (book against gauges), differences (the closure that can fail).
import { failMany, ok } from "@/lib/core/result";
import type { DomainIssue, Result } from "@/lib/core/result";
import { MOVE_ROLES } from "@/lib/core/vocabulary";
import type { HolderKind, MoveRole } from "@/lib/core/vocabulary";
import { computeDifferences } from "@/lib/mass-balance/differences";
import type { Differences, GaugeDifference } from "@/lib/mass-balance/differences";
import {
  classifyClosure,
  DEFAULT_CLOSURE_TOLERANCE,
  DEFAULT_HOLDER_CLASSES,
  RECEIPT_CLASS_BY_KIND,
  validateTolerance,
} from "@/lib/mass-balance/balance-rules";
import type {
  BalanceHolder,
  BalanceMove,
  BalanceScope,
  CarriedBooks,
  ClosureTolerance,
  HolderClass,
  HolderStock,
  ProcessView,
  RoleFlow,
  StockView,
} from "@/lib/mass-balance/balance-types";
import { slotLedger, walkStock } from "@/lib/mass-balance/ledger-slots";
import { computeProcessView } from "@/lib/mass-balance/process-view";

export type {
  BalanceHolder,
  BalanceMove,
  BalanceScope,
  BatchBalance,
  BatchTally,
  CarriedBooks,
  Closure,
  ClosureFlag,
  ClosureTolerance,
  HolderClass,
  HolderStock,
  NegativeStock,
  ProcessView,
  ReceiptClass,
  RoleFlow,
  StockView,
} from "@/lib/mass-balance/balance-types";
export {
  classifyClosure,
  DEFAULT_CLOSURE_TOLERANCE,
  DEFAULT_HOLDER_CLASSES,
  RECEIPT_CLASS_BY_KIND,
  validateTolerance,
} from "@/lib/mass-balance/balance-rules";
export { validateLedger } from "@/lib/mass-balance/ledger-slots";
export { compareBookToGauges } from "@/lib/mass-balance/gauges";
export type { GaugeComparison, GaugeReading, GaugeReport } from "@/lib/mass-balance/gauges";

export interface PeriodBalanceInput {
  holders: readonly BalanceHolder[];
  moves: readonly BalanceMove[];
  period: { startMs: number; endMs: number };
  scope: BalanceScope;
  tolerance?: ClosureTolerance;
  /** Book against measured stock of gauged tanks at the period end (latest reading), for the differences. */
  gauges?: readonly GaugeDifference[];
  /**
   * The books brought forward to an instant at or before the period start: the walk starts from them,
   * so `moves` need hold only the movements dated from then on (any earlier ones are left out).
   */
  carried?: CarriedBooks;
}

export interface PeriodBalance {
  period: { startMs: number; endMs: number };
  scope: { siteId: number; materialKind: string | null };
  tolerance: ClosureTolerance;
  stock: StockView;
  process: ProcessView;
  /** Unmeasured batch differences, receiving differences and gauge-vs-book differences, flagged: the closure that can fail. */
  differences: Differences;
}

function emptyRoleFlows(): Record<MoveRole, RoleFlow> {
  return Object.fromEntries(MOVE_ROLES.map((r) => [r, { inG: 0, outG: 0, internalG: 0 }])) as Record<
    MoveRole,
    RoleFlow
  >;
}

/** The period's movements sorted into receipts, outputs, transfers and returns of the scope, and by role. */
function tallyFlows(
  moves: readonly BalanceMove[],
  slots: { from: Int32Array; to: Int32Array },
  holders: readonly BalanceHolder[],
  scopedSlot: Uint8Array,
  period: { startMs: number; endMs: number },
  classes: Readonly<Record<HolderKind, HolderClass>>,
) {
  const receipts = { totalG: 0, feedstockG: 0, reagentG: 0, otherG: 0, unmeasuredG: 0 };
  const outputs = { totalG: 0, shipmentG: 0, disposalG: 0, lossG: 0, unmeasuredG: 0, otherG: 0 };
  let transfersInG = 0;
  let transfersOutG = 0;
  let returnsG = 0;
  const byRole = emptyRoleFlows();

  for (let i = 0; i < moves.length; i++) {
    const m = moves[i] as BalanceMove;
    if (m.at < period.startMs || m.at >= period.endMs) continue;
    const toSlot = slots.to[i] as number;
    const fromSlot = slots.from[i] as number;
    const to = holders[toSlot] as BalanceHolder;
    const from = fromSlot < 0 ? null : (holders[fromSlot] as BalanceHolder);
    const toIn = scopedSlot[toSlot] === 1;
    const fromIn = fromSlot >= 0 && scopedSlot[fromSlot] === 1;
    const flow = byRole[m.role];
    if (fromIn && toIn) {
      flow.internalG += m.massG;
    } else if (toIn) {
      flow.inG += m.massG;
      if (from === null) {
        receipts.totalG += m.massG;
        const rc = to.receiptClass ?? RECEIPT_CLASS_BY_KIND[to.kind];
        if (m.role === "UNMEASURED") receipts.unmeasuredG += m.massG;
        else if (rc === "FEEDSTOCK") receipts.feedstockG += m.massG;
        else if (rc === "REAGENT") receipts.reagentG += m.massG;
        else receipts.otherG += m.massG;
      } else if (classes[from.kind] === "OUT") {
        returnsG += m.massG;
      } else {
        transfersInG += m.massG;
      }
    } else if (fromIn) {
      flow.outG += m.massG;
      if (classes[to.kind] === "OUT") {
        outputs.totalG += m.massG;
        if (to.kind === "SHIPMENT") outputs.shipmentG += m.massG;
        else if (to.kind === "DISPOSAL") outputs.disposalG += m.massG;
        else if (to.kind === "LOSS") outputs.lossG += m.massG;
        else if (to.kind === "DIFFERENCE") outputs.unmeasuredG += m.massG;
        else outputs.otherG += m.massG;
      } else {
        transfersOutG += m.massG;
      }
    }
  }

  return { receipts, outputs, transfersInG, transfersOutG, returnsG, byRole };
}

function validatePeriod(period: { startMs: number; endMs: number }, carried?: CarriedBooks): DomainIssue[] {
  if (!Number.isSafeInteger(period.startMs) || !Number.isSafeInteger(period.endMs) || period.endMs <= period.startMs)
    return [
      { code: "MASS_BALANCE.INVALID_PERIOD", message: "Period end must be after its start", field: "period.endMs" },
    ];
  if (carried !== undefined && !(carried.atMs <= period.startMs))
    return [
      {
        code: "MASS_BALANCE.INVALID_PERIOD",
        message: "The books brought forward must be taken at or before the period start",
        field: "carried.atMs",
      },
    ];
  return [];
}

/** Opening and closing stock of each holder in scope that held anything at either end. */
function holderStocks(
  holders: readonly BalanceHolder[],
  scopedSlot: Uint8Array,
  opening: Float64Array,
  closing: Float64Array,
): HolderStock[] {
  const byHolder: HolderStock[] = [];
  holders.forEach((h, i) => {
    const openingG = opening[i] ?? 0;
    const closingG = closing[i] ?? 0;
    if (scopedSlot[i] === 1 && (openingG !== 0 || closingG !== 0))
      byHolder.push({ holderId: h.id, kind: h.kind, openingG, closingG });
  });
  return byHolder;
}

/** Mass balance of one site (optionally one material kind) over [startMs, endMs). */
export function computePeriodBalance(input: PeriodBalanceInput): Result<PeriodBalance> {
  const { holders, moves, period, scope } = input;
  const tolerance = input.tolerance ?? DEFAULT_CLOSURE_TOLERANCE;
  const slots = slotLedger(holders, moves);
  const issues = [...slots.issues, ...validateTolerance(tolerance), ...validatePeriod(period, input.carried)];
  if (issues.length > 0) return failMany(issues);

  const classes = scope.holderClasses ?? DEFAULT_HOLDER_CLASSES;
  const inScope = (h: BalanceHolder): boolean =>
    classes[h.kind] === "STOCK" &&
    h.siteId === scope.siteId &&
    (scope.materialKind === undefined || h.materialKind === scope.materialKind);
  const scopedSlot = new Uint8Array(holders.length);
  holders.forEach((h, i) => (scopedSlot[i] = inScope(h) ? 1 : 0));

  // Stock view: opening and closing stock and negative stock in one walk.
  const walked = walkStock(moves, slots, holders, period.startMs, period.endMs, scopedSlot, input.carried);
  const { opening, closing, negativeStock } = walked;
  const byHolder = holderStocks(holders, scopedSlot, opening, closing);
  const scoped = holders.filter((_h, i) => scopedSlot[i] === 1);
  const openingG = byHolder.reduce((s, h) => s + h.openingG, 0);
  const closingG = byHolder.reduce((s, h) => s + h.closingG, 0);

  const { receipts, outputs, transfersInG, transfersOutG, returnsG, byRole } = tallyFlows(
    moves,
    slots,
    holders,
    scopedSlot,
    period,
    classes,
  );

  const stockInG = receipts.totalG + transfersInG + returnsG;
  const imbalanceG = openingG + stockInG - outputs.totalG - transfersOutG - closingG;

  const stock: StockView = {
    openingG,
    receipts,
    transfersInG,
    returnsG,
    outputs,
    transfersOutG,
    closingG,
    deltaStockG: closingG - openingG,
    imbalanceG,
    closure: classifyClosure(imbalanceG, stockInG, tolerance),
    byRole,
    byHolder,
    negativeStock,
  };

  return ok({
    period: { startMs: period.startMs, endMs: period.endMs },
    scope: { siteId: scope.siteId, materialKind: scope.materialKind ?? null },
    tolerance,
    stock,
    process: computeProcessView(
      scoped.filter((h) => h.kind === "BATCH"),
      moves,
      period,
      tolerance,
      input.carried,
    ),
    differences: computeDifferences({
      holders,
      moves,
      period,
      inScope,
      ...(input.gauges ? { gauges: input.gauges } : {}),
      baseG: stockInG,
      tolerance,
      classify: classifyClosure,
    }),
  });
}
