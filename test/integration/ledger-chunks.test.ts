// Ledger chunks kept in the database (lib/ledger/ledger-chunks.store.ts): a restarted process reads the
// stored chunks plus the rows after them and answers exactly what a process that read the whole ledger
// answers; a chunk that no longer matches the ledger is not used, and is rebuilt. Our own consistency
// checks: every answer is compared, as JSON text, with the answer computed with nothing stored.
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type { TestDb } from "./support/test-db";
import { createTestDb, PROVIDERS } from "./support/test-db";
import { buildScenario } from "@/seeds/scenario";
import { writeScenario } from "@/seeds/load";
import type { Result } from "@/lib/core/result";
import { decodeChunk, encodeChunk } from "@/lib/ledger/ledger-chunks";
import type { MoveRow } from "@/lib/ledger/ledger-chunks";
import { deleteLedgerChunks, readChunkedMoveRows, saveLedgerChunks } from "@/lib/ledger/ledger-chunks.store";
import { readMoveRows } from "@/lib/ledger/ledger-rows.store";
import { deleteTraceSnapshots } from "@/lib/trace/snapshot.store";
import {
  clearTraceCache,
  flushTraceSnapshots,
  traceBackwardReport,
  traceForwardReport,
  traceLotMaterial,
} from "@/lib/trace/trace.service";

const ANCHOR = new Date("2026-12-02T00:00:00Z");
const NOW = new Date("2026-12-02T06:00:00Z");
/** Small chunks, so the scenario's ledger fills several and leaves rows after them. */
const ROWS_PER_CHUNK = 40;

function value<T>(r: Result<T>): T {
  if (!r.ok) throw new Error(`expected success, got ${JSON.stringify(r.issues)}`);
  return r.value;
}

function withoutFreshness<T extends { freshness: unknown }>(r: T): Omit<T, "freshness"> {
  const { freshness: _ignored, ...rest } = r;
  return rest;
}

describe.each(PROVIDERS)("ledger chunks kept in the database on %s", (provider) => {
  let t: TestDb;
  let siteId: number;
  let lotHolderId: number;
  let queries: Array<{ kind: string; code: string; forward: boolean }>;
  let fromScratch: string;

  const chunkRows = () => t.db.ledgerChunk.findMany({ where: { siteId }, orderBy: { afterId: "asc" } });
  /** Every answer of a first trace after a restart, as one JSON text. */
  const restartAndTrace = async (): Promise<string> => {
    clearTraceCache();
    const answers: unknown[] = [];
    for (const q of queries) {
      if (q.forward) answers.push(withoutFreshness(value(await traceForwardReport(t.db, siteId, q, NOW))));
      else answers.push(withoutFreshness(value(await traceBackwardReport(t.db, siteId, q, NOW))));
    }
    clearTraceCache();
    const lot = value(await traceLotMaterial(t.db, siteId, lotHolderId, NOW));
    answers.push({ back: lot.back, fwd: lot.fwd, moves: lot.index.moves, order: lot.order });
    await flushTraceSnapshots();
    return JSON.stringify(answers);
  };

  beforeAll(async () => {
    clearTraceCache();
    t = await createTestDb(provider);
    await writeScenario(t.db, buildScenario({ anchor: ANCHOR, days: 45 }));
    siteId = (await t.db.site.findFirstOrThrow()).id;
    const shipment = await t.db.holder.findFirstOrThrow({ where: { kind: "SHIPMENT" }, orderBy: { id: "desc" } });
    const product = await t.db.holder.findFirstOrThrow({ where: { kind: "PRODUCT_LOT" }, orderBy: { id: "desc" } });
    const lot = await t.db.feedstockLot.findFirstOrThrow({ orderBy: { holderId: "asc" } });
    lotHolderId = lot.holderId;
    queries = [
      { kind: "SHIPMENT", code: shipment.code, forward: false },
      { kind: "PRODUCT_LOT", code: product.code, forward: false },
      { kind: "LOT", code: lot.code, forward: true },
    ];
    // Nothing stored: the whole ledger read and replayed.
    await deleteLedgerChunks(t.db, siteId);
    await deleteTraceSnapshots(t.db, siteId);
    fromScratch = await restartAndTrace();
    await deleteLedgerChunks(t.db, siteId);
  }, 300_000);
  afterAll(async () => {
    clearTraceCache();
    await t.drop();
  });

  it("stores full chunks only, following each other from the first movement", async () => {
    const saved = await saveLedgerChunks(t.db, siteId, await readChunkedMoveRows(t.db, siteId), ROWS_PER_CHUNK);
    const all = await readMoveRows(t.db, siteId);
    expect(saved).toBe(Math.floor(all.length / ROWS_PER_CHUNK));
    expect(saved).toBeGreaterThanOrEqual(3);
    let upTo = 0;
    for (const c of await chunkRows()) {
      expect(c.afterId).toBe(upTo);
      expect(c.rowCount).toBe(ROWS_PER_CHUNK);
      upTo = c.lastId;
    }
    const read = await readChunkedMoveRows(t.db, siteId);
    expect(read.chunkedUpTo).toBe(upTo);
    expect(read.rows.length).toBe(all.length % ROWS_PER_CHUNK);
    expect(read.chunks.reduce((n, c) => n + c.count, 0) + read.rows.length).toBe(all.length);
  });

  it("answers the first trace after a restart from the chunks exactly as from the whole ledger", async () => {
    expect((await readChunkedMoveRows(t.db, siteId)).chunkedUpTo).toBeGreaterThan(0);
    expect(await restartAndTrace()).toBe(fromScratch);
    // The restart stored nothing new (its rows after the chunks do not fill one) and kept the chunks.
    expect((await chunkRows()).length).toBeGreaterThanOrEqual(3);
  });

  it("does not use a chunk that disagrees with the ledger, answers the same, and drops the chunks", async () => {
    const [first, second] = await chunkRows();
    if (first === undefined || second === undefined) throw new Error("expected stored chunks");
    const columns = decodeChunk(second.body, {
      afterId: second.afterId,
      lastId: second.lastId,
      count: second.rowCount,
    });
    if (columns === null) throw new Error("expected a readable chunk");
    // One movement's grams changed in the stored copy: the ledger itself says otherwise.
    const rows: MoveRow[] = Array.from({ length: columns.count }, (_, i) => ({
      id: columns.id[i] ?? 0,
      at: columns.at[i] ?? 0,
      fromHolderId: (columns.from[i] ?? -1) === -1 ? null : (columns.from[i] ?? null),
      toHolderId: columns.to[i] ?? 0,
      massG: (columns.mass[i] ?? 0) + (i === 3 ? 1 : 0),
      reversesId: (columns.reverses[i] ?? -1) === -1 ? null : (columns.reverses[i] ?? null),
    }));
    await t.db.ledgerChunk.update({
      where: { id: second.id },
      data: { body: encodeChunk(rows) as Uint8Array<ArrayBuffer> },
    });
    expect((await readChunkedMoveRows(t.db, siteId)).chunkedUpTo).toBe(0);
    expect(await restartAndTrace()).toBe(fromScratch);
    // Rebuilt at the app's chunk size: the scenario's ledger does not fill one, so none is left.
    expect(await chunkRows()).toEqual([]);
  });

  it("skips chunks after a gap and reads the rest of the ledger as rows", async () => {
    await saveLedgerChunks(t.db, siteId, await readChunkedMoveRows(t.db, siteId), ROWS_PER_CHUNK);
    const [first] = await chunkRows();
    if (first === undefined) throw new Error("expected stored chunks");
    await t.db.ledgerChunk.delete({ where: { id: first.id } });
    const read = await readChunkedMoveRows(t.db, siteId);
    expect(read.chunkedUpTo).toBe(0);
    expect(read.rows.length).toBe((await readMoveRows(t.db, siteId)).length);
    expect(await restartAndTrace()).toBe(fromScratch);
  });

  it("uses the chunks before a bad body and reads the rows after them, with the same answers", async () => {
    await saveLedgerChunks(t.db, siteId, await readChunkedMoveRows(t.db, siteId), ROWS_PER_CHUNK);
    const [first, second] = await chunkRows();
    if (first === undefined || second === undefined) throw new Error("expected stored chunks");
    // A body one row short of what its keys say: decoded as unusable, so the chunks end at the first.
    await t.db.ledgerChunk.update({
      where: { id: second.id },
      data: { body: second.body.slice(0, second.body.byteLength - 28) },
    });
    const read = await readChunkedMoveRows(t.db, siteId);
    expect(read.chunkedUpTo).toBe(first.lastId);
    expect(read.chunks.length).toBe(1);
    expect(read.rows.length).toBe((await readMoveRows(t.db, siteId, first.lastId)).length);
    expect(await restartAndTrace()).toBe(fromScratch);
  });
});
