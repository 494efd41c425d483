// Writes a synthetic plant history into a fresh SQLite file migrated with the real migrations, and
// reads the trace's ledger rows back with one plain SQL query: the floor every trace has to stand on,
// since no trace can be faster than fetching the rows it replays.
import { existsSync, rmSync, statSync } from "node:fs";
import Database from "better-sqlite3";
import { deploy } from "@/prisma/migrate";
import type { PlantHistory } from "@/bench/plant-history";

export interface LedgerDatabase {
  file: string;
  url: string;
  /** Milliseconds for deploy (migrations) and for the bulk insert, measured once. */
  migrateMs: number;
  insertMs: number;
  bytes: number;
}

/** The rows lib/trace needs (loadTraceLedger also reads reversesId; the synthetic ledger has no reversals). */
export const FLOOR_SQL =
  'SELECT id, at, fromHolderId, toHolderId, massG FROM "Movement" WHERE siteId = ? ORDER BY at, id';

function removeDatabaseFiles(file: string): void {
  for (const f of [file, `${file}-wal`, `${file}-shm`, `${file}-journal`]) if (existsSync(f)) rmSync(f);
}

/** Prisma's SQLite adapter stores DateTime as ISO 8601 text with an explicit +00:00 offset. */
function toStoredInstant(ms: number): string {
  return new Date(ms).toISOString().replace("Z", "+00:00");
}

export async function writeLedgerDatabase(history: PlantHistory, file: string): Promise<LedgerDatabase> {
  removeDatabaseFiles(file);
  const url = `file:${file}`;
  const t0 = performance.now();
  await deploy(url);
  const migrateMs = performance.now() - t0;

  const db = new Database(file);
  try {
    db.pragma("journal_mode = WAL");
    db.pragma("foreign_keys = ON");
    const t1 = performance.now();
    const siteId = history.siteId;
    const insertSite = db.prepare('INSERT INTO "Site" (id, code, name, town, timeZone) VALUES (?, ?, ?, ?, ?)');
    const insertUser = db.prepare('INSERT INTO "User" (id, siteId, login, fullName, role) VALUES (?, ?, ?, ?, ?)');
    const insertHolder = db.prepare('INSERT INTO "Holder" (id, siteId, kind, code, stockG) VALUES (?, ?, ?, ?, ?)');
    const insertMove = db.prepare(
      'INSERT INTO "Movement" (id, siteId, at, role, fromHolderId, toHolderId, massG, recordedById) VALUES (?, ?, ?, ?, ?, ?, ?, ?)',
    );
    db.transaction(() => {
      insertSite.run(siteId, `BENCH-${history.years}Y`, "Benchmark plant (synthetic)", "Nowhere", "UTC");
      insertUser.run(1, siteId, `bench.${history.years}y`, "Benchmark loader", "ADMIN");
      for (const h of history.holders)
        insertHolder.run(h.id, siteId, h.kind, h.code, history.finalStockG.get(h.id) ?? 0);
      for (const m of history.moves)
        insertMove.run(m.id, siteId, toStoredInstant(m.at), m.role, m.fromHolderId, m.toHolderId, m.massG, 1);
    })();
    const insertMs = performance.now() - t1;
    db.pragma("wal_checkpoint(TRUNCATE)");
    db.exec("ANALYZE");
    return { file, url, migrateMs, insertMs, bytes: statSync(file).size };
  } finally {
    db.close();
  }
}

export interface FloorReader {
  /** Runs FLOOR_SQL once and returns the row count. */
  read(): number;
  close(): void;
}

export function openFloorReader(file: string, siteId: number): FloorReader {
  const db = new Database(file, { readonly: true });
  const statement = db.prepare(FLOOR_SQL);
  return {
    read: () => statement.all(siteId).length,
    close: () => db.close(),
  };
}
