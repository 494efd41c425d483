// GET answers kept as sent (lib/api/etag.service.ts respondAtPosition with lib/api/answer-bytes.ts):
// the same question under the same tag (site position, quarter-hour, role, address, units) is answered
// with the bytes sent before and computes nothing; a booking, another role, other units or a refusal
// never reuse them; an answer overtaken by a booking while it was computed is sent but not kept. The grid
// rows route answers a new pickup at once after it is booked. Readers who ask the same question at the
// same position at the same moment share one computation: sent answers, kept page reads, the balance and
// trace answers.
import { afterAll, beforeAll, describe, expect, it, vi } from "vitest";
import type { TestDb } from "./support/test-db";
import { createTestDb, PROVIDERS } from "./support/test-db";
import type { TestPlant } from "./support/plant";
import { acceptedLot, createTestPlant } from "./support/plant";
import { clearSentAnswers, respondAtPosition } from "@/lib/api/etag.service";
import { fail, ok } from "@/lib/core/result";
import { PositionCache } from "@/lib/ledger/position";
import { keptAtPosition } from "@/lib/ledger/position-cache.service";
import { clearTraceCache, traceForwardReport } from "@/lib/trace/trace.service";
import { clearBalanceCache, getBalanceReportTraced } from "@/lib/mass-balance/balance-cache.service";

const session = vi.hoisted(() => ({
  db: null as unknown,
  user: null as null | { siteId: number; userId: number; now: Date; role: string; unitSystem?: string },
}));
vi.mock("@/lib/core/db", () => ({ getDb: () => Promise.resolve(session.db) }));
vi.mock("@/lib/auth/request.service", async () => (await import("./support/request-mock")).requestServiceMock(session));

describe.each(PROVIDERS)("answers kept as sent on %s", (provider) => {
  let t: TestDb;
  let plant: TestPlant;
  let day = 3;
  const now = new Date("2026-03-01T12:00:00Z");
  const url = "http://127.0.0.1/api/example?b=2&a=1";
  const who = (role = "COMPLIANCE") => ({ siteId: plant.siteId, role, now });
  const book = async () => {
    day += 1;
    await acceptedLot(t.db, plant, { lot: `L-${day}`, pickup: `PU-${day}`, day });
  };

  beforeAll(async () => {
    clearSentAnswers();
    t = await createTestDb(provider);
    session.db = t.db;
    plant = await createTestPlant(t.db);
    await acceptedLot(t.db, plant, { lot: "L-1", pickup: "PU-1", day: 2 });
  }, 120_000);
  afterAll(async () => {
    clearSentAnswers();
    await t.drop();
  });

  it("sends the kept bytes for the same tag and computes again after a booking, for another role or units", async () => {
    let computed = 0;
    const compute = () => Promise.resolve(ok({ answer: ++computed }));
    const first = await respondAtPosition(new Request(url), t.db, who(), compute);
    const again = await respondAtPosition(new Request(url), t.db, who(), compute);
    expect(computed).toBe(1);
    expect(again.headers.get("etag")).toBe(first.headers.get("etag"));
    expect(again.headers.get("content-type")).toBe("application/json");
    expect(await again.json()).toEqual({ ok: true, value: { answer: 1 } });
    expect(await first.json()).toEqual({ ok: true, value: { answer: 1 } });

    await respondAtPosition(new Request(url), t.db, who("ADMIN"), compute);
    expect(computed).toBe(2);
    await respondAtPosition(new Request(url), t.db, who(), compute, "US_CUSTOMARY");
    expect(computed).toBe(3);
    await book();
    const after = await respondAtPosition(new Request(url), t.db, who(), compute);
    expect(computed).toBe(4);
    expect(after.headers.get("etag")).not.toBe(first.headers.get("etag"));
    expect(await after.json()).toEqual({ ok: true, value: { answer: 4 } });
  });

  it("keeps no refusal and no answer a booking overtook while it was computed", async () => {
    let computed = 0;
    const refuse = () => Promise.resolve(fail("INPUT.INVALID", "bad", "code"));
    const url2 = `${url}&c=3`;
    expect((await respondAtPosition(new Request(url2), t.db, who(), refuse)).status).toBe(422);
    const overtaken = async () => {
      computed += 1;
      if (computed === 1) await book();
      return ok({ answer: computed });
    };
    const first = await respondAtPosition(new Request(url2), t.db, who(), overtaken);
    expect(await first.json()).toEqual({ ok: true, value: { answer: 1 } });
    const second = await respondAtPosition(new Request(url2), t.db, who(), overtaken);
    expect(await second.json()).toEqual({ ok: true, value: { answer: 2 } });
    const third = await respondAtPosition(new Request(url2), t.db, who(), overtaken);
    expect(await third.json()).toEqual({ ok: true, value: { answer: 2 } });
    expect(computed).toBe(2);
  });

  it("computes a question asked by many readers at once, at one position, once", async () => {
    let computed = 0;
    const slow = async () => {
      computed += 1;
      await new Promise((r) => setTimeout(r, 50));
      return ok({ answer: computed });
    };
    const url3 = `${url}&d=4`;
    const sentAll = await Promise.all(
      Array.from({ length: 8 }, () => respondAtPosition(new Request(url3), t.db, who(), slow)),
    );
    expect(computed).toBe(1);
    for (const r of sentAll) expect(await r.json()).toEqual({ ok: true, value: { answer: 1 } });

    const cache = new PositionCache<number>(10);
    let reads = 0;
    const read = async () => {
      reads += 1;
      await new Promise((r) => setTimeout(r, 50));
      return reads;
    };
    const keptAll = await Promise.all(
      Array.from({ length: 8 }, () => keptAtPosition(cache, t.db, plant.siteId, "page 1", read)),
    );
    expect(reads).toBe(1);
    expect(keptAll.map((k) => k.value)).toEqual(Array.from({ length: 8 }, () => 1));
    expect(keptAll.filter((k) => k.outcome === "computed")).toHaveLength(1);
  });

  it("the balance and a trace asked by many readers at once are computed once each, with the same answer", async () => {
    clearBalanceCache();
    clearTraceCache();
    await book();
    const site = { id: plant.siteId, timeZone: "UTC" };
    const balances = await Promise.all(
      Array.from({ length: 6 }, () =>
        getBalanceReportTraced(t.db, site, { period: "MONTH", year: "2026", month: "2" }, now),
      ),
    );
    expect(balances.filter((b) => b.outcome === "computed")).toHaveLength(1);
    const strip = (r: (typeof balances)[number]) => {
      if (!r.result.ok) throw new Error(JSON.stringify(r.result.issues));
      const { computeMs: _ignored, ...rest } = r.result.value;
      return rest;
    };
    for (const b of balances) expect(strip(b)).toEqual(strip(balances[0] ?? balances[1]!));

    const traces = await Promise.all(
      Array.from({ length: 6 }, () => traceForwardReport(t.db, plant.siteId, { kind: "LOT", code: "L-1" }, now)),
    );
    const values = traces.map((r) => {
      if (!r.ok) throw new Error(JSON.stringify(r.issues));
      return r.value;
    });
    expect(values.filter((v) => !v.freshness.fromCache)).toHaveLength(1);
    const strip2 = (v: (typeof values)[number]) => ({ ...v, freshness: undefined });
    for (const v of values) expect(strip2(v)).toEqual(strip2(values[0]!));
  });

  it("GET /api/grid/rows shows a pickup booked after the same page was asked for", async () => {
    const { GET } = await import("@/app/api/grid/rows/route");
    session.user = { ...plant.compliance, role: "COMPLIANCE", unitSystem: "METRIC" };
    const ask = async () => {
      const r = await GET(new Request("http://127.0.0.1/api/grid/rows?table=pickups&start=0&end=100"));
      expect(r.status).toBe(200);
      const body = (await r.json()) as { value: { rows: Array<Record<string, unknown>>; rowCount: number } };
      return { tag: r.headers.get("etag"), codes: body.value.rows.map((row) => row.code) };
    };
    const before = await ask();
    expect(await ask()).toEqual(before);
    await book();
    const after = await ask();
    expect(after.tag).not.toBe(before.tag);
    expect(after.codes).toContain(`PU-${day}`);
    expect(before.codes).not.toContain(`PU-${day}`);
  });
});
