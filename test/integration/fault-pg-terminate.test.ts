import { randomUUID } from "node:crypto";
import pg from "pg";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type { TestDb } from "./support/test-db";
import { createTestDb, PG_URL } from "./support/test-db";
import type { TestPlant } from "./support/plant";
import { createTestPlant } from "./support/plant";
import { fingerprint } from "./support/books";
import { importPickups, MAX_IMPORT_ROWS } from "@/lib/feedstock/pickup.service";
import { withIdempotencyKey } from "@/lib/ledger/transaction.store";

// The PostgreSQL server drops the app's connections (a failover, an administrator, a restart) while a
// large import's transaction is open and has already written: the import is refused with a retryable
// code, nothing of it stays, the app reconnects by itself, and the same import resent then saves once.
const row = (i: number) => ({
  code: `PGK-${i}`,
  sourceCode: "R1",
  material: "USED_COOKING_OIL",
  observedAt: "2026-03-05T09:00:00Z",
  containers: 1,
  volumeL: 40 + (i % 9),
  tempC: 15,
  idempotencyKey: randomUUID(),
});

const TERMINATE =
  "SELECT pg_terminate_backend(pid) AS done FROM pg_stat_activity WHERE datname = current_database() AND pid <> pg_backend_pid()";
// A backend of this database inside a transaction that has written (it holds a transaction id).
const WRITING =
  "SELECT count(*)::int AS n FROM pg_stat_activity WHERE datname = current_database() AND pid <> pg_backend_pid() AND backend_xid IS NOT NULL";

describe.skipIf(!PG_URL)("PostgreSQL connections terminated during an import", () => {
  let t: TestDb;
  let plant: TestPlant;
  let admin: pg.Client;
  beforeAll(async () => {
    t = await createTestDb("postgresql");
    plant = await createTestPlant(t.db);
    admin = new pg.Client({ connectionString: t.url });
    await admin.connect();
  });
  afterAll(async () => {
    await admin.end();
    await t.drop();
  });

  it("refuses with DATABASE.UNAVAILABLE, leaves the books as they were, recovers, and takes the resend once", async () => {
    const before = await fingerprint(t.db, plant.siteId);
    const rows = Array.from({ length: MAX_IMPORT_ROWS }, (_, i) => row(i));
    const ctx = { userId: plant.production.userId, key: "pg-terminate-0001", requestHash: "same-body" };
    const sent = withIdempotencyKey(ctx, () => importPickups(t.db, plant.production, { rows }));

    let writing = false;
    for (let i = 0; i < 600 && !writing; i++) {
      writing = (await admin.query<{ n: number }>(WRITING)).rows[0]?.n !== 0;
      if (!writing) await new Promise((r) => setTimeout(r, 5));
    }
    expect(writing, "the import's transaction was never seen writing").toBe(true);
    const killed = (await admin.query(TERMINATE)).rowCount ?? 0;
    const killedAt = performance.now();
    expect(killed).toBeGreaterThan(0);

    const r = await sent;
    expect(r.ok ? "saved" : r.issues).toEqual([
      { code: "DATABASE.UNAVAILABLE", message: "The database connection was lost; nothing was saved. Try again." },
    ]);

    // The next read through the same client succeeds without a restart (the pool drops dead connections).
    let recoveredMs = -1;
    let after = before;
    let failedReads = 0;
    for (let i = 0; i < 100 && recoveredMs < 0; i++) {
      try {
        after = await fingerprint(t.db, plant.siteId);
        recoveredMs = Math.round(performance.now() - killedAt);
      } catch {
        failedReads++;
        await new Promise((res) => setTimeout(res, 100));
      }
    }
    console.log(
      `PostgreSQL: ${killed} backend(s) terminated mid-import; import refused, first read succeeded ${recoveredMs} ms after pg_terminate_backend, ${failedReads} failed read(s) before it`,
    );
    expect(recoveredMs).toBeGreaterThanOrEqual(0);
    expect(recoveredMs).toBeLessThan(5_000);
    expect(after).toEqual(before);

    const again = await withIdempotencyKey(ctx, () => importPickups(t.db, plant.production, { rows }));
    expect(again.ok && again.value).toEqual({ written: MAX_IMPORT_ROWS, skipped: 0 });
    const replay = await withIdempotencyKey(ctx, () => importPickups(t.db, plant.production, { rows }));
    expect(replay).toEqual(again);
    const done = await fingerprint(t.db, plant.siteId);
    expect(done.pickups).toBe(before.pickups + MAX_IMPORT_ROWS);
    expect(done.movements).toBe(before.movements + MAX_IMPORT_ROWS);
    expect(done.auditEvents).toBe(before.auditEvents + MAX_IMPORT_ROWS);
    expect(done.idempotencyRecords).toBe(before.idempotencyRecords + 1);
    expect(done.stockOffLedger).toEqual([]);
  });
});
