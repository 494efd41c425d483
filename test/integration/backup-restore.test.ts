import { mkdtempSync, readFileSync, writeFileSync } from "node:fs";
import os from "node:os";
import path from "node:path";
import pg from "pg";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type { TestDb } from "./support/test-db";
import { createTestDb, PG_URL, PROVIDERS } from "./support/test-db";
import { buildScenario } from "@/seeds/scenario";
import { writeScenario } from "@/seeds/load";
import { backupDatabase, collectFacts, restoreDatabase } from "@/lib/database/backup";
import { openDb } from "@/lib/core/connect";

describe.each(PROVIDERS)("backup and restore on %s", (provider) => {
  let t: TestDb;
  const dir = mkdtempSync(path.join(os.tmpdir(), "tracevat-backup-"));
  const extraDbs: string[] = [];
  beforeAll(async () => {
    t = await createTestDb(provider);
    await writeScenario(t.db, buildScenario({ anchor: new Date("2026-12-02T00:00:00Z"), days: 20 }));
  }, 120_000);
  afterAll(async () => {
    await t.drop();
    if (PG_URL && extraDbs.length) {
      const c = new pg.Client({ connectionString: PG_URL });
      await c.connect();
      for (const d of extraDbs) await c.query(`DROP DATABASE IF EXISTS "${d}" WITH (FORCE)`);
      await c.end();
    }
  });

  async function emptyTarget(): Promise<string> {
    if (provider === "sqlite") return `file:${path.join(dir, `restored-${Date.now()}.db`)}`;
    const name = `tracevat_restore_${process.pid}_${Date.now()}`;
    const c = new pg.Client({ connectionString: PG_URL });
    await c.connect();
    await c.query(`CREATE DATABASE "${name}"`);
    await c.end();
    extraDbs.push(name);
    const u = new URL(PG_URL ?? "");
    u.pathname = `/${name}`;
    return u.toString();
  }

  it("restores a backup with identical row counts, ledger checksum, audit chain and balances", async () => {
    const file = path.join(dir, provider === "sqlite" ? "b.db" : "b.pgdump");
    const manifest = await backupDatabase(t.url, file, new Date());
    expect(manifest.facts.rowCounts.Movement).toBeGreaterThan(100);
    expect(manifest.facts.stockMismatches).toEqual([]);
    const target = await emptyTarget();
    const report = await restoreDatabase(file, target);
    expect(report.problems).toEqual([]);
    const db = await openDb(target);
    const facts = await collectFacts(db, target).finally(() => db.$disconnect());
    expect(facts.rowCounts).toEqual(manifest.facts.rowCounts);
    expect(facts.ledgerChecksum).toBe(manifest.facts.ledgerChecksum);
    expect(facts.auditHeads).toEqual(manifest.facts.auditHeads);
  }, 120_000);

  it("refuses a backup file that no longer matches its manifest", async () => {
    const file = path.join(dir, provider === "sqlite" ? "c.db" : "c.pgdump");
    await backupDatabase(t.url, file, new Date());
    const bytes = readFileSync(file);
    bytes[bytes.length - 100] = (bytes[bytes.length - 100] ?? 0) ^ 0xff;
    writeFileSync(file, bytes);
    const report = await restoreDatabase(file, await emptyTarget());
    expect(report.ok).toBe(false);
    expect(report.problems[0]).toContain("checksum");
  }, 120_000);
});
