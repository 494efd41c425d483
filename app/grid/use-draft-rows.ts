"use client";
// The draft grid's rows and their undo history: each row checked as typed (cell by cell, then with the
// table's shared schema), edits recorded one step per edit, paste or fill, and undo and redo of them.
import { useCallback, useMemo, useRef, useState } from "react";
import type { MutableRefObject } from "react";
import type { UnitSystem } from "@/lib/quantity/units";
import type { GridRow, GridTable } from "@/lib/grid/tables";
import { entryColumns } from "@/lib/grid/tables";
import { readCell } from "@/lib/grid/cells";
import { checkRow, isBlankRow, ROW_KEY, toInput } from "@/lib/grid/rows";
import { dateOrderFor } from "@/lib/grid/locale-date";
import { numberStyleFor } from "@/lib/grid/locale-number";
import type { CellChange, UndoHistory, UndoStep } from "@/lib/grid/undo";
import { emptyHistory, record, redo, replayValues, revertValues, undo } from "@/lib/grid/undo";
import type { DraftRow } from "@/lib/grid/drafts";
import { applyValues, hasTyping, isSaved, REF, refOf, STATE, withTrailingBlank } from "@/lib/grid/drafts";
import { useKeptDrafts } from "@/app/grid/kept-drafts";

export interface DraftCheck {
  ok: boolean;
  blank: boolean;
  errors: Record<string, string>;
  input: Record<string, unknown>;
}

let counter = 0;
const newRef = () => `d${Date.now().toString(36)}${(counter++).toString(36)}`;
export const uuid = () =>
  typeof crypto !== "undefined" && "randomUUID" in crypto ? crypto.randomUUID() : `${Date.now()}-${Math.random()}`;

function useRowChecks(table: GridTable, system: UnitSystem, locale: string, rows: DraftRow[]) {
  const ctx = useMemo(
    () => ({ style: numberStyleFor(locale), order: dateOrderFor(locale), siteOffsetMin: 0, system }),
    [locale, system],
  );
  const check = useCallback(
    (row: DraftRow): DraftCheck => {
      const values: GridRow = {};
      const errors: Record<string, string> = {};
      for (const col of entryColumns(table)) {
        const r = readCell(col, row[col.field] ?? "", ctx);
        if (r.ok) values[col.field] = r.value;
        else errors[col.field] = r.issues[0]?.message ?? "cannot be read";
      }
      if (row[ROW_KEY]) values[ROW_KEY] = row[ROW_KEY];
      const isBlank = isBlankRow(table, values) && Object.keys(errors).length === 0;
      const schema = checkRow(table, values);
      for (const [f, m] of Object.entries(schema.errors)) if (!errors[f]) errors[f] = m;
      return { ok: Object.keys(errors).length === 0, blank: isBlank, errors, input: toInput(table, values) };
    },
    [table, ctx],
  );
  return useMemo(() => new Map(rows.map((r) => [refOf(r), isSaved(r) ? null : check(r)])), [rows, check]);
}

/** A cell's problems: what the row check found and what the server refused, for the latest render. */
function useErrorsRef(
  checks: ReadonlyMap<string, DraftCheck | null>,
  serverErrors: Record<string, Record<string, string>>,
): MutableRefObject<(r: DraftRow | undefined) => Record<string, string>> {
  const errorsOf = useCallback(
    (r: DraftRow | undefined): Record<string, string> => {
      if (!r) return {};
      const c = checks.get(refOf(r));
      if (!c || c.blank) return {};
      return { ...c.errors, ...(serverErrors[refOf(r)] ?? {}) };
    },
    [checks, serverErrors],
  );
  const errorsRef = useRef(errorsOf);
  errorsRef.current = errorsOf;
  return errorsRef;
}

/** Ctrl+Z and Ctrl+Y over the grid's own history: a whole paste or fill is one step. */
function useUndoRedo(o: {
  history: MutableRefObject<UndoHistory>;
  rowsRef: MutableRefObject<DraftRow[]>;
  apply: (values: Array<{ rowId: string; field: string; value: unknown }>, base?: DraftRow[]) => DraftRow[];
  setAll: (next: DraftRow[]) => void;
  withBlank: (list: DraftRow[]) => DraftRow[];
  onStatus: (s: string) => void;
  entry: ReadonlySet<string>;
  table: GridTable;
}) {
  const { history, rowsRef, apply, setAll, withBlank, onStatus, entry, table } = o;
  const doUndo = useCallback(() => {
    const u = undo(history.current);
    if (!u) return onStatus("Nothing to undo");
    history.current = u.history;
    let next = apply(revertValues(u.step));
    if (u.step.addedRows?.length) {
      const gone = new Set(u.step.addedRows);
      next = next.filter((r) => !gone.has(refOf(r)) || isSaved(r));
    }
    setAll(withBlank(next));
    onStatus(`Undone: ${u.step.label}`);
  }, [apply, setAll, withBlank, onStatus]);

  const doRedo = useCallback(() => {
    const r = redo(history.current);
    if (!r) return onStatus("Nothing to redo");
    history.current = r.history;
    let base = rowsRef.current;
    if (r.step.addedRows?.length) {
      const have = new Set(base.map((x) => x[REF]));
      const trailing = base.at(-1);
      const keep =
        trailing && !have.has(undefined) ? base.filter((x) => x !== trailing || hasTyping(x, entry, table)) : base;
      base = [
        ...keep,
        ...r.step.addedRows
          .filter((id) => !have.has(id))
          .map((id) => ({ [REF]: id, [ROW_KEY]: uuid(), [STATE]: "draft" })),
      ];
    }
    setAll(withBlank(apply(replayValues(r.step), base)));
    onStatus(`Redone: ${r.step.label}`);
  }, [apply, setAll, withBlank, onStatus, table, entry]);

  return { doUndo, doRedo };
}

export interface DraftRowsOptions {
  table: GridTable;
  system: UnitSystem;
  locale: string;
  onStatus: (s: string) => void;
  onChange: () => void;
}

export function useDraftRows(o: DraftRowsOptions) {
  const { table, system, locale, onStatus, onChange } = o;
  const blank = useCallback((): DraftRow => ({ [REF]: newRef(), [ROW_KEY]: uuid(), [STATE]: "draft" }), []);
  const [rows, setRows] = useState<DraftRow[]>(() => [blank()]);
  const rowsRef = useRef(rows);
  rowsRef.current = rows;
  const [serverErrors, setServerErrors] = useState<Record<string, Record<string, string>>>({});
  const history = useRef<UndoHistory>(emptyHistory());
  useKeptDrafts({ table, rows, stateField: STATE, restore: (kept) => setRows([...kept, blank()]), onStatus });
  const entry = useMemo(() => new Set(entryColumns(table).map((c) => c.field)), [table]);
  const checks = useRowChecks(table, system, locale, rows);
  const errorsRef = useErrorsRef(checks, serverErrors);

  const withBlank = useCallback(
    (list: DraftRow[]) => withTrailingBlank(list, blank, entry, table),
    [blank, entry, table],
  );
  const setAll = useCallback(
    (next: DraftRow[]) => {
      rowsRef.current = next;
      setRows(next);
      onChange();
    },
    [onChange],
  );
  /** Applies cell values; saved rows are not touched (they are the server's rows now). */
  const apply = useCallback(
    (values: Array<{ rowId: string; field: string; value: unknown }>, base = rowsRef.current): DraftRow[] => {
      const { rows: next, touched } = applyValues(base, values, entry);
      if (touched.size)
        setServerErrors((prev) => Object.fromEntries(Object.entries(prev).filter(([k]) => !touched.has(k))));
      return next;
    },
    [entry],
  );
  const commit = useCallback(
    (step: UndoStep, next: DraftRow[]) => {
      history.current = record(history.current, step);
      setAll(withBlank(next));
    },
    [setAll, withBlank],
  );
  const change = useCallback(
    (label: string, changes: CellChange[], addedRows: string[] = [], base = rowsRef.current) => {
      const real = changes.filter((c) => (c.before ?? "") !== (c.after ?? ""));
      if (real.length === 0 && addedRows.length === 0) return;
      commit(
        { label, changes: real, ...(addedRows.length ? { addedRows } : {}) },
        apply(
          real.map((c) => ({ rowId: c.rowId, field: c.field, value: c.after })),
          base,
        ),
      );
    },
    [apply, commit],
  );

  const { doUndo, doRedo } = useUndoRedo({ history, rowsRef, apply, setAll, withBlank, onStatus, entry, table });

  return {
    rows,
    rowsRef,
    blank,
    entry,
    checks,
    serverErrors,
    setServerErrors,
    errorsRef,
    withBlank,
    setAll,
    change,
    doUndo,
    doRedo,
  };
}
