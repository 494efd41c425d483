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
