// The balance's defaults and closure flag: which holders hold stock, how a receipt is counted, and an
// imbalance against the tolerance as a share of its base.
import type { DomainIssue } from "@/lib/core/result";
import type { HolderKind } from "@/lib/core/vocabulary";
import type {
  Closure,
  ClosureFlag,
  ClosureTolerance,
  HolderClass,
  ReceiptClass,
} from "@/lib/mass-balance/balance-types";

export const DEFAULT_HOLDER_CLASSES: Readonly<Record<HolderKind, HolderClass>> = {
  PICKUP: "STOCK", // collected, not yet received into a lot
  DELIVERY: "STOCK",
  LOT: "STOCK",
  TANK: "STOCK",
  BATCH: "STOCK", // a batch in progress holds what was charged and not yet drawn off
  PRODUCT_LOT: "STOCK",
  WASTE_CONTAINER: "STOCK",
  REAGENT_LOT: "STOCK",
  SHIPMENT: "OUT",
  DISPOSAL: "OUT",
  LOSS: "OUT",
  DIFFERENCE: "OUT",
};

export const RECEIPT_CLASS_BY_KIND: Readonly<Record<HolderKind, ReceiptClass>> = {
  PICKUP: "FEEDSTOCK",
  DELIVERY: "FEEDSTOCK",
  LOT: "FEEDSTOCK",
  TANK: "FEEDSTOCK",
  REAGENT_LOT: "REAGENT",
  BATCH: "OTHER",
  PRODUCT_LOT: "OTHER",
  WASTE_CONTAINER: "OTHER",
  SHIPMENT: "OTHER",
  DISPOSAL: "OTHER",
  LOSS: "OTHER",
  DIFFERENCE: "OTHER",
};

export const DEFAULT_CLOSURE_TOLERANCE: ClosureTolerance = {
  warnPct: 0.5,
  failPct: 2,
  source: "common practice, no source",
  note: "Period mass-balance closure: warn above 0.5 %, fail above 2 % of inputs. A site setting; change it to what your scheme or auditor accepts.",
};

const CLOSURE_EPS = 1e-9;

function exceedsPct(absG: number, baseG: number, pct: number): boolean {
  const limitG = (pct * baseG) / 100;
  return absG - limitG > CLOSURE_EPS * Math.max(1, limitG);
}

/** Flags |imbalance| against a tolerance expressed as a percentage of `baseG`. */
export function classifyClosure(imbalanceG: number, baseG: number, tolerance: ClosureTolerance): Closure {
  const abs = Math.abs(imbalanceG);
  if (baseG <= 0) return { imbalanceG, baseG, pct: null, flag: abs === 0 ? "OK" : "FAIL" };
  const pct = (imbalanceG * 100) / baseG;
  const flag: ClosureFlag = exceedsPct(abs, baseG, tolerance.failPct)
    ? "FAIL"
    : exceedsPct(abs, baseG, tolerance.warnPct)
      ? "WARN"
      : "OK";
  return { imbalanceG, baseG, pct, flag };
}

export function validateTolerance(tolerance: ClosureTolerance, field = "tolerance"): DomainIssue[] {
  const issues: DomainIssue[] = [];
  for (const key of ["warnPct", "failPct"] as const) {
    const v = tolerance[key];
    if (!Number.isFinite(v) || v < 0 || v > 100) {
      issues.push({
        code: "MASS_BALANCE.INVALID_TOLERANCE",
        message: `${key} must be between 0 and 100 %, got ${v}`,
        field: `${field}.${key}`,
      });
    }
  }
  if (issues.length === 0 && tolerance.warnPct > tolerance.failPct) {
    issues.push({
      code: "MASS_BALANCE.INVALID_TOLERANCE",
      message: "Warn level must not be above the fail level",
      field: `${field}.warnPct`,
    });
  }
  return issues;
}
