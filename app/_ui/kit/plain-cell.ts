// A table cell as plain values, for lists whose rows are drawn by PlainRows: a string, or a few parts,
// each a string, a link (kept within the app) or a marked span (a status, a tag, a date kept on one line).
import { labelOf } from "@/lib/core/vocabulary";

export type PlainCellPart = string | { text: string; href?: string; className?: string; label?: string };
export type PlainCell = string | readonly PlainCellPart[];

/** A record's code linking to its page (CodeLink's plain form). */
export function codePart(href: string, code: string): PlainCellPart {
  return { text: code, href, className: "code" };
}

/** A state's label in its family's colour (Status's plain form). */
export function statusPart(code: string): PlainCellPart {
  return { text: labelOf(code), className: `status status-${code.toLowerCase()}` };
}

/** The link to a record's change history (HistoryLink's plain form). */
export function historyPart(kind: string, recordKey: string, label: string): PlainCellPart {
  return {
    text: "History",
    href: `/history?${new URLSearchParams({ kind, key: recordKey }).toString()}`,
    className: "history-link",
    label: `History of ${label} ${recordKey}`,
  };
}
