import "server-only";
// Chain of custody by mass balance for the custody page and GET /api/custody. Built from the books:
//   INPUT       certified feedstock as received: per lot and characteristic set, the grams of the origins
//               whose lot is marked certified and whose source held a valid certificate on the day;
//   CONVERSION  a receiving shortfall of such a lot is written off (zero output), and each finished batch
//               converts the certified oil it was charged with (from the genealogy) into methyl ester at
//               the batch's own measured yield (ester out ÷ oil in);
//   CLAIM       each shipment marked as a certified claim debits methyl ester credit.
// The pure ledger (buildCustodyLedger) checks every booking in time order under the active rule set.
import type { Db } from "@/lib/core/connect";
import { fail, ok } from "@/lib/core/result";
import type { DomainIssue, Result } from "@/lib/core/result";
import { labelOf } from "@/lib/core/vocabulary";
import { parseInput } from "@/lib/ledger/parse";
import { toGrams } from "@/lib/quantity/units";
import {
  buildCustodyLedger,
  checkClaim,
  convertCredit,
  getBalancePeriodOf,
  RULESET_EU_2022_996,
} from "@/lib/custody/custody-balance";
import { CustodyQuerySchema } from "@/lib/custody/custody.schema";
import type {
  BalanceAccount,
  CharacteristicSet,
  ClaimBooking,
  ClaimCheck,
  ConversionStep,
  CustodyBooking,
  CustodyFailure,
  CustodyRuleSet,
  CustodyState,
  LedgerEntry,
  OperatorType,
  PeriodSummary,
} from "@/lib/custody/custody-balance";
import { loadCustodyRows } from "@/lib/custody/custody.store";
import { getUtcOffsetMin } from "@/lib/period/site-time";
import { getMoveCompositions } from "@/lib/trace/trace.service";
import type { LedgerFreshness } from "@/lib/trace/trace.service";
import { listEntryHolderFacts } from "@/lib/trace/trace.store";
import type { EntryHolderFacts } from "@/lib/trace/trace.store";

/** The material certified conversions produce and claims are made in. */
export const OUTPUT_MATERIAL = "FAME";
/** Certified feedstock lost at receiving is converted into this, at zero credit. */
export const WRITTEN_OFF = "WRITTEN_OFF";

export interface SetInputs {
  key: string;
  attributes: Readonly<Record<string, string>>;
  inputG: number;
  /** Certified input by source certificate. */
  certificates: Array<{ certificate: string; sources: string[]; grams: number }>;
}

export interface ConversionRow {
  batchCode: string;
  completedAt: Date;
  oilG: number;
  esterG: number;
  /** Measured yield of the step: ester out ÷ oil in. */
  factor: number;
  bySet: Array<{ setKey: string; material: string; certifiedOilG: number; fameCreditG: number; accepted: boolean }>;
}

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

export interface CustodyReport {
  query: { period: string; operatorType: OperatorType; claimKg: number | null; claimSet: string | null };
  ruleSet: CustodyRuleSet;
  periodMonths: number;
  periods: Array<{ label: string; startsAt: Date; endsAt: Date; closed: boolean }>;
  selected: { label: string; startsAt: Date; endsAt: Date };
  sets: SetInputs[];
  accounts: AccountView[];
  failures: Array<CustodyFailure & { description: string }>;
  claims: ClaimRow[];
  conversions: ConversionRow[];
  /** Feedstock that is not credited, and why. */
  notCredited: {
    lotOnlyG: number;
    sourceOnlyG: number;
    surplusG: number;
    withheldG: number;
    withheldSources: string[];
  };
  claimCheck:
    | { ok: true; setKey: string; massG: number; check: ClaimCheck }
    | { ok: false; setKey: string; massG: number; issues: DomainIssue[] }
    | null;
  bookings: number;
  computeMs: number;
  trace: LedgerFreshness;
}

const MATERIAL_WORDS: Readonly<Record<string, string>> = {
  FAME: "Methyl ester (credit for claims)",
  WRITTEN_OFF: "Written off (receiving shortfall)",
};

function setOf(
  entry: EntryHolderFacts | undefined,
  enteredAt: number,
): { key: string; scheme: string; material: string; certificate: string; source: string } | null {
  if (entry === undefined || (entry.kind !== "PICKUP" && entry.kind !== "LOT")) return null;
  const s = entry.source;
  const lot = entry.lot;
  if (lot === null || !lot.certified || s === null || s.certificateScheme === null || s.certificateNo === null)
    return null;
  if (s.certificateExpires !== null && s.certificateExpires.getTime() < enteredAt) return null;
  const material = entry.material ?? lot.material;
  return {
    key: `${s.certificateScheme} | ${material}`,
    scheme: s.certificateScheme,
    material,
    certificate: s.certificateNo,
    source: s.code,
  };
}

/** The chain-of-custody ledger of a site under RULESET_EU_2022_996: inputs, conversions, claims, running balances. */
export async function getCustodyReport(
  db: Db,
  site: { id: number; timeZone: string },
  input: unknown,
  now: Date,
): Promise<Result<CustodyReport>> {
  const started = performance.now();
  const parsed = parseInput(CustodyQuerySchema, input);
  if (!parsed.ok) return parsed;
  const q = parsed.value;
  const [rows, facts] = await Promise.all([loadCustodyRows(db, site.id), listEntryHolderFacts(db, site.id)]);
  const ruleSet = RULESET_EU_2022_996;
  const utcOffsetMin = getUtcOffsetMin(site.timeZone, now);

  // ---- inputs, by lot and set ----
  const setOfOrigin = new Map<number, string>();
  const sets = new Map<
    string,
    {
      attributes: Record<string, string>;
      inputG: number;
      certificates: Map<string, { sources: Set<string>; grams: number }>;
    }
  >();
  const inputs = new Map<string, { at: number; lotCode: string; setKey: string; material: string; grams: number }>();
  const notCredited = { lotOnlyG: 0, sourceOnlyG: 0, surplusG: 0, withheldG: 0, withheldSources: [] as string[] };
  const withheld = new Set<string>();
  for (const e of rows.entries) {
    const entry = facts.get(e.toHolderId);
    const enteredAt = e.at.getTime();
    // A source whose credit compliance withholds after a confirmed screening flag earns none until cleared.
    if (entry?.source?.creditWithheld && entry.lot?.certified) {
      notCredited.withheldG += e.massG;
      withheld.add(entry.source.code);
      continue;
    }
    const set = setOf(entry, enteredAt);
    if (set === null || entry?.lot == null) {
      if (entry?.lot?.certified && entry.kind === "LOT" && entry.lot.origin !== "DELIVERY")
        notCredited.surplusG += e.massG;
      else if (entry?.lot?.certified) notCredited.lotOnlyG += e.massG;
      else if (entry?.source?.certificateNo && (entry.kind === "PICKUP" || entry.kind === "LOT"))
        notCredited.sourceOnlyG += e.massG;
      continue;
    }
    setOfOrigin.set(e.id, set.key);
    const s = sets.get(set.key) ?? {
      attributes: { scheme: set.scheme, material: set.material },
      inputG: 0,
      certificates: new Map<string, { sources: Set<string>; grams: number }>(),
    };
    s.inputG += e.massG;
    const c = s.certificates.get(set.certificate) ?? { sources: new Set<string>(), grams: 0 };
    c.sources.add(set.source);
    c.grams += e.massG;
    s.certificates.set(set.certificate, c);
    sets.set(set.key, s);
    // Credited when the plant receives the lot (a pickup's oil is collected before its lot is received).
    const at = Math.max(enteredAt, entry.lot.receivedAt.getTime());
    const key = `${entry.lot.code}|${set.key}`;
    const row = inputs.get(key) ?? { at, lotCode: entry.lot.code, setKey: set.key, material: set.material, grams: 0 };
    row.grams += e.massG;
    row.at = Math.max(row.at, at);
    inputs.set(key, row);
  }
  for (const s of sets.values()) s.attributes.certificates = [...s.certificates.keys()].sort().join(", ");
  notCredited.withheldSources = [...withheld].sort();

  // ---- the certified share of receiving shortfalls and of the oil charged to batches, from the genealogy ----
  const batchByHolder = new Map(rows.batches.map((b) => [b.holderId, b]));
  const oilMoves = rows.batchMoves.filter((m) => m.role === "OIL" && batchByHolder.has(m.toHolderId));
  const composed = await getMoveCompositions(
    db,
    site.id,
    [...oilMoves.map((m) => m.id), ...rows.lotLosses.map((m) => m.id)],
    now,
  );
  if (!composed.ok) return composed;
  const certifiedBySet = (moveId: number): Map<string, number> => {
    const bySet = new Map<string, number>();
    const parts = composed.value.carried.get(moveId);
    parts?.originIds.forEach((origin, i) => {
      const key = setOfOrigin.get(origin);
      if (key !== undefined) bySet.set(key, (bySet.get(key) ?? 0) + (parts.grams[i] ?? 0));
    });
    return bySet;
  };
  const materialOfSet = (key: string) => sets.get(key)?.attributes.material ?? "UNKNOWN";

  const steps: ConversionStep[] = [];
  const bookings: CustodyBooking[] = [];
  const describe = new Map<string, string>();
  for (const i of [...inputs.values()].sort((a, b) => a.at - b.at || a.lotCode.localeCompare(b.lotCode))) {
    const id = `IN:${i.lotCode}:${i.setKey}`;
    bookings.push({
      kind: "INPUT",
      id,
      at: i.at,
      setKey: i.setKey,
      material: i.material,
      massG: i.grams,
      reference: i.lotCode,
    });
    describe.set(id, `Certified lot ${i.lotCode} received`);
  }
  for (const m of rows.lotLosses) {
    for (const [setKey, grams] of certifiedBySet(m.id)) {
      if (grams <= 0) continue;
      const material = materialOfSet(setKey);
      const stepId = `RECEIVING_SHORTFALL:${material}`;
      if (!steps.some((s) => s.id === stepId))
        steps.push({
          id: stepId,
          inputMaterial: material,
          outputs: [{ material: WRITTEN_OFF, outputMassG: 0, inputMassG: 1 }],
          basis: "receiving shortfall booked as a loss: no credit",
        });
      const id = `LOSS:${m.id}:${setKey}`;
      bookings.push({
        kind: "CONVERSION",
        id,
        at: m.at.getTime(),
        setKey,
        stepId,
        inputMassG: grams,
        reference: `movement ${m.id}`,
      });
      describe.set(id, `Receiving shortfall written off (movement no. ${m.id})`);
    }
  }
  const conversions: ConversionRow[] = [];
  for (const b of rows.batches) {
    if (b.completedAt === null) continue;
    const oil = oilMoves.filter((m) => m.toHolderId === b.holderId);
    const oilG = oil.reduce((s, m) => s + m.massG, 0);
    const esterG = rows.batchMoves
      .filter((m) => m.role === "ESTER" && m.fromHolderId === b.holderId)
      .reduce((s, m) => s + m.massG, 0);
    if (oilG === 0) continue;
    const bySet = new Map<string, number>();
    for (const m of oil) for (const [k, g] of certifiedBySet(m.id)) bySet.set(k, (bySet.get(k) ?? 0) + g);
    const row: ConversionRow = {
      batchCode: b.code,
      completedAt: b.completedAt,
      oilG,
      esterG,
      factor: esterG / oilG,
      bySet: [],
    };
    for (const [setKey, certifiedOilG] of [...bySet].sort((x, y) => x[0].localeCompare(y[0]))) {
      if (certifiedOilG <= 0) continue;
      const material = materialOfSet(setKey);
      const output = { material: OUTPUT_MATERIAL, outputMassG: esterG, inputMassG: oilG };
      const stepId = `${b.code}:${material}`;
      steps.push({
        id: stepId,
        inputMaterial: material,
        outputs: [output],
        basis: `batch ${b.code}: ${esterG} g ester out of ${oilG} g oil in`,
      });
      const id = `CONV:${b.code}:${setKey}`;
      bookings.push({
        kind: "CONVERSION",
        id,
        at: b.completedAt.getTime(),
        setKey,
        stepId,
        inputMassG: certifiedOilG,
        reference: b.code,
      });
      describe.set(id, `Batch ${b.code}: certified oil converted at ${(esterG / oilG).toFixed(4)} kg ester per kg oil`);
      row.bySet.push({
        setKey,
        material,
        certifiedOilG,
        fameCreditG: convertCredit(certifiedOilG, output),
        accepted: true,
      });
    }
    conversions.push(row);
  }

  const characteristicSets: CharacteristicSet[] = [...sets].map(([key, s]) => ({ key, attributes: s.attributes }));
  if (characteristicSets.length === 0)
    characteristicSets.push({ key: "NONE", attributes: { scheme: "none", material: "none" } });
  const base: Omit<CustodyState, "bookings"> = {
    siteId: site.id,
    ruleSet,
    operatorType: q.operatorType,
    utcOffsetMin,
    sets: characteristicSets,
    steps,
  };

  // ---- claims: each against the set with the most methyl-ester credit at the shipment time (our rule) ----
  const claimShipments = rows.shipments.filter((s) => s.certifiedClaim);
  const claimSetOf = new Map<string, string>();
  const fallbackSet = characteristicSets[0]?.key ?? "NONE";
  for (const s of claimShipments) {
    const at = s.shippedAt.getTime();
    const before = bookings.filter((b) => b.at <= at);
    const ledger = buildCustodyLedger({ ...base, bookings: before });
    const best = ledger.ok
      ? ledger.value.accounts
          .filter((a) => a.material === OUTPUT_MATERIAL)
          .sort((a, b) => b.balanceG - a.balanceG || a.setKey.localeCompare(b.setKey))[0]
      : undefined;
    const setKey = best?.setKey ?? fallbackSet;
    claimSetOf.set(s.documentNo, setKey);
    const id = `CLAIM:${s.documentNo}`;
    bookings.push({
      kind: "CLAIM",
      id,
      at,
      setKey,
      material: OUTPUT_MATERIAL,
      massG: s.massG,
      reference: s.documentNo,
    });
    describe.set(id, `Shipment ${s.documentNo} to ${s.customer} claimed certified`);
  }

  const state: CustodyState = { ...base, bookings, closeThroughMs: now.getTime() };
  const built = buildCustodyLedger(state);
  if (!built.ok) return built;
  const ledger = built.value;

  const failureOf = new Map(ledger.failures.map((f) => [f.bookingId, f]));
  const claims: ClaimRow[] = claimShipments.map((s) => {
    const id = `CLAIM:${s.documentNo}`;
    const setKey = claimSetOf.get(s.documentNo) ?? fallbackSet;
    const account = ledger.accounts.find((a) => a.setKey === setKey && a.material === OUTPUT_MATERIAL);
    const entry = account?.entries.find((e) => e.bookingId === id);
    const f = failureOf.get(id);
    const availableG = f ? f.availableG : (entry?.balanceG ?? 0) + s.massG;
    return {
      documentNo: s.documentNo,
      customer: s.customer,
      at: s.shippedAt,
      massG: s.massG,
      setKey,
      accepted: f === undefined,
      availableG,
      shortfallG: f?.shortfallG ?? 0,
    };
  });
  for (const c of conversions) for (const s of c.bySet) s.accepted = !failureOf.has(`CONV:${c.batchCode}:${s.setKey}`);

  // ---- periods and the chosen one ----
  const periodsByLabel = new Map<string, { label: string; startsAt: Date; endsAt: Date; closed: boolean }>();
  for (const a of ledger.accounts)
    for (const p of a.periods)
      periodsByLabel.set(p.label, {
        label: p.label,
        startsAt: new Date(p.startMs),
        endsAt: new Date(p.endMs),
        closed: p.closed,
      });
  const current = getBalancePeriodOf(state, now.getTime());
  if (current !== null && !periodsByLabel.has(current.label))
    periodsByLabel.set(current.label, {
      label: current.label,
      startsAt: new Date(current.startMs),
      endsAt: new Date(current.endMs),
      closed: false,
    });
  const periods = [...periodsByLabel.values()].sort((a, b) => a.startsAt.getTime() - b.startsAt.getTime());
  const selectedLabel = q.period ?? current?.label ?? periods[periods.length - 1]?.label ?? "";
  const selected = periodsByLabel.get(selectedLabel);
  if (selected === undefined)
    return fail(
      "INPUT.INVALID",
      `Period: ${selectedLabel} is not a balance period of this ledger (${periods.map((p) => p.label).join(", ")})`,
      "period",
    );

  const describeEntry = (e: LedgerEntry): string =>
    e.bookingId === null
      ? e.kind === "LAPSE"
        ? "Period end: balance lapses"
        : "Period end: balance carried forward"
      : (describe.get(e.bookingId) ?? e.bookingId);
  const accounts: AccountView[] = ledger.accounts
    .filter((a) => !(a.material === WRITTEN_OFF && a.balanceG === 0))
    .map((a: BalanceAccount) => ({
      setKey: a.setKey,
      attributes: a.attributes,
      material: a.material,
      materialLabel: MATERIAL_WORDS[a.material] ?? labelOf(a.material),
      balanceG: a.balanceG,
      periods: a.periods,
      selected: a.periods.find((p) => p.label === selected.label) ?? null,
      entries: a.entries
        .filter((e) => e.period === selected.label)
        .map((e) => ({ ...e, description: describeEntry(e) })),
    }))
    .sort((x, y) => x.setKey.localeCompare(y.setKey) || x.material.localeCompare(y.material));

  // ---- a claim tried now, not saved ----
  let claimCheck: CustodyReport["claimCheck"] = null;
  if (q.claimKg !== undefined) {
    const massG = toGrams(q.claimKg);
    const fame = ledger.accounts.filter((a) => a.material === OUTPUT_MATERIAL).sort((a, b) => b.balanceG - a.balanceG);
    const setKey = q.claimSet ?? fame[0]?.setKey ?? fallbackSet;
    if (!characteristicSets.some((s) => s.key === setKey)) {
      claimCheck = {
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
    } else {
      const claim: ClaimBooking = {
        kind: "CLAIM",
        id: "CLAIM:TRIED-NOW",
        at: now.getTime(),
        setKey,
        material: OUTPUT_MATERIAL,
        massG,
      };
      const checked = checkClaim(state, claim);
      claimCheck = checked.ok
        ? { ok: true, setKey, massG, check: checked.value }
        : { ok: false, setKey, massG, issues: checked.issues };
    }
  }

  return ok({
    query: {
      period: selected.label,
      operatorType: q.operatorType,
      claimKg: q.claimKg ?? null,
      claimSet: q.claimSet ?? null,
    },
    ruleSet,
    periodMonths: ledger.periodMonths,
    periods,
    selected: { label: selected.label, startsAt: selected.startsAt, endsAt: selected.endsAt },
    sets: [...sets]
      .map(([key, s]) => ({
        key,
        attributes: s.attributes,
        inputG: s.inputG,
        certificates: [...s.certificates]
          .map(([certificate, c]) => ({ certificate, sources: [...c.sources].sort(), grams: c.grams }))
          .sort((a, b) => b.grams - a.grams || a.certificate.localeCompare(b.certificate)),
      }))
      .sort((a, b) => a.key.localeCompare(b.key)),
    accounts,
    failures: ledger.failures.map((f) => ({ ...f, description: describe.get(f.bookingId) ?? f.bookingId })),
    claims,
    conversions,
    notCredited,
    claimCheck,
    bookings: bookings.length,
    computeMs: performance.now() - started,
    trace: composed.value.freshness,
  });
}
