// Which audit entities make up the history of one record as staff see it, and the field-by-field
// view of a change. Pure: no database, no clock.

/** A record page and the audit entities stored under its key (a lot's titrations and lab tests are part of its story). */
export const RECORD_HISTORIES = {
  source: { label: "Source", entities: ["Source"] },
  pickup: { label: "Pickup", entities: ["Pickup"] },
  lot: { label: "Feedstock lot", entities: ["FeedstockLot", "Titration", "LabTest"] },
  tank: { label: "Tank", entities: ["Tank", "TankGauge"] },
  batch: { label: "Batch", entities: ["Batch"] },
  reagent: { label: "Reagent lot", entities: ["ReagentLot"] },
  product: { label: "Product lot", entities: ["ProductLot", "QcResult"] },
  shipment: { label: "Shipment", entities: ["Shipment"] },
  customer: { label: "Customer", entities: ["Customer"] },
  waste: { label: "Waste container", entities: ["WasteContainer"] },
  disposal: { label: "Disposal", entities: ["Disposal"] },
  period: { label: "Accounting period", entities: ["AccountingPeriod"] },
  movement: { label: "Movement", entities: ["Movement"] },
  user: { label: "Account", entities: ["User"] },
} as const satisfies Record<string, { label: string; entities: readonly string[] }>;

export type RecordHistoryKind = keyof typeof RECORD_HISTORIES;

export function isRecordHistoryKind(v: string): v is RecordHistoryKind {
  return Object.hasOwn(RECORD_HISTORIES, v);
}

export interface FieldChange {
  field: string;
  before: string | null;
  after: string | null;
}

function parseJson(text: string): unknown {
  if (text === "") return undefined;
  try {
    return JSON.parse(text) as unknown;
  } catch {
    return text;
  }
}

function show(v: unknown): string | null {
  if (v === undefined) return null;
  if (v === null) return "—";
  if (typeof v === "string") return v;
  if (typeof v === "number" || typeof v === "boolean") return String(v);
  return JSON.stringify(v);
}

/** Flattens nested objects to dotted paths so a change deep inside shows as its own line. */
function flatten(v: unknown, prefix = "", out = new Map<string, unknown>()): Map<string, unknown> {
  if (v !== null && typeof v === "object" && !Array.isArray(v)) {
    for (const [k, x] of Object.entries(v as Record<string, unknown>))
      flatten(x, prefix === "" ? k : `${prefix}.${k}`, out);
  } else if (prefix !== "") {
    out.set(prefix, v);
  } else if (v !== undefined) {
    out.set("value", v);
  }
  return out;
}

/**
 * The fields of an audit event as before → after lines: every field of a creation, only the fields
 * that differ for a change (a field present on one side only shows the other side as empty).
 */
export function describeChange(beforeJson: string, afterJson: string): FieldChange[] {
  const before = flatten(parseJson(beforeJson));
  const after = flatten(parseJson(afterJson));
  const fields = [...new Set([...before.keys(), ...after.keys()])];
  const rows: FieldChange[] = [];
  for (const field of fields) {
    const b = show(before.get(field));
    const a = show(after.get(field));
    if (before.size > 0 && b === a) continue;
    rows.push({ field, before: b, after: a });
  }
  return rows;
}
