import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type { TestDb } from "./support/test-db";
import { createTestDb, PROVIDERS } from "./support/test-db";
import { deploy } from "@/prisma/migrate";

describe.each(PROVIDERS)("migrations on %s", (provider) => {
  let t: TestDb;
  beforeAll(async () => {
    t = await createTestDb(provider);
  });
  afterAll(async () => {
    await t.drop();
  });

  it("records applied migrations and re-applies nothing", async () => {
    const rows = await t.db.$queryRawUnsafe<Array<{ migration_name: string }>>(
      `SELECT migration_name FROM _prisma_migrations`,
    );
    expect(rows.length).toBeGreaterThan(0);
    expect(await deploy(t.url)).toEqual([]);
  });

  it.runIf(provider === "sqlite")("runs SQLite in WAL with synchronous=FULL and foreign keys on", async () => {
    const [j] = await t.db.$queryRawUnsafe<Array<{ journal_mode: string }>>("PRAGMA journal_mode");
    const [s] = await t.db.$queryRawUnsafe<Array<{ synchronous: number | bigint }>>("PRAGMA synchronous");
    const [f] = await t.db.$queryRawUnsafe<Array<{ foreign_keys: number | bigint }>>("PRAGMA foreign_keys");
    expect(j?.journal_mode).toBe("wal");
    expect(Number(s?.synchronous)).toBe(2);
    expect(Number(f?.foreign_keys)).toBe(1);
  });
});
