// The grid's own undo history: one step per typed edit, paste, fill-down or clear, each a list of
// cell changes, so Ctrl+Z undoes a whole paste at once (the grid library's own stack only knows editor edits).
import type { CellValue } from "@/lib/grid/tables";

export interface CellChange {
  rowId: string;
  field: string;
  before: CellValue;
  after: CellValue;
}

/** Rows a step added (a paste below the last row); undo takes them away again. */
export interface UndoStep {
  label: string;
  changes: CellChange[];
  addedRows?: string[];
}

export interface UndoHistory {
  done: UndoStep[];
  undone: UndoStep[];
}

export const MAX_UNDO_STEPS = 200;

export const emptyHistory = (): UndoHistory => ({ done: [], undone: [] });

/** A new step clears the redo side, as in every spreadsheet. */
export function record(h: UndoHistory, step: UndoStep): UndoHistory {
  if (step.changes.length === 0 && !step.addedRows?.length) return h;
  return { done: [...h.done, step].slice(-MAX_UNDO_STEPS), undone: [] };
}

/** The step to revert and the history after it; its changes are applied in reverse order with `before`. */
export function undo(h: UndoHistory): { step: UndoStep; history: UndoHistory } | null {
  const step = h.done.at(-1);
  if (!step) return null;
  return { step, history: { done: h.done.slice(0, -1), undone: [...h.undone, step] } };
}

export function redo(h: UndoHistory): { step: UndoStep; history: UndoHistory } | null {
  const step = h.undone.at(-1);
  if (!step) return null;
  return { step, history: { done: [...h.done, step], undone: h.undone.slice(0, -1) } };
}

/** The cell values to set to revert a step (last change first, so repeated cells end at their first `before`). */
export function revertValues(step: UndoStep): Array<{ rowId: string; field: string; value: CellValue }> {
  return [...step.changes].reverse().map((c) => ({ rowId: c.rowId, field: c.field, value: c.before }));
}

export function replayValues(step: UndoStep): Array<{ rowId: string; field: string; value: CellValue }> {
  return step.changes.map((c) => ({ rowId: c.rowId, field: c.field, value: c.after }));
}

/** A server-saved row gets a new id; steps that named its draft id follow it. */
export function renameRow(h: UndoHistory, from: string, to: string): UndoHistory {
  const fix = (s: UndoStep): UndoStep => ({
    ...s,
    changes: s.changes.map((c) => (c.rowId === from ? { ...c, rowId: to } : c)),
    ...(s.addedRows ? { addedRows: s.addedRows.map((r) => (r === from ? to : r)) } : {}),
  });
  return { done: h.done.map(fix), undone: h.undone.map(fix) };
}
