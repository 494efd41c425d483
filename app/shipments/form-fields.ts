// Field names of the shipment form, shared by the form (client) and its server action. Pure.
import { MAX_SHIPMENT_LINES } from "@/lib/shipment/shipment.schema";

export const SHIPMENT_FIELDS = [
  "documentNo",
  "customerCode",
  "shippedAt",
  "vehicle",
  "compartment",
  "certifiedClaim",
  "note",
] as const;

/** Line n's fields (1-based): where from (kind, code), quantity, unit, temperature. */
export function lineFieldNames(n: number): [kind: string, code: string, qty: string, unit: string, temp: string] {
  return [`line${n}Kind`, `line${n}Code`, `line${n}Qty`, `line${n}Unit`, `line${n}Temp`];
}

/** How many lines the form posted (1 to the most a shipment may have). */
export function lineCountOf(text: string): number {
  const n = Number.parseInt(text, 10);
  return Number.isFinite(n) ? Math.min(Math.max(n, 1), MAX_SHIPMENT_LINES) : 1;
}

/** A service field path ("lines.1.massKg") → the form field it belongs to ("line2Qty"). */
export function formFieldOf(path: string): string {
  const m = /^lines\.(\d+)\.(\w+)$/.exec(path);
  if (!m) return path;
  const n = Number(m[1]) + 1;
  const [kind, code, qty, , temp] = lineFieldNames(n);
  switch (m[2]) {
    case "fromKind":
      return kind;
    case "fromCode":
      return code;
    case "tempC":
      return temp;
    default:
      return qty;
  }
}
