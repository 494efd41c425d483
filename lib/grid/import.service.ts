import "server-only";
// CSV import into the grid's tables: read and check every row (the same shared schemas), match rows to
// stored records by the table's stable key, and write the new rows in one transaction.
import { futureObservation } from "@/lib/collect/time-skew";
import type { Db } from "@/lib/core/connect";
import { refreshPlannerStats, REFRESH_STATS_AFTER_ROWS } from "@/lib/database/maintenance";
import type { DomainIssue, Result } from "@/lib/core/result";
import { failMany, ok } from "@/lib/core/result";
import { parseInput } from "@/lib/ledger/parse";
import { Rejection, runInTransaction, withoutIdempotencyKey } from "@/lib/ledger/transaction.store";
import type { Actor } from "@/lib/core/actor";
import { importPickupRows } from "@/lib/feedstock/pickup.service";
import type { GridTable } from "@/lib/grid/tables";
import { GRID_TABLES } from "@/lib/grid/tables";
import { GridImportSchema } from "@/lib/grid/query.schema";
import { findRowsByKey } from "@/lib/grid/grid.store";
import type { AddableTable } from "@/lib/grid/rows";
import { toInput } from "@/lib/grid/rows";
import type { SheetRow } from "@/lib/grid/sheet";
import { readSheet } from "@/lib/grid/sheet";
import type { ImportRowPreview } from "@/lib/grid/import-match";
import { markRefusedRows, MAX_MESSAGES, rowIssue, sortImportRows } from "@/lib/grid/import-match";
import type { GridActor } from "@/lib/grid/grid-write.service";
import { addRow, joinTransaction, PREVIEW, requireAdder } from "@/lib/grid/grid-write.service";

export type { ImportRowPreview } from "@/lib/grid/import-match";
export { PREVIEW_ROWS } from "@/lib/grid/import-match";

export interface ImportOutcome {
  dryRun: boolean;
  encodingNote?: string;
  total: number;
  written: number;
  unchanged: number;
  failed: number;
  /** Block-level problems and per-row messages naming the row and the column. */
  messages: string[];
  /** The first rows, for the preview table. */
  preview: ImportRowPreview[];
}

/** Pickups go through the bulk writer: the same records, receipts and audit events, a few statements per 500 rows. */
async function writePickups(db: Db, actor: Actor, table: GridTable, fresh: readonly SheetRow[]): Promise<number> {
  const issues: DomainIssue[] = [];
  for (const r of fresh) {
    const future = futureObservation(toInput(table, r.values).observedAt, actor.now);
    if (future)
      issues.push(rowIssue(table, r.line, { code: "PICKUP.IN_FUTURE", message: future, field: "observedAt" }));
    if (issues.length >= MAX_MESSAGES) break;
  }
  if (issues.length) throw new Rejection(issues);
  const res = await withoutIdempotencyKey(() =>
    importPickupRows(
      db,
      actor,
      fresh.map((r) => toInput(table, r.values)),
    ),
  );
  if (res.ok) return res.value.written;
  for (const i of res.issues.slice(0, MAX_MESSAGES)) {
    const [, index, ...rest] = (i.field ?? "").split(".");
    const line = fresh[Number(index)]?.line ?? 0;
    issues.push(rowIssue(table, line, { ...i, field: rest.join("."), message: i.message.replace(/^Row \d+: /, "") }));
  }
  throw new Rejection(issues);
}

/** Every other table: row by row through its record service. */
async function writeRows(db: Db, actor: Actor, table: GridTable, fresh: readonly SheetRow[]): Promise<number> {
  const issues: DomainIssue[] = [];
  let written = 0;
  for (const r of fresh) {
    const res = await withoutIdempotencyKey(() =>
      addRow(db, actor, table.key as AddableTable, toInput(table, r.values)),
    );
    if (!res.ok) {
      for (const i of res.issues) issues.push(rowIssue(table, r.line, i));
      if (issues.length >= MAX_MESSAGES) break;
    } else written++;
  }
  if (issues.length) throw new Rejection(issues);
  return written;
}

/**
 * CSV import: read and check every row (the same shared schemas), match rows to stored records by the
 * table's stable key — identical rows are left alone, so re-importing a file or an export changes
 * nothing — and write the new rows in one transaction. Any problem: nothing is written, every
 * problem is named by row and column.
 */
export async function importGridFile(db: Db, actor: GridActor, input: unknown): Promise<Result<ImportOutcome>> {
  const parsed = parseInput(GridImportSchema, input);
  if (!parsed.ok) return parsed;
  const { table: key, text, locale, dryRun } = parsed.value;
  const table = GRID_TABLES[key];
  const allowed = requireAdder(table, actor.role);
  if (!allowed.ok) return allowed;
  const sheet = readSheet(table, text, { locale, system: actor.unitSystem, siteOffsetMin: 0, requireHeader: true });
  const stored = await findRowsByKey(
    db,
    actor.siteId,
    key,
    sheet.rows.map((r) => String(r.values[table.importKey[0] ?? ""] ?? "")).filter((v) => v !== ""),
    actor.now,
  );
  const { fresh, unchanged, failed, messages, preview } = sortImportRows(table, sheet.rows, stored, sheet.problems);
  const base = { dryRun, total: sheet.rows.length, unchanged, failed, messages, preview };
  if (sheet.problems.length > 0 || failed > 0) {
    if (dryRun) return ok({ ...base, written: 0 });
    return failMany(messages.slice(0, MAX_MESSAGES).map((m) => ({ code: "GRID.IMPORT_REFUSED", message: m })));
  }
  if (fresh.length === 0) return ok({ ...base, written: 0 });
  let wouldWrite = 0;
  const result = await runInTransaction(
    db,
    async (tx) => {
      const inner = joinTransaction(tx);
      wouldWrite = await (key === "pickups" ? writePickups : writeRows)(inner, actor, table, fresh);
      if (dryRun) throw new Rejection([{ code: PREVIEW, message: "preview only: rolled back" }]);
      return wouldWrite;
    },
    600_000,
  );
  if (result.ok) {
    if (result.value >= REFRESH_STATS_AFTER_ROWS) await refreshPlannerStats(db);
    return ok({ ...base, written: result.value });
  }
  if (result.issues.length === 1 && result.issues[0]?.code === PREVIEW) return ok({ ...base, written: wouldWrite });
  if (!dryRun) return result;
  const refused = markRefusedRows(preview, result.issues);
  return ok({
    ...base,
    failed: failed + refused,
    written: 0,
    messages: [...messages, ...result.issues.map((i) => i.message)],
  });
}
