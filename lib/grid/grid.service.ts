import "server-only";
import { futureObservation } from "@/lib/collect/time-skew";
// The grid's writes: a batch of typed or pasted rows, or a CSV import, saved through the record
// services (audit trail, period lock, guarded draws, idempotency) inside ONE transaction — all rows or none.
import type { Db, Tx } from "@/lib/core/connect";
import { refreshPlannerStats, REFRESH_STATS_AFTER_ROWS } from "@/lib/database/maintenance";
import type { DomainIssue, Result } from "@/lib/core/result";
import { fail, failMany, ok } from "@/lib/core/result";
import { parseInput } from "@/lib/ledger/parse";
import { Rejection, runInTransaction, withoutIdempotencyKey } from "@/lib/ledger/transaction.store";
import type { SiteRole } from "@/lib/core/vocabulary";
import type { UnitSystem } from "@/lib/quantity/units";
import type { Actor } from "@/lib/core/actor";
import { createSource } from "@/lib/source/source.service";
import { importPickupRows, recordPickup } from "@/lib/feedstock/pickup.service";
import { decideLot, receiveDelivery, receiveLotFromPickups, recordLabTest } from "@/lib/feedstock/lot.service";
import { recordTitration } from "@/lib/feedstock/titration.service";
import type { GridRow, GridTable, TableKey } from "@/lib/grid/tables";
import { GRID_TABLES } from "@/lib/grid/tables";
import type { GridQuery } from "@/lib/grid/query.schema";
import { GridImportSchema, GridSaveSchema } from "@/lib/grid/query.schema";
import type { RowsPage } from "@/lib/grid/grid.store";
import { findRowsByKey, queryGridRows } from "@/lib/grid/grid.store";
import type { AddableTable } from "@/lib/grid/rows";
import { isAddable, toInput } from "@/lib/grid/rows";
import type { SheetRow } from "@/lib/grid/sheet";
import { readSheet } from "@/lib/grid/sheet";
import { sameStored } from "@/lib/grid/compare";

export interface GridActor extends Actor {
  role: SiteRole;
  unitSystem: UnitSystem;
}

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

/**
 * A view of the open transaction that record services can take as their database: their own
 * `runInTransaction` then runs inside this one, so a batch of rows commits or rolls back as one.
 */
function joinTransaction(tx: Tx): Db {
  return new Proxy(tx, {
    get(target, prop) {
      if (prop === "$transaction") return async (fn: (t: Tx) => Promise<unknown>) => fn(tx);
      return Reflect.get(target, prop) as unknown;
    },
  }) as Db;
}

type Saved = { code?: string; id?: number };

async function addRow(
  db: Db,
  actor: Actor,
  table: AddableTable,
  input: Record<string, unknown>,
): Promise<Result<Saved>> {
  switch (table) {
    case "sources":
      return createSource(db, actor, input);
    case "pickups": {
      const future = futureObservation(input.observedAt, actor.now);
      return future ? fail("PICKUP.IN_FUTURE", future, "observedAt") : recordPickup(db, actor, input);
    }
    case "lots":
      return input.supplierCode !== undefined || input.deliveryDocument !== undefined
        ? receiveDelivery(db, actor, input)
        : receiveLotFromPickups(db, actor, input);
    case "titrations":
      return recordTitration(db, actor, input);
    case "labTests":
      return recordLabTest(db, actor, input);
  }
}

function requireAdder(table: GridTable, role: SiteRole): Result<true> {
  if (!isAddable(table.key) || table.addRoles.length === 0)
    return fail("GRID.READ_ONLY", `${table.label} are recorded elsewhere; this table is read-only here`, "table");
  if (!(table.addRoles as readonly string[]).includes(role))
    return fail(
      "AUTH.FORBIDDEN",
      `Adding ${table.label.toLowerCase()} needs one of these roles: ${table.addRoles.map((r) => r.toLowerCase()).join(", ")}`,
    );
  return ok(true);
}

const PREVIEW = "GRID.PREVIEW_ONLY";

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

/**
 * Saves new rows and corrections of stored rows in one transaction. Every row goes through its record
 * service; if any row is refused nothing is written and every refusal comes back naming its row and field.
 * With dryRun the same work runs and is rolled back: the preview shows exactly what a save would do.
 */
export async function saveGridRows(db: Db, actor: GridActor, input: unknown): Promise<Result<SaveOutcome>> {
  const parsed = parseInput(GridSaveSchema, input);
  if (!parsed.ok) return parsed;
  const { table: key, rows, corrections, dryRun } = parsed.value;
  const table = GRID_TABLES[key];
  if (rows.length > 0) {
    const allowed = requireAdder(table, actor.role);
    if (!allowed.ok) return allowed;
  }
  for (const c of corrections) {
    const col = table.columns.find((x) => x.field === c.field);
    if (!col?.correctable)
      return fail(
        "GRID.NOT_CORRECTABLE",
        `${table.label}: ${col?.header ?? c.field} of a stored record is not changed in place; ledger quantities are corrected by a reversing entry`,
        `${c.ref}.${c.field}`,
      );
    if (key === "lots" && c.field === "status" && actor.role !== "PRODUCTION")
      return fail("AUTH.FORBIDDEN", "Lab decisions need the production role", `${c.ref}.${c.field}`);
  }
  if (rows.length === 0 && corrections.length === 0) return ok({ dryRun, saved: [], corrected: [] });
  let outcome: SaveOutcome | null = null;
  const result = await runInTransaction(
    db,
    async (tx) => {
      const inner = joinTransaction(tx);
      const issues: DomainIssue[] = [];
      const done: Array<{ ref: string; saved: Saved }> = [];
      for (const [n, r] of rows.entries()) {
        const res = await withoutIdempotencyKey(() => addRow(inner, actor, key as AddableTable, r.input));
        if (res.ok) done.push({ ref: r.ref, saved: res.value });
        else issues.push(...prefixIssues(r.ref, res.issues, `New row ${n + 1}`));
      }
      const fixed: Array<{ ref: string; rowId: string }> = [];
      for (const c of corrections) {
        const res = await withoutIdempotencyKey(() => decideLot(inner, actor, { lotCode: c.rowId, status: c.value }));
        if (res.ok) fixed.push({ ref: c.ref, rowId: c.rowId });
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
      const rowsNow = await savedRows(
        tx,
        actor,
        key,
        done.map((d) => d.saved),
      );
      outcome = {
        dryRun,
        saved: done.map((d) => ({
          ref: d.ref,
          row:
            rowsNow.find((x) =>
              d.saved.code !== undefined && !table.rowId.startsWith("id")
                ? x[table.rowId] === d.saved.code
                : x.id === d.saved.id,
            ) ?? null,
        })),
        corrected: fixed.length
          ? (
              await findRowsByKey(
                tx,
                actor.siteId,
                key,
                fixed.map((f) => f.rowId),
                actor.now,
              )
            ).map((row) => ({ ref: fixed.find((f) => f.rowId === row[table.rowId])?.ref ?? "", row }))
          : [],
      };
      if (dryRun) throw new Rejection([{ code: PREVIEW, message: "preview only: rolled back" }]);
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

export interface ImportRowPreview {
  line: number;
  status: "new" | "unchanged" | "error";
  values: GridRow;
  errors: Record<string, string>;
}

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

export const PREVIEW_ROWS = 200;
const MAX_MESSAGES = 500;

function keyOf(table: GridTable, row: GridRow): string {
  return table.importKey.map((f) => JSON.stringify(row[f] ?? null)).join("|");
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
  const messages = [...sheet.problems];
  const stored = await findRowsByKey(
    db,
    actor.siteId,
    key,
    sheet.rows.map((r) => String(r.values[table.importKey[0] ?? ""] ?? "")).filter((v) => v !== ""),
    actor.now,
  );
  const byKey = new Map(stored.map((row) => [keyOf(table, row), row]));
  const fresh: SheetRow[] = [];
  const preview: ImportRowPreview[] = [];
  const seen = new Map<string, number>();
  let unchanged = 0;
  let failed = 0;
  for (const r of sheet.rows) {
    const k = keyOf(table, r.values);
    const errors = { ...r.errors };
    const twin = seen.get(k);
    if (twin !== undefined && Object.keys(errors).length === 0)
      errors[table.importKey[0] ?? ""] = `the same record as row ${twin}`;
    seen.set(k, r.line);
    const existing = byKey.get(k);
    let status: ImportRowPreview["status"] = "new";
    if (Object.keys(errors).length) status = "error";
    else if (existing) {
      const diff = sameStored(table, r, existing);
      if (diff.length === 0) status = "unchanged";
      else {
        status = "error";
        for (const d of diff)
          errors[d.field] =
            `differs from the stored record (stored ${d.stored}); stored records are not overwritten by an import`;
      }
    }
    if (status === "error") {
      failed++;
      for (const [field, msg] of Object.entries(errors)) {
        if (messages.length >= MAX_MESSAGES) break;
        const header = table.columns.find((c) => c.field === field)?.header;
        messages.push(`Row ${r.line}${header ? `, column "${header}"` : ""}: ${msg}`);
      }
    } else if (status === "unchanged") unchanged++;
    else fresh.push(r);
    if (preview.length < PREVIEW_ROWS) preview.push({ line: r.line, status, values: r.values, errors });
  }
  const base = { dryRun, total: sheet.rows.length, unchanged, failed, messages, preview };
  const blocked = sheet.problems.length > 0 || failed > 0;
  if (blocked) {
    if (dryRun) return ok({ ...base, written: 0 });
    return failMany(messages.slice(0, MAX_MESSAGES).map((m) => ({ code: "GRID.IMPORT_REFUSED", message: m })));
  }
  if (fresh.length === 0) return ok({ ...base, written: 0 });
  let wouldWrite = 0;
  const result = await runInTransaction(
    db,
    async (tx) => {
      const inner = joinTransaction(tx);
      const issues: DomainIssue[] = [];
      const rowIssue = (line: number, i: DomainIssue): DomainIssue => {
        const header = table.columns.find((c) => c.field === (i.field ?? "").split(".")[0])?.header;
        return {
          ...i,
          field: `rows.${line}.${i.field ?? ""}`,
          message: `Row ${line}${header ? `, column "${header}"` : ""}: ${i.message}`,
        };
      };
      if (key === "pickups") {
        for (const r of fresh) {
          const future = futureObservation(toInput(table, r.values).observedAt, actor.now);
          if (future) issues.push(rowIssue(r.line, { code: "PICKUP.IN_FUTURE", message: future, field: "observedAt" }));
          if (issues.length >= MAX_MESSAGES) break;
        }
        if (issues.length) throw new Rejection(issues);
        // Pickups go through the bulk writer: the same records, receipts and audit events, a few statements per 500 rows.
        const res = await withoutIdempotencyKey(() =>
          importPickupRows(
            inner,
            actor,
            fresh.map((r) => toInput(table, r.values)),
          ),
        );
        if (!res.ok) {
          for (const i of res.issues.slice(0, MAX_MESSAGES)) {
            const [, index, ...rest] = (i.field ?? "").split(".");
            const line = fresh[Number(index)]?.line ?? 0;
            issues.push(rowIssue(line, { ...i, field: rest.join("."), message: i.message.replace(/^Row \d+: /, "") }));
          }
          throw new Rejection(issues);
        }
        wouldWrite = res.value.written;
      }
      for (const r of key === "pickups" ? [] : fresh) {
        const res = await withoutIdempotencyKey(() =>
          addRow(inner, actor, key as AddableTable, toInput(table, r.values)),
        );
        if (!res.ok) {
          for (const i of res.issues) issues.push(rowIssue(r.line, i));
          if (issues.length >= MAX_MESSAGES) break;
        } else wouldWrite++;
      }
      if (issues.length) throw new Rejection(issues);
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
  if (dryRun) {
    const failedLines = new Set(result.issues.map((i) => (i.field ?? "").split(".")[1]));
    for (const p of preview) {
      const mine = result.issues.filter((i) => (i.field ?? "").split(".")[1] === String(p.line));
      if (mine.length) {
        p.status = "error";
        for (const i of mine)
          p.errors[(i.field ?? "").split(".")[2] ?? ""] = i.message.replace(/^Row \d+(, column "[^"]*")?: /, "");
      }
    }
    return ok({
      ...base,
      failed: failed + failedLines.size,
      written: 0,
      messages: [...messages, ...result.issues.map((i) => i.message)],
    });
  }
  return result;
}
