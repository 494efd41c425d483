import { spawn } from "node:child_process";
import { once } from "node:events";
import Database from "better-sqlite3";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type { TestDb } from "./support/test-db";
import { createTestDb } from "./support/test-db";
import type { TestPlant } from "./support/plant";
import { acceptedLot, createTestPlant } from "./support/plant";
import { fingerprint } from "./support/books";
import { sqliteFilePath, SQLITE_PRAGMAS } from "@/lib/core/connect";
import { recordPickup } from "@/lib/feedstock/pickup.service";
import { transferToTank } from "@/lib/tank/tank.service";

// Another process (a backup tool, a second server by mistake) holds SQLite's write lock longer than the
// app waits for it: the write is refused with a retryable code, nothing is half-written, and the same
// write goes through once the lock is released.
const BUSY_TIMEOUT_MS = Number(/busy_timeout = (\d+)/.exec(SQLITE_PRAGMAS.join(";"))?.[1]);

describe("a SQLite write lock held past the busy timeout", () => {
  let t: TestDb;
  let plant: TestPlant;
  beforeAll(async () => {
    t = await createTestDb("sqlite");
    plant = await createTestPlant(t.db);
    await acceptedLot(t.db, plant, { lot: "L-BUSY", pickup: "PU-BUSY-0", day: 3 });
  });
  afterAll(async () => {
    await t.drop();
  });

  const pickup = {
    code: "PU-BUSY-1",
    sourceCode: "R1",
    material: "USED_COOKING_OIL",
    observedAt: "2026-02-05T09:00:00Z",
    containers: 2,
    volumeL: 80,
    tempC: 15,
  };
  const transfer = { fromKind: "LOT", fromCode: "L-BUSY", toTankCode: "T1", at: "2026-02-05T10:00:00Z", massKg: 50 };

  it("refuses a pickup and a transfer with DATABASE.BUSY while the lock is held, then takes them", async () => {
    expect(BUSY_TIMEOUT_MS).toBeGreaterThan(0);
    const before = await fingerprint(t.db, plant.siteId);
    const other = new Database(sqliteFilePath(t.url));
    other.exec("BEGIN IMMEDIATE");
    const waits: number[] = [];
    try {
      for (const write of [
        () => recordPickup(t.db, plant.collector, pickup),
        () => transferToTank(t.db, plant.production, transfer),
      ]) {
        const started = performance.now();
        const r = await write();
        waits.push(Math.round(performance.now() - started));
        expect(r.ok ? "saved" : r.issues).toEqual([
          { code: "DATABASE.BUSY", message: "The records are busy; nothing was saved. Try again in a moment." },
        ]);
      }
    } finally {
      other.exec("ROLLBACK");
      other.close();
    }
    console.log(
      `SQLite busy: lock held past busy_timeout=${BUSY_TIMEOUT_MS} ms; writes refused after ${waits.join(" ms, ")} ms`,
    );
    // The app waited out its busy timeout before giving up (a lock released in time would have let it through).
    for (const w of waits) expect(w).toBeGreaterThanOrEqual(BUSY_TIMEOUT_MS * 0.9);
    expect(await fingerprint(t.db, plant.siteId)).toEqual(before);

    const p = await recordPickup(t.db, plant.collector, pickup);
    const m = await transferToTank(t.db, plant.production, transfer);
    expect(p.ok && m.ok).toBe(true);
    const after = await fingerprint(t.db, plant.siteId);
    expect(after.pickups).toBe(before.pickups + 1);
    expect(after.movements).toBe(before.movements + 2);
    expect(after.auditEvents).toBeGreaterThan(before.auditEvents);
    expect(after.stockOffLedger).toEqual([]);
  });

  it("waits for a lock another process releases within the busy timeout, then saves", async () => {
    // A separate process holds the write lock for 1.5 s (this process's SQLite calls block while they wait).
    const script = `const D=require("better-sqlite3");const d=new D(process.argv[1]);d.exec("BEGIN IMMEDIATE");console.log("locked");Atomics.wait(new Int32Array(new SharedArrayBuffer(4)),0,0,1500);d.exec("ROLLBACK");d.close();`;
    const holder = spawn(process.execPath, ["-e", script, sqliteFilePath(t.url)], {
      stdio: ["ignore", "pipe", "inherit"],
    });
    await once(holder.stdout, "data");
    const started = performance.now();
    const r = await recordPickup(t.db, plant.collector, { ...pickup, code: "PU-BUSY-2" });
    const waited = performance.now() - started;
    await once(holder, "exit");
    expect(r.ok).toBe(true);
    expect(waited).toBeGreaterThan(1000);
    expect((await fingerprint(t.db, plant.siteId)).stockOffLedger).toEqual([]);
  });
});
