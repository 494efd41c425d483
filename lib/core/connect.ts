// Opens a Prisma client for a DATABASE_URL: SQLite (file:…) by default, PostgreSQL for postgres:// URLs.
// Code sees one client type, the SQLite one; its filter set is the narrower of the two.
import { mkdirSync } from "node:fs";
import path from "node:path";
import { PrismaBetterSqlite3 } from "@prisma/adapter-better-sqlite3";
import { PrismaPg } from "@prisma/adapter-pg";
import { classifyDatabaseFault } from "@/lib/core/faults";
import { PrismaClient as SqliteClient } from "@/lib/generated/sqlite/client";
import { PrismaClient as PgClient } from "@/lib/generated/pg/client";

export type Db = SqliteClient;
export type Tx = Parameters<Parameters<Db["$transaction"]>[0]>[0];

export const DEFAULT_DATABASE_URL = "file:./data/tracevat.db";

export function isPostgresUrl(url: string): boolean {
  return /^postgres(ql)?:\/\//.test(url);
}

export function sqliteFilePath(url: string): string {
  return url.replace(/^file:/, "");
}

/**
 * SQLite durability: WAL for concurrent readers, synchronous=FULL on every connection (WAL reopens at
 * NORMAL). Then the planner statistics SQLite's documentation advises for long-lived connections
 * (`PRAGMA optimize=0x10002` on open, sampling bounded by analysis_limit): without them a filtered grid
 * page on 100 k pickups walked the (siteId, code) index row by row.
 */
export const SQLITE_PRAGMAS = [
  "PRAGMA journal_mode = WAL",
  "PRAGMA synchronous = FULL",
  "PRAGMA foreign_keys = ON",
  "PRAGMA busy_timeout = 10000",
  "PRAGMA analysis_limit = 400",
  "PRAGMA optimize = 0x10002",
];

/**
 * Applies and then reads back the durability pragmas on every connection the adapter opens, so a
 * reconnect can never silently run at synchronous=NORMAL. Refuses the connection otherwise.
 */
class DurableSqliteFactory extends PrismaBetterSqlite3 {
  override async connect(): ReturnType<PrismaBetterSqlite3["connect"]> {
    const adapter = takeWriteLockFirst(await super.connect());
    await adapter.executeScript(SQLITE_PRAGMAS.join(";\n"));
    const read = await adapter.queryRaw({ sql: "PRAGMA synchronous", args: [], argTypes: [] });
    const level = Number(read.rows[0]?.[0]);
    if (level !== 2) {
      await adapter.dispose();
      throw new Error(`SQLite synchronous is ${level}, expected 2 (FULL); refusing to open the database`);
    }
    return adapter;
  }
}

const NO_ARGS = { args: [], argTypes: [] };

/**
 * The adapter opens transactions with a plain (deferred) BEGIN, and a transaction that has read before
 * its first write is refused SQLITE_BUSY at once when another connection holds the write lock: SQLite
 * skips the busy handler there rather than risk a deadlock, so busy_timeout never applied. A write that
 * matches no row, first thing after BEGIN, takes the write lock through the busy handler instead: the
 * transaction waits up to busy_timeout for another process (a backup, a script) and only then gives up.
 */
function takeWriteLockFirst<A extends Awaited<ReturnType<PrismaBetterSqlite3["connect"]>>>(adapter: A): A {
  const start = adapter.startTransaction.bind(adapter);
  adapter.startTransaction = async (isolationLevel) => {
    const tx = await start(isolationLevel);
    try {
      await tx.executeRaw({ sql: 'UPDATE "Site" SET "id" = "id" WHERE 0', ...NO_ARGS });
    } catch (error) {
      // Before the first migration there is no Site table: go on, the first real write takes the lock.
      if (classifyDatabaseFault(error) === null) return tx;
      await tx.executeRaw({ sql: "ROLLBACK", ...NO_ARGS }).catch(() => undefined);
      await tx.rollback();
      throw error;
    }
    return tx;
  };
  return adapter;
}

/**
 * Marks a raw statement to be kept prepared on each PostgreSQL connection: a `$queryRaw` whose text
 * begins with this comment is parsed and planned once per connection instead of on every run. For
 * short statements asked on every request (a kept answer's key read), planning costs more than running.
 * Only marked statements are named, so the statements a connection keeps stay few (one per marked text).
 */
export const PREPARED_MARK = "/* prepared */";

const preparedNames = new Map<string, string>();

/** The statement's name on every connection (one per marked text), or "" (unnamed: parsed each time). */
export function preparedStatementName(sql: string): string {
  if (!sql.startsWith(PREPARED_MARK)) return "";
  let name = preparedNames.get(sql);
  if (name === undefined) {
    name = `tracevat_prepared_${preparedNames.size + 1}`;
    preparedNames.set(sql, name);
  }
  return name;
}

function postgresAdapter(url: string): PrismaPg {
  return new PrismaPg({ connectionString: url }, { statementNameGenerator: (q) => preparedStatementName(q.sql) });
}

/** Adapter factory for the URL, shared by the client and the migration engine. */
export function adapterFor(url: string): PrismaBetterSqlite3 | PrismaPg {
  if (isPostgresUrl(url)) return postgresAdapter(url);
  const file = sqliteFilePath(url);
  mkdirSync(path.dirname(path.resolve(file)), { recursive: true });
  return new DurableSqliteFactory({ url: `file:${file}` });
}

export async function openDb(url: string): Promise<Db> {
  if (isPostgresUrl(url)) {
    return new PgClient({ adapter: postgresAdapter(url) }) as unknown as Db;
  }
  const db = new SqliteClient({ adapter: adapterFor(url) as PrismaBetterSqlite3 });
  await db.$connect();
  return db;
}
