"use client";
// The grid page's working area: table picker, new-row grid, stored-row grid, status line, save,
// CSV import with a preview and export of the whole filtered view.
import { useCallback, useRef, useState } from "react";
import type { ChangeEvent } from "react";
import { useRouter } from "next/navigation";
import type { UnitSystem } from "@/lib/quantity/units";
import type { TableKey } from "@/lib/grid/tables";
import { GRID_TABLES, TABLE_KEYS } from "@/lib/grid/tables";
import { headerWithUnit, showCell } from "@/lib/grid/cells";
import { decodeText, MAX_IMPORT_BYTES } from "@/lib/grid/sheet";
import type { DraftGridHandle } from "@/app/grid/draft-grid";
import { DraftGrid } from "@/app/grid/draft-grid";
import type { Correction, ViewModel } from "@/app/grid/stored-grid";
import { StoredGrid } from "@/app/grid/stored-grid";
import type { ImportAnswer } from "@/app/grid/grid-api";
import { exportUrl, importFile, saveRows } from "@/app/grid/grid-api";
import { LOCALES } from "@/lib/grid/locales";

type Role = "COLLECTOR" | "PRODUCTION" | "COMPLIANCE" | "ADMIN";

export function GridWorkspace(props: { tableKey: TableKey; role: Role; system: UnitSystem; locale: string }) {
  const { tableKey, role, system } = props;
  const table = GRID_TABLES[tableKey];
  const router = useRouter();
  const [locale, setLocale] = useState(props.locale);
  const [status, setStatus] = useState(
    "Arrows, Tab and Enter move; type to replace; F2 edits; Esc cancels; Shift+arrows select; Ctrl+D fills down; Ctrl+Z / Ctrl+Y undo and redo.",
  );
  const [busy, setBusy] = useState(false);
  const [, setTick] = useState(0);
  const [messages, setMessages] = useState<string[]>([]);
  const [corrections, setCorrections] = useState<Correction[]>([]);
  const [refreshToken, setRefreshToken] = useState(0);
  const [importState, setImportState] = useState<{
    name: string;
    text: string;
    encoding: string;
    answer: ImportAnswer | null;
  } | null>(null);
  const drafts = useRef<DraftGridHandle>(null);
  const view = useRef<ViewModel>({ sort: [], filter: {} });
  const canAdd = (table.addRoles as readonly string[]).includes(role);
  const canCorrect = role === "PRODUCTION" && table.columns.some((c) => c.correctable);

  const onStatus = useCallback((s: string) => setStatus(s), []);
  const onView = useCallback((v: ViewModel) => (view.current = v), []);
  const onChange = useCallback(() => setTick((t) => t + 1), []);
  const onCorrection = useCallback((c: Correction) => {
    setCorrections((prev) => [
      ...prev.filter((x) => !(x.rowId === c.rowId && x.field === c.field)),
      ...(c.value === c.before && prev.every((x) => x.rowId !== c.rowId) ? [] : [c]),
    ]);
    setStatus(
      `Lot ${c.rowId}: decision ${c.value.toLowerCase()} will be saved with Save (Ctrl+Z in this table before saving takes it back)`,
    );
  }, []);

  const applyIssues = (issues: Array<{ field?: string; message: string }>) => {
    const byRef: Record<string, Record<string, string>> = {};
    for (const i of issues) {
      const [ref, ...rest] = (i.field ?? "").split(".");
      if (!ref) continue;
      (byRef[ref] ??= {})[rest.join(".").split(".")[0] ?? ""] = i.message;
    }
    drafts.current?.setServerErrors(byRef);
  };

  const save = async (dryRun = false, only?: string[]) => {
    const ready = (drafts.current?.ready() ?? []).filter((r) => !only || only.includes(r.ref));
    const fixes = dryRun
      ? []
      : corrections.map((c) => ({ ref: c.ref, rowId: c.rowId, field: c.field, value: c.value }));
    if (ready.length === 0 && fixes.length === 0) {
      if (!dryRun)
        setStatus(
          drafts.current?.counts().drafts
            ? "No row is complete and valid yet: fix the marked cells (hover a cell for its message)"
            : "Nothing to save",
        );
      return;
    }
    setBusy(true);
    const a = await saveRows({ table: tableKey, rows: ready, corrections: fixes, dryRun });
    setBusy(false);
    if (!a.ok) {
      applyIssues(a.issues);
      setMessages(a.issues.map((i) => i.message));
      setStatus(
        `${dryRun ? "Server check" : "Nothing saved"}: ${a.issues.length} problem${a.issues.length === 1 ? "" : "s"} — ${a.issues[0]?.message ?? ""}`,
      );
      return;
    }
    if (dryRun) {
      drafts.current?.setServerErrors({});
      setMessages([]);
      setStatus(
        (s) => `${s} Server check: ${a.value.saved.length} row${a.value.saved.length === 1 ? "" : "s"} would save.`,
      );
      return;
    }
    drafts.current?.markSaved(a.value.saved);
    setCorrections([]);
    setMessages([]);
    setRefreshToken((t) => t + 1);
    const left = drafts.current?.counts();
    setStatus(
      `Saved ${a.value.saved.length} row${a.value.saved.length === 1 ? "" : "s"}${a.value.corrected.length ? ` and ${a.value.corrected.length} correction${a.value.corrected.length === 1 ? "" : "s"}` : ""}; the rows now show the server's record.${left && left.invalid ? ` ${left.invalid} row${left.invalid === 1 ? " is" : "s are"} still drafts with problems.` : ""}`,
    );
  };

  const onPasted = useCallback(
    (refs: string[]) => {
      setTimeout(() => void save(true, refs), 0);
    },
    [tableKey],
  );

  const onFile = async (e: ChangeEvent<HTMLInputElement>) => {
    const file = e.target.files?.[0];
    e.target.value = "";
    if (!file) return;
    if (file.size > MAX_IMPORT_BYTES) {
      setStatus(
        `${file.name} is ${(file.size / 1e6).toFixed(1)} MB; files up to 10 MB can be imported — split it into parts`,
      );
      return;
    }
    const { text, encoding } = decodeText(new Uint8Array(await file.arrayBuffer()));
    setBusy(true);
    const a = await importFile({ table: tableKey, text, locale, dryRun: true });
    setBusy(false);
    if (!a.ok) {
      setImportState(null);
      setStatus(`${file.name}: ${a.issues.map((i) => i.message).join("; ")}`);
      return;
    }
    setImportState({ name: file.name, text, encoding, answer: a.value });
    setStatus(
      `${file.name} (${encoding}): ${a.value.total} rows — ${a.value.written} new, ${a.value.unchanged} already stored unchanged, ${a.value.failed} with problems. Nothing is saved yet.`,
    );
  };

  const confirmImport = async () => {
    if (!importState) return;
    setBusy(true);
    const a = await importFile({ table: tableKey, text: importState.text, locale, dryRun: false });
    setBusy(false);
    if (!a.ok) {
      setStatus(`Nothing imported: ${a.issues[0]?.message ?? ""}`);
      setMessages(a.issues.map((i) => i.message));
      return;
    }
    setImportState(null);
    setRefreshToken((t) => t + 1);
    setStatus(
      `Imported ${importState.name}: ${a.value.written} rows written, ${a.value.unchanged} already stored and unchanged.`,
    );
  };

  const counts = drafts.current?.counts() ?? { drafts: 0, ready: 0, invalid: 0 };

  return (
    <div className="grid-page">
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
            onClick={(e) =>
              (e.currentTarget.href = exportUrl(tableKey, "xlsx", view.current.sort, view.current.filter))
            }
            download
          >
            Export XLSX
          </a>
        </span>
      </div>
      <p className="grid-note">{table.note}</p>
      <p className="grid-status" role="status" aria-live="polite" data-testid="grid-status">
        {status}
      </p>
      {messages.length > 0 ? (
        <ul className="grid-messages" aria-label="Problems">
          {messages.slice(0, 20).map((m, i) => (
            <li key={i}>{m}</li>
          ))}
          {messages.length > 20 ? <li>… and {messages.length - 20} more</li> : null}
        </ul>
      ) : null}

      {canAdd ? (
        <section aria-labelledby="grid-new-rows">
          <div className="grid-section-head">
            <h2 id="grid-new-rows">New rows</h2>
            <span className="muted">
              {counts.drafts} draft{counts.drafts === 1 ? "" : "s"}: {counts.ready} ready, {counts.invalid} with
              problems
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
                  disabled={busy || role !== "PRODUCTION"}
                  aria-label="Import CSV file"
                />
              </label>
            </span>
          </div>
          <DraftGrid
            key={`${tableKey}-${locale}`}
            ref={drafts}
            table={table}
            system={system}
            locale={locale}
            onStatus={onStatus}
            onChange={onChange}
            onPasted={onPasted}
          />
        </section>
      ) : null}

      {importState?.answer ? (
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
            <button type="button" onClick={() => setImportState(null)}>
              Cancel import
            </button>
          </p>
        </section>
      ) : null}

      <section aria-labelledby="grid-stored">
        <div className="grid-section-head">
          <h2 id="grid-stored">Stored {table.label.toLowerCase()}</h2>
          <span className="muted">
            Sorted and filtered on the server; the last row totals mass and volume within the filter.
          </span>
          {corrections.length ? (
            <span className="grid-toolbar-end">
              {corrections.length} unsaved change{corrections.length === 1 ? "" : "s"}{" "}
              <button type="button" onClick={() => setCorrections((c) => c.slice(0, -1))}>
                Undo last change
              </button>{" "}
              <button type="button" className="primary" disabled={busy} onClick={() => void save(false)}>
                Save changes
              </button>
            </span>
          ) : null}
        </div>
        <StoredGrid
          key={tableKey}
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
    </div>
  );
}
