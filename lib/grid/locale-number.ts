// Numbers as people type them in spreadsheets: thousands separators and decimal commas per locale.
// Separators per locale come from Unicode CLDR through Intl.NumberFormat (decimal and group symbols).
import type { Result } from "@/lib/core/result";
import { fail, ok } from "@/lib/core/result";

export interface NumberStyle {
  decimal: "." | ",";
  /** Characters accepted as thousands separators for this style. */
  groups: readonly string[];
}

const SPACES = [" ", "\u00a0", "\u202f"];

/** The decimal and group symbols CLDR gives a locale ("en" → "." and ","; "de" → "," and "."; "fr" → "," and U+202F). */
export function numberStyleFor(locale: string): NumberStyle {
  let parts: Intl.NumberFormatPart[];
  try {
    parts = new Intl.NumberFormat(locale).formatToParts(12345.5);
  } catch {
    parts = new Intl.NumberFormat("en").formatToParts(12345.5);
  }
  const decimal = parts.find((p) => p.type === "decimal")?.value === "," ? "," : ".";
  const group = parts.find((p) => p.type === "group")?.value ?? (decimal === "," ? "." : ",");
  const groups = [...new Set([group, ...SPACES, ...(group === "'" || group === "’" ? ["'", "’"] : [])])].filter(
    (g) => g !== decimal,
  );
  return { decimal, groups };
}

const escape = (s: string) => s.replace(/[.*+?^${}()|[\]\\]/g, "\\$&");

/**
 * Parses a typed or pasted number under a locale's style. Grouping must be in threes ("1.234,5" in de,
 * "1,234.5" in en); "1,5" in en is refused rather than read as 15, because a silent misreading is worse
 * than a question. A lone separator after 1–3 digits that could be either reading is decided by the style.
 */
export function parseLocaleNumber(raw: string, style: NumberStyle, field?: string): Result<number> {
  const text = raw
    .trim()
    .replace(/\u2212/g, "-")
    .replace(/^\+/, "");
  if (text === "") return fail("INPUT.EMPTY", "no number given", field);
  const g = style.groups.map(escape).join("|");
  const d = escape(style.decimal);
  const grouped = new RegExp(`^-?\\d{1,3}(?:(?:${g})\\d{3})+(?:${d}\\d+)?$`);
  const plain = new RegExp(`^-?\\d*(?:${d}\\d+)?$`);
  const scientific = /^-?\d+(?:\.\d+)?[eE][-+]?\d+$/;
  let normal: string | null = null;
  if (plain.test(text) && /\d/.test(text)) normal = text.replace(style.decimal, ".");
  else if (grouped.test(text)) normal = text.replace(new RegExp(g, "g"), "").replace(style.decimal, ".");
  else if (scientific.test(text)) normal = text;
  if (normal === null) {
    const other = style.decimal === "," ? "." : ",";
    const hint = text.includes(other) ? ` (this sheet uses "${style.decimal}" for decimals)` : "";
    return fail("INPUT.NOT_A_NUMBER", `"${raw.trim()}" is not a number${hint}`, field);
  }
  const value = Number(normal);
  return Number.isFinite(value)
    ? ok(value)
    : fail("INPUT.NOT_A_NUMBER", `"${raw.trim()}" is not a finite number`, field);
}
