import type { HolderKind } from "@/lib/core/vocabulary";

/** Where a holder's own page is; null for holders with none (losses, reagent lots). */
export function hrefOf(kind: HolderKind, code: string): string | null {
  const c = encodeURIComponent(code);
  switch (kind) {
    case "PICKUP":
      return `/pickups/${c}`;
    case "LOT":
      return `/lots/${c}`;
    case "TANK":
      return `/tanks/${c}`;
    case "BATCH":
      return `/batches/${c}`;
    case "PRODUCT_LOT":
      return `/products/${c}`;
    case "SHIPMENT":
      return `/shipments/${c}`;
    case "WASTE_CONTAINER":
      return `/waste/${c}`;
    case "DISPOSAL":
      return `/waste#${c}`;
    default:
      return null;
  }
}

/** Route params arrive URL-encoded or not depending on the path; codes never contain "%", so decoding twice is harmless. */
export function codeParam(raw: string): string {
  try {
    return decodeURIComponent(raw);
  } catch {
    return raw;
  }
}

/** A page's query as the router hands it over: a name may come once, several times, or not at all. */
export type SearchParams = Record<string, string | string[] | undefined>;

/** The first value given for a query name, as typed; "" when it is not given. */
export function queryValue(v: string | string[] | undefined): string {
  return (Array.isArray(v) ? v[0] : v) ?? "";
}

export const PAGE_SIZE = 50;

export function pageParam(raw: string | string[] | undefined): number {
  const text = Array.isArray(raw) ? raw[0] : raw;
  const n = Number.parseInt(text ?? "1", 10);
  return Number.isFinite(n) && n >= 1 ? n : 1;
}
