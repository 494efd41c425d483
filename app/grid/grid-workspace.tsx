"use client";
// The grid page's working area: table picker, new-row grid, stored-row grid, status line, save,
// CSV import with a preview and export of the whole filtered view.
import { useCallback, useRef, useState } from "react";
import type { ChangeEvent, Dispatch, RefObject, SetStateAction } from "react";
import type { UnitSystem } from "@/lib/quantity/units";
import type { GridTable, TableKey } from "@/lib/grid/tables";
import { GRID_TABLES } from "@/lib/grid/tables";
import type { DraftGridHandle } from "@/app/grid/draft-grid";
import { DraftGrid } from "@/app/grid/draft-grid";
import type { Correction, ViewModel } from "@/app/grid/stored-grid";
import { StoredGrid } from "@/app/grid/stored-grid";
import { useGridImport, useGridSave } from "@/app/grid/use-grid-actions";
import { GridMessages, GridToolbar, ImportPreview, NewRowsBar, StoredBar } from "@/app/grid/workspace-parts";

type Role = "COLLECTOR" | "PRODUCTION" | "COMPLIANCE" | "ADMIN";

const KEYS_HELP =
  "Arrows, Tab and Enter move; type to replace; F2 edits; Esc cancels; Shift+arrows select; Ctrl+D fills down; Ctrl+Z / Ctrl+Y undo and redo.";

export function GridWorkspace(props: { tableKey: TableKey; role: Role; system: UnitSystem; locale: string }) {
  const { tableKey, role, system } = props;
  const table = GRID_TABLES[tableKey];
  const [locale, setLocale] = useState(props.locale);
  const [status, setStatus] = useState(KEYS_HELP);
  const [busy, setBusy] = useState(false);
  const [, setTick] = useState(0);
  const [messages, setMessages] = useState<string[]>([]);
  const [corrections, setCorrections, onCorrection] = useCorrections(setStatus);
  const [refreshToken, setRefreshToken] = useState(0);
  const drafts = useRef<DraftGridHandle>(null);
  const view = useRef<ViewModel>({ sort: [], filter: {} });
  const canAdd = (table.addRoles as readonly string[]).includes(role);
  const canCorrect = role === "PRODUCTION" && table.columns.some((c) => c.correctable);
  const fb = { setStatus, setBusy, setMessages, refresh: () => setRefreshToken((t) => t + 1) };
  const save = useGridSave(tableKey, drafts, corrections, setCorrections, fb);
  const { importState, setImportState, onFile, confirmImport } = useGridImport(tableKey, locale, fb);

  const onStatus = useCallback((s: string) => setStatus(s), []);
  const onView = useCallback((v: ViewModel) => (view.current = v), []);
  const onChange = useCallback(() => setTick((t) => t + 1), []);
  const onPasted = useCallback(
    (refs: string[]) => {
      setTimeout(() => void save(true, refs), 0);
    },
    [tableKey],
  );
  return (
    <div className="grid-page">
      <GridToolbar tableKey={tableKey} locale={locale} setLocale={setLocale} system={system} view={view} />
      <p className="grid-note">{table.note}</p>
      <p className="grid-status" role="status" aria-live="polite" data-testid="grid-status">
        {status}
      </p>
      <GridMessages messages={messages} label="Problems" max={20} />
      {canAdd ? (
        <NewRowsSection
          key={`${tableKey}-${locale}`}
          drafts={drafts}
          table={table}
          system={system}
          locale={locale}
          busy={busy}
          canImport={role === "PRODUCTION"}
          save={save}
          onFile={onFile}
          onStatus={onStatus}
          onChange={onChange}
          onPasted={onPasted}
        />
      ) : null}
      {importState?.answer ? (
        <ImportPreview
          importState={{ ...importState, answer: importState.answer }}
          table={table}
          system={system}
          busy={busy}
          confirmImport={confirmImport}
          cancel={() => setImportState(null)}
        />
      ) : null}
      <StoredSection
        key={tableKey}
        table={table}
        system={system}
        canCorrect={canCorrect}
        busy={busy}
        corrections={corrections}
        setCorrections={setCorrections}
        save={save}
        onStatus={onStatus}
        onView={onView}
        onCorrection={onCorrection}
        refreshToken={refreshToken}
      />
    </div>
  );
}

function useCorrections(
  setStatus: (s: string) => void,
): [Correction[], Dispatch<SetStateAction<Correction[]>>, (c: Correction) => void] {
  const [corrections, setCorrections] = useState<Correction[]>([]);
  const onCorrection = useCallback((c: Correction) => {
    setCorrections((prev) => [
      ...prev.filter((x) => !(x.rowId === c.rowId && x.field === c.field)),
      ...(c.value === c.before && prev.every((x) => x.rowId !== c.rowId) ? [] : [c]),
    ]);
    setStatus(
      `Lot ${c.rowId}: decision ${c.value.toLowerCase()} will be saved with Save (Ctrl+Z in this table before saving takes it back)`,
    );
  }, []);

  return [corrections, setCorrections, onCorrection];
}

function StoredSection(props: {
  table: GridTable;
  system: UnitSystem;
  canCorrect: boolean;
  busy: boolean;
  corrections: Correction[];
  setCorrections: Dispatch<SetStateAction<Correction[]>>;
  save: (dryRun?: boolean) => Promise<void>;
  onStatus: (s: string) => void;
  onView: (v: ViewModel) => void;
  onCorrection: (c: Correction) => void;
  refreshToken: number;
}) {
  const {
    table,
    system,
    canCorrect,
    busy,
    corrections,
    setCorrections,
    save,
    onStatus,
    onView,
    onCorrection,
    refreshToken,
  } = props;
  return (
    <section aria-labelledby="grid-stored">
      <StoredBar
        label={table.label}
        corrections={corrections}
        busy={busy}
        undoLast={() => setCorrections((c) => c.slice(0, -1))}
        save={save}
      />
      <StoredGrid
        table={table}
        system={system}
        canCorrect={canCorrect}
        onStatus={onStatus}
        onView={onView}
        corrections={corrections}
        onCorrection={onCorrection}
        refreshToken={refreshToken}
      />
    </section>
  );
}

function NewRowsSection(props: {
  drafts: RefObject<DraftGridHandle | null>;
  table: GridTable;
  system: UnitSystem;
  locale: string;
  busy: boolean;
  canImport: boolean;
  save: (dryRun?: boolean) => Promise<void>;
  onFile: (e: ChangeEvent<HTMLInputElement>) => Promise<void>;
  onStatus: (s: string) => void;
  onChange: () => void;
  onPasted: (refs: string[]) => void;
}) {
  const { drafts, table, system, locale, busy, canImport, save, onFile, onStatus, onChange, onPasted } = props;
  const counts = drafts.current?.counts() ?? { drafts: 0, ready: 0, invalid: 0 };
  return (
    <section aria-labelledby="grid-new-rows">
      <NewRowsBar counts={counts} drafts={drafts} busy={busy} canImport={canImport} save={save} onFile={onFile} />
      <DraftGrid
        ref={drafts}
        table={table}
        system={system}
        locale={locale}
        onStatus={onStatus}
        onChange={onChange}
        onPasted={onPasted}
      />
    </section>
  );
}
