// The chain-of-custody bookings drawn from the books: certified inputs per lot and characteristic set,
// receiving shortfalls written off, and each finished batch's conversion of certified oil into methyl
// ester at its own measured yield. Pure: the rows, the entry facts and the genealogy come in.
import { convertCredit } from "@/lib/custody/custody-balance";
import type { ConversionStep, CustodyBooking } from "@/lib/custody/custody-balance";
import type { BatchMoveRow, CustodyLedgerRows, EntryMoveRow } from "@/lib/custody/custody-rows";
import type { CompositionParts } from "@/lib/trace/composition";
import type { EntryHolderFacts } from "@/lib/trace/trace-facts";

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

/** Feedstock that is not credited, and why. */
export interface NotCredited {
  lotOnlyG: number;
  sourceOnlyG: number;
  surplusG: number;
  withheldG: number;
  withheldSources: string[];
}

interface SetTally {
  attributes: Record<string, string>;
  inputG: number;
  certificates: Map<string, { sources: Set<string>; grams: number }>;
}

interface LotInput {
  at: number;
  lotCode: string;
  setKey: string;
  material: string;
  grams: number;
}

/** Certified inputs: by characteristic set, by lot, and the set each entry movement (origin) belongs to. */
export interface CustodyInputs {
  setOfOrigin: Map<number, string>;
  sets: Map<string, SetTally>;
  inputs: LotInput[];
  notCredited: NotCredited;
}

interface OriginSet {
  key: string;
  scheme: string;
  material: string;
  certificate: string;
  source: string;
}

/** The characteristic set of material entering at a holder: a certified lot from a source certified on the day. */
export function setOf(entry: EntryHolderFacts | undefined, enteredAt: number): OriginSet | null {
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

function countNotCredited(notCredited: NotCredited, entry: EntryHolderFacts | undefined, massG: number): void {
  if (entry?.lot?.certified && entry.kind === "LOT" && entry.lot.origin !== "DELIVERY") notCredited.surplusG += massG;
  else if (entry?.lot?.certified) notCredited.lotOnlyG += massG;
  else if (entry?.source?.certificateNo && (entry.kind === "PICKUP" || entry.kind === "LOT"))
    notCredited.sourceOnlyG += massG;
}

function tallySet(sets: Map<string, SetTally>, set: OriginSet, massG: number): void {
  const s = sets.get(set.key) ?? {
    attributes: { scheme: set.scheme, material: set.material },
    inputG: 0,
    certificates: new Map<string, { sources: Set<string>; grams: number }>(),
  };
  s.inputG += massG;
  const c = s.certificates.get(set.certificate) ?? { sources: new Set<string>(), grams: 0 };
  c.sources.add(set.source);
  c.grams += massG;
  s.certificates.set(set.certificate, c);
  sets.set(set.key, s);
}

/** Sorts the entry movements into certified inputs (per set and lot) and what is not credited. */
export function collectInputs(
  entries: readonly EntryMoveRow[],
  facts: ReadonlyMap<number, EntryHolderFacts>,
): CustodyInputs {
  const setOfOrigin = new Map<number, string>();
  const sets = new Map<string, SetTally>();
  const inputs = new Map<string, LotInput>();
  const notCredited: NotCredited = { lotOnlyG: 0, sourceOnlyG: 0, surplusG: 0, withheldG: 0, withheldSources: [] };
  const withheld = new Set<string>();
  for (const e of entries) {
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
      countNotCredited(notCredited, entry, e.massG);
      continue;
    }
    setOfOrigin.set(e.id, set.key);
    tallySet(sets, set, e.massG);
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
  return { setOfOrigin, sets, inputs: [...inputs.values()], notCredited };
}

/** The inputs as a report lists them: sets by key, certificates largest first. */
export function setInputsOf(sets: ReadonlyMap<string, SetTally>): SetInputs[] {
  return [...sets]
    .map(([key, s]) => ({
      key,
      attributes: s.attributes,
      inputG: s.inputG,
      certificates: [...s.certificates]
        .map(([certificate, c]) => ({ certificate, sources: [...c.sources].sort(), grams: c.grams }))
        .sort((a, b) => b.grams - a.grams || a.certificate.localeCompare(b.certificate)),
    }))
    .sort((a, b) => a.key.localeCompare(b.key));
}

/** The moves whose certified share the genealogy must give: oil charged to batches and receiving shortfalls. */
export function movesToCompose(rows: CustodyLedgerRows): { oilMoves: BatchMoveRow[]; moveIds: number[] } {
  const batchHolders = new Set(rows.batches.map((b) => b.holderId));
  const oilMoves = rows.batchMoves.filter((m) => m.role === "OIL" && batchHolders.has(m.toHolderId));
  return { oilMoves, moveIds: [...oilMoves.map((m) => m.id), ...rows.lotLosses.map((m) => m.id)] };
}

/** Bookings, the conversion steps they use, and each booking's wording on the ledger page. */
export interface CustodyBookings {
  steps: ConversionStep[];
  bookings: CustodyBooking[];
  describe: Map<string, string>;
  conversions: ConversionRow[];
}

/** Certified grams a move carried, by characteristic set (from what the genealogy says it carried). */
function certifiedBySet(parts: CompositionParts | undefined, setOfOrigin: ReadonlyMap<number, string>) {
  const bySet = new Map<string, number>();
  parts?.originIds.forEach((origin, i) => {
    const key = setOfOrigin.get(origin);
    if (key !== undefined) bySet.set(key, (bySet.get(key) ?? 0) + (parts.grams[i] ?? 0));
  });
  return bySet;
}

function bookInputs(inputs: readonly LotInput[], out: CustodyBookings): void {
  for (const i of [...inputs].sort((a, b) => a.at - b.at || a.lotCode.localeCompare(b.lotCode))) {
    const id = `IN:${i.lotCode}:${i.setKey}`;
    out.bookings.push({
      kind: "INPUT",
      id,
      at: i.at,
      setKey: i.setKey,
      material: i.material,
      massG: i.grams,
      reference: i.lotCode,
    });
    out.describe.set(id, `Certified lot ${i.lotCode} received`);
  }
}

function bookLosses(
  losses: readonly BatchMoveRow[],
  bySetOf: (moveId: number) => Map<string, number>,
  materialOfSet: (key: string) => string,
  out: CustodyBookings,
): void {
  for (const m of losses) {
    for (const [setKey, grams] of bySetOf(m.id)) {
      if (grams <= 0) continue;
      const material = materialOfSet(setKey);
      const stepId = `RECEIVING_SHORTFALL:${material}`;
      if (!out.steps.some((s) => s.id === stepId))
        out.steps.push({
          id: stepId,
          inputMaterial: material,
          outputs: [{ material: WRITTEN_OFF, outputMassG: 0, inputMassG: 1 }],
          basis: "receiving shortfall booked as a loss: no credit",
        });
      const id = `LOSS:${m.id}:${setKey}`;
      out.bookings.push({
        kind: "CONVERSION",
        id,
        at: m.at.getTime(),
        setKey,
        stepId,
        inputMassG: grams,
        reference: `movement ${m.id}`,
      });
      out.describe.set(id, `Receiving shortfall written off (movement no. ${m.id})`);
    }
  }
}

function bookBatch(
  b: { code: string; completedAt: Date },
  oilG: number,
  esterG: number,
  bySet: ReadonlyMap<string, number>,
  materialOfSet: (key: string) => string,
  out: CustodyBookings,
): ConversionRow {
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
    out.steps.push({
      id: stepId,
      inputMaterial: material,
      outputs: [output],
      basis: `batch ${b.code}: ${esterG} g ester out of ${oilG} g oil in`,
    });
    const id = `CONV:${b.code}:${setKey}`;
    out.bookings.push({
      kind: "CONVERSION",
      id,
      at: b.completedAt.getTime(),
      setKey,
      stepId,
      inputMassG: certifiedOilG,
      reference: b.code,
    });
    out.describe.set(
      id,
      `Batch ${b.code}: certified oil converted at ${(esterG / oilG).toFixed(4)} kg ester per kg oil`,
    );
    row.bySet.push({
      setKey,
      material,
      certifiedOilG,
      fameCreditG: convertCredit(certifiedOilG, output),
      accepted: true,
    });
  }
  return row;
}

/**
 * Input, write-off and conversion bookings. `carried` is what the genealogy says each oil charge and
 * receiving shortfall carried, by origin; only the certified origins' grams are booked.
 */
export function bookMaterial(
  rows: CustodyLedgerRows,
  inputs: CustodyInputs,
  oilMoves: readonly BatchMoveRow[],
  carried: ReadonlyMap<number, CompositionParts>,
): CustodyBookings {
  const out: CustodyBookings = { steps: [], bookings: [], describe: new Map(), conversions: [] };
  const bySetOf = (moveId: number) => certifiedBySet(carried.get(moveId), inputs.setOfOrigin);
  const materialOfSet = (key: string) => inputs.sets.get(key)?.attributes.material ?? "UNKNOWN";
  bookInputs(inputs.inputs, out);
  bookLosses(rows.lotLosses, bySetOf, materialOfSet, out);
  for (const b of rows.batches) {
    if (b.completedAt === null) continue;
    const oil = oilMoves.filter((m) => m.toHolderId === b.holderId);
    const oilG = oil.reduce((s, m) => s + m.massG, 0);
    const esterG = rows.batchMoves
      .filter((m) => m.role === "ESTER" && m.fromHolderId === b.holderId)
      .reduce((s, m) => s + m.massG, 0);
    if (oilG === 0) continue;
    const bySet = new Map<string, number>();
    for (const m of oil) for (const [k, g] of bySetOf(m.id)) bySet.set(k, (bySet.get(k) ?? 0) + g);
    out.conversions.push(
      bookBatch({ code: b.code, completedAt: b.completedAt }, oilG, esterG, bySet, materialOfSet, out),
    );
  }
  return out;
}
