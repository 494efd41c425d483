"use client";
// The draft grid's keyboard and clipboard commands: undo and redo, Shift+arrow selection, Ctrl+D fill-down,
// Delete, Ctrl+C of a rectangle, and paste of a tab-separated block. What each changes is worked out by
// lib/grid/drafts.ts; here it is applied, recorded for undo and told to the user.
import type {
  ClipboardEvent as ReactClipboardEvent,
  KeyboardEvent as ReactKeyboardEvent,
  MutableRefObject,
} from "react";
import type { GridApi } from "ag-grid-community";
import type { UnitSystem } from "@/lib/quantity/units";
import type { GridColumn, GridTable } from "@/lib/grid/tables";
import { readSheet } from "@/lib/grid/sheet";
import type { CellChange } from "@/lib/grid/undo";
import type { CellPos, CellRange } from "@/lib/grid/selection";
import { cellCount, extend, rangeOf } from "@/lib/grid/selection";
import type { DraftRow } from "@/lib/grid/drafts";
import { clearChanges, copyText, fillDownChanges, pasteChanges, pasteTargets } from "@/lib/grid/drafts";

export interface Selection {
  anchor: CellPos;
  corner: CellPos;
}

export interface DraftCommands {
  api: GridApi | null;
  rows: DraftRow[];
  table: GridTable;
  system: UnitSystem;
  locale: string;
  entry: ReadonlySet<string>;
  sel: MutableRefObject<Selection | null>;
  /** The selection was set by a click whose focus the grid may not have reported yet. */
  setByMouse: MutableRefObject<boolean>;
  columns: () => string[];
  focused: () => CellPos | null;
  refreshSelection: () => void;
  blank: () => DraftRow;
  change: (label: string, changes: CellChange[], addedRows?: string[], base?: DraftRow[]) => void;
  doUndo: () => void;
  doRedo: () => void;
  onStatus: (s: string) => void;
  onPasted: (refs: string[]) => void;
}

const plural = (n: number) => (n === 1 ? "" : "s");
const ARROWS: Record<string, [number, number]> = {
  ArrowUp: [-1, 0],
  ArrowDown: [1, 0],
  ArrowLeft: [0, -1],
  ArrowRight: [0, 1],
};

function selectedRange(c: DraftCommands): CellRange | null {
  return c.sel.current ? rangeOf(c.sel.current.anchor, c.sel.current.corner) : null;
}

/** A one-cell selection follows the focused cell (focus can move without a focus event reaching us first). */
function followFocus(c: DraftCommands, here: CellPos, shiftArrow: boolean): void {
  const s = c.sel.current;
  const stale =
    !c.setByMouse.current &&
    cellCount(rangeOf(s?.anchor ?? here, s?.corner ?? here)) === 1 &&
    (s?.anchor.row !== here.row || s?.anchor.col !== here.col);
  if (!s || stale) c.sel.current = { anchor: here, corner: here };
  if (!shiftArrow) c.setByMouse.current = false;
}

function extendSelection(c: DraftCommands, key: string): void {
  const s = c.sel.current;
  if (!s) return;
  const d = ARROWS[key] ?? [0, 0];
  c.sel.current = { anchor: s.anchor, corner: extend(s.corner, d[0], d[1], c.rows.length, c.columns().length) };
  c.refreshSelection();
  const r = selectedRange(c);
  if (r) c.onStatus(`Selected ${r.bottom - r.top + 1} × ${r.right - r.left + 1} cells`);
}

function fillDownCommand(c: DraftCommands, here: CellPos): void {
  const changes = fillDownChanges(c.rows, selectedRange(c) ?? rangeOf(here, here), c.columns(), c.entry);
  c.change("fill down", changes);
  c.onStatus(
    changes.length
      ? `Filled down ${changes.length} cell${plural(changes.length)} (Ctrl+Z undoes)`
      : "Nothing to fill: select the cells below a filled cell",
  );
}

function clearCommand(c: DraftCommands, here: CellPos): void {
  const changes = clearChanges(c.rows, selectedRange(c) ?? rangeOf(here, here), c.columns(), c.entry);
  c.change("clear cells", changes);
  c.onStatus(
    changes.length
      ? `Cleared ${changes.length} cell${plural(changes.length)}`
      : "Those cells cannot be cleared (computed or saved)",
  );
}

/** Handles a key on the grid; true when the key was ours (the grid must not see it). */
function runKey(c: DraftCommands, e: ReactKeyboardEvent<HTMLDivElement>): boolean {
  const key = e.key.length === 1 ? e.key.toLowerCase() : e.key;
  const mod = e.ctrlKey || e.metaKey;
  if (mod && !e.shiftKey && key === "z") return (c.doUndo(), true);
  if (mod && (key === "y" || (e.shiftKey && key === "z"))) return (c.doRedo(), true);
  const here = c.focused();
  if (!here) return false;
  const shiftArrow = e.shiftKey && e.key.startsWith("Arrow");
  followFocus(c, here, shiftArrow);
  if (shiftArrow) return (extendSelection(c, e.key), true);
  if (mod && key === "d") return (fillDownCommand(c, here), true);
  if ((e.key === "Delete" || e.key === "Backspace") && !mod) return (clearCommand(c, here), true);
  if (mod && key === "c") {
    const r = selectedRange(c);
    if (!r || cellCount(r) <= 1) return false;
    void navigator.clipboard?.writeText(copyText(c.rows, r, c.columns()));
    c.onStatus(`Copied ${cellCount(r)} cells`);
    return true;
  }
  return false;
}

export function onDraftKeyDown(c: DraftCommands, e: ReactKeyboardEvent<HTMLDivElement>): void {
  if (!c.api || c.api.getEditingCells().length > 0) return;
  if (runKey(c, e)) {
    e.preventDefault();
    e.stopPropagation();
  }
}

/** A tab-separated block pasted from the focused cell on, into draft rows (added below as needed). */
export function onDraftPaste(c: DraftCommands, e: ReactClipboardEvent<HTMLDivElement>): void {
  if (!c.api || c.api.getEditingCells().length > 0) return;
  const text = e.clipboardData.getData("text/plain");
  if (!text) return;
  e.preventDefault();
  const here = c.focused() ?? { row: c.rows.length - 1, col: 0 };
  const fromHere = c
    .columns()
    .slice(Math.max(0, here.col))
    .map((f) => c.table.columns.find((col) => col.field === f))
    .filter((col): col is GridColumn => !!col && c.entry.has(col.field));
  const sheet = readSheet(c.table, text, {
    locale: c.locale,
    system: c.system,
    siteOffsetMin: 0,
    delimiter: "\t",
    columnsWithoutHeader: fromHere,
  });
  if (sheet.rows.length === 0) return c.onStatus(sheet.problems.join("; ") || "Nothing to paste");
  const n = sheet.rows.length;
  const { base, added, targets } = pasteTargets(c.rows, Math.max(0, here.row), n, c.blank, c.entry, c.table);
  c.change(`paste of ${n} row${plural(n)}`, pasteChanges(sheet, base, targets, c.entry, c.system), added, base);
  const invalid = sheet.rows.filter((r) => Object.keys(r.errors).length > 0).length;
  c.onStatus(
    `Pasted ${n} rows${sheet.hasHeader ? " (header row used)" : ""}: ${n - invalid} ready, ${invalid} with problems. Nothing is saved yet — review the marked cells, then Save. ${sheet.problems.join(" ")}`.trim(),
  );
  c.onPasted(targets);
}
