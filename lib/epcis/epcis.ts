// GS1 EPCIS 2.0 events (JSON-LD) built from the movement ledger: receipts, pickups and moves between
// holders as ObjectEvents with quantities in kg, batches as TransformationEvents (inputs → outputs).
// Pure: the ledger, identifiers, period and creation time come in as arguments.
import { BATCH_OUTPUT_ROLES } from "@/lib/core/vocabulary";
import type { HolderKind, MoveRole } from "@/lib/core/vocabulary";
import type { IdentifierScheme } from "@/lib/epcis/identifiers";

export const EPCIS_CONTEXT = "https://ref.gs1.org/standards/epcis/2.0.0/epcis-context.jsonld";
/** UN/CEFACT Recommendation 20 common code for kilogram. */
export const UOM_KG = "KGM";

export interface EpcisHolder {
  id: number;
  kind: HolderKind;
  code: string;
  /** What the holder carries, e.g. USED_COOKING_OIL, FAME, METHANOL; null when unknown. */
  material: string | null;
  /** Pickups and supplier deliveries: the source or supplier code. */
  sourceCode?: string | null;
  /** Shipments: the customer's code, when it may be shown. */
  customerCode?: string | null;
}

export interface EpcisMove {
  id: number;
  at: number;
  fromHolderId: number | null;
  toHolderId: number;
  massG: number;
  role: MoveRole;
}

export interface QuantityElement {
  epcClass: string;
  quantity: number;
  uom: typeof UOM_KG;
}

interface Party {
  type: "owning_party" | "location";
  [key: string]: string;
}

export interface EpcisEvent {
  type: "ObjectEvent" | "TransformationEvent";
  eventID: string;
  eventTime: string;
  eventTimeZoneOffset: string;
  action?: "OBSERVE";
  quantityList?: QuantityElement[];
  inputQuantityList?: QuantityElement[];
  outputQuantityList?: QuantityElement[];
  transformationID?: string;
  bizStep: string;
  disposition?: string;
  readPoint: { id: string };
  bizLocation: { id: string };
  bizTransactionList?: Array<{ type: string; bizTransaction: string }>;
  sourceList?: Party[];
  destinationList?: Party[];
}

export interface EpcisDocument {
  "@context": string[];
  type: "EPCISDocument";
  schemaVersion: "2.0";
  creationDate: string;
  epcisBody: { eventList: EpcisEvent[] };
}

export interface EpcisInput {
  holders: readonly EpcisHolder[];
  moves: readonly EpcisMove[];
  ids: IdentifierScheme;
  /** Base for event ids (a URI); each event id is `${eventBase}/${kind}/${n}`. */
  eventBase: string;
  /** Events whose time falls in [startMs, endMs); omitted = all. */
  period?: { startMs: number; endMs: number };
  /** Only movements between these holders (a trace answer); omitted = all. */
  scope?: ReadonlySet<number>;
  /** The site's UTC offset in minutes at each event time. */
  offsetMin: (atMs: number) => number;
  createdAt: Date;
}

const OUTPUT_ROLES: ReadonlySet<MoveRole> = new Set(BATCH_OUTPUT_ROLES);
const OUTPUT_MATERIAL: Partial<Record<MoveRole, string>> = {
  ESTER: "FAME",
  GLYCEROL_PHASE: "GLYCEROL_PHASE",
  WASH_WATER: "WASH_WATER",
  RECOVERED_METHANOL: "METHANOL",
};

/** EPCIS eventTimeZoneOffset: "+hh:mm" or "-hh:mm". */
export function formatOffset(offsetMin: number): string {
  const sign = offsetMin < 0 ? "-" : "+";
  const abs = Math.abs(offsetMin);
  return `${sign}${String(Math.floor(abs / 60)).padStart(2, "0")}:${String(abs % 60).padStart(2, "0")}`;
}

/** Grams to kg as an exact decimal of at most three places. */
export function kgOf(grams: number): number {
  return Math.round(grams) / 1000;
}

function classOf(h: EpcisHolder, ids: IdentifierScheme): string {
  return ids.lotClass(h.material ?? "OTHER", h.code);
}

function locationOf(h: EpcisHolder | undefined, ids: IdentifierScheme): string {
  return h?.kind === "TANK" ? ids.location(h.code) : ids.location();
}

/** Adds quantities of the same class (the same lot charged twice) in whole grams, then to kg. */
function mergeQuantities(parts: ReadonlyArray<{ epcClass: string; grams: number }>): QuantityElement[] {
  const grams = new Map<string, number>();
  for (const p of parts) grams.set(p.epcClass, (grams.get(p.epcClass) ?? 0) + p.grams);
  return [...grams].map(([epcClass, g]) => ({ epcClass, quantity: kgOf(g), uom: UOM_KG }));
}

function bizStepOf(from: EpcisHolder | undefined, to: EpcisHolder): string {
  if (from === undefined) return to.kind === "PICKUP" ? "collecting" : "receiving";
  if (from.kind === "PICKUP") return "receiving";
  if (to.kind === "SHIPMENT") return "shipping";
  if (to.kind === "DISPOSAL") return "destroying";
  if (to.kind === "LOSS") return "removing";
  return "storing";
}

function moveEvent(m: EpcisMove, holders: ReadonlyMap<number, EpcisHolder>, input: EpcisInput): EpcisEvent | null {
  const ids = input.ids;
  const to = holders.get(m.toHolderId);
  const from = m.fromHolderId === null ? undefined : holders.get(m.fromHolderId);
  if (to === undefined || (m.fromHolderId !== null && from === undefined)) return null;
  // Material is named by the lot it arrives as (receipts, pickups pooled into a lot) or it leaves.
  const named = from === undefined || from.kind === "PICKUP" ? to : from;
  const event: EpcisEvent = {
    type: "ObjectEvent",
    eventID: `${input.eventBase}/move/${m.id}`,
    eventTime: new Date(m.at).toISOString(),
    eventTimeZoneOffset: formatOffset(input.offsetMin(m.at)),
    action: "OBSERVE",
    quantityList: [{ epcClass: classOf(named, ids), quantity: kgOf(m.massG), uom: UOM_KG }],
    bizStep: bizStepOf(from, to),
    readPoint: { id: locationOf(to.kind === "TANK" ? to : from, ids) },
    bizLocation: { id: ids.location() },
  };
  const origin = from?.kind === "PICKUP" ? from : to;
  if ((from === undefined || from.kind === "PICKUP") && origin.sourceCode) {
    event.sourceList = [{ type: "owning_party", source: ids.party("source", origin.sourceCode) }];
    event.destinationList = [{ type: "owning_party", destination: ids.site() }];
  } else if (from !== undefined && to.kind === "SHIPMENT") {
    event.bizTransactionList = [{ type: "bol", bizTransaction: ids.document("shipment", to.code) }];
    event.sourceList = [{ type: "owning_party", source: ids.site() }];
    if (to.customerCode)
      event.destinationList = [{ type: "owning_party", destination: ids.party("customer", to.customerCode) }];
  } else if (from !== undefined) {
    event.sourceList = [{ type: "location", source: locationOf(from, ids) }];
    event.destinationList = [{ type: "location", destination: locationOf(to, ids) }];
  }
  return event;
}

function batchEvent(
  batch: EpcisHolder,
  moves: readonly EpcisMove[],
  holders: ReadonlyMap<number, EpcisHolder>,
  input: EpcisInput,
): EpcisEvent | null {
  const ids = input.ids;
  const inputs = moves.filter((m) => m.toHolderId === batch.id);
  const outputs = moves.filter((m) => m.fromHolderId === batch.id && OUTPUT_ROLES.has(m.role) && m.role !== "LOSS");
  if (outputs.length === 0) return null; // still running: it appears once something comes out of it
  const at = Math.max(...moves.map((m) => m.at));
  const inputParts = inputs.map((m) => {
    const from = m.fromHolderId === null ? undefined : holders.get(m.fromHolderId);
    return { epcClass: from ? classOf(from, ids) : ids.lotClass("OTHER", batch.code), grams: m.massG };
  });
  const outputParts = outputs.map((m) => {
    const to = holders.get(m.toHolderId);
    const lot = to?.kind === "PRODUCT_LOT" ? to.code : batch.code;
    return { epcClass: ids.lotClass(OUTPUT_MATERIAL[m.role] ?? "OTHER", lot), grams: m.massG };
  });
  return {
    type: "TransformationEvent",
    eventID: `${input.eventBase}/batch/${encodeURIComponent(batch.code)}`,
    eventTime: new Date(at).toISOString(),
    eventTimeZoneOffset: formatOffset(input.offsetMin(at)),
    inputQuantityList: mergeQuantities(inputParts),
    outputQuantityList: mergeQuantities(outputParts),
    transformationID: ids.document("batch", batch.code),
    bizStep: "commissioning",
    disposition: "in_progress",
    readPoint: { id: ids.location() },
    bizLocation: { id: ids.location() },
  };
}

function inPeriod(atMs: number, period: EpcisInput["period"]): boolean {
  return period === undefined || (atMs >= period.startMs && atMs < period.endMs);
}

/** The EPCIS 2.0 document for the ledger, in event-time order. */
export function buildEpcisDocument(input: EpcisInput): EpcisDocument {
  const holders = new Map(input.holders.map((h) => [h.id, h]));
  const inScope = (id: number | null) => id === null || input.scope === undefined || input.scope.has(id);
  const byBatch = new Map<number, EpcisMove[]>();
  const events: EpcisEvent[] = [];
  for (const m of input.moves) {
    const batchId =
      holders.get(m.toHolderId)?.kind === "BATCH"
        ? m.toHolderId
        : m.fromHolderId !== null && holders.get(m.fromHolderId)?.kind === "BATCH"
          ? m.fromHolderId
          : null;
    if (batchId !== null) {
      const list = byBatch.get(batchId) ?? [];
      list.push(m);
      byBatch.set(batchId, list);
      continue;
    }
    if (!inScope(m.toHolderId) || !inScope(m.fromHolderId) || !inPeriod(m.at, input.period)) continue;
    const e = moveEvent(m, holders, input);
    if (e) events.push(e);
  }
  for (const [batchId, moves] of byBatch) {
    const batch = holders.get(batchId);
    if (batch === undefined || !inScope(batchId)) continue;
    const e = batchEvent(batch, moves, holders, input);
    if (e && inPeriod(Date.parse(e.eventTime), input.period)) events.push(e);
  }
  events.sort((a, b) => a.eventTime.localeCompare(b.eventTime) || a.eventID.localeCompare(b.eventID));
  return {
    "@context": [EPCIS_CONTEXT],
    type: "EPCISDocument",
    schemaVersion: "2.0",
    creationDate: input.createdAt.toISOString(),
    epcisBody: { eventList: events },
  };
}
