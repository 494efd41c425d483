"use client";
// New rows, spreadsheet-style: typing, Shift+arrow / mouse rectangles, Ctrl+D fill-down, Delete,
// paste of a tab-separated block, and our own undo history (one step per edit, paste or fill).
// Rows and undo live in use-draft-rows.ts, the commands in draft-commands.ts, the columns in draft-columns.ts.
import { forwardRef, useCallback, useImperativeHandle, useMemo, useRef } from "react";
import type { MouseEvent as ReactMouseEvent, MutableRefObject } from "react";
import { AgGridReact } from "ag-grid-react";
import type {
  CellEditRequestEvent,
  CellFocusedEvent,
  CellMouseOverEvent,
  GridApi,
  GridReadyEvent,
} from "ag-grid-community";
import type { UnitSystem } from "@/lib/quantity/units";
import type { GridRow, GridTable } from "@/lib/grid/tables";
import type { CellPos } from "@/lib/grid/selection";
import { cellCount, rangeOf } from "@/lib/grid/selection";
import type { DraftRow } from "@/lib/grid/drafts";
import { isSaved, markSavedRows, REF, refOf } from "@/lib/grid/drafts";
import { gridTheme, registerGridModules } from "@/app/grid/grid-modules";
import type { DraftCheck } from "@/app/grid/use-draft-rows";
import { useDraftRows } from "@/app/grid/use-draft-rows";
import type { DraftCommands, Selection } from "@/app/grid/draft-commands";
import { onDraftKeyDown, onDraftPaste } from "@/app/grid/draft-commands";
import { draftColumnDefs } from "@/app/grid/draft-columns";

registerGridModules();

export type { DraftRow } from "@/lib/grid/drafts";
export type { DraftCheck } from "@/app/grid/use-draft-rows";

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

interface DraftGridProps {
  table: GridTable;
  system: UnitSystem;
  locale: string;
  onStatus: (s: string) => void;
  onChange: () => void;
  onPasted: (refs: string[]) => void;
}

function countDrafts(
  rows: readonly DraftRow[],
  checks: ReadonlyMap<string, DraftCheck | null>,
  serverErrors: Record<string, unknown>,
) {
  let drafts = 0;
  let ready = 0;
  let invalid = 0;
  for (const r of rows) {
    const c = checks.get(refOf(r));
    if (!c || c.blank) continue;
    drafts++;
    if (c.ok && !serverErrors[refOf(r)]) ready++;
    else invalid++;
  }
  return { drafts, ready, invalid };
}

/** Mouse rectangles and the focused cell: the selection the commands work on. */
function useDraftSelection(
  apiRef: MutableRefObject<GridApi | null>,
  table: GridTable,
  errorsRef: MutableRefObject<(r: DraftRow | undefined) => Record<string, string>>,
  rowsRef: MutableRefObject<DraftRow[]>,
  onStatus: (s: string) => void,
) {
  const sel = useRef<Selection | null>(null);
  /** The selection was set by a click whose focus the grid may not have reported yet. */
  const setByMouse = useRef(false);
  const dragging = useRef(false);
  const columns = useCallback(
    (): string[] =>
      apiRef.current?.getAllDisplayedColumns().map((c) => c.getColId()) ?? table.columns.map((c) => c.field),
    [apiRef, table],
  );
  const refreshSelection = () => apiRef.current?.refreshCells({ force: true });
  const focused = (): CellPos | null => {
    const f = apiRef.current?.getFocusedCell();
    if (!f || f.rowPinned) return null;
    return { row: f.rowIndex, col: columns().indexOf(f.column.getColId()) };
  };

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
    else if (isSaved(row))
      onStatus("This row is saved; it shows the server's record. Stored records are changed on their own page.");
  };

  const onMouseOver = (e: CellMouseOverEvent<DraftRow>) => {
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
  };

  return { sel, setByMouse, dragging, columns, focused, refreshSelection, onMouseDownCapture, onFocused, onMouseOver };
}

/** What the workspace may ask of the draft grid: rows to save, counts, and marking rows saved. */
function draftHandle(d: ReturnType<typeof useDraftRows>, table: GridTable, system: UnitSystem): DraftGridHandle {
  const { rowsRef, checks, serverErrors, setAll, withBlank, blank } = d;
  return {
    ready: () =>
      rowsRef.current.flatMap((r) => {
        const c = checks.get(refOf(r));
        return c && c.ok && !c.blank ? [{ ref: refOf(r), input: c.input }] : [];
      }),
    counts: () => countDrafts(rowsRef.current, checks, serverErrors),
    markSaved: (saved) => setAll(withBlank(markSavedRows(rowsRef.current, saved, table, system))),
    setServerErrors: (byRef) => d.setServerErrors(byRef),
    addRow: () => setAll([...rowsRef.current, blank()]),
    clearSaved: () => setAll(withBlank(rowsRef.current.filter((r) => !isSaved(r)))),
    undo: d.doUndo,
    redo: d.doRedo,
  };
}

export const DraftGrid = forwardRef<DraftGridHandle, DraftGridProps>(function DraftGrid(props, ref) {
  const { table, system, locale, onStatus, onPasted } = props;
  const d = useDraftRows(props);
  const { rows, rowsRef, blank, entry, errorsRef, change } = d;
  const apiRef = useRef<GridApi | null>(null);
  const s = useDraftSelection(apiRef, table, errorsRef, rowsRef, onStatus);
  const commands = (): DraftCommands => ({
    api: apiRef.current,
    rows: rowsRef.current,
    table,
    system,
    locale,
    entry,
    sel: s.sel,
    setByMouse: s.setByMouse,
    columns: s.columns,
    focused: s.focused,
    refreshSelection: s.refreshSelection,
    blank,
    change,
    doUndo: d.doUndo,
    doRedo: d.doRedo,
    onStatus,
    onPasted,
  });

  useImperativeHandle(ref, () => draftHandle(d, table, system), [d, table, system]);

  const columnDefs = useMemo(
    () => draftColumnDefs(table, system, entry, errorsRef, s.sel),
    [table, system, entry, errorsRef, s.sel],
  );

  return (
    <div
      className="grid-box grid-box-drafts"
      data-testid="draft-grid"
      onKeyDownCapture={(e) => onDraftKeyDown(commands(), e)}
      onMouseDownCapture={s.onMouseDownCapture}
      onPaste={(e) => onDraftPaste(commands(), e)}
      onMouseUp={() => (s.dragging.current = false)}
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
        onCellFocused={s.onFocused}
        onCellMouseOver={s.onMouseOver}
        getRowClass={(p) => (isSaved(p.data) ? "row-saved" : undefined)}
        tooltipShowDelay={200}
        stopEditingWhenCellsLoseFocus
        enterNavigatesVerticallyAfterEdit
        domLayout="normal"
      />
    </div>
  );
});
