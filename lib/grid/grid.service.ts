import "server-only";
// The grid's reads and saves: a block of rows for the infinite row model, and a batch of typed or pasted
// rows saved through the record services (audit trail, period lock, guarded draws, idempotency) inside
// ONE transaction — all rows or none. CSV import is in import.service.ts.
import type { Db, Tx } from "@/lib/core/connect";
import type { DomainIssue, Result } from "@/lib/core/result";
import { fail, ok } from "@/lib/core/result";
import { parseInput } from "@/lib/ledger/parse";
import { Rejection, runInTransaction, withoutIdempotencyKey } from "@/lib/ledger/transaction.store";
import type { Actor } from "@/lib/core/actor";
import { decideLot } from "@/lib/feedstock/lot.service";
import type { GridRow, GridTable, TableKey } from "@/lib/grid/tables";
import { GRID_TABLES } from "@/lib/grid/tables";
import type { GridQuery, GridSave } from "@/lib/grid/query.schema";
import { GridSaveSchema } from "@/lib/grid/query.schema";
import type { RowsPage } from "@/lib/grid/grid.store";
import { findRowsByKey, queryGridRows } from "@/lib/grid/grid.store";
import type { AddableTable } from "@/lib/grid/rows";
import type { GridActor, Saved } from "@/lib/grid/grid-write.service";
import { addRow, joinTransaction, PREVIEW, requireAdder } from "@/lib/grid/grid-write.service";

export type { GridActor } from "@/lib/grid/grid-write.service";
export { importGridFile } from "@/lib/grid/import.service";

export async function listGridRows(db: Db, actor: GridActor, q: GridQuery): Promise<RowsPage> {
  return queryGridRows(db, {
    siteId: actor.siteId,
    table: q.table,
    start: q.start,
    end: q.end,
    sort: q.sort,
    filter: q.filter,
    system: actor.unitSystem,
    now: actor.now,
  });
}

export interface SaveOutcome {
  dryRun: boolean;
  /** The stored rows as the server now has them (computed fields included), by the client's row reference. */
  saved: Array<{ ref: string; row: GridRow | null }>;
  corrected: Array<{ ref: string; row: GridRow | null }>;
}

/** Issues of one row, each field prefixed with the row's reference so the grid marks the right cell. */
function prefixIssues(ref: string, issues: DomainIssue[], label: string): DomainIssue[] {
  return issues.map((i) => ({ ...i, field: `${ref}.${i.field ?? ""}`, message: `${label}: ${i.message}` }));
}

type Correction = GridSave["corrections"][number];

/** Only a lot's lab decision is changed in place, and only by production. */
function checkCorrections(table: GridTable, corrections: readonly Correction[], role: string): Result<true> {
  for (const c of corrections) {
    const col = table.columns.find((x) => x.field === c.field);
    if (!col?.correctable)
      return fail(
        "GRID.NOT_CORRECTABLE",
        `${table.label}: ${col?.header ?? c.field} of a stored record is not changed in place; ledger quantities are corrected by a reversing entry`,
        `${c.ref}.${c.field}`,
      );
    if (table.key === "lots" && c.field === "status" && role !== "PRODUCTION")
      return fail("AUTH.FORBIDDEN", "Lab decisions need the production role", `${c.ref}.${c.field}`);
  }
  return ok(true);
}

interface Written {
  done: Array<{ ref: string; saved: Saved }>;
  fixed: Array<{ ref: string; rowId: string }>;
}

/** Every new row and correction through its service; any refusal rolls the whole block back, all named. */
async function writeBlock(db: Db, actor: Actor, key: TableKey, block: GridSave): Promise<Written> {
  const issues: DomainIssue[] = [];
  const out: Written = { done: [], fixed: [] };
  for (const [n, r] of block.rows.entries()) {
    const res = await withoutIdempotencyKey(() => addRow(db, actor, key as AddableTable, r.input));
    if (res.ok) out.done.push({ ref: r.ref, saved: res.value });
    else issues.push(...prefixIssues(r.ref, res.issues, `New row ${n + 1}`));
  }
  for (const c of block.corrections) {
    const res = await withoutIdempotencyKey(() => decideLot(db, actor, { lotCode: c.rowId, status: c.value }));
    if (res.ok) out.fixed.push({ ref: c.ref, rowId: c.rowId });
    else
      issues.push(
        ...prefixIssues(
          c.ref,
          res.issues.map((i) => ({ ...i, field: c.field })),
          `Lot ${c.rowId}`,
        ),
      );
  }
  if (issues.length) throw new Rejection(issues);
  return out;
}

/** The stored rows as the server now has them, by the client's row reference. */
async function outcomeOf(tx: Tx, actor: Actor, table: GridTable, w: Written, dryRun: boolean): Promise<SaveOutcome> {
  const rowsNow = await savedRows(
    tx,
    actor,
    table.key,
    w.done.map((d) => d.saved),
  );
  const corrected = w.fixed.length
    ? await findRowsByKey(
        tx,
        actor.siteId,
        table.key,
        w.fixed.map((f) => f.rowId),
        actor.now,
      )
    : [];
  return {
    dryRun,
    saved: w.done.map((d) => ({
      ref: d.ref,
      row:
        rowsNow.find((x) =>
          d.saved.code !== undefined && !table.rowId.startsWith("id")
            ? x[table.rowId] === d.saved.code
            : x.id === d.saved.id,
        ) ?? null,
    })),
    corrected: corrected.map((row) => ({ ref: w.fixed.find((f) => f.rowId === row[table.rowId])?.ref ?? "", row })),
  };
}

/**
 * Saves new rows and corrections of stored rows in one transaction. Every row goes through its record
 * service; if any row is refused nothing is written and every refusal comes back naming its row and field.
 * With dryRun the same work runs and is rolled back: the preview shows exactly what a save would do.
 */
export async function saveGridRows(db: Db, actor: GridActor, input: unknown): Promise<Result<SaveOutcome>> {
  const parsed = parseInput(GridSaveSchema, input);
  if (!parsed.ok) return parsed;
  const block = parsed.value;
  const table = GRID_TABLES[block.table];
  if (block.rows.length > 0) {
    const allowed = requireAdder(table, actor.role);
    if (!allowed.ok) return allowed;
  }
  const correctable = checkCorrections(table, block.corrections, actor.role);
  if (!correctable.ok) return correctable;
  if (block.rows.length === 0 && block.corrections.length === 0)
    return ok({ dryRun: block.dryRun, saved: [], corrected: [] });
  let outcome: SaveOutcome | null = null;
  const result = await runInTransaction(
    db,
    async (tx) => {
      const written = await writeBlock(joinTransaction(tx), actor, block.table, block);
      outcome = await outcomeOf(tx, actor, table, written, block.dryRun);
      if (block.dryRun) throw new Rejection([{ code: PREVIEW, message: "preview only: rolled back" }]);
      return outcome;
    },
    600_000,
  );
  if (!result.ok && result.issues.length === 1 && result.issues[0]?.code === PREVIEW && outcome) return ok(outcome);
  return result;
}

async function savedRows(tx: Tx, actor: Actor, key: TableKey, saved: Saved[]): Promise<GridRow[]> {
  if (saved.length === 0) return [];
  const table = GRID_TABLES[key];
  if (table.rowId === "id") {
    const ids = saved.map((s) => s.id).filter((x): x is number => x !== undefined);
    return (
      await queryGridRows(tx, {
        siteId: actor.siteId,
        table: key,
        start: 0,
        end: ids.length + 1,
        sort: [],
        filter: {},
        system: "metric",
        now: actor.now,
        extra: { id: { in: ids } },
      })
    ).rows;
  }
  return findRowsByKey(
    tx,
    actor.siteId,
    key,
    saved.map((s) => s.code ?? ""),
    actor.now,
  );
}
