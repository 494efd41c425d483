// Multi-row INSERTs for bulk imports. Prisma's createMany spends most of a 50,000-row import building
// and checking its own arguments; one parameterised statement per few thousand rows costs a fraction.
// Values are bound, never spliced into the SQL; table and column names come from the caller's code,
// and are checked against a plain identifier pattern all the same.
import { invariant } from "@/lib/core/result";
import type { Db, Tx } from "@/lib/core/connect";

export type SqlValue = string | number | boolean | Date | null;

type Dialect = "sqlite" | "postgresql";

/** SQLite binds at most 32,766 parameters per statement, PostgreSQL 65,535; stay well under both. */
const MAX_PARAMS = 30_000;
const MAX_ROWS = 2_000;
const IDENTIFIER = /^[A-Za-z][A-Za-z0-9_]*$/;

export function dialectOf(tx: Db | Tx): Dialect {
  const provider = (tx as unknown as { _activeProvider?: string })._activeProvider;
  invariant(provider === "sqlite" || provider === "postgresql", `unknown database provider ${String(provider)}`);
  return provider;
}

/**
 * Dates as Prisma stores them: on SQLite the text "YYYY-MM-DDTHH:MM:SS.mmm+00:00" that its adapter
 * writes and reads back, on PostgreSQL an ISO UTC string for a timestamp(3) column.
 */
function bind(dialect: Dialect, v: SqlValue): string | number | null {
  if (v instanceof Date) {
    invariant(!Number.isNaN(v.getTime()), "cannot store an invalid date");
    const iso = v.toISOString();
    return dialect === "sqlite" ? `${iso.slice(0, -1)}+00:00` : iso;
  }
  if (typeof v === "boolean") return dialect === "sqlite" ? (v ? 1 : 0) : v ? "true" : "false";
  return v;
}

function quote(name: string): string {
  invariant(IDENTIFIER.test(name), `not a plain SQL identifier: ${name}`);
  return `"${name}"`;
}

function statement(dialect: Dialect, table: string, columns: readonly string[], rowCount: number): string {
  const width = columns.length;
  const tuples: string[] = [];
  for (let r = 0; r < rowCount; r++) {
    const marks: string[] = [];
    for (let c = 0; c < width; c++) marks.push(dialect === "sqlite" ? "?" : `$${r * width + c + 1}`);
    tuples.push(`(${marks.join(",")})`);
  }
  return `INSERT INTO ${quote(table)} (${columns.map(quote).join(",")}) VALUES ${tuples.join(",")}`;
}

function* chunks<T>(rows: readonly T[], width: number): Generator<readonly T[]> {
  const size = Math.max(1, Math.min(MAX_ROWS, Math.floor(MAX_PARAMS / Math.max(1, width))));
  for (let i = 0; i < rows.length; i += size) yield rows.slice(i, i + size);
}

function flatten(
  dialect: Dialect,
  width: number,
  part: ReadonlyArray<readonly SqlValue[]>,
): Array<string | number | null> {
  const params: Array<string | number | null> = [];
  for (const row of part) {
    invariant(row.length === width, `a row has ${row.length} values for ${width} columns`);
    for (const v of row) params.push(bind(dialect, v));
  }
  return params;
}

/** Inserts the rows in as few statements as the parameter limits allow. Rows are value arrays in column order. */
export async function insertRows(
  tx: Tx,
  table: string,
  columns: readonly string[],
  rows: ReadonlyArray<readonly SqlValue[]>,
): Promise<void> {
  const dialect = dialectOf(tx);
  for (const part of chunks(rows, columns.length)) {
    const sql = statement(dialect, table, columns, part.length);
    const written = await tx.$executeRawUnsafe(sql, ...flatten(dialect, columns.length, part));
    invariant(written === part.length, `${table}: ${written} of ${part.length} rows written`);
  }
}
