// How a default's source and certainty read on a screen: one function pair for every page (waste rules,
// recipe defaults, specification limits, the references page). Source texts written for engineers carry
// notes about how they were checked ("from memory"); a screen shows "to be confirmed" instead.

/** How far a default can be relied on, in the words a screen uses. */
export type SourceLevel = "published" | "common practice" | "site choice" | "check";

/** Status words in the lib → the screen's levels; anything not plainly verified is to be checked. */
export function levelOf(status: string): SourceLevel {
  const s = status.toLowerCase();
  if (s.includes("site's own choice")) return "site choice";
  if (s.includes("common practice")) return "common practice";
  if (s.startsWith("verified") || s === "computed") return "published";
  return "check";
}

/** The source as a worker reads it: recall notes become "to be confirmed", engineers' fill words go. */
export function screenText(text: string): string {
  return text
    .replace(/,?\s*from memory(, unverified)?/gi, ", to be confirmed")
    .replace(/^, /, "")
    .replace(/\(\s*, /g, "(")
    .replace(/placeholder;?\s*/gi, "");
}

/** The certainty note worth showing beside a value: none for published values or recall notes. */
export function statusNote(status: string): string {
  return /from memory/i.test(status) || /^(partly )?verified\b/i.test(status) ? "" : status;
}
