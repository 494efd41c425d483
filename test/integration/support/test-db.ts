// A freshly migrated database per test file: a temporary SQLite file, or (when TEST_PG_URL is set)
// a PostgreSQL database created for the run and dropped afterwards.
import { mkdtempSync, rmSync } from "node:fs";
import os from "node:os";
import path from "node:path";
import pg from "pg";
import type { Db } from "@/lib/core/connect";
import { openDb } from "@/lib/core/connect";
import { deploy } from "@/prisma/migrate";

export type Provider = "sqlite" | "postgresql";

export const PG_URL = process.env.TEST_PG_URL;
/** The providers this run covers: SQLite always, PostgreSQL when TEST_PG_URL is set. */
export const PROVIDERS: Provider[] = PG_URL ? ["sqlite", "postgresql"] : ["sqlite"];

export interface TestDb {
  provider: Provider;
  url: string;
  db: Db;
  drop(): Promise<void>;
}

function withDatabase(url: string, database: string): string {
  const u = new URL(url);
  u.pathname = `/${database}`;
  return u.toString();
}

export async function createTestDb(provider: Provider): Promise<TestDb> {
  if (provider === "sqlite") {
    const dir = mkdtempSync(path.join(os.tmpdir(), "tracevat-it-"));
    const url = `file:${path.join(dir, "test.db")}`;
    await deploy(url);
    const db = await openDb(url);
    return {
      provider,
      url,
      db,
      drop: async () => {
        await db.$disconnect();
        rmSync(dir, { recursive: true, force: true });
      },
    };
  }
  if (!PG_URL) throw new Error("TEST_PG_URL is not set");
  const name = `tracevat_it_${process.pid}_${Date.now()}_${Math.floor(Math.random() * 1e6)}`;
  const admin = new pg.Client({ connectionString: PG_URL });
  await admin.connect();
  await admin.query(`CREATE DATABASE "${name}"`);
  await admin.end();
  const url = withDatabase(PG_URL, name);
  await deploy(url);
  const db = await openDb(url);
  return {
    provider,
    url,
    db,
    drop: async () => {
      await db.$disconnect();
      const c = new pg.Client({ connectionString: PG_URL });
      await c.connect();
      await c.query(`DROP DATABASE IF EXISTS "${name}" WITH (FORCE)`);
      await c.end();
    },
  };
}
