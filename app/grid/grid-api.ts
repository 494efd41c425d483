// Browser calls to the grid's route handlers; every answer is {ok, value} or {ok:false, issues}.
import type { DomainIssue } from "@/lib/core/result";
import type { GridRow, TableKey } from "@/lib/grid/tables";

export type Answer<T> = { ok: true; value: T } | { ok: false; issues: DomainIssue[] };

export interface RowsAnswer {
  rows: GridRow[];
  lastRow: number;
  totals: { massKg: number | null; volumeL: number | null };
}

export interface SaveAnswer {
  dryRun: boolean;
  saved: Array<{ ref: string; row: GridRow | null }>;
  corrected: Array<{ ref: string; row: GridRow | null }>;
}

export interface ImportAnswer {
  dryRun: boolean;
  total: number;
  written: number;
  unchanged: number;
  failed: number;
  messages: string[];
  preview: Array<{
    line: number;
    status: "new" | "unchanged" | "error";
    values: GridRow;
    errors: Record<string, string>;
  }>;
}

async function post<T>(url: string, body: unknown, write: boolean): Promise<Answer<T>> {
  try {
    const res = await fetch(url, {
      method: "POST",
      headers: { "content-type": "application/json", ...(write ? { "idempotency-key": crypto.randomUUID() } : {}) },
      body: JSON.stringify(body),
    });
    return (await res.json()) as Answer<T>;
  } catch {
    return {
      ok: false,
      issues: [
        {
          code: "NETWORK.FAILED",
          message: "The server could not be reached; nothing was saved and your rows are kept here",
        },
      ],
    };
  }
}

export function saveRows(body: {
  table: TableKey;
  rows: Array<{ ref: string; input: Record<string, unknown> }>;
  corrections: Array<{ ref: string; rowId: string; field: string; value: unknown }>;
  dryRun: boolean;
}): Promise<Answer<SaveAnswer>> {
  return post<SaveAnswer>("/api/grid/save", body, !body.dryRun);
}

export function importFile(body: {
  table: TableKey;
  text: string;
  locale: string;
  dryRun: boolean;
}): Promise<Answer<ImportAnswer>> {
  return post<ImportAnswer>("/api/grid/import", body, !body.dryRun);
}

export async function fetchRows(
  table: TableKey,
  start: number,
  end: number,
  sort: unknown,
  filter: unknown,
): Promise<Answer<RowsAnswer>> {
  const q = new URLSearchParams({
    table,
    start: String(start),
    end: String(end),
    sort: JSON.stringify(sort),
    filter: JSON.stringify(filter),
  });
  try {
    const res = await fetch(`/api/grid/rows?${q.toString()}`);
    return (await res.json()) as Answer<RowsAnswer>;
  } catch {
    return { ok: false, issues: [{ code: "NETWORK.FAILED", message: "The server could not be reached" }] };
  }
}

export function exportUrl(table: TableKey, format: "csv" | "xlsx", sort: unknown, filter: unknown): string {
  return `/api/grid/export?${new URLSearchParams({ table, format, sort: JSON.stringify(sort), filter: JSON.stringify(filter) }).toString()}`;
}
