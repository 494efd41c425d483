// The chain-of-custody report from its bookings: claims booked against the set with the most credit,
// the ledger built under the rule set, the balance periods and the chosen one, the accounts as the page
// lists them, and a claim tried now without saving it. Pure: rows, bookings and now come in.
import { fail, ok } from "@/lib/core/result";
import type { DomainIssue, Result } from "@/lib/core/result";
import { labelOf } from "@/lib/core/vocabulary";
import { toGrams } from "@/lib/quantity/units";
import { buildCustodyLedger, checkClaim, getBalancePeriodOf } from "@/lib/custody/custody-balance";
import type {
  CharacteristicSet,
  ClaimBooking,
  ClaimCheck,
  CustodyBooking,
  CustodyFailure,
  CustodyLedger,
  CustodyRuleSet,
  CustodyState,
  LedgerEntry,
  OperatorType,
  PeriodSummary,
} from "@/lib/custody/custody-balance";
import { OUTPUT_MATERIAL, setInputsOf, WRITTEN_OFF } from "@/lib/custody/custody-inputs";
import type {
  ConversionRow,
  CustodyBookings,
  CustodyInputs,
  NotCredited,
  SetInputs,
} from "@/lib/custody/custody-inputs";
import type { CustodyShipmentRow } from "@/lib/custody/custody-rows";
import type { CustodyQuery } from "@/lib/custody/custody.schema";
import type { LedgerFreshness } from "@/lib/trace/trace-answers";

export interface ClaimRow {
  documentNo: string;
  customer: string;
  at: Date;
  massG: number;
  setKey: string;
  accepted: boolean;
  /** FAME credit of the set just before the claim. */
  availableG: number;
  shortfallG: number;
}

export interface DescribedEntry extends LedgerEntry {
  description: string;
}

export interface AccountView {
  setKey: string;
  attributes: Readonly<Record<string, string>>;
  material: string;
  materialLabel: string;
  balanceG: number;
  periods: PeriodSummary[];
  /** The chosen period's summary, if the account had one. */
  selected: PeriodSummary | null;
  /** The chosen period's entries in booking order, with the running balance. */
  entries: DescribedEntry[];
}

export interface CustodyPeriod {
  label: string;
  startsAt: Date;
  endsAt: Date;
  closed: boolean;
}

export type ClaimTried =
  | { ok: true; setKey: string; massG: number; check: ClaimCheck }
  | { ok: false; setKey: string; massG: number; issues: DomainIssue[] };

export interface CustodyReport {
  query: { period: string; operatorType: OperatorType; claimKg: number | null; claimSet: string | null };
  ruleSet: CustodyRuleSet;
  periodMonths: number;
  periods: CustodyPeriod[];
  selected: { label: string; startsAt: Date; endsAt: Date };
  sets: SetInputs[];
  accounts: AccountView[];
  failures: Array<CustodyFailure & { description: string }>;
  claims: ClaimRow[];
  conversions: ConversionRow[];
  /** Feedstock that is not credited, and why. */
  notCredited: NotCredited;
  claimCheck: ClaimTried | null;
  bookings: number;
  computeMs: number;
  trace: LedgerFreshness;
}

const MATERIAL_WORDS: Readonly<Record<string, string>> = {
  FAME: "Methyl ester (credit for claims)",
  WRITTEN_OFF: "Written off (receiving shortfall)",
};

/** The FAME accounts, largest credit first (ties by set key). */
function fameByBalance(ledger: CustodyLedger) {
  return ledger.accounts
    .filter((a) => a.material === OUTPUT_MATERIAL)
    .sort((a, b) => b.balanceG - a.balanceG || a.setKey.localeCompare(b.setKey));
}

/**
 * Books each certified-claim shipment against the set with the most methyl-ester credit at the shipment
 * time (our rule; falls back to the first set). Returns the set chosen per shipment document.
 */
export function bookClaims(
  base: Omit<CustodyState, "bookings">,
  shipments: readonly CustodyShipmentRow[],
  out: Pick<CustodyBookings, "bookings" | "describe">,
  fallbackSet: string,
): Map<string, string> {
  const claimSetOf = new Map<string, string>();
  for (const s of shipments) {
    const at = s.shippedAt.getTime();
    const ledger = buildCustodyLedger({ ...base, bookings: out.bookings.filter((b) => b.at <= at) });
    const setKey = (ledger.ok ? fameByBalance(ledger.value)[0]?.setKey : undefined) ?? fallbackSet;
    claimSetOf.set(s.documentNo, setKey);
    const id = `CLAIM:${s.documentNo}`;
    out.bookings.push({
      kind: "CLAIM",
      id,
      at,
      setKey,
      material: OUTPUT_MATERIAL,
      massG: s.massG,
      reference: s.documentNo,
    });
    out.describe.set(id, `Shipment ${s.documentNo} to ${s.customer} claimed certified`);
  }
  return claimSetOf;
}

/** Each claim with its verdict and the credit the set held just before it. */
export function claimRowsOf(
  ledger: CustodyLedger,
  shipments: readonly CustodyShipmentRow[],
  claimSetOf: ReadonlyMap<string, string>,
  fallbackSet: string,
): ClaimRow[] {
  const failureOf = new Map(ledger.failures.map((f) => [f.bookingId, f]));
  return shipments.map((s) => {
    const id = `CLAIM:${s.documentNo}`;
    const setKey = claimSetOf.get(s.documentNo) ?? fallbackSet;
    const account = ledger.accounts.find((a) => a.setKey === setKey && a.material === OUTPUT_MATERIAL);
    const entry = account?.entries.find((e) => e.bookingId === id);
    const f = failureOf.get(id);
    return {
      documentNo: s.documentNo,
      customer: s.customer,
      at: s.shippedAt,
      massG: s.massG,
      setKey,
      accepted: f === undefined,
      availableG: f ? f.availableG : (entry?.balanceG ?? 0) + s.massG,
      shortfallG: f?.shortfallG ?? 0,
    };
  });
}

/** Every balance period of the ledger plus the current one, in time order. */
export function periodsOf(ledger: CustodyLedger, state: CustodyState, nowMs: number) {
  const byLabel = new Map<string, CustodyPeriod>();
  const add = (p: { label: string; startMs: number; endMs: number }, closed: boolean) =>
    byLabel.set(p.label, { label: p.label, startsAt: new Date(p.startMs), endsAt: new Date(p.endMs), closed });
  for (const a of ledger.accounts) for (const p of a.periods) add(p, p.closed);
  const current = getBalancePeriodOf(state, nowMs);
  if (current !== null && !byLabel.has(current.label)) add(current, false);
  const periods = [...byLabel.values()].sort((a, b) => a.startsAt.getTime() - b.startsAt.getTime());
  return { byLabel, periods, currentLabel: current?.label ?? null };
}

/** The accounts as the page lists them, with the chosen period's entries described. */
export function accountViewsOf(
  ledger: CustodyLedger,
  period: string,
  describe: ReadonlyMap<string, string>,
): AccountView[] {
  const describeEntry = (e: LedgerEntry): string =>
    e.bookingId === null
      ? e.kind === "LAPSE"
        ? "Period end: balance lapses"
        : "Period end: balance carried forward"
      : (describe.get(e.bookingId) ?? e.bookingId);
  return ledger.accounts
    .filter((a) => !(a.material === WRITTEN_OFF && a.balanceG === 0))
    .map((a) => ({
      setKey: a.setKey,
      attributes: a.attributes,
      material: a.material,
      materialLabel: MATERIAL_WORDS[a.material] ?? labelOf(a.material),
      balanceG: a.balanceG,
      periods: a.periods,
      selected: a.periods.find((p) => p.label === period) ?? null,
      entries: a.entries.filter((e) => e.period === period).map((e) => ({ ...e, description: describeEntry(e) })),
    }))
    .sort((x, y) => x.setKey.localeCompare(y.setKey) || x.material.localeCompare(y.material));
}

/** A claim of `claimKg` tried now against the given set (or the one with the most credit); nothing is saved. */
export function tryClaim(
  state: CustodyState,
  ledger: CustodyLedger,
  claimKg: number,
  claimSet: string | undefined,
  fallbackSet: string,
  nowMs: number,
): ClaimTried {
  const massG = toGrams(claimKg);
  const fame = ledger.accounts.filter((a) => a.material === OUTPUT_MATERIAL).sort((a, b) => b.balanceG - a.balanceG);
  const setKey = claimSet ?? fame[0]?.setKey ?? fallbackSet;
  if (!state.sets.some((s) => s.key === setKey))
    return {
      ok: false,
      setKey,
      massG,
      issues: [
        {
          code: "INPUT.INVALID",
          message: `Characteristic set "${setKey}" is not one of this site's sets`,
          field: "claimSet",
        },
      ],
    };
  const claim: ClaimBooking = {
    kind: "CLAIM",
    id: "CLAIM:TRIED-NOW",
    at: nowMs,
    setKey,
    material: OUTPUT_MATERIAL,
    massG,
  };
  const checked = checkClaim(state, claim);
  return checked.ok
    ? { ok: true, setKey, massG, check: checked.value }
    : { ok: false, setKey, massG, issues: checked.issues };
}

export interface CustodyReportInput {
  query: CustodyQuery;
  siteId: number;
  ruleSet: CustodyRuleSet;
  utcOffsetMin: number;
  shipments: readonly CustodyShipmentRow[];
  inputs: CustodyInputs;
  booked: CustodyBookings;
  nowMs: number;
}

/** The report from the material bookings: claims added, the ledger built, the chosen period laid out. */
export function assembleCustodyReport(input: CustodyReportInput): Result<Omit<CustodyReport, "computeMs" | "trace">> {
  const { query: q, inputs, booked, nowMs } = input;
  const sets: CharacteristicSet[] = [...inputs.sets].map(([key, s]) => ({ key, attributes: s.attributes }));
  if (sets.length === 0) sets.push({ key: "NONE", attributes: { scheme: "none", material: "none" } });
  const base = {
    siteId: input.siteId,
    ruleSet: input.ruleSet,
    operatorType: q.operatorType,
    utcOffsetMin: input.utcOffsetMin,
    sets,
    steps: booked.steps,
  };
  const fallbackSet = sets[0]?.key ?? "NONE";
  const claimShipments = input.shipments.filter((s) => s.certifiedClaim);
  const claimSetOf = bookClaims(base, claimShipments, booked, fallbackSet);
  const bookings: CustodyBooking[] = booked.bookings;
  const state: CustodyState = { ...base, bookings, closeThroughMs: nowMs };
  const built = buildCustodyLedger(state);
  if (!built.ok) return built;
  const ledger = built.value;
  const failed = new Set(ledger.failures.map((f) => f.bookingId));
  for (const c of booked.conversions)
    for (const s of c.bySet) s.accepted = !failed.has(`CONV:${c.batchCode}:${s.setKey}`);
  const { byLabel, periods, currentLabel } = periodsOf(ledger, state, nowMs);
  const selectedLabel = q.period ?? currentLabel ?? periods[periods.length - 1]?.label ?? "";
  const selected = byLabel.get(selectedLabel);
  if (selected === undefined)
    return fail(
      "INPUT.INVALID",
      `Period: ${selectedLabel} is not a balance period of this ledger (${periods.map((p) => p.label).join(", ")})`,
      "period",
    );
  return ok({
    query: {
      period: selected.label,
      operatorType: q.operatorType,
      claimKg: q.claimKg ?? null,
      claimSet: q.claimSet ?? null,
    },
    ruleSet: input.ruleSet,
    periodMonths: ledger.periodMonths,
    periods,
    selected: { label: selected.label, startsAt: selected.startsAt, endsAt: selected.endsAt },
    sets: setInputsOf(inputs.sets),
    accounts: accountViewsOf(ledger, selected.label, booked.describe),
    failures: ledger.failures.map((f) => ({ ...f, description: booked.describe.get(f.bookingId) ?? f.bookingId })),
    claims: claimRowsOf(ledger, claimShipments, claimSetOf, fallbackSet),
    conversions: booked.conversions,
    notCredited: inputs.notCredited,
    claimCheck: q.claimKg === undefined ? null : tryClaim(state, ledger, q.claimKg, q.claimSet, fallbackSet, nowMs),
    bookings: bookings.length,
  });
}
