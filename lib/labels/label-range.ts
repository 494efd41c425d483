// Container label numbers for a printed sheet: a prefix and a run of zero-padded numbers.
import type { Result } from "@/lib/core/result";
import { fail, ok } from "@/lib/core/result";
import { CODE_PATTERN } from "@/lib/core/fields";

export const MAX_LABELS_PER_SHEET = 120;

export function containerRange(prefix: string, from: number, to: number, width = 4): Result<string[]> {
  const p = prefix.trim().toUpperCase();
  if (!Number.isInteger(from) || from < 0) return fail("INPUT.INVALID", "From: a whole number, 0 or more", "from");
  if (!Number.isInteger(to) || to < from) return fail("INPUT.INVALID", "To: a whole number not below From", "to");
  if (to - from + 1 > MAX_LABELS_PER_SHEET)
    return fail("INPUT.INVALID", `At most ${MAX_LABELS_PER_SHEET} labels per sheet`, "to");
  const tags: string[] = [];
  for (let n = from; n <= to; n++) {
    const tag = `${p}${String(n).padStart(width, "0")}`;
    if (!CODE_PATTERN.test(tag))
      return fail(
        "INPUT.INVALID",
        `Prefix: ${tag} is not a valid label (letters, digits, ".", "_", "/", "-"; at most 40)`,
        "prefix",
      );
    tags.push(tag);
  }
  return ok(tags);
}

/** A scanned or typed label: a URL of this app, a GS1 element string "(10)…", or a plain number. */
export function readScanned(text: string, ownOrigin: string): { path: string } | { code: string } | null {
  const t = text.trim();
  if (t === "") return null;
  try {
    const u = new URL(t);
    if (u.origin === ownOrigin) return { path: u.pathname + u.search };
    return null;
  } catch {
    /* not a URL */
  }
  const gs1 = /^\(10\)(.+)$/.exec(t);
  return { code: (gs1?.[1] ?? t).trim().toUpperCase() };
}
