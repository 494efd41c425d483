import "server-only";
import { DEFAULT_DATABASE_URL, openDb } from "@/lib/core/connect";
import type { Db } from "@/lib/core/connect";

// One client per server process (and per dev hot-reload), opened lazily on first use.
const globalForDb = globalThis as unknown as { tracevatDb?: Promise<Db> };

export function getDb(): Promise<Db> {
  globalForDb.tracevatDb ??= openDb(process.env.DATABASE_URL ?? DEFAULT_DATABASE_URL);
  return globalForDb.tracevatDb;
}
