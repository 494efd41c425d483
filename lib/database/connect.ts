// Opens a Prisma client for a DATABASE_URL: SQLite (file:…) by default, PostgreSQL for postgres:// URLs.
// Code sees one client type, the SQLite one; its filter set is the narrower of the two.
import { mkdirSync } from "node:fs";
import path from "node:path";
import { PrismaBetterSqlite3 } from "@prisma/adapter-better-sqlite3";
import { PrismaPg } from "@prisma/adapter-pg";
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

/** Adapter factory for the URL, shared by the client and the migration engine. */
export function adapterFor(url: string): PrismaBetterSqlite3 | PrismaPg {
  if (isPostgresUrl(url)) return new PrismaPg({ connectionString: url });
  const file = sqliteFilePath(url);
  mkdirSync(path.dirname(path.resolve(file)), { recursive: true });
  return new PrismaBetterSqlite3({ url: `file:${file}` });
}

/** SQLite durability: WAL for concurrent readers, synchronous=FULL on every connection (WAL reopens at NORMAL). */
export const SQLITE_PRAGMAS = ["PRAGMA journal_mode = WAL", "PRAGMA synchronous = FULL", "PRAGMA foreign_keys = ON", "PRAGMA busy_timeout = 10000"];

export async function openDb(url: string): Promise<Db> {
  if (isPostgresUrl(url)) {
    return new PgClient({ adapter: new PrismaPg({ connectionString: url }) }) as unknown as Db;
  }
  const db = new SqliteClient({ adapter: adapterFor(url) as PrismaBetterSqlite3 });
  for (const pragma of SQLITE_PRAGMAS) await db.$queryRawUnsafe(pragma);
  const [sync] = await db.$queryRawUnsafe<Array<{ synchronous: number | bigint }>>("PRAGMA synchronous");
  if (Number(sync?.synchronous) !== 2) throw new Error(`SQLite synchronous is ${String(sync?.synchronous)}, expected 2 (FULL)`);
  return db;
}
