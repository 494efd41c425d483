// The shapes a period balance is computed over and answers with, shared by period-balance and differences
// (kept apart so the two computations do not import each other). Pure.
import type { HolderKind, MoveRole } from "@/lib/core/vocabulary";

export type ReceiptClass = "FEEDSTOCK" | "REAGENT" | "OTHER";

export interface BalanceHolder {
  id: number;
  kind: HolderKind;
  siteId: number;
  /** Material kind of what the holder carries (e.g. "USED_COOKING_OIL"); used only by a material-scoped balance. */
  materialKind?: string | null;
  /** For batches: when the batch was finished. A batch without it is in progress. */
  completedAt?: number | null;
  /** Overrides how a receipt into this holder is counted (default: by holder kind, see RECEIPT_CLASS_BY_KIND). */
  receiptClass?: ReceiptClass;
}

export interface BalanceMove {
  id: number;
  at: number;
  /** null = the material enters the books here. */
  fromHolderId: number | null;
  toHolderId: number;
  massG: number;
  role: MoveRole;
  /** A receiving difference: the plant's measurement of a lot below (shortfall) or above (surplus) the pickup estimates. */
  receiving?: boolean;
}

export interface ClosureTolerance {
  /** Flag WARN when |imbalance| exceeds this share of inputs, in %. */
  warnPct: number;
  /** Flag FAIL when |imbalance| exceeds this share of inputs, in %. */
  failPct: number;
  source: string;
  note: string;
}

export type ClosureFlag = "OK" | "WARN" | "FAIL";

export interface Closure {
  imbalanceG: number;
  baseG: number;
  /** imbalance ÷ base × 100; null when the base is 0. */
  pct: number | null;
  flag: ClosureFlag;
}

/** A holder as the balance page names it. */
export interface BalanceHolderRef {
  id: number;
  kind: HolderKind;
  code: string;
  materialKind: string | null;
}

export interface BalanceLedger {
  holders: BalanceHolder[];
  /**
   * Every movement except reversed pairs: a booking made by mistake and its reversal (same instant, so
   * stock at any time is the same either way) are left out, as in traces and the chain of custody, so
   * a charge taken back is neither an input nor an output of its batch.
   */
  moves: BalanceMove[];
  refs: Map<number, BalanceHolderRef>;
}

export interface AccountingPeriodView {
  id: number;
  startsAt: Date;
  endsAt: Date;
  status: string;
  closedAt: Date | null;
  closedBy: string | null;
}

export interface PeriodEventView {
  id: number;
  periodId: number;
  periodStartsAt: Date;
  periodEndsAt: Date;
  action: string;
  reason: string;
  by: string;
  at: Date;
}

/** STOCK holders hold material on site; OUT holders are where material leaves the books (cumulative). */
export type HolderClass = "STOCK" | "OUT";

export interface BalanceScope {
  siteId: number;
  /** Only stock holders carrying this material kind are in scope. */
  materialKind?: string;
  holderClasses?: Readonly<Record<HolderKind, HolderClass>>;
}

export interface RoleFlow {
  /** Entered the scope's stock (receipts, transfers in, returns). */
  inG: number;
  /** Left the scope's stock (outputs, transfers out). */
  outG: number;
  /** Moved between holders inside the scope. */
  internalG: number;
}

export interface HolderStock {
  holderId: number;
  kind: HolderKind;
  openingG: number;
  closingG: number;
}

export interface NegativeStock {
  holderId: number;
  at: number;
  moveId: number;
  balanceG: number;
}

export interface StockView {
  openingG: number;
  receipts: { totalG: number; feedstockG: number; reagentG: number; otherG: number; unmeasuredG: number };
  /** From stock holders outside the scope (another site or material kind). */
  transfersInG: number;
  /** From OUT holders back into stock (e.g. a returned shipment). */
  returnsG: number;
  outputs: { totalG: number; shipmentG: number; disposalG: number; lossG: number; unmeasuredG: number; otherG: number };
  transfersOutG: number;
  closingG: number;
  deltaStockG: number;
  /** opening + receipts + transfers in + returns − outputs − transfers out − closing; 0 when every movement is recorded. */
  imbalanceG: number;
  closure: Closure;
  byRole: Record<MoveRole, RoleFlow>;
  /** In-scope holders with stock at the start or the end of the period (every other one is empty at both ends). */
  byHolder: HolderStock[];
  /** Holders whose book stock dropped below zero at some movement up to the period end: a movement in is missing. */
  negativeStock: NegativeStock[];
}

export interface BatchBalance extends Omit<BatchTally, "touched"> {
  holderId: number;
  completedAt: number | null;
  /** inputs − measured outputs: the unmeasured difference of a finished batch, still held for one in progress. */
  imbalanceG: number;
  closure: Closure;
}

export interface ProcessView {
  /** Batches finished inside the period, with all their movements up to the period end. */
  completed: BatchBalance[];
  /** Batches with movements before the period end and not finished by then (not flagged). */
  inProgress: BatchBalance[];
  inputsG: number;
  outputsG: number;
  imbalanceG: number;
  inputsByRole: Partial<Record<MoveRole, number>>;
  outputsByRole: Partial<Record<MoveRole, number>>;
  closure: Closure;
}

/** What a batch's movements add up to: its charges and outputs by role, as the process view counts them. */
export interface BatchTally {
  /** Charges (oil and reagents); an unmeasured gain is not an input. */
  inputsG: number;
  /** Measured outputs and recorded losses; the booked unmeasured difference is not an output. */
  outputsG: number;
  /** The unmeasured difference as booked (out to the site's difference account, less any unmeasured gain). */
  unmeasuredG: number;
  inputsByRole: Partial<Record<MoveRole, number>>;
  outputsByRole: Partial<Record<MoveRole, number>>;
  /** Roles other than the usual batch input/output roles that touched the batch. */
  unusualRoles: MoveRole[];
  /** Any charge or output (an unmeasured difference alone does not count). */
  touched: boolean;
}

/**
 * The books brought forward to an instant: what every movement dated before `atMs` adds up to, so a
 * period starting at or after it is computed from its own movements. Holders not listed hold nothing.
 */
export interface CarriedBooks {
  atMs: number;
  /** Book stock of each stock holder with any, whole grams. */
  stockG: ReadonlyMap<number, number>;
  /** The first movement at which each stock holder's book stock went below zero, in ledger order. */
  negativeStock: readonly NegativeStock[];
  /** Each batch's movements so far. */
  batches: ReadonlyMap<number, BatchTally>;
}
