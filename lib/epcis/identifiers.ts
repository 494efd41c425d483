// Identifiers for EPCIS events: GS1 forms when the plant has a GS1 Company Prefix, otherwise the
// site's own HTTP URIs (docs/decisions/0034-epcis-identifiers.md).
import { CHARACTER_SET_82, GS1_PREFIX_MAX_DIGITS, GS1_PREFIX_MIN_DIGITS, MAX_LOT_LENGTH } from "@/lib/labels/gs1";

/**
 * Item references the site uses under its prefix, one per material class. The plant registers these
 * numbers under its prefix (or changes this table before it exports with GS1 identifiers).
 */
export const ITEM_REFERENCES: Readonly<Record<string, number>> = {
  USED_COOKING_OIL: 1,
  YELLOW_GREASE: 2,
  TRAP_GREASE: 3,
  TALLOW: 4,
  SOYBEAN: 5,
  CANOLA: 6,
  OTHER_OIL: 7,
  MIXED_FEEDSTOCK: 8,
  FAME: 20,
  GLYCEROL_PHASE: 21,
  WASH_WATER: 22,
  METHANOL: 30,
  NAOH: 31,
  KOH: 32,
  NAOME_SOLUTION: 33,
  KOME_SOLUTION: 34,
  H2SO4: 35,
  WATER: 36,
  FILTER_MEDIA: 40,
  METHANOL_RICH: 41,
  OTHER: 49,
};
/** Any material not in the table. */
export const OTHER_ITEM_REFERENCE = 99;

/** GS1 General Specifications §7.9.1, standard check digit calculation (weights 3,1,3,… from the right). */
export function gs1CheckDigit(digits: string): number {
  let sum = 0;
  for (let i = 0; i < digits.length; i++) {
    const d = Number(digits[digits.length - 1 - i]);
    sum += i % 2 === 0 ? d * 3 : d;
  }
  return (10 - (sum % 10)) % 10;
}

export function isGs1CompanyPrefix(prefix: string): boolean {
  return new RegExp(`^\\d{${GS1_PREFIX_MIN_DIGITS},${GS1_PREFIX_MAX_DIGITS}}$`).test(prefix);
}

function itemReference(prefix: string, material: string): string {
  const ref = ITEM_REFERENCES[material] ?? OTHER_ITEM_REFERENCE;
  return String(ref).padStart(12 - prefix.length, "0");
}

/** The GTIN-14 (indicator 0) of a material class under the prefix. */
export function gtinFor(prefix: string, material: string): string {
  const body = `0${prefix}${itemReference(prefix, material)}`;
  return body + String(gs1CheckDigit(body));
}

/** GS1 EPC Tag Data Standard: characters escaped in the URI form of an alphanumeric component. */
export function escapeEpcComponent(value: string): string {
  return value.replace(/["%&/<>?]/g, (c) => `%${c.charCodeAt(0).toString(16).toUpperCase().padStart(2, "0")}`);
}

function isGs1Alphanumeric(value: string): boolean {
  return (
    value.length > 0 && [...value].length <= MAX_LOT_LENGTH && [...value].every((c) => CHARACTER_SET_82.includes(c))
  );
}

export interface IdentifierScheme {
  /** A material class at lot level: what moved. */
  lotClass: (material: string, lot: string) => string;
  /** The plant, or a tank in it. */
  location: (tankCode?: string) => string;
  /** A supplier, collection source or customer. */
  party: (kind: "source" | "customer", code: string) => string;
  /** The site itself as the owning party. */
  site: () => string;
  /** A shipment document or a batch run. */
  document: (kind: "shipment" | "batch", code: string) => string;
}

function ownScheme(base: string, siteCode: string): IdentifierScheme {
  const root = `${base.replace(/\/+$/, "")}/id/${encodeURIComponent(siteCode)}`;
  const seg = (v: string) => encodeURIComponent(v);
  return {
    lotClass: (material, lot) => `${root}/class/${seg(material)}/${seg(lot)}`,
    location: (tankCode) => (tankCode === undefined ? `${root}/location` : `${root}/location/${seg(tankCode)}`),
    party: (kind, code) => `${root}/${kind}/${seg(code)}`,
    site: () => `${root}/party`,
    document: (kind, code) => `${root}/${kind}/${seg(code)}`,
  };
}

/**
 * With a prefix: LGTIN class URIs (EPC Tag Data Standard, urn:epc:class:lgtin) for lots and SGLN for the
 * plant (location reference 0, the site itself) and its tanks (GLN extension = tank code). Parties and
 * documents have no GS1 key on file here, so they keep the site's own URIs.
 */
function gs1Scheme(prefix: string, own: IdentifierScheme): IdentifierScheme {
  const locationRef = "0".repeat(12 - prefix.length);
  return {
    lotClass: (material, lot) => {
      if (!isGs1Alphanumeric(lot)) return own.lotClass(material, lot);
      const gtin = gtinFor(prefix, material);
      return `urn:epc:class:lgtin:${prefix}.${gtin.slice(0, 1)}${gtin.slice(1 + prefix.length, 13)}.${escapeEpcComponent(lot)}`;
    },
    location: (tankCode) =>
      tankCode === undefined || !isGs1Alphanumeric(tankCode)
        ? tankCode === undefined
          ? `urn:epc:id:sgln:${prefix}.${locationRef}.0`
          : own.location(tankCode)
        : `urn:epc:id:sgln:${prefix}.${locationRef}.${escapeEpcComponent(tankCode)}`,
    party: own.party,
    site: () => `urn:epc:id:pgln:${prefix}.${locationRef}`,
    document: own.document,
  };
}

export function identifierScheme(opts: {
  gs1CompanyPrefix: string | null;
  baseUri: string;
  siteCode: string;
}): IdentifierScheme {
  const own = ownScheme(opts.baseUri, opts.siteCode);
  return opts.gs1CompanyPrefix !== null && isGs1CompanyPrefix(opts.gs1CompanyPrefix)
    ? gs1Scheme(opts.gs1CompanyPrefix, own)
    : own;
}
