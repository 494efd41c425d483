// Chain of custody by mass balance (RED II Art. 30(1); Implementing Regulation (EU) 2022/996 Art. 19):
// a per-site ledger of certified credit per characteristic set and material, evaluated at every
// booking in time order, with balance periods, carry-forward and conversion factors per process step.
// The rule set, the bookings and the ledger's shapes.
import type { DomainIssue } from "@/lib/core/result";

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

export interface AccountState extends BalanceAccount {
  current: { openingG: number; creditsG: number; debitsG: number; lastDebitBookingId: string | null } | null;
}

export function accountKey(setKey: string, material: string): string {
  return `${setKey}\u0000${material}`;
}

export function isPositiveGrams(v: number): boolean {
  return Number.isSafeInteger(v) && v > 0;
}

/** Output credit = input × (output mass ÷ input mass), rounded down to whole grams so credit is never overstated. */
export function convertCredit(inputMassG: number, output: ConversionOutput): number {
  return Number((BigInt(inputMassG) * BigInt(output.outputMassG)) / BigInt(output.inputMassG));
}
