// Trace snapshots kept in the database (lib/trace/snapshot.store.ts): the first index stores its monthly
// snapshots; a restarted process (the in-memory cache cleared) resumes from them and gives the same
// answers; a stored snapshot whose ledger position no longer matches, or of another format, is dropped
// and rebuilt; only the bodies a trace resumes from are read, and one that turns out unreadable is rebuilt
// too. Our own consistency checks: answers are compared with the answer before any restart.
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type { TestDb } from "./support/test-db";
import { createTestDb, PROVIDERS } from "./support/test-db";
import { buildScenario } from "@/seeds/scenario";
import { writeScenario } from "@/seeds/load";
import type { Result } from "@/lib/core/result";
import {
  clearTraceCache,
  flushTraceSnapshots,
  getMoveCompositions,
  requireLedgerState,
  traceBackwardReport,
  traceForwardReport,
} from "@/lib/trace/trace.service";
import { needsBody } from "@/lib/trace/stored-snapshot";
import type { BackwardTraceReport, ForwardTraceReport } from "@/lib/trace/trace.service";

const ANCHOR = new Date("2026-12-02T00:00:00Z");
const NOW = new Date("2026-12-02T06:00:00Z");

function value<T>(r: Result<T>): T {
  if (!r.ok) throw new Error(`expected success, got ${JSON.stringify(r.issues)}`);
  return r.value;
}

function answerOf<T extends { freshness: unknown }>(r: T): Omit<T, "freshness"> {
  const { freshness: _ignored, ...rest } = r;
  return rest;
}

describe.each(PROVIDERS)("trace snapshots kept in the database on %s", (provider) => {
  let t: TestDb;
  let siteId: number;
  let backward: { kind: string; code: string };
  let forward: { kind: string; code: string };
  let first: { back: Omit<BackwardTraceReport, "freshness">; fwd: Omit<ForwardTraceReport, "freshness"> };

  const rows = () => t.db.traceSnapshot.findMany({ where: { siteId }, orderBy: { appliedCount: "asc" } });
  const trace = async () => ({
    back: answerOf(value(await traceBackwardReport(t.db, siteId, backward, NOW))),
    fwd: answerOf(value(await traceForwardReport(t.db, siteId, forward, NOW))),
  });

  beforeAll(async () => {
    clearTraceCache();
    t = await createTestDb(provider);
    // 45 days from 18 October: the index crosses two month starts, so it keeps two snapshots.
    await writeScenario(t.db, buildScenario({ anchor: ANCHOR, days: 45 }));
    siteId = (await t.db.site.findFirstOrThrow()).id;
    const shipment = await t.db.holder.findFirstOrThrow({ where: { kind: "SHIPMENT" }, orderBy: { id: "desc" } });
    const lot = await t.db.feedstockLot.findFirstOrThrow({ orderBy: { holderId: "asc" } });
    backward = { kind: "SHIPMENT", code: shipment.code };
    forward = { kind: "LOT", code: lot.code };
  }, 300_000);
  afterAll(async () => {
    clearTraceCache();
    await t.drop();
  });

  it("stores the first index's snapshots, each under the position it was built at", async () => {
    first = await trace();
    await flushTraceSnapshots();
    expect((await rows()).length).toBeGreaterThanOrEqual(2);
    for (const r of await rows()) {
      const body = JSON.parse(r.body) as {
        format: string;
        applied: { count: number; last: { moveId: number } | null };
      };
      expect(body.format).toBe(r.format);
      expect(body.applied.count).toBe(r.appliedCount);
      expect(body.applied.last?.moveId ?? null).toBe(r.lastMoveId);
      expect(await t.db.movement.count({ where: { siteId, id: r.lastMoveId ?? 0 } })).toBe(1);
    }
  });

  it("resumes a restarted process from the stored snapshots, keeping them, with the same answers", async () => {
    await flushTraceSnapshots();
    const before = (await rows()).map((r) => [r.id, r.body]);
    clearTraceCache();
    expect(await trace()).toEqual(first);
    await flushTraceSnapshots();
    expect((await rows()).map((r) => [r.id, r.body])).toEqual(before);
  });

  it("drops and rebuilds a stored snapshot whose position no longer matches, and one of another format", async () => {
    const [older, latest] = await rows();
    if (older === undefined || latest === undefined) throw new Error("expected two stored snapshots");
    const body = JSON.parse(latest.body) as { applied: { massSumG: number } };
    body.applied.massSumG += 1; // as if built over a different ledger
    await t.db.traceSnapshot.update({ where: { id: latest.id }, data: { body: JSON.stringify(body) } });
    await t.db.traceSnapshot.update({ where: { id: older.id }, data: { format: "tracevat.replay/0" } });
    clearTraceCache();
    expect(await trace()).toEqual(first);
    await flushTraceSnapshots();
    const rebuilt = await rows();
    expect(rebuilt.every((r) => r.id !== latest.id && r.id !== older.id)).toBe(true);
    expect(rebuilt.map((r) => [r.appliedCount, r.lastMoveId])).toEqual([
      [older.appliedCount, older.lastMoveId],
      [latest.appliedCount, latest.lastMoveId],
    ]);
    expect((JSON.parse(rebuilt[1]?.body ?? "{}") as { applied: { massSumG: number } }).applied.massSumG).toBe(
      body.applied.massSumG - 1,
    );
  });
  it("reads only the latest stored body on a restart, and an older one when a trace resumes from it", async () => {
    await flushTraceSnapshots();
    // What the first move after the oldest snapshot carried, from the index kept in memory.
    const kept = value(await requireLedgerState(t.db, siteId, NOW));
    const oldest = kept.snapshots[0]?.applied.count ?? 0;
    const moveId = kept.index.moves[oldest]?.id ?? 0;
    const carried = value(await getMoveCompositions(t.db, siteId, [moveId], NOW)).carried;
    expect(carried.size).toBe(1);
    clearTraceCache();
    const state = value(await requireLedgerState(t.db, siteId, NOW));
    // The replay resumes from the latest, which it takes again at the same place; the older ones wait.
    const latest = state.snapshots.at(-1)?.applied.count ?? 0;
    const older = state.snapshots.filter((s) => s.applied.count < latest);
    expect(older.map((s) => s.applied.count)).toContain(oldest);
    expect(older.every((s) => needsBody(s))).toBe(true);
    expect(state.snapshots.filter((s) => s.applied.count === latest).some((s) => needsBody(s))).toBe(false);
    expect(value(await getMoveCompositions(t.db, siteId, [moveId], NOW)).carried).toEqual(carried);
    expect(needsBody(older[0] as (typeof older)[number])).toBe(false);
    expect(await trace()).toEqual(first);
  });

  it("rebuilds a stored snapshot whose body is no longer readable past its head, with the same answers", async () => {
    await flushTraceSnapshots();
    const latest = (await rows()).at(-1);
    if (latest === undefined) throw new Error("expected a stored snapshot");
    const broken = latest.body.replace('"holders":[', '"holders":[[');
    expect(broken).not.toBe(latest.body);
    await t.db.traceSnapshot.update({ where: { id: latest.id }, data: { body: broken } });
    clearTraceCache();
    expect(await trace()).toEqual(first);
    await flushTraceSnapshots();
    const rebuilt = (await rows()).at(-1);
    expect(rebuilt?.id).not.toBe(latest.id);
    expect(rebuilt?.body).toBe(latest.body);
  });
});
