// Chain of custody by mass balance (RED II Art. 30(1); Implementing Regulation (EU) 2022/996 Art. 19):
// a per-site ledger of certified credit per characteristic set and material, evaluated at every
// booking in time order, with balance periods, carry-forward and conversion factors per process step.
import { failMany, ok } from "@/lib/core/result";
import type { DomainIssue, Result } from "@/lib/core/result";
import { getPeriodContaining } from "@/lib/mass-balance/period";
import type { Period } from "@/lib/mass-balance/period";

/** A rule-set value with where it comes from and how sure we are of it. */
export interface SourcedSetting<T> {
  value: T;
  source: string;
  status: string;
}

export const OPERATOR_TYPES = ["OTHER_OPERATOR", "AGRI_FOREST_PRODUCER_OR_FIRST_GATHERING_POINT"] as const;
export type OperatorType = (typeof OPERATOR_TYPES)[number];

/** CARRY_POSITIVE: a positive closing balance opens the next period. LAPSE: it is written off at period end. */
export const CARRY_FORWARD_MODES = ["CARRY_POSITIVE", "LAPSE"] as const;
export type CarryForwardMode = (typeof CARRY_FORWARD_MODES)[number];

/**
 * NEVER_NEGATIVE_AT_ANY_BOOKING: a debit larger than the balance at its booking time is refused.
 * NON_NEGATIVE_AT_PERIOD_END: debits may run the balance below zero inside a period; a negative closing fails
 * and is carried into the next period as it is, never written off.
 */
export const NEGATIVE_BALANCE_POLICIES = ["NEVER_NEGATIVE_AT_ANY_BOOKING", "NON_NEGATIVE_AT_PERIOD_END"] as const;
export type NegativeBalancePolicy = (typeof NEGATIVE_BALANCE_POLICIES)[number];

export interface CustodyRuleSet {
  id: string;
  name: string;
  source: string;
  edition: string;
  balancePeriodMonths: Readonly<Record<OperatorType, SourcedSetting<number>>>;
  /** First month (1 = January) of the balance-period cycle. */
  periodAnchorMonth: SourcedSetting<number>;
  carryForward: SourcedSetting<CarryForwardMode>;
  negativeBalance: SourcedSetting<NegativeBalancePolicy>;
  notes: readonly string[];
}

const REG_2022_996 = "Commission Implementing Regulation (EU) 2022/996";

export const RULESET_EU_2022_996: CustodyRuleSet = {
  id: "EU_2022_996",
  name: "EU mass balance (RED II, Implementing Regulation (EU) 2022/996)",
  source: `${REG_2022_996}, Art. 19`,
  edition:
    "Text as published in OJ L 168, 27.6.2022. A consolidated version of 30.12.2023 and a later amending act exist: check Art. 19 there before relying on these values.",
  balancePeriodMonths: {
    OTHER_OPERATOR: {
      value: 3,
      source: `${REG_2022_996}, Art. 19(2)(l)`,
      status: "verified in the text as published 27.6.2022",
    },
    AGRI_FOREST_PRODUCER_OR_FIRST_GATHERING_POINT: {
      value: 12,
      source: `${REG_2022_996}, Art. 19(2)(l) (producers of agricultural and forest biomass; first gathering points sourcing only such biomass)`,
      status: "verified in the text as published 27.6.2022",
    },
  },
  periodAnchorMonth: {
    value: 1,
    source: `${REG_2022_996}, Art. 19(2)(l): aligned to the calendar year or quarters, or another clearly stated start applied consistently`,
    status: "verified in the text as published 27.6.2022; January start is our default",
  },
  carryForward: {
    value: "CARRY_POSITIVE",
    source: `No explicit carry-over clause in ${REG_2022_996} Art. 19; Art. 19(2)(e): the sustainability data carried forward should be equivalent to the physical stock`,
    status: "our default (common practice, no source)",
  },
  negativeBalance: {
    value: "NEVER_NEGATIVE_AT_ANY_BOOKING",
    source: `None: ${REG_2022_996} Art. 19 has no explicit rule that the balance may never go negative at any booking`,
    status: "our conservative policy (common practice, no source); safe under every reading of Art. 19",
  },
  notes: [
    "Separate balances for materials that cannot be mixed, no transfer of information between balances, sets are not split: Art. 19(2)(e), (j) — verified.",
    "Mass balance applied at site level; when raw material is processed, output = input × (output mass ÷ input mass) per process step, with a separate factor per co-product, sustainability data adjusted accordingly — from memory, unverified.",
    "Energy quantities use the conversion factors of Annex III to Directive (EU) 2018/2001 (Annex I point 2(f) — verified); process-step yield factors such as oil → ester are the operator's measured values (common practice, no source).",
    "Mixing consignments with different characteristics, each keeping its characteristics and size assigned to the mixture, withdrawals equal to additions: Directive 2009/28/EC Art. 18(1)(a)–(c) wording carried into Directive (EU) 2018/2001 Art. 30(1) — verified; the balance 'over an appropriate period of time' wording of RED II — from memory, unverified.",
    "Records kept at least 5 years — from memory, unverified for the EU text.",
  ],
};

export interface CustodySettings {
  periodAnchorMonth?: number;
  carryForward?: CarryForwardMode;
  negativeBalance?: NegativeBalancePolicy;
}

/** A copy of `base` with a site's choices applied; each changed value says it is a site setting and what it replaced. */
export function withCustodySettings(base: CustodyRuleSet, settings: CustodySettings): CustodyRuleSet {
  const override = <T>(current: SourcedSetting<T>, value: T | undefined): SourcedSetting<T> =>
    value === undefined || value === current.value
      ? current
      : {
          value,
          source: "site setting",
          status: `changed from ${String(current.value)} (${current.source}; ${current.status})`,
        };
  return {
    ...base,
    id: `${base.id}+SITE`,
    periodAnchorMonth: override(base.periodAnchorMonth, settings.periodAnchorMonth),
    carryForward: override(base.carryForward, settings.carryForward),
    negativeBalance: override(base.negativeBalance, settings.negativeBalance),
  };
}

export interface CharacteristicSet {
  /** Stable key of the set, e.g. "SCHEME-A|CERT-0042|UCO|XX" (an invented scheme and certificate). */
  key: string;
  /** Shown with the balance: scheme, certificate, material kind, country of origin, … */
  attributes: Readonly<Record<string, string>>;
}

/** A measured yield: `outputMassG` of `material` came out of `inputMassG` of the step's input material. */
export interface ConversionOutput {
  material: string;
  outputMassG: number;
  inputMassG: number;
}

export interface ConversionStep {
  id: string;
  inputMaterial: string;
  outputs: readonly ConversionOutput[];
  /** Where the measured yields come from, e.g. "batches B-101…B-140, 2026-Q1". */
  basis: string;
}

interface BookingBase {
  id: string;
  at: number;
  setKey: string;
  reference?: string;
}

export interface InputBooking extends BookingBase {
  kind: "INPUT";
  material: string;
  massG: number;
}

export interface ConversionBooking extends BookingBase {
  kind: "CONVERSION";
  stepId: string;
  /** Certified input material processed in this step. */
  inputMassG: number;
}

export interface ClaimBooking extends BookingBase {
  kind: "CLAIM";
  material: string;
  massG: number;
}

export type CustodyBooking = InputBooking | ConversionBooking | ClaimBooking;

export interface CustodyState {
  siteId: number;
  ruleSet: CustodyRuleSet;
  operatorType: OperatorType;
  /** Site offset from UTC in minutes, for period bounds at local midnight. */
  utcOffsetMin: number;
  sets: readonly CharacteristicSet[];
  steps: readonly ConversionStep[];
  bookings: readonly CustodyBooking[];
  /** Close every period ending at or before this instant; without it only periods before the last booking's are closed. */
  closeThroughMs?: number;
}

export type EntryKind = "INPUT" | "CONVERSION_OUT" | "CONVERSION_IN" | "CLAIM" | "CARRY_FORWARD" | "LAPSE";

export interface LedgerEntry {
  /** null for period-end entries. */
  bookingId: string | null;
  at: number;
  kind: EntryKind;
  deltaG: number;
  balanceG: number;
  period: string;
  accepted: boolean;
  shortfallG?: number;
}

export interface PeriodSummary {
  label: string;
  startMs: number;
  endMs: number;
  openingG: number;
  creditsG: number;
  debitsG: number;
  closingG: number;
  /** What opens the next period (0 when it lapsed); null while the period is open. */
  carriedForwardG: number | null;
  closed: boolean;
}

export interface BalanceAccount {
  setKey: string;
  attributes: Readonly<Record<string, string>>;
  material: string;
  balanceG: number;
  entries: LedgerEntry[];
  periods: PeriodSummary[];
}

export interface CustodyFailure extends DomainIssue {
  bookingId: string;
  at: number;
  setKey: string;
  material: string;
  requestedG: number;
  availableG: number;
  shortfallG: number;
}

export interface CustodyLedger {
  siteId: number;
  ruleSetId: string;
  periodMonths: number;
  accounts: BalanceAccount[];
  failures: CustodyFailure[];
}

interface AccountState extends BalanceAccount {
  current: { openingG: number; creditsG: number; debitsG: number; lastDebitBookingId: string | null } | null;
}

function accountKey(setKey: string, material: string): string {
  return `${setKey}\u0000${material}`;
}

function isPositiveGrams(v: number): boolean {
  return Number.isSafeInteger(v) && v > 0;
}

/** Output credit = input × (output mass ÷ input mass), rounded down to whole grams so credit is never overstated. */
export function convertCredit(inputMassG: number, output: ConversionOutput): number {
  return Number((BigInt(inputMassG) * BigInt(output.outputMassG)) / BigInt(output.inputMassG));
}

function validateState(state: CustodyState): DomainIssue[] {
  const issues: DomainIssue[] = [];
  const setKeys = new Set<string>();
  state.sets.forEach((s, i) => {
    if (s.key.trim() === "")
      issues.push({
        code: "CUSTODY.INVALID_SET",
        message: "Characteristic set key must not be empty",
        field: `sets.${i}.key`,
      });
    if (setKeys.has(s.key))
      issues.push({
        code: "CUSTODY.DUPLICATE_SET",
        message: `Characteristic set ${s.key} is listed twice`,
        field: `sets.${i}.key`,
      });
    setKeys.add(s.key);
  });
  const steps = new Map<string, ConversionStep>();
  state.steps.forEach((st, i) => {
    if (steps.has(st.id))
      issues.push({
        code: "CUSTODY.DUPLICATE_STEP",
        message: `Process step ${st.id} is listed twice`,
        field: `steps.${i}.id`,
      });
    steps.set(st.id, st);
    if (st.outputs.length === 0)
      issues.push({
        code: "CUSTODY.INVALID_STEP",
        message: `Process step ${st.id} has no outputs`,
        field: `steps.${i}.outputs`,
      });
    st.outputs.forEach((o, j) => {
      if (!Number.isSafeInteger(o.outputMassG) || o.outputMassG < 0 || !isPositiveGrams(o.inputMassG)) {
        issues.push({
          code: "CUSTODY.INVALID_FACTOR",
          message: `Process step ${st.id} → ${o.material}: measured yield must be whole grams (output ≥ 0, input > 0)`,
          field: `steps.${i}.outputs.${j}`,
        });
      }
    });
  });
  const periodMonths = state.ruleSet.balancePeriodMonths[state.operatorType].value;
  if (!Number.isInteger(periodMonths) || periodMonths < 1 || periodMonths > 120) {
    issues.push({
      code: "CUSTODY.INVALID_RULESET",
      message: `Balance period must be 1–120 whole months, got ${periodMonths}`,
      field: "ruleSet.balancePeriodMonths",
    });
  }
  const anchor = state.ruleSet.periodAnchorMonth.value;
  if (!Number.isInteger(anchor) || anchor < 1 || anchor > 12) {
    issues.push({
      code: "CUSTODY.INVALID_RULESET",
      message: `Period start month must be 1–12, got ${anchor}`,
      field: "ruleSet.periodAnchorMonth",
    });
  }
  if (!Number.isInteger(state.utcOffsetMin) || Math.abs(state.utcOffsetMin) > 14 * 60) {
    issues.push({
      code: "CUSTODY.INVALID_OFFSET",
      message: "UTC offset must be whole minutes between −720 and +840",
      field: "utcOffsetMin",
    });
  }
  const ids = new Set<string>();
  state.bookings.forEach((b, i) => {
    const f = `bookings.${i}`;
    if (ids.has(b.id))
      issues.push({ code: "CUSTODY.DUPLICATE_BOOKING", message: `Booking ${b.id} is listed twice`, field: `${f}.id` });
    ids.add(b.id);
    if (!Number.isSafeInteger(b.at))
      issues.push({
        code: "CUSTODY.INVALID_TIME",
        message: `Booking ${b.id}: time must be an instant in milliseconds`,
        field: `${f}.at`,
      });
    if (!setKeys.has(b.setKey))
      issues.push({
        code: "CUSTODY.UNKNOWN_SET",
        message: `Booking ${b.id}: characteristic set ${b.setKey} is not declared`,
        field: `${f}.setKey`,
      });
    const mass = b.kind === "CONVERSION" ? b.inputMassG : b.massG;
    if (!isPositiveGrams(mass)) {
      issues.push({
        code: "CUSTODY.INVALID_MASS",
        message: `Booking ${b.id}: mass must be whole grams above 0, got ${mass}`,
        field: `${f}.${b.kind === "CONVERSION" ? "inputMassG" : "massG"}`,
      });
    }
    if (b.kind === "CONVERSION" && !steps.has(b.stepId)) {
      issues.push({
        code: "CUSTODY.UNKNOWN_STEP",
        message: `Booking ${b.id}: process step ${b.stepId} is not defined`,
        field: `${f}.stepId`,
      });
    }
  });
  if (state.closeThroughMs !== undefined && !Number.isSafeInteger(state.closeThroughMs)) {
    issues.push({
      code: "CUSTODY.INVALID_TIME",
      message: "Close-through time must be an instant in milliseconds",
      field: "closeThroughMs",
    });
  }
  return issues;
}

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
  const anchor = ruleSet.periodAnchorMonth.value;
  const policy = ruleSet.negativeBalance.value;
  const carry = ruleSet.carryForward.value;
  const periodOf = (at: number): Period => getPeriodContaining(at, periodMonths, anchor, state.utcOffsetMin);

  const attributes = new Map(state.sets.map((s) => [s.key, s.attributes]));
  const steps = new Map(state.steps.map((s) => [s.id, s]));
  const accounts = new Map<string, AccountState>();
  const failures: CustodyFailure[] = [];

  const order = state.bookings.map((b, i) => ({ b, i })).sort((x, y) => x.b.at - y.b.at || x.i - y.i);
  const firstBooking = order[0];
  if (firstBooking === undefined)
    return ok({ siteId: state.siteId, ruleSetId: ruleSet.id, periodMonths, accounts: [], failures });

  let period = periodOf(firstBooking.b.at);

  const accountFor = (setKey: string, material: string): AccountState => {
    const k = accountKey(setKey, material);
    let a = accounts.get(k);
    if (a === undefined) {
      a = {
        setKey,
        attributes: attributes.get(setKey) ?? {},
        material,
        balanceG: 0,
        entries: [],
        periods: [],
        current: null,
      };
      accounts.set(k, a);
    }
    if (a.current === null) a.current = { openingG: a.balanceG, creditsG: 0, debitsG: 0, lastDebitBookingId: null };
    return a;
  };

  const credit = (a: AccountState, bookingId: string, at: number, kind: EntryKind, g: number): void => {
    a.balanceG += g;
    if (a.current !== null) a.current.creditsG += g;
    a.entries.push({ bookingId, at, kind, deltaG: g, balanceG: a.balanceG, period: period.label, accepted: true });
  };

  /** Returns false when the debit was refused. */
  const debit = (
    a: AccountState,
    b: CustodyBooking,
    index: number,
    kind: EntryKind,
    g: number,
    code: "CUSTODY.CLAIM_EXCEEDS_BALANCE" | "CUSTODY.CONVERSION_EXCEEDS_BALANCE",
  ): boolean => {
    if (policy === "NEVER_NEGATIVE_AT_ANY_BOOKING" && g > a.balanceG) {
      const availableG = Math.max(0, a.balanceG);
      const shortfallG = g - availableG;
      a.entries.push({
        bookingId: b.id,
        at: b.at,
        kind,
        deltaG: 0,
        balanceG: a.balanceG,
        period: period.label,
        accepted: false,
        shortfallG,
      });
      const what = kind === "CLAIM" ? "Claim" : "Conversion";
      failures.push({
        code,
        message: `${what} ${b.id} of ${g} g ${a.material} (set ${a.setKey}) exceeds the certified balance of ${availableG} g at its booking time by ${shortfallG} g`,
        field: `bookings.${index}.${kind === "CLAIM" ? "massG" : "inputMassG"}`,
        bookingId: b.id,
        at: b.at,
        setKey: a.setKey,
        material: a.material,
        requestedG: g,
        availableG,
        shortfallG,
      });
      return false;
    }
    a.balanceG -= g;
    if (a.current !== null) {
      a.current.debitsG += g;
      a.current.lastDebitBookingId = b.id;
    }
    a.entries.push({
      bookingId: b.id,
      at: b.at,
      kind,
      deltaG: -g,
      balanceG: a.balanceG,
      period: period.label,
      accepted: true,
    });
    return true;
  };

  const closePeriod = (): void => {
    for (const a of accounts.values()) {
      const cur = a.current ?? { openingG: a.balanceG, creditsG: 0, debitsG: 0, lastDebitBookingId: null };
      const closingG = a.balanceG;
      if (policy === "NON_NEGATIVE_AT_PERIOD_END" && closingG < 0) {
        const bookingId = cur.lastDebitBookingId ?? "";
        failures.push({
          code: "CUSTODY.PERIOD_CLOSES_NEGATIVE",
          message: `Balance of ${a.material} (set ${a.setKey}) closes period ${period.label} at ${closingG} g; last debit ${bookingId}`,
          bookingId,
          at: period.endMs,
          setKey: a.setKey,
          material: a.material,
          requestedG: 0,
          availableG: closingG,
          shortfallG: -closingG,
        });
      }
      let carriedForwardG = closingG;
      if (carry === "LAPSE" && closingG > 0) {
        a.balanceG = 0;
        carriedForwardG = 0;
        a.entries.push({
          bookingId: null,
          at: period.endMs,
          kind: "LAPSE",
          deltaG: -closingG,
          balanceG: 0,
          period: period.label,
          accepted: true,
        });
      } else if (closingG !== 0) {
        a.entries.push({
          bookingId: null,
          at: period.endMs,
          kind: "CARRY_FORWARD",
          deltaG: 0,
          balanceG: closingG,
          period: period.label,
          accepted: true,
        });
      }
      a.periods.push({
        label: period.label,
        startMs: period.startMs,
        endMs: period.endMs,
        openingG: cur.openingG,
        creditsG: cur.creditsG,
        debitsG: cur.debitsG,
        closingG,
        carriedForwardG,
        closed: true,
      });
      a.current = null;
    }
    period = periodOf(period.endMs);
  };

  for (const { b, i } of order) {
    while (b.at >= period.endMs) closePeriod();
    if (b.kind === "INPUT") {
      credit(accountFor(b.setKey, b.material), b.id, b.at, "INPUT", b.massG);
    } else if (b.kind === "CLAIM") {
      debit(accountFor(b.setKey, b.material), b, i, "CLAIM", b.massG, "CUSTODY.CLAIM_EXCEEDS_BALANCE");
    } else {
      const step = steps.get(b.stepId);
      if (step === undefined) continue;
      if (
        !debit(
          accountFor(b.setKey, step.inputMaterial),
          b,
          i,
          "CONVERSION_OUT",
          b.inputMassG,
          "CUSTODY.CONVERSION_EXCEEDS_BALANCE",
        )
      )
        continue;
      for (const o of step.outputs)
        credit(accountFor(b.setKey, o.material), b.id, b.at, "CONVERSION_IN", convertCredit(b.inputMassG, o));
    }
  }
  if (state.closeThroughMs !== undefined) {
    while (period.endMs <= state.closeThroughMs) closePeriod();
  }
  for (const a of accounts.values()) {
    const cur = a.current ?? { openingG: a.balanceG, creditsG: 0, debitsG: 0 };
    a.periods.push({
      label: period.label,
      startMs: period.startMs,
      endMs: period.endMs,
      openingG: cur.openingG,
      creditsG: cur.creditsG,
      debitsG: cur.debitsG,
      closingG: a.balanceG,
      carriedForwardG: null,
      closed: false,
    });
  }

  return ok({
    siteId: state.siteId,
    ruleSetId: ruleSet.id,
    periodMonths,
    accounts: [...accounts.values()].map(({ current: _current, ...account }) => account),
    failures,
  });
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
