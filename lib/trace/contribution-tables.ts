// The trace's report rows: each origin described (who, what, certified) and grouped into the
// contribution tables by lot, pickup, source, material and certification.
import { invariant } from "@/lib/core/result";
import { labelOf } from "@/lib/core/vocabulary";
import type { HolderRef } from "@/lib/ledger/holder-ref";
import type { TraceComposition } from "@/lib/trace/genealogy";
import type { LedgerState } from "@/lib/trace/ledger-state";
import { groupOrigins } from "@/lib/trace/origin-groups";
import { CERTIFICATION_LABELS } from "@/lib/trace/trace-answers";
import type { CertificationStatus, ContributionRow, ContributionTables, OriginRow } from "@/lib/trace/trace-answers";
import type { EntryHolderFacts } from "@/lib/trace/trace-facts";

export interface OriginFacts {
  originId: number;
  enteredAt: number;
  entry: EntryHolderFacts | null;
  entryRef: HolderRef | null;
  certification: CertificationStatus;
  certificate: string | null;
  feedstock: boolean;
}

export function certificateOf(entry: EntryHolderFacts, enteredAt: number): { valid: boolean; text: string | null } {
  const s = entry.source;
  if (s === null || s.certificateNo === null || s.certificateScheme === null) return { valid: false, text: null };
  const expires = s.certificateExpires;
  const valid = expires === null || expires.getTime() >= enteredAt;
  const until = expires === null ? "" : `, ${valid ? "valid to" : "expired"} ${expires.toISOString().slice(0, 10)}`;
  return { valid, text: `${s.certificateScheme} ${s.certificateNo}${until}` };
}

export function describeOrigin(
  state: LedgerState,
  facts: ReadonlyMap<number, EntryHolderFacts>,
  originId: number,
): OriginFacts {
  const pos = state.index.positionOf.get(originId);
  const move = pos === undefined ? undefined : state.index.moves[pos];
  const entryRef = move === undefined ? null : (state.ledger.refs.get(move.toHolderId) ?? null);
  const entry = move === undefined ? null : (facts.get(move.toHolderId) ?? null);
  const enteredAt = state.realAt.get(originId) ?? 0;
  const feedstock = entry !== null && (entry.kind === "PICKUP" || entry.kind === "LOT");
  if (entry === null || !feedstock)
    return {
      originId,
      enteredAt,
      entry,
      entryRef,
      certification: "NOT_FEEDSTOCK",
      certificate: null,
      feedstock: false,
    };
  const cert = certificateOf(entry, enteredAt);
  const lotCertified = entry.lot?.certified ?? false;
  const certification: CertificationStatus = lotCertified
    ? cert.valid
      ? "CERTIFIED"
      : "LOT_ONLY"
    : cert.valid
      ? "SOURCE_ONLY"
      : "NOT_CERTIFIED";
  return { originId, enteredAt, entry, entryRef, certification, certificate: cert.text, feedstock: true };
}

export function originRow(o: OriginFacts, grams: number, totalG: number): OriginRow {
  const e = o.entry;
  return {
    originId: o.originId,
    enteredAt: new Date(o.enteredAt),
    entryHolder: o.entryRef,
    pickupCode: e?.pickup?.code ?? null,
    lotCode: e?.lot?.code ?? null,
    sourceCode: e?.source?.code ?? null,
    sourceName: e?.source?.name ?? null,
    materialKind: e?.material ?? null,
    certification: o.certification,
    certificate: o.certificate,
    grams,
    pct: totalG === 0 ? 0 : (grams * 100) / totalG,
  };
}

type RowFacts = Omit<ContributionRow, "key" | "grams" | "pct" | "origins">;
const NO_FACTS: RowFacts = {
  label: "",
  materialKind: null,
  certification: null,
  lotCertified: null,
  certificate: null,
  lotCode: null,
  sourceCode: null,
};

/** Groups a composition with groupOrigins; grams are sums of integer origin grams, so every table adds up to the total. */
export function groupRows(
  composition: TraceComposition,
  info: ReadonlyMap<number, OriginFacts>,
  keyOf: (o: OriginFacts) => string,
  describe: (key: string, sample: OriginFacts) => Partial<RowFacts>,
): ContributionRow[] {
  const sample = new Map<string, OriginFacts>();
  const groups = groupOrigins(
    composition,
    () => undefined,
    (_info, originId) => {
      const o = info.get(originId);
      invariant(o !== undefined, `origin ${originId} is described`);
      const key = keyOf(o);
      if (!sample.has(key)) sample.set(key, o);
      return key;
    },
  );
  return groups.map((g) => {
    const key = String(g.key);
    const s = sample.get(key);
    invariant(s !== undefined, `group ${key} has a sample origin`);
    return { key, ...NO_FACTS, ...describe(key, s), grams: g.grams, pct: g.pct, origins: g.originIds.length };
  });
}

export function buildTables(composition: TraceComposition, info: ReadonlyMap<number, OriginFacts>): ContributionTables {
  const entryLabel = (o: OriginFacts) =>
    o.entry ? `${labelOf(o.entry.kind)} ${o.entry.code}` : `origin ${o.originId}`;
  return {
    totalG: composition.totalG,
    byLot: groupRows(
      composition,
      info,
      (o) => o.entry?.lot?.code ?? entryLabel(o),
      (key, o) => {
        const lot = o.entry?.lot ?? null;
        return lot === null
          ? {
              label: o.entry?.reagent
                ? `${labelOf(o.entry.reagent.reagent)} (reagent lot)`
                : "Not received as a feedstock lot",
              materialKind: o.entry?.material ?? null,
            }
          : {
              label: `${labelOf(lot.material)}, ${lot.origin === "DELIVERY" ? "delivered" : "from pickups"}`,
              materialKind: lot.material,
              lotCertified: lot.certified,
              lotCode: key,
            };
      },
    ),
    byPickup: groupRows(
      composition,
      info,
      (o) =>
        o.entry?.pickup?.code ??
        (o.entry?.lot
          ? `${o.entry.lot.code}: ${o.entry.lot.origin === "DELIVERY" ? "delivery" : "receiving difference"}`
          : entryLabel(o)),
      (_key, o) => ({
        label: o.entry?.pickup
          ? (o.entry.source?.name ?? "")
          : o.entry?.lot?.origin === "DELIVERY"
            ? `Delivered by ${o.entry.source?.name ?? "a supplier"}`
            : o.entry?.lot
              ? "Measured at the plant above the pickups' estimate"
              : "Not a pickup",
        materialKind: o.entry?.material ?? null,
        certification: o.certification,
        certificate: o.certificate,
        lotCode: o.entry?.lot?.code ?? null,
        sourceCode: o.entry?.source?.code ?? null,
      }),
    ),
    bySource: groupRows(
      composition,
      info,
      (o) => o.entry?.source?.code ?? (o.entry?.lot ? "(receiving difference)" : entryLabel(o)),
      (_key, o) => ({
        label: o.entry?.source
          ? `${o.entry.source.name} (${labelOf(o.entry.source.kind).toLowerCase()})`
          : o.entry?.lot
            ? "Measured surplus at receiving, no source"
            : "Not from a source",
        materialKind: o.entry?.material ?? null,
        certificate: o.certificate,
        sourceCode: o.entry?.source?.code ?? null,
      }),
    ),
    byMaterial: groupRows(
      composition,
      info,
      (o) => o.entry?.material ?? "UNKNOWN",
      (key) => ({ label: labelOf(key), materialKind: key }),
    ),
    byCertification: groupRows(
      composition,
      info,
      (o) => o.certification,
      (key) => ({ label: CERTIFICATION_LABELS[key as CertificationStatus], certification: key as CertificationStatus }),
    ),
  };
}
