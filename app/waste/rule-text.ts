// How a rule value's source and certainty read on screen: the regulation paragraph and a plain mark of
// how far to rely on it. Recall notes kept in lib/waste for engineers stay off the screens.

const RECALL = /from memory/i;

/** The paragraph cited, without the engineers' recall notes in brackets. */
export function plainSource(source: string): string {
  if (!RECALL.test(source)) return source;
  const cut = source.indexOf(" (");
  return cut > 0 ? source.slice(0, cut) : source.replace(/,?\s*from memory[^;)]*/gi, "");
}

/** "published" only for values checked against the published text. */
export function confidenceOf(status: string): "published" | "check" {
  return /^verified\b/i.test(status) ? "published" : "check";
}

/** The certainty note when it is worth showing a worker (not a recall note). */
export function plainStatus(status: string): string {
  return RECALL.test(status) || /^(partly )?verified\b/i.test(status) ? "" : status;
}
