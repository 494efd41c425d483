// GS1 Application Identifier (10), batch or lot number: up to 20 characters from the GS1 AI encodable
// character set 82 (GS1 General Specifications, AI (10) and Figure 7.11-1).
import type { Result } from "@/lib/errors";
import { fail, ok } from "@/lib/errors";

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
  if (chars.length > MAX_LOT_LENGTH) return fail("GS1.TOO_LONG", `Lot number ${lot} has ${chars.length} characters; GS1 AI (10) allows at most ${MAX_LOT_LENGTH}`, field);
  const bad = chars.findIndex((c) => !SET_82.has(c));
  if (bad >= 0) {
    const c = chars[bad] ?? "";
    const shown = c === " " ? "a space" : `"${c}"`;
    return fail("GS1.CHARACTER", `Lot number ${lot}: ${shown} at position ${bad + 1} is not in GS1 character set 82`, field);
  }
  return ok({ elementString: `(${AI_BATCH_LOT})${lot}`, lot });
}
