"use client";
import { useEffect, useRef } from "react";
import type { GridTable } from "@/lib/grid/tables";
import { entryColumns } from "@/lib/grid/tables";

type DraftRow = Record<string, string>;

/**
 * Keeps a table's unsaved rows in this browser, so a reload or a closed tab loses nothing typed; saved
 * rows leave the store. The row key travels along, so a restored row is still recorded only once.
 */
export function useKeptDrafts(opts: {
  table: GridTable;
  rows: readonly DraftRow[];
  stateField: string;
  restore: (kept: DraftRow[]) => void;
  onStatus: (message: string) => void;
}): void {
  const { table, rows, stateField } = opts;
  const storageKey = `tracevat.grid.drafts.${table.key}`;
  const restored = useRef(false);
  const latest = useRef(opts);
  latest.current = opts;
  useEffect(() => {
    restored.current = false;
    let kept: DraftRow[] = [];
    try {
      const raw: unknown = JSON.parse(window.localStorage.getItem(storageKey) ?? "[]");
      if (Array.isArray(raw))
        kept = raw.filter(
          (r): r is DraftRow =>
            typeof r === "object" && r !== null && Object.values(r as object).every((v) => typeof v === "string"),
        );
    } catch {
      kept = [];
    }
    if (kept.length > 0) {
      latest.current.restore(kept.map((r) => ({ ...r, [latest.current.stateField]: "draft" })));
      latest.current.onStatus(
        `Restored ${kept.length} unsaved row${kept.length === 1 ? "" : "s"} typed earlier in this browser`,
      );
    }
    restored.current = true;
  }, [storageKey]);
  useEffect(() => {
    if (!restored.current) return;
    const keep = rows.filter(
      (r) => r[stateField] === "draft" && entryColumns(table).some((c) => (r[c.field] ?? "").trim() !== ""),
    );
    try {
      if (keep.length > 0) window.localStorage.setItem(storageKey, JSON.stringify(keep));
      else window.localStorage.removeItem(storageKey);
    } catch {
      /* storage full or refused: the rows stay on the page */
    }
  }, [rows, storageKey, table, stateField]);
}
