"use client";
// New rows, spreadsheet-style: typing, Shift+arrow / mouse rectangles, Ctrl+D fill-down, Delete,
// paste of a tab-separated block, and our own undo history (one step per edit, paste or fill).
import { forwardRef, useCallback, useImperativeHandle, useMemo, useRef, useState } from "react";
import { useKeptDrafts } from "@/app/grid/kept-drafts";
import type {
  ClipboardEvent as ReactClipboardEvent,
  KeyboardEvent as ReactKeyboardEvent,
  MouseEvent as ReactMouseEvent,
} from "react";
import { AgGridReact } from "ag-grid-react";
import type {
  CellEditRequestEvent,
  CellFocusedEvent,
  CellMouseOverEvent,
  ColDef,
  GridApi,
  GridReadyEvent,
} from "ag-grid-community";
import type { UnitSystem } from "@/lib/quantity/units";
import type { GridColumn, GridRow, GridTable } from "@/lib/grid/tables";
import { entryColumns } from "@/lib/grid/tables";
import { headerWithUnit, readCell, showCell } from "@/lib/grid/cells";
import { checkRow, isBlankRow, ROW_KEY, toInput } from "@/lib/grid/rows";
import { readSheet } from "@/lib/grid/sheet";
import { dateOrderFor } from "@/lib/grid/locale-date";
import { numberStyleFor } from "@/lib/grid/locale-number";
import type { CellChange, UndoHistory, UndoStep } from "@/lib/grid/undo";
import { emptyHistory, record, redo, replayValues, revertValues, undo } from "@/lib/grid/undo";
import type { CellPos } from "@/lib/grid/selection";
import { cellCount, contains, extend, fillDown, rangeOf } from "@/lib/grid/selection";
import { gridTheme, registerGridModules } from "@/app/grid/grid-modules";

registerGridModules();

/** A draft row holds the text as typed (in the user's units), plus its reference and state. */
export type DraftRow = Record<string, string>;
const REF = "__ref";
const STATE = "__state"; // "draft" | "saved"

export interface DraftCheck {
  ok: boolean;
  blank: boolean;
  errors: Record<string, string>;
  input: Record<string, unknown>;
}

export interface DraftGridHandle {
  /** Rows ready to save (complete and valid, not yet saved). */
  ready(): Array<{ ref: string; input: Record<string, unknown> }>;
  counts(): { drafts: number; ready: number; invalid: number };
  markSaved(saved: Array<{ ref: string; row: GridRow | null }>): void;
  setServerErrors(byRef: Record<string, Record<string, string>>): void;
  addRow(): void;
  clearSaved(): void;
  undo(): void;
  redo(): void;
}

let counter = 0;
const newRef = () => `d${Date.now().toString(36)}${(counter++).toString(36)}`;
const uuid = () =>
  typeof crypto !== "undefined" && "randomUUID" in crypto ? crypto.randomUUID() : `${Date.now()}-${Math.random()}`;

export const DraftGrid = forwardRef<
  DraftGridHandle,
  {
    table: GridTable;
    system: UnitSystem;
    locale: string;
    onStatus: (s: string) => void;
    onChange: () => void;
    onPasted: (refs: string[]) => void;
  }
>(function DraftGrid(props, ref) {
  const { table, system, locale, onStatus, onChange, onPasted } = props;
  const blank = useCallback((): DraftRow => ({ [REF]: newRef(), [ROW_KEY]: uuid(), [STATE]: "draft" }), []);
  const [rows, setRows] = useState<DraftRow[]>(() => [blank()]);
  const rowsRef = useRef(rows);
  rowsRef.current = rows;
  const [serverErrors, setServerErrorsState] = useState<Record<string, Record<string, string>>>({});
  const history = useRef<UndoHistory>(emptyHistory());
  const apiRef = useRef<GridApi | null>(null);
  const sel = useRef<{ anchor: CellPos; corner: CellPos } | null>(null);
  /** The selection was set by a click whose focus the grid may not have reported yet. */
  const setByMouse = useRef(false);
  const dragging = useRef(false);

  useKeptDrafts({ table, rows, stateField: STATE, restore: (kept) => setRows([...kept, blank()]), onStatus });

  const ctx = useMemo(
    () => ({ style: numberStyleFor(locale), order: dateOrderFor(locale), siteOffsetMin: 0, system }),
    [locale, system],
  );
  const entry = useMemo(() => new Set(entryColumns(table).map((c) => c.field)), [table]);

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

  const checks = useMemo(
    () => new Map(rows.map((r) => [r[REF] ?? "", r[STATE] === "saved" ? null : check(r)])),
    [rows, check],
  );
  const errorsOf = useCallback(
    (r: DraftRow | undefined): Record<string, string> => {
      if (!r) return {};
      const c = checks.get(r[REF] ?? "");
      if (!c || c.blank) return {};
      return { ...c.errors, ...(serverErrors[r[REF] ?? ""] ?? {}) };
    },
    [checks, serverErrors],
  );
  const errorsRef = useRef(errorsOf);
  errorsRef.current = errorsOf;

  const withTrailingBlank = useCallback(
    (list: DraftRow[]): DraftRow[] => {
      const last = list.at(-1);
      if (
        !last ||
        last[STATE] === "saved" ||
        table.columns.some((c) => entry.has(c.field) && (last[c.field] ?? "") !== "")
      )
        return [...list, blank()];
      return list;
    },
    [blank, table, entry],
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
      const byRef = new Map(base.map((r) => [r[REF] ?? "", { ...r }]));
      const touched = new Set<string>();
      for (const v of values) {
        const row = byRef.get(v.rowId);
        if (!row || row[STATE] === "saved" || !entry.has(v.field)) continue;
        const raw = v.value;
        row[v.field] =
          raw === null || raw === undefined
            ? ""
            : typeof raw === "string"
              ? raw
              : typeof raw === "number" || typeof raw === "boolean"
                ? String(raw)
                : JSON.stringify(raw);
        touched.add(v.rowId);
      }
      if (touched.size)
        setServerErrorsState((prev) => Object.fromEntries(Object.entries(prev).filter(([k]) => !touched.has(k))));
      return base.map((r) => byRef.get(r[REF] ?? "") ?? r);
    },
    [entry],
  );

  const commit = useCallback(
    (step: UndoStep, next: DraftRow[]) => {
      history.current = record(history.current, step);
      setAll(withTrailingBlank(next));
    },
    [setAll, withTrailingBlank],
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

  const doUndo = useCallback(() => {
    const u = undo(history.current);
    if (!u) return onStatus("Nothing to undo");
    history.current = u.history;
    let next = apply(revertValues(u.step));
    if (u.step.addedRows?.length) {
      const gone = new Set(u.step.addedRows);
      next = next.filter((r) => !gone.has(r[REF] ?? "") || r[STATE] === "saved");
    }
    setAll(withTrailingBlank(next));
    onStatus(`Undone: ${u.step.label}`);
  }, [apply, setAll, withTrailingBlank, onStatus]);

  const doRedo = useCallback(() => {
    const r = redo(history.current);
    if (!r) return onStatus("Nothing to redo");
    history.current = r.history;
    let base = rowsRef.current;
    if (r.step.addedRows?.length) {
      const have = new Set(base.map((x) => x[REF]));
      const trailing = base.at(-1);
      const keep =
        trailing && !have.has(undefined)
          ? base.filter(
              (x) => x !== trailing || table.columns.some((c) => entry.has(c.field) && (x[c.field] ?? "") !== ""),
            )
          : base;
      base = [
        ...keep,
        ...r.step.addedRows
          .filter((id) => !have.has(id))
          .map((id) => ({ [REF]: id, [ROW_KEY]: uuid(), [STATE]: "draft" })),
      ];
    }
    setAll(withTrailingBlank(apply(replayValues(r.step), base)));
    onStatus(`Redone: ${r.step.label}`);
  }, [apply, setAll, withTrailingBlank, onStatus, table, entry]);

  const columns = useCallback(
    (): string[] =>
      apiRef.current?.getAllDisplayedColumns().map((c) => c.getColId()) ?? table.columns.map((c) => c.field),
    [table],
  );

  const refreshSelection = () => apiRef.current?.refreshCells({ force: true });

  const selectedRange = () => (sel.current ? rangeOf(sel.current.anchor, sel.current.corner) : null);

  const focused = (): CellPos | null => {
    const f = apiRef.current?.getFocusedCell();
    if (!f || f.rowPinned) return null;
    return { row: f.rowIndex, col: columns().indexOf(f.column.getColId()) };
  };

  const onKeyDownCapture = (e: ReactKeyboardEvent<HTMLDivElement>) => {
    const api = apiRef.current;
    if (!api || api.getEditingCells().length > 0) return;
    const key = e.key;
    const mod = e.ctrlKey || e.metaKey;
    const stop = () => {
      e.preventDefault();
      e.stopPropagation();
    };
    if (mod && !e.shiftKey && key.toLowerCase() === "z") return (stop(), doUndo());
    if (mod && (key.toLowerCase() === "y" || (e.shiftKey && key.toLowerCase() === "z"))) return (stop(), doRedo());
    const here = focused();
    if (!here) return;
    // A one-cell selection follows the focused cell (focus can move without a focus event reaching us first).
    const stale =
      !setByMouse.current &&
      cellCount(rangeOf(sel.current?.anchor ?? here, sel.current?.corner ?? here)) === 1 &&
      (sel.current?.anchor.row !== here.row || sel.current?.anchor.col !== here.col);
    if (!sel.current || stale) sel.current = { anchor: here, corner: here };
    if (!(e.shiftKey && key.startsWith("Arrow"))) setByMouse.current = false;
    if (e.shiftKey && key.startsWith("Arrow")) {
      stop();
      const d = { ArrowUp: [-1, 0], ArrowDown: [1, 0], ArrowLeft: [0, -1], ArrowRight: [0, 1] }[key] ?? [0, 0];
      sel.current = {
        anchor: sel.current.anchor,
        corner: extend(sel.current.corner, d[0] ?? 0, d[1] ?? 0, rowsRef.current.length, columns().length),
      };
      refreshSelection();
      const r = selectedRange();
      if (r) onStatus(`Selected ${r.bottom - r.top + 1} × ${r.right - r.left + 1} cells`);
      return;
    }
    if (mod && key.toLowerCase() === "d") {
      stop();
      const r = selectedRange() ?? rangeOf(here, here);
      const cols = columns();
      const fills = fillDown(r, (p) => rowsRef.current[p.row]?.[cols[p.col] ?? ""] ?? "");
      const changes = fills
        .map(({ pos, value }) => {
          const row = rowsRef.current[pos.row];
          const field = cols[pos.col] ?? "";
          const c: CellChange | null =
            row && row[STATE] !== "saved" && entry.has(field)
              ? { rowId: row[REF] ?? "", field, before: row[field] ?? "", after: String(value ?? "") }
              : null;
          return c;
        })
        .filter((c): c is CellChange => c !== null);
      change("fill down", changes);
      onStatus(
        changes.length
          ? `Filled down ${changes.length} cell${changes.length === 1 ? "" : "s"} (Ctrl+Z undoes)`
          : "Nothing to fill: select the cells below a filled cell",
      );
      return;
    }
    if ((key === "Delete" || key === "Backspace") && !mod) {
      stop();
      const r = selectedRange() ?? rangeOf(here, here);
      const cols = columns();
      const changes: CellChange[] = [];
      for (let i = r.top; i <= r.bottom; i++) {
        const row = rowsRef.current[i];
        for (let j = r.left; j <= r.right; j++) {
          const field = cols[j] ?? "";
          if (row && row[STATE] !== "saved" && entry.has(field) && (row[field] ?? "") !== "")
            changes.push({ rowId: row[REF] ?? "", field, before: row[field] ?? "", after: "" });
        }
      }
      change("clear cells", changes);
      onStatus(
        changes.length
          ? `Cleared ${changes.length} cell${changes.length === 1 ? "" : "s"}`
          : "Those cells cannot be cleared (computed or saved)",
      );
      return;
    }
    if (mod && key.toLowerCase() === "c") {
      const r = selectedRange();
      if (!r || cellCount(r) <= 1) return;
      stop();
      const cols = columns();
      const lines: string[] = [];
      for (let i = r.top; i <= r.bottom; i++)
        lines.push(
          cols
            .slice(r.left, r.right + 1)
            .map((f) => rowsRef.current[i]?.[f] ?? "")
            .join("\t"),
        );
      void navigator.clipboard?.writeText(lines.join("\n"));
      onStatus(`Copied ${cellCount(r)} cells`);
    }
  };

  const onPaste = (e: ReactClipboardEvent<HTMLDivElement>) => {
    const api = apiRef.current;
    if (!api || api.getEditingCells().length > 0) return;
    const text = e.clipboardData.getData("text/plain");
    if (!text) return;
    e.preventDefault();
    const here = focused() ?? { row: rowsRef.current.length - 1, col: 0 };
    const cols = columns();
    const fromHere = cols
      .slice(Math.max(0, here.col))
      .map((f) => table.columns.find((c) => c.field === f))
      .filter((c): c is GridColumn => !!c && entry.has(c.field));
    const sheet = readSheet(table, text, {
      locale,
      system,
      siteOffsetMin: 0,
      delimiter: "\t",
      columnsWithoutHeader: fromHere,
    });
    if (sheet.rows.length === 0) return onStatus(sheet.problems.join("; ") || "Nothing to paste");
    let base = rowsRef.current;
    const startRow = Math.max(0, here.row);
    const added: string[] = [];
    const targets: string[] = [];
    const trailingBlank = base.at(-1);
    if (
      trailingBlank &&
      base.length - 1 < startRow + sheet.rows.length &&
      table.columns.every((c) => !entry.has(c.field) || (trailingBlank[c.field] ?? "") === "")
    )
      base = base.slice(0, -1);
    for (let i = 0; i < sheet.rows.length; i++) {
      let row = base[startRow + i];
      while (row && row[STATE] === "saved") {
        base = [...base.slice(0, startRow + i), ...base.slice(startRow + i + 1), row];
        row = base[startRow + i];
      }
      if (!row) {
        const fresh = blank();
        base = [...base, fresh];
        added.push(fresh[REF] ?? "");
        row = fresh;
      }
      targets.push(row[REF] ?? "");
    }
    const changes: CellChange[] = [];
    sheet.rows.forEach((sr, i) => {
      const target = base.find((r) => r[REF] === targets[i]);
      if (!target) return;
      for (const { column } of sheet.columns) {
        if (!entry.has(column.field)) continue;
        const v = sr.values[column.field];
        const bad = sr.errors[column.field] !== undefined && (sr.raw[column.field] ?? "") !== "";
        const shown = bad
          ? (sr.raw[column.field] ?? "")
          : v === null || v === undefined
            ? ""
            : showCell(column, v, system);
        changes.push({
          rowId: target[REF] ?? "",
          field: column.field,
          before: target[column.field] ?? "",
          after: shown,
        });
      }
    });
    change(`paste of ${sheet.rows.length} row${sheet.rows.length === 1 ? "" : "s"}`, changes, added, base);
    const invalid = sheet.rows.filter((r) => Object.keys(r.errors).length > 0).length;
    onStatus(
      `Pasted ${sheet.rows.length} rows${sheet.hasHeader ? " (header row used)" : ""}: ${sheet.rows.length - invalid} ready, ${invalid} with problems. Nothing is saved yet — review the marked cells, then Save. ${sheet.problems.join(" ")}`.trim(),
    );
    onPasted(targets);
  };

  useImperativeHandle(
    ref,
    () => ({
      ready: () =>
        rowsRef.current.flatMap((r) => {
          const c = checks.get(r[REF] ?? "");
          return c && c.ok && !c.blank ? [{ ref: r[REF] ?? "", input: c.input }] : [];
        }),
      counts: () => {
        let drafts = 0,
          ready = 0,
          invalid = 0;
        for (const r of rowsRef.current) {
          const c = checks.get(r[REF] ?? "");
          if (!c || c.blank) continue;
          drafts++;
          if (c.ok && !serverErrors[r[REF] ?? ""]) ready++;
          else invalid++;
        }
        return { drafts, ready, invalid };
      },
      markSaved: (saved) => {
        const byRef = new Map(saved.map((s) => [s.ref, s.row]));
        const next = rowsRef.current.map((r) => {
          if (!byRef.has(r[REF] ?? "")) return r;
          const server = byRef.get(r[REF] ?? "");
          const out: DraftRow = { [REF]: r[REF] ?? "", [STATE]: "saved" };
          for (const c of table.columns)
            out[c.field] = server ? showCell(c, server[c.field] ?? null, system) : (r[c.field] ?? "");
          return out;
        });
        setAll(withTrailingBlank(next));
      },
      setServerErrors: (byRef) => setServerErrorsState(byRef),
      addRow: () => setAll([...rowsRef.current, blank()]),
      clearSaved: () => setAll(withTrailingBlank(rowsRef.current.filter((r) => r[STATE] !== "saved"))),
      undo: doUndo,
      redo: doRedo,
    }),
    [checks, serverErrors, table, system, setAll, withTrailingBlank, blank, doUndo, doRedo],
  );

  const columnDefs = useMemo<ColDef<DraftRow>[]>(
    () => [
      ...table.columns.map<ColDef<DraftRow>>((c, index) => ({
        colId: c.field,
        field: c.field,
        headerName: headerWithUnit(c, system),
        headerTooltip: c.computed
          ? `${c.header}: computed on the server after saving`
          : entry.has(c.field)
            ? undefined
            : `${c.header}: read-only`,
        width: c.width ?? 130,
        editable: (p) => p.data?.[STATE] !== "saved" && entry.has(c.field),
        type: c.kind === "number" || c.kind === "integer" ? "rightAligned" : undefined,
        tooltipValueGetter: (p) => errorsRef.current(p.data)[c.field],
        cellClassRules: {
          "cell-invalid": (p) => !!errorsRef.current(p.data)[c.field],
          "cell-computed": () => !entry.has(c.field),
          "cell-in-range": (p) => {
            const r = sel.current ? rangeOf(sel.current.anchor, sel.current.corner) : null;
            return (
              !!r && cellCount(r) > 1 && p.node.rowIndex !== null && contains(r, { row: p.node.rowIndex, col: index })
            );
          },
        },
      })),
    ],
    [table, system, entry],
  );

  // Read from the DOM on the mouse-down itself: the grid's own cell events arrive asynchronously, and a
  // Shift+arrow typed straight after a click must extend from the clicked cell.
  const onMouseDownCapture = (e: ReactMouseEvent<HTMLDivElement>) => {
    const cellEl = (e.target as HTMLElement).closest(".ag-cell");
    const rowEl = cellEl?.closest(".ag-row");
    const rowIndex = Number(rowEl?.getAttribute("row-index"));
    const colId = cellEl?.getAttribute("col-id") ?? "";
    if (!cellEl || !Number.isInteger(rowIndex) || rowEl?.classList.contains("ag-row-pinned")) return;
    const pos = { row: rowIndex, col: columns().indexOf(colId) };
    if (pos.col < 0) return;
    sel.current =
      e.shiftKey && sel.current ? { anchor: sel.current.anchor, corner: pos } : { anchor: pos, corner: pos };
    setByMouse.current = true;
    dragging.current = true;
    refreshSelection();
  };

  const onFocused = (e: CellFocusedEvent<DraftRow>) => {
    if (e.rowIndex === null || e.rowIndex === undefined || !e.column || typeof e.column === "string") return;
    const pos = { row: e.rowIndex, col: columns().indexOf(e.column.getColId()) };
    // A focus event can arrive after the first Shift+arrow that followed the click; focus landing on the
    // selection's own anchor keeps the selection instead of collapsing it.
    const onAnchor = sel.current !== null && sel.current.anchor.row === pos.row && sel.current.anchor.col === pos.col;
    if (!onAnchor) setByMouse.current = false;
    if (!dragging.current && !onAnchor) {
      const had = sel.current && cellCount(rangeOf(sel.current.anchor, sel.current.corner)) > 1;
      sel.current = { anchor: pos, corner: pos };
      if (had) refreshSelection();
    }
    const row = rowsRef.current[e.rowIndex];
    const msg = errorsRef.current(row)[e.column.getColId()];
    const col = table.columns.find((c) => c.field === (typeof e.column === "string" ? "" : e.column?.getColId()));
    if (msg) onStatus(`Row ${e.rowIndex + 1}, ${col?.header ?? ""}: ${msg}`);
    else if (row?.[STATE] === "saved")
      onStatus("This row is saved; it shows the server's record. Stored records are changed on their own page.");
  };

  return (
    <div
      className="grid-box grid-box-drafts"
      data-testid="draft-grid"
      onKeyDownCapture={onKeyDownCapture}
      onMouseDownCapture={onMouseDownCapture}
      onPaste={onPaste}
      onMouseUp={() => (dragging.current = false)}
    >
      <AgGridReact<DraftRow>
        theme={gridTheme}
        rowData={rows}
        columnDefs={columnDefs}
        getRowId={(p) => p.data[REF] ?? ""}
        readOnlyEdit
        onCellEditRequest={(e: CellEditRequestEvent<DraftRow>) => {
          const field = e.colDef.field ?? "";
          change("typed edit", [
            { rowId: e.data?.[REF] ?? "", field, before: e.data?.[field] ?? "", after: String(e.newValue ?? "") },
          ]);
        }}
        onGridReady={(e: GridReadyEvent<DraftRow>) => (apiRef.current = e.api)}
        onCellFocused={onFocused}
        onCellMouseOver={(e: CellMouseOverEvent<DraftRow>) => {
          if (!dragging.current || e.rowIndex === null || !sel.current) return;
          if (((e.event as MouseEvent | undefined)?.buttons ?? 0) === 0) {
            dragging.current = false;
            return;
          }
          sel.current = {
            anchor: sel.current.anchor,
            corner: { row: e.rowIndex, col: columns().indexOf(e.column.getColId()) },
          };
          refreshSelection();
        }}
        getRowClass={(p) => (p.data?.[STATE] === "saved" ? "row-saved" : undefined)}
        tooltipShowDelay={200}
        stopEditingWhenCellsLoseFocus
        enterNavigatesVerticallyAfterEdit
        domLayout="normal"
      />
    </div>
  );
});
