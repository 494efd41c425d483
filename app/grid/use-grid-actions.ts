"use client";
// What the grid page does with the server: save ready rows and corrections (or check them first), and
// import a CSV file after a preview. Each reports through the page's status line.
import { useState } from "react";
import type { ChangeEvent, Dispatch, RefObject, SetStateAction } from "react";
import type { TableKey } from "@/lib/grid/tables";
import { decodeText, MAX_IMPORT_BYTES } from "@/lib/grid/sheet";
import type { DraftGridHandle } from "@/app/grid/draft-grid";
import type { Correction } from "@/app/grid/stored-grid";
import { importFile, saveRows } from "@/app/grid/grid-api";
import type { ImportState } from "@/app/grid/workspace-parts";

export interface GridFeedback {
  setStatus: Dispatch<SetStateAction<string>>;
  setBusy: (busy: boolean) => void;
  setMessages: (messages: string[]) => void;
  refresh: () => void;
}

export function useGridSave(
  tableKey: TableKey,
  drafts: RefObject<DraftGridHandle | null>,
  corrections: readonly Correction[],
  setCorrections: (c: Correction[]) => void,
  fb: GridFeedback,
): (dryRun?: boolean, only?: string[]) => Promise<void> {
  const { setStatus, setBusy, setMessages } = fb;
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
    fb.refresh();
    const left = drafts.current?.counts();
    setStatus(
      `Saved ${a.value.saved.length} row${a.value.saved.length === 1 ? "" : "s"}${a.value.corrected.length ? ` and ${a.value.corrected.length} correction${a.value.corrected.length === 1 ? "" : "s"}` : ""}; the rows now show the server's record.${left && left.invalid ? ` ${left.invalid} row${left.invalid === 1 ? " is" : "s are"} still drafts with problems.` : ""}`,
    );
  };
  return save;
}

export function useGridImport(
  tableKey: TableKey,
  locale: string,
  fb: GridFeedback,
): {
  importState: ImportState | null;
  setImportState: (s: ImportState | null) => void;
  onFile: (e: ChangeEvent<HTMLInputElement>) => Promise<void>;
  confirmImport: () => Promise<void>;
} {
  const { setStatus, setBusy, setMessages } = fb;
  const [importState, setImportState] = useState<ImportState | null>(null);
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
    fb.refresh();
    setStatus(
      `Imported ${importState.name}: ${a.value.written} rows written, ${a.value.unchanged} already stored and unchanged.`,
    );
  };
  return { importState, setImportState, onFile, confirmImport };
}
