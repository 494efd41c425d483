// Chain of custody by mass balance (RED II Art. 30(1); Implementing Regulation (EU) 2022/996 Art. 19):
// a per-site ledger of certified credit per characteristic set and material, evaluated at every
// booking in time order, with balance periods, carry-forward and conversion factors per process step.
// The rule set and shapes are in custody-rules.ts, the checks in custody-validate.ts, one replay in
// custody-run.ts; this file builds the ledger, finds a balance period and checks a claim.
import { failMany, ok } from "@/lib/core/result";
import type { Result } from "@/lib/core/result";
import { getPeriodContaining } from "@/lib/mass-balance/period";
import type { Period } from "@/lib/mass-balance/period";
import type { ClaimBooking, CustodyFailure, CustodyLedger, CustodyState } from "@/lib/custody/custody-rules";
import { CustodyRun } from "@/lib/custody/custody-run";
import { validateState } from "@/lib/custody/custody-validate";

export * from "@/lib/custody/custody-rules";

/**
 * Replays the bookings in time order (same instant: in list order) and returns every account's running
 * balance. Under NEVER_NEGATIVE_AT_ANY_BOOKING a debit larger than the balance is refused: it is listed
 * as a failure with its shortfall and not applied, so later bookings see the balance without it.
 */
export function buildCustodyLedger(state: CustodyState): Result<CustodyLedger> {
  const issues = validateState(state);
  if (issues.length > 0) return failMany(issues);
  const { ruleSet } = state;
  const periodMonths = ruleSet.balancePeriodMonths[state.operatorType].value;
  const order = state.bookings.map((b, i) => ({ b, i })).sort((x, y) => x.b.at - y.b.at || x.i - y.i);
  const firstBooking = order[0];
  if (firstBooking === undefined)
    return ok({ siteId: state.siteId, ruleSetId: ruleSet.id, periodMonths, accounts: [], failures: [] });
  const run = new CustodyRun(state, periodMonths, firstBooking.b.at);
  for (const { b, i } of order) {
    while (b.at >= run.period.endMs) run.closePeriod();
    run.apply(b, i);
  }
  if (state.closeThroughMs !== undefined) {
    while (run.period.endMs <= state.closeThroughMs) run.closePeriod();
  }
  const accounts = run.finish();
  return ok({ siteId: state.siteId, ruleSetId: ruleSet.id, periodMonths, accounts, failures: run.failures });
}

/** The balance period containing `at` under the state's rule set; null when the rule set or instant is invalid. */
export function getBalancePeriodOf(
  state: Pick<CustodyState, "ruleSet" | "operatorType" | "utcOffsetMin">,
  at: number,
): Period | null {
  const months = state.ruleSet.balancePeriodMonths[state.operatorType].value;
  const anchor = state.ruleSet.periodAnchorMonth.value;
  const valid =
    Number.isSafeInteger(at) &&
    Number.isInteger(months) &&
    months >= 1 &&
    months <= 120 &&
    Number.isInteger(anchor) &&
    anchor >= 1 &&
    anchor <= 12 &&
    Number.isInteger(state.utcOffsetMin) &&
    Math.abs(state.utcOffsetMin) <= 14 * 60;
  return valid ? getPeriodContaining(at, months, anchor, state.utcOffsetMin) : null;
}

export interface ClaimCheck {
  /** Balance of the claimed material and set just before the claim. */
  availableG: number;
  balanceAfterG: number;
}

/**
 * Whether a certified output claim may be saved: the ledger is replayed with the claim inserted at its
 * booking time (through the end of its balance period), and the claim passes only if neither it nor any
 * booking already accepted fails because of it.
 */
export function checkClaim(state: CustodyState, claim: ClaimBooking): Result<ClaimCheck> {
  const claimPeriodEnd = getBalancePeriodOf(state, claim.at)?.endMs;
  const closeThroughMs =
    claimPeriodEnd === undefined
      ? state.closeThroughMs
      : Math.max(state.closeThroughMs ?? claimPeriodEnd, claimPeriodEnd);
  const baseline = buildCustodyLedger({ ...state, closeThroughMs });
  if (!baseline.ok) return baseline;
  const prefix = `bookings.${state.bookings.length}.`;
  const after = buildCustodyLedger({ ...state, closeThroughMs, bookings: [...state.bookings, claim] });
  if (!after.ok)
    return failMany(
      after.issues.map((i) => (i.field?.startsWith(prefix) ? { ...i, field: i.field.slice(prefix.length) } : i)),
    );

  const keyOf = (f: CustodyFailure): string =>
    [f.code, f.setKey, f.material, f.at, f.code === "CUSTODY.PERIOD_CLOSES_NEGATIVE" ? "" : f.bookingId].join("\u0000");
  const known = new Set(baseline.value.failures.map(keyOf));
  const added = after.value.failures.filter((f) => !known.has(keyOf(f)));
  const own = added.filter((f) => f.bookingId === claim.id);
  if (own.length > 0) return failMany(own.map((f) => ({ ...f, field: "massG" })));
  if (added.length > 0) {
    return failMany(
      added.map((f) => ({
        code: "CUSTODY.CLAIM_BREAKS_LATER_BOOKING" as const,
        message: `Claim ${claim.id} would leave ${f.bookingId === "" ? "the period end" : `booking ${f.bookingId}`} short by ${f.shortfallG} g of ${f.material} (set ${f.setKey})`,
        field: "massG",
      })),
    );
  }
  const account = after.value.accounts.find((a) => a.setKey === claim.setKey && a.material === claim.material);
  const entry = account?.entries.find((e) => e.bookingId === claim.id);
  const balanceAfterG = entry?.balanceG ?? 0;
  return ok({ availableG: balanceAfterG + claim.massG, balanceAfterG });
}
