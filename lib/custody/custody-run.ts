// One replay of a custody state's bookings: accounts per set and material, credits and debits with the
// negative-balance policy, and period ends with carry-forward or lapse. Used by buildCustodyLedger.
import { getPeriodContaining } from "@/lib/mass-balance/period";
import type { Period } from "@/lib/mass-balance/period";
import { accountKey, convertCredit } from "@/lib/custody/custody-rules";
import type {
  AccountState,
  BalanceAccount,
  CarryForwardMode,
  ConversionStep,
  CustodyBooking,
  CustodyFailure,
  CustodyState,
  EntryKind,
  NegativeBalancePolicy,
} from "@/lib/custody/custody-rules";

type DebitCode = "CUSTODY.CLAIM_EXCEEDS_BALANCE" | "CUSTODY.CONVERSION_EXCEEDS_BALANCE";

export class CustodyRun {
  readonly accounts = new Map<string, AccountState>();
  readonly failures: CustodyFailure[] = [];
  period: Period;
  private readonly attributes: ReadonlyMap<string, Readonly<Record<string, string>>>;
  private readonly steps: ReadonlyMap<string, ConversionStep>;
  private readonly policy: NegativeBalancePolicy;
  private readonly carry: CarryForwardMode;

  constructor(
    private readonly state: CustodyState,
    private readonly periodMonths: number,
    firstAt: number,
  ) {
    this.attributes = new Map(state.sets.map((s) => [s.key, s.attributes]));
    this.steps = new Map(state.steps.map((s) => [s.id, s]));
    this.policy = state.ruleSet.negativeBalance.value;
    this.carry = state.ruleSet.carryForward.value;
    this.period = this.periodOf(firstAt);
  }

  private periodOf(at: number): Period {
    return getPeriodContaining(
      at,
      this.periodMonths,
      this.state.ruleSet.periodAnchorMonth.value,
      this.state.utcOffsetMin,
    );
  }

  private accountFor(setKey: string, material: string): AccountState {
    const k = accountKey(setKey, material);
    let a = this.accounts.get(k);
    if (a === undefined) {
      a = {
        setKey,
        attributes: this.attributes.get(setKey) ?? {},
        material,
        balanceG: 0,
        entries: [],
        periods: [],
        current: null,
      };
      this.accounts.set(k, a);
    }
    if (a.current === null) a.current = { openingG: a.balanceG, creditsG: 0, debitsG: 0, lastDebitBookingId: null };
    return a;
  }

  private credit(a: AccountState, bookingId: string, at: number, kind: EntryKind, g: number): void {
    a.balanceG += g;
    if (a.current !== null) a.current.creditsG += g;
    a.entries.push({ bookingId, at, kind, deltaG: g, balanceG: a.balanceG, period: this.period.label, accepted: true });
  }

  private refuse(a: AccountState, b: CustodyBooking, index: number, kind: EntryKind, g: number, code: DebitCode): void {
    const availableG = Math.max(0, a.balanceG);
    const shortfallG = g - availableG;
    a.entries.push({
      bookingId: b.id,
      at: b.at,
      kind,
      deltaG: 0,
      balanceG: a.balanceG,
      period: this.period.label,
      accepted: false,
      shortfallG,
    });
    const what = kind === "CLAIM" ? "Claim" : "Conversion";
    this.failures.push({
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
  }

  /** Returns false when the debit was refused (listed as a failure with its shortfall, not applied). */
  private debit(
    a: AccountState,
    b: CustodyBooking,
    index: number,
    kind: EntryKind,
    g: number,
    code: DebitCode,
  ): boolean {
    if (this.policy === "NEVER_NEGATIVE_AT_ANY_BOOKING" && g > a.balanceG) {
      this.refuse(a, b, index, kind, g, code);
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
      period: this.period.label,
      accepted: true,
    });
    return true;
  }

  /** Applies one booking (the period must already contain it). */
  apply(b: CustodyBooking, i: number): void {
    if (b.kind === "INPUT") {
      this.credit(this.accountFor(b.setKey, b.material), b.id, b.at, "INPUT", b.massG);
    } else if (b.kind === "CLAIM") {
      this.debit(this.accountFor(b.setKey, b.material), b, i, "CLAIM", b.massG, "CUSTODY.CLAIM_EXCEEDS_BALANCE");
    } else {
      const step = this.steps.get(b.stepId);
      if (step === undefined) return;
      const from = this.accountFor(b.setKey, step.inputMaterial);
      if (!this.debit(from, b, i, "CONVERSION_OUT", b.inputMassG, "CUSTODY.CONVERSION_EXCEEDS_BALANCE")) return;
      for (const o of step.outputs)
        this.credit(this.accountFor(b.setKey, o.material), b.id, b.at, "CONVERSION_IN", convertCredit(b.inputMassG, o));
    }
  }

  private closeAccount(a: AccountState): void {
    const period = this.period;
    const cur = a.current ?? { openingG: a.balanceG, creditsG: 0, debitsG: 0, lastDebitBookingId: null };
    const closingG = a.balanceG;
    if (this.policy === "NON_NEGATIVE_AT_PERIOD_END" && closingG < 0) {
      const bookingId = cur.lastDebitBookingId ?? "";
      this.failures.push({
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
    if (this.carry === "LAPSE" && closingG > 0) {
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

  /** Closes the current period for every account and opens the next. */
  closePeriod(): void {
    for (const a of this.accounts.values()) this.closeAccount(a);
    this.period = this.periodOf(this.period.endMs);
  }

  /** Every account with the still-open period's summary added. */
  finish(): BalanceAccount[] {
    const period = this.period;
    for (const a of this.accounts.values()) {
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
    return [...this.accounts.values()].map(({ current: _current, ...account }) => account);
  }
}
