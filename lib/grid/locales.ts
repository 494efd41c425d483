// The number and date styles offered for typing and pasting (separators and day/month order from CLDR via Intl).
export const LOCALES: ReadonlyArray<readonly [string, string]> = [
  ["en-US", "1,234.5 and 3/1/2026 (month first)"],
  ["en-GB", "1,234.5 and 01/03/2026 (day first)"],
  ["de-DE", "1.234,5 and 01.03.2026"],
  ["fr-FR", "1 234,5 and 01/03/2026"],
];

/** The browser's first language among the offered styles; British English (day first) otherwise. */
export function pickLocale(acceptLanguage: string): string {
  const wanted = acceptLanguage.split(",").map((s) => s.split(";")[0]?.trim().toLowerCase() ?? "");
  for (const w of wanted) {
    const exact = LOCALES.find(([k]) => k.toLowerCase() === w);
    if (exact) return exact[0];
    const lang = LOCALES.find(([k]) => k.slice(0, 2).toLowerCase() === w.slice(0, 2));
    if (lang) return lang[0];
  }
  return "en-GB";
}
