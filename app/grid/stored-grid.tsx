"use client";
// Stored rows: server-side infinite row model (paging, sort, filter on the server), a pinned totals row
// within the current filter, and the few corrections the record services allow (a lot's lab decision).
import { useCallback, useMemo, useRef, useState } from "react";
import { AgGridReact } from "ag-grid-react";
import type {
  CellEditRequestEvent,
  ColDef,
  GridApi,
  GridReadyEvent,
  IDatasource,
  IGetRowsParams,
  CellDoubleClickedEvent,
  CellKeyDownEvent,
} from "ag-grid-community";
import type { UnitSystem } from "@/lib/quantity/units";
import type { GridColumn, GridRow, GridTable } from "@/lib/grid/tables";
import { headerWithUnit, showCell } from "@/lib/grid/cells";
import { fetchRows } from "@/app/grid/grid-api";
import { gridTheme, registerGridModules } from "@/app/grid/grid-modules";

registerGridModules();

export interface ViewModel {
  sort: unknown;
  filter: unknown;
}

export interface Correction {
  ref: string;
  rowId: string;
  field: string;
  value: string;
  before: string;
}

const READ_ONLY_HINT =
  "Stored records are not edited in place: booked quantities are corrected by a reversing entry on the record's page, and records are never deleted.";

function filterFor(c: GridColumn): string | boolean {
  if (!c.db || c.kind === "boolean") return false;
  if (c.kind === "number" || c.kind === "integer") return "agNumberColumnFilter";
  if (c.kind === "date") return "agDateColumnFilter";
  return "agTextColumnFilter";
}

/** The stored grid's columns: units in the headers, pending corrections shown in place, lot decisions editable. */
function storedColumns(
  table: GridTable,
  system: UnitSystem,
  canCorrect: boolean,
  pendingRef: { current: Map<string, Correction> },
): ColDef<GridRow>[] {
  return table.columns.map((c) => ({
    colId: c.field,
    field: c.field,
    headerName: headerWithUnit(c, system),
    headerTooltip: c.computed ? `${c.header}: computed on the server, read-only` : undefined,
    width: c.width ?? 130,
    sortable: !!c.db,
    filter: filterFor(c),
    filterParams: c.kind === "number" || c.kind === "integer" ? { buttons: ["reset"] } : undefined,
    type: c.kind === "number" || c.kind === "integer" ? "rightAligned" : undefined,
    valueFormatter: (p) => {
      if (p.node?.rowPinned)
        return p.value === null || p.value === undefined
          ? ""
          : typeof p.value === "number"
            ? showCell(c, p.value, system)
            : String(p.value);
      const pend = p.data ? pendingRef.current.get(`${String(p.data[table.rowId])}|${c.field}`) : undefined;
      return showCell(c, pend ? pend.value : ((p.value as GridRow[string]) ?? null), system);
    },
    editable: (p) => canCorrect && !!c.correctable && !p.node.rowPinned && p.data?.status === "QUARANTINED",
    cellEditor: c.correctable ? "agSelectCellEditor" : undefined,
    cellEditorParams: c.correctable ? { values: [...c.correctable] } : undefined,
    cellClassRules: {
      "cell-computed": () => c.computed === true,
      "cell-pending": (p) => !!p.data && pendingRef.current.has(`${String(p.data[table.rowId])}|${c.field}`),
      "cell-correctable": (p) => canCorrect && !!c.correctable && p.data?.status === "QUARANTINED",
    },
    tooltipValueGetter: (p) =>
      p.data && pendingRef.current.has(`${String(p.data[table.rowId])}|${c.field}`)
        ? "Changed here, not saved yet"
        : undefined,
  }));
}

/** Rows from the server a block at a time, with the totals row for the current filter. */
function storedRows(
  table: GridTable,
  onStatus: (s: string) => void,
  onView: (v: ViewModel) => void,
  setTotal: (t: GridRow) => void,
): IDatasource {
  return {
    getRows: (p: IGetRowsParams) => {
      onView({ sort: p.sortModel, filter: p.filterModel });
      void fetchRows(table.key, p.startRow, p.endRow, p.sortModel, p.filterModel).then((a) => {
        if (!a.ok) {
          onStatus(`Could not load rows: ${a.issues.map((i) => i.message).join("; ")}`);
          p.failCallback();
          return;
        }
        p.successCallback(a.value.rows, a.value.lastRow);
        const first = table.columns[0]?.field ?? "code";
        const t: GridRow = { [first]: `Total, ${a.value.lastRow.toLocaleString("en")} rows` };
        if (table.totals.mass) t[table.totals.mass] = a.value.totals.massKg;
        if (table.totals.volume) t[table.totals.volume] = a.value.totals.volumeL;
        setTotal(t);
      });
    },
  };
}

export function StoredGrid(props: {
  table: GridTable;
  system: UnitSystem;
  canCorrect: boolean;
  onStatus: (s: string) => void;
  onView: (v: ViewModel) => void;
  corrections: Correction[];
  onCorrection: (c: Correction) => void;
  refreshToken: number;
}) {
  const { table, system, onStatus, onView, onCorrection, canCorrect } = props;
  const apiRef = useRef<GridApi | null>(null);
  const [total, setTotal] = useState<GridRow | null>(null);
  const pending = useMemo(
    () => new Map(props.corrections.map((c) => [`${c.rowId}|${c.field}`, c])),
    [props.corrections],
  );
  const pendingRef = useRef(pending);
  pendingRef.current = pending;

  const columnDefs = useMemo(() => storedColumns(table, system, canCorrect, pendingRef), [table, system, canCorrect]);

  const datasource = useMemo(() => storedRows(table, onStatus, onView, setTotal), [table, onStatus, onView]);

  const onGridReady = useCallback(
    (e: GridReadyEvent<GridRow>) => {
      apiRef.current = e.api;
      e.api.setGridOption("datasource", datasource);
    },
    [datasource],
  );

  const lastToken = useRef(props.refreshToken);
  if (lastToken.current !== props.refreshToken) {
    lastToken.current = props.refreshToken;
    queueMicrotask(() => apiRef.current?.refreshInfiniteCache());
  }

  const { onEdit, onKey, onDoubleClick } = useStoredEditing(
    table,
    canCorrect,
    onStatus,
    onCorrection,
    pendingRef,
    apiRef,
  );

  return (
    <div className="grid-box grid-box-stored" data-testid="stored-grid">
      <AgGridReact<GridRow>
        theme={gridTheme}
        rowModelType="infinite"
        cacheBlockSize={100}
        maxBlocksInCache={20}
        infiniteInitialRowCount={50}
        columnDefs={columnDefs}
        getRowId={(p) => String(p.data[table.rowId])}
        onGridReady={onGridReady}
        readOnlyEdit
        onCellEditRequest={onEdit}
        onCellDoubleClicked={onDoubleClick}
        onCellKeyDown={onKey}
        pinnedBottomRowData={total ? [total] : []}
        tooltipShowDelay={300}
        ensureDomOrder
        suppressMultiSort={false}
      />
    </div>
  );
}

/** Editing the stored rows: only a quarantined lot's decision, as a pending correction; anything else says why not. */
function useStoredEditing(
  table: GridTable,
  canCorrect: boolean,
  onStatus: (s: string) => void,
  onCorrection: (c: Correction) => void,
  pendingRef: { current: Map<string, Correction> },
  apiRef: { current: GridApi | null },
) {
  const onEdit = useCallback(
    (e: CellEditRequestEvent<GridRow>) => {
      const field = e.colDef.field ?? "";
      const rowId = String(e.data?.[table.rowId] ?? "");
      const value = String(e.newValue ?? "");
      const before = pendingRef.current.get(`${rowId}|${field}`)?.value ?? String(e.oldValue ?? "");
      if (value === before) return;
      onCorrection({ ref: `fix-${rowId}-${field}`, rowId, field, value, before });
      queueMicrotask(() => apiRef.current?.refreshCells({ force: true }));
    },
    [table, onCorrection],
  );

  const onKey = useCallback(
    (e: CellKeyDownEvent<GridRow>) => {
      const ev = e.event as KeyboardEvent | undefined;
      if (!ev || e.node.rowPinned) return;
      const editable = typeof e.colDef.editable === "function" ? false : e.colDef.editable;
      const col = table.columns.find((c) => c.field === e.colDef.field);
      const canEdit = canCorrect && !!col?.correctable && e.data?.status === "QUARANTINED";
      if (
        !editable &&
        !canEdit &&
        (ev.key === "F2" ||
          ev.key === "Enter" ||
          ev.key === "Delete" ||
          (ev.key.length === 1 && !ev.ctrlKey && !ev.metaKey))
      )
        onStatus(READ_ONLY_HINT);
    },
    [table, canCorrect, onStatus],
  );

  const onDoubleClick = useCallback(
    (e: CellDoubleClickedEvent<GridRow>) => {
      const col = table.columns.find((c) => c.field === e.colDef.field);
      if (!(canCorrect && col?.correctable && e.data?.status === "QUARANTINED") && !e.node.rowPinned)
        onStatus(READ_ONLY_HINT);
    },
    [table, canCorrect, onStatus],
  );
  return { onEdit, onKey, onDoubleClick };
}
