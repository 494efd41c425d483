"use client";
// The grid page's bars and panels: the table and number-format pickers with the exports, the problem
// list, the new-rows bar, the CSV import preview and the stored rows' bar.
import type { ChangeEvent, RefObject } from "react";
import { useRouter } from "next/navigation";
import type { UnitSystem } from "@/lib/quantity/units";
import type { GridTable, TableKey } from "@/lib/grid/tables";
import { GRID_TABLES, TABLE_KEYS } from "@/lib/grid/tables";
import { headerWithUnit, showCell } from "@/lib/grid/cells";
import { LOCALES } from "@/lib/grid/locales";
import type { DraftGridHandle } from "@/app/grid/draft-grid";
import type { Correction, ViewModel } from "@/app/grid/stored-grid";
import type { ImportAnswer } from "@/app/grid/grid-api";
import { exportUrl } from "@/app/grid/grid-api";

export interface ImportState {
  name: string;
  text: string;
  encoding: string;
  answer: ImportAnswer | null;
}

export function GridToolbar(props: {
  tableKey: TableKey;
  locale: string;
  setLocale: (locale: string) => void;
  system: UnitSystem;
  view: RefObject<ViewModel>;
}) {
  const { tableKey, locale, setLocale, system, view } = props;
  const router = useRouter();
  return (
    <div className="grid-toolbar">
      <label>
        Table{" "}
        <select value={tableKey} onChange={(e) => router.push(`/grid?table=${e.target.value}`)}>
          {TABLE_KEYS.map((k) => (
            <option key={k} value={k}>
              {GRID_TABLES[k].label}
            </option>
          ))}
        </select>
      </label>
      <label>
        Numbers and dates typed as{" "}
        <select value={locale} onChange={(e) => setLocale(e.target.value)}>
          {LOCALES.map(([k, label]) => (
            <option key={k} value={k}>
              {label}
            </option>
          ))}
        </select>
      </label>
      <span className="muted">Units: {system === "us" ? "US (gal, lb, °F)" : "metric (L, kg, °C)"}</span>
      <span className="grid-toolbar-end">
        <a
          className="button"
          href={exportUrl(tableKey, "csv", view.current.sort, view.current.filter)}
          onClick={(e) => (e.currentTarget.href = exportUrl(tableKey, "csv", view.current.sort, view.current.filter))}
          download
        >
          Export CSV
        </a>{" "}
        <a
          className="button"
          href={exportUrl(tableKey, "xlsx", view.current.sort, view.current.filter)}
          onClick={(e) => (e.currentTarget.href = exportUrl(tableKey, "xlsx", view.current.sort, view.current.filter))}
          download
        >
          Export XLSX
        </a>
      </span>
    </div>
  );
}

export function GridMessages({ messages, label, max }: { messages: readonly string[]; label: string; max: number }) {
  if (messages.length === 0) return null;
  return (
    <ul className="grid-messages" aria-label={label}>
      {messages.slice(0, max).map((m, i) => (
        <li key={i}>{m}</li>
      ))}
      {messages.length > max ? <li>… and {messages.length - max} more</li> : null}
    </ul>
  );
}

export function NewRowsBar(props: {
  counts: { drafts: number; ready: number; invalid: number };
  drafts: RefObject<DraftGridHandle | null>;
  busy: boolean;
  canImport: boolean;
  save: (dryRun?: boolean) => Promise<void>;
  onFile: (e: ChangeEvent<HTMLInputElement>) => Promise<void>;
}) {
  const { counts, drafts, busy, canImport, save, onFile } = props;
  return (
    <div className="grid-section-head">
      <h2 id="grid-new-rows">New rows</h2>
      <span className="muted">
        {counts.drafts} draft{counts.drafts === 1 ? "" : "s"}: {counts.ready} ready, {counts.invalid} with problems
      </span>
      <span className="grid-toolbar-end">
        <button type="button" onClick={() => drafts.current?.addRow()}>
          Add row
        </button>{" "}
        <button type="button" onClick={() => drafts.current?.undo()}>
          Undo
        </button>{" "}
        <button type="button" onClick={() => drafts.current?.redo()}>
          Redo
        </button>{" "}
        <button type="button" onClick={() => drafts.current?.clearSaved()}>
          Clear saved rows
        </button>{" "}
        <button type="button" className="primary" disabled={busy} onClick={() => void save(false)}>
          Save ready rows
        </button>{" "}
        <label className="button">
          Import CSV…
          <input
            type="file"
            accept=".csv,.txt,text/csv"
            className="visually-hidden"
            onChange={(e) => void onFile(e)}
            disabled={busy || !canImport}
            aria-label="Import CSV file"
          />
        </label>
      </span>
    </div>
  );
}

export function ImportPreview(props: {
  importState: ImportState & { answer: ImportAnswer };
  table: GridTable;
  system: UnitSystem;
  busy: boolean;
  confirmImport: () => Promise<void>;
  cancel: () => void;
}) {
  const { importState, table, system, busy, confirmImport, cancel } = props;
  return (
    <section className="grid-import" aria-labelledby="grid-import-head">
      <h2 id="grid-import-head">Import preview: {importState.name}</h2>
      <p>
        {importState.encoding}; {importState.answer.total} rows: <strong>{importState.answer.written} new</strong>,{" "}
        {importState.answer.unchanged} already stored and unchanged,{" "}
        <strong>{importState.answer.failed} with problems</strong>. Nothing has been saved.
      </p>
      {importState.answer.messages.length ? (
        <ul className="grid-messages" aria-label="Import problems">
          {importState.answer.messages.slice(0, 50).map((m, i) => (
            <li key={i}>{m}</li>
          ))}
        </ul>
      ) : null}
      <div className="table-wrap grid-preview">
        <table>
          <thead>
            <tr>
              <th scope="col">Row</th>
              <th scope="col">Will be</th>
              {table.columns
                .filter((c) => c.entry)
                .map((c) => (
                  <th key={c.field} scope="col">
                    {headerWithUnit(c, system)}
                  </th>
                ))}
            </tr>
          </thead>
          <tbody>
            {importState.answer.preview.slice(0, 50).map((r) => (
              <tr key={r.line} className={`preview-${r.status}`}>
                <td>{r.line}</td>
                <td>{r.status === "new" ? "written" : r.status === "unchanged" ? "left as stored" : "refused"}</td>
                {table.columns
                  .filter((c) => c.entry)
                  .map((c) => (
                    <td
                      key={c.field}
                      className={r.errors[c.field] ? "cell-invalid" : undefined}
                      title={r.errors[c.field]}
                    >
                      {showCell(c, r.values[c.field] ?? null, system)}
                    </td>
                  ))}
              </tr>
            ))}
          </tbody>
        </table>
      </div>
      <p>
        <button
          type="button"
          className="primary"
          disabled={busy || importState.answer.failed > 0 || importState.answer.written === 0}
          onClick={() => void confirmImport()}
        >
          Import {importState.answer.written} rows
        </button>{" "}
        <button type="button" onClick={cancel}>
          Cancel import
        </button>
      </p>
    </section>
  );
}

export function StoredBar(props: {
  label: string;
  corrections: readonly Correction[];
  busy: boolean;
  undoLast: () => void;
  save: (dryRun?: boolean) => Promise<void>;
}) {
  const { label, corrections, busy, undoLast, save } = props;
  return (
    <div className="grid-section-head">
      <h2 id="grid-stored">Stored {label.toLowerCase()}</h2>
      <span className="muted">
        Sorted and filtered on the server; the last row totals mass and volume within the filter.
      </span>
      {corrections.length ? (
        <span className="grid-toolbar-end">
          {corrections.length} unsaved change{corrections.length === 1 ? "" : "s"}{" "}
          <button type="button" onClick={undoLast}>
            Undo last change
          </button>{" "}
          <button type="button" className="primary" disabled={busy} onClick={() => void save(false)}>
            Save changes
          </button>
        </span>
      ) : null}
    </div>
  );
}
