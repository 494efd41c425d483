// GS1 Application Identifier (10), batch or lot number: up to 20 characters from the GS1 AI encodable
// character set 82 (GS1 General Specifications, AI (10) and Figure 7.11-1).
import type { Result } from "@/lib/core/result";
import { fail, ok } from "@/lib/core/result";

export const AI_BATCH_LOT = "10";
/** GS1 General Specifications, AI (10): format N2+X..20. */
export const MAX_LOT_LENGTH = 20;

/** GS1 General Specifications, Figure 7.11-1: the 82 characters allowed in AI data fields. */
export const CHARACTER_SET_82 = "!\"%&'()*+,-./0123456789:;<=>?ABCDEFGHIJKLMNOPQRSTUVWXYZ_abcdefghijklmnopqrstuvwxyz";
const SET_82 = new Set(CHARACTER_SET_82);

export interface Gs1Lot {
  /** Human-readable element string with the AI in brackets, as printed under a barcode: "(10)L-0042". */
  elementString: string;
  /** The lot as carried in the data field, after AI 10. */
  lot: string;
}

/** Checks a lot number against AI (10) and returns its element string, or says which rule it breaks. */
export function gs1LotElement(lot: string, field = "lot"): Result<Gs1Lot> {
  if (lot.length === 0) return fail("GS1.EMPTY", "Lot number is empty; AI (10) needs at least one character", field);
  const chars = [...lot];
  if (chars.length > MAX_LOT_LENGTH)
    return fail(
      "GS1.TOO_LONG",
      `Lot number ${lot} has ${chars.length} characters; GS1 AI (10) allows at most ${MAX_LOT_LENGTH}`,
      field,
    );
  const bad = chars.findIndex((c) => !SET_82.has(c));
  if (bad >= 0) {
    const c = chars[bad] ?? "";
    const shown = c === " " ? "a space" : `"${c}"`;
    return fail(
      "GS1.CHARACTER",
      `Lot number ${lot}: ${shown} at position ${bad + 1} is not in GS1 character set 82`,
      field,
    );
  }
  return ok({ elementString: `(${AI_BATCH_LOT})${lot}`, lot });
}

/** GS1 General Specifications, AI (01): a GTIN-14, 14 digits. */
const GTIN14 = /^\d{14}$/;

/**
 * The element string a lot label's GS1 symbol carries: "(01)<GTIN>(10)<lot>" when the plant has a
 * GTIN for the material (AI (10) is to be used with a GTIN — GS1 General Specifications §4.14,
 * mandatory associations, from memory for the clause), else "(10)<lot>" alone.
 */
export function gs1LabelElementString(
  lot: string,
  gtin: string | null,
): Result<{ elementString: string; withGtin: boolean }> {
  const element = gs1LotElement(lot);
  if (!element.ok) return element;
  if (gtin !== null && !GTIN14.test(gtin)) return fail("GS1.GTIN", `GTIN ${gtin} must be 14 digits`, "gtin");
  return ok({
    elementString: gtin === null ? element.value.elementString : `(01)${gtin}${element.value.elementString}`,
    withGtin: gtin !== null,
  });
}

/** Digits of a GS1 Company Prefix we accept: the item reference keeps at least two digits (GTIN-13 structure). */
export const GS1_PREFIX_MIN_DIGITS = 6;
export const GS1_PREFIX_MAX_DIGITS = 10;
