// The demo plant, loaded through the services, checked through the balance, trace and custody services
// and their route handlers. Expected values are worked out here from the raw ledger and the record
// tables with plain sums, not by the code under test.
import { afterAll, beforeAll, describe, expect, it, vi } from "vitest";
import type { TestDb } from "./support/test-db";
import { createTestDb, PROVIDERS } from "./support/test-db";
import { buildScenario } from "@/seeds/scenario";
import { writeScenario } from "@/seeds/load";
import type { Result } from "@/lib/core/result";
import { getBalanceReport } from "@/lib/mass-balance/balance.service";
import { clearTraceCache, traceBackwardReport, traceForwardReport } from "@/lib/trace/trace.service";
import type { BackwardTraceReport, ContributionTables } from "@/lib/trace/trace.service";
import { getLotFlow, getMadeOf } from "@/lib/feedstock/lot-flow.service";
import { getCustodyReport } from "@/lib/custody/custody.service";
import { reopenPeriod } from "@/lib/period/period.service";

// Route handlers read the session through next/headers and the database through getDb; both are
// replaced so the handlers' own steps (same-origin check, role, parse, service, status) run as served.
const session = vi.hoisted(() => ({
  db: null as unknown,
  user: null as null | { siteId: number; userId: number; now: Date; role: string },
}));
vi.mock("@/lib/core/db", () => ({ getDb: () => Promise.resolve(session.db) }));
vi.mock("@/lib/auth/request.service", async () => (await import("./support/request-mock")).requestServiceMock(session));

const ANCHOR = new Date("2026-12-02T00:00:00Z");
const NOW = new Date("2026-12-02T06:00:00Z");
const OUT_KINDS = new Set(["SHIPMENT", "DISPOSAL", "LOSS", "DIFFERENCE"]);

function value<T>(r: Result<T>): T {
  if (!r.ok) throw new Error(`expected success, got ${JSON.stringify(r.issues)}`);
  return r.value;
}

function post(path: string, body: unknown): Request {
  return new Request(`http://127.0.0.1${path}`, {
    method: "POST",
    headers: { "content-type": "application/json" },
    body: JSON.stringify(body),
  });
}

function sum(xs: readonly number[]): number {
  return xs.reduce((s, x) => s + x, 0);
}

function tableSums(t: ContributionTables): number[] {
  return [t.byLot, t.byPickup, t.bySource, t.byMaterial, t.byCertification].map((rows) =>
    sum(rows.map((r) => r.grams)),
  );
}

describe.each(PROVIDERS)("demo plant: balances, traces and custody on %s", (provider) => {
  let t: TestDb;
  let site: { id: number; timeZone: string };
  let moves: Array<{
    id: number;
    at: Date;
    fromHolderId: number | null;
    toHolderId: number;
    massG: number;
    role: string;
  }>;
  let kindOf: Map<number, string>;
  const days = provider === "sqlite" ? 182 : 60;

  beforeAll(async () => {
    clearTraceCache();
    t = await createTestDb(provider);
    await writeScenario(t.db, buildScenario({ anchor: ANCHOR, days }));
    const s = await t.db.site.findFirstOrThrow();
    site = { id: s.id, timeZone: s.timeZone };
    moves = await t.db.movement.findMany({
      select: { id: true, at: true, fromHolderId: true, toHolderId: true, massG: true, role: true },
    });
    kindOf = new Map((await t.db.holder.findMany({ select: { id: true, kind: true } })).map((h) => [h.id, h.kind]));
    session.db = t.db;
  }, 300_000);
  afterAll(async () => {
    clearTraceCache();
    await t.drop();
  });

  /** Calendar months the demo touches, [start, end) in UTC (the demo site's time zone). */
  function demoMonths(): Array<{ year: number; month: number; startMs: number; endMs: number }> {
    const first = new Date(ANCHOR.getTime() - days * 86_400_000);
    const out = [];
    for (
      let y = first.getUTCFullYear(), m = first.getUTCMonth();
      Date.UTC(y, m, 1) <= ANCHOR.getTime();
      m === 11 ? ((y += 1), (m = 0)) : (m += 1)
    ) {
      out.push({ year: y, month: m + 1, startMs: Date.UTC(y, m, 1), endMs: Date.UTC(y, m + 1, 1) });
    }
    return out;
  }

  it("closes every month exactly, in grams, and agrees with sums over the raw ledger", async () => {
    const months = demoMonths();
    expect(months.length).toBe(provider === "sqlite" ? 7 : 3);
    const shipments = await t.db.shipment.findMany({ select: { shippedAt: true, massG: true } });
    const disposals = await t.db.disposal.findMany({ select: { disposedAt: true, massG: true } });
    for (const m of months) {
      const r = value(
        await getBalanceReport(t.db, site, { period: "MONTH", year: String(m.year), month: String(m.month) }, NOW),
      );
      const inRange = (at: Date) => at.getTime() >= m.startMs && at.getTime() < m.endMs;
      const before = (at: Date) => at.getTime() < m.startMs;
      const isOut = (id: number) => OUT_KINDS.has(kindOf.get(id) ?? "");
      // Conservation over the raw ledger: stock = Σ entries − Σ moves into shipments, disposals and losses (hand arithmetic).
      const entered = (p: (at: Date) => boolean) =>
        sum(moves.filter((x) => x.fromHolderId === null && p(x.at)).map((x) => x.massG));
      const left = (p: (at: Date) => boolean) =>
        sum(
          moves
            .filter((x) => x.fromHolderId !== null && !isOut(x.fromHolderId) && isOut(x.toHolderId) && p(x.at))
            .map((x) => x.massG),
        );
      const opening = entered(before) - left(before);
      const receipts = entered(inRange);
      const outputs = left(inRange);
      expect(r.stock.openingG, `${m.year}-${m.month} opening`).toBe(opening);
      expect(r.stock.receipts.totalG, `${m.year}-${m.month} receipts`).toBe(receipts);
      expect(r.stock.outputs.totalG, `${m.year}-${m.month} outputs`).toBe(outputs);
      expect(r.stock.closingG, `${m.year}-${m.month} closing`).toBe(opening + receipts - outputs);
      expect(r.stock.imbalanceG).toBe(0);
      expect(r.stock.closure.flag).toBe("OK");
      expect(r.inputsG).toBe(r.outputsG + r.stock.imbalanceG);
      // Shipments and disposals from their own tables, not from the ledger.
      expect(r.stock.outputs.shipmentG).toBe(sum(shipments.filter((s) => inRange(s.shippedAt)).map((s) => s.massG)));
      expect(r.stock.outputs.disposalG).toBe(sum(disposals.filter((d) => inRange(d.disposedAt)).map((d) => d.massG)));
      // Batches finished in the month: charged − measured out = the unmeasured differences the service booked (hand sum over the ledger).
      const unmeasured = sum(
        moves
          .filter((x) => x.role === "UNMEASURED" && inRange(x.at))
          .map((x) => (x.fromHolderId === null ? -x.massG : x.massG)),
      );
      expect(r.process.imbalanceG, `${m.year}-${m.month} unmeasured`).toBe(unmeasured);
      expect(r.differences.unmeasuredG).toBe(unmeasured);
      for (const k of r.byMaterial) expect(k.imbalanceG, `${m.year}-${m.month} ${k.materialKind}`).toBe(0);
    }
    // After the last month, closing stock is the book stock the guarded ledger keeps on every holder.
    const last = months[months.length - 1];
    if (last === undefined) throw new Error("no months");
    const r = value(
      await getBalanceReport(t.db, site, { period: "MONTH", year: String(last.year), month: String(last.month) }, NOW),
    );
    const holders = await t.db.holder.findMany({ select: { kind: true, stockG: true } });
    expect(r.stock.closingG).toBe(sum(holders.filter((h) => !OUT_KINDS.has(h.kind)).map((h) => h.stockG)));
  });

  it("shows realistic unmeasured differences: a few tenths of a percent, one batch above the warn level", async () => {
    const batches = [];
    for (const m of demoMonths()) {
      const r = value(
        await getBalanceReport(t.db, site, { period: "MONTH", year: String(m.year), month: String(m.month) }, NOW),
      );
      batches.push(...r.process.completed);
    }
    expect(batches.length).toBeGreaterThan(10);
    const pcts = batches.map((b) => (b.imbalanceG * 100) / b.inputsG);
    // Common practice: warn above 0.5 % of the charge (the site's default tolerance).
    expect(batches.filter((b) => b.closure.flag !== "OK").map((b) => b.code)).toEqual(["B-0006"]);
    for (const p of pcts) expect(p).toBeGreaterThan(0);
    expect(pcts.filter((p) => p <= 0.5).length).toBe(batches.length - 1);
  });

  it("closes November per material kind, and used cooking oil agrees with its pickups and lots", async () => {
    const r = value(await getBalanceReport(t.db, site, { period: "MONTH", year: "2026", month: "11" }, NOW));
    const start = Date.UTC(2026, 10, 1);
    const end = Date.UTC(2026, 11, 1);
    const uco = r.byMaterial.find((k) => k.materialKind === "USED_COOKING_OIL");
    if (uco === undefined) throw new Error("no used cooking oil balance");
    const pickups = await t.db.pickup.findMany({ where: { material: "USED_COOKING_OIL" }, select: { holderId: true } });
    const lots = await t.db.feedstockLot.findMany({
      where: { material: "USED_COOKING_OIL" },
      select: { holderId: true },
    });
    const ucoHolders = new Set([...pickups.map((p) => p.holderId), ...lots.map((l) => l.holderId)]);
    const inMonth = (x: { at: Date }) => x.at.getTime() >= start && x.at.getTime() < end;
    // Receipts: entries into used-cooking-oil pickups and lots; out: everything leaving them for other holders (hand sums).
    expect(uco.receiptsG).toBe(
      sum(
        moves.filter((x) => x.fromHolderId === null && ucoHolders.has(x.toHolderId) && inMonth(x)).map((x) => x.massG),
      ),
    );
    const leaving = sum(
      moves
        .filter(
          (x) =>
            x.fromHolderId !== null && ucoHolders.has(x.fromHolderId) && !ucoHolders.has(x.toHolderId) && inMonth(x),
        )
        .map((x) => x.massG),
    );
    expect(uco.outputsG + uco.transfersOutG).toBe(leaving);
    expect(uco.openingG + uco.inG - uco.outputsG - uco.transfersOutG).toBe(uco.closingG);
    expect(r.byMaterial.length).toBeGreaterThan(5);
    for (const k of r.byMaterial) expect(k.imbalanceG, k.materialKind).toBe(0);
  });

  it("traces the last product lot back to exactly its recorded mass, agreeing with the product page's trace", async () => {
    const product = await t.db.productLot.findFirstOrThrow({ orderBy: [{ producedAt: "desc" }, { id: "desc" }] });
    const r: BackwardTraceReport = value(
      await traceBackwardReport(t.db, site.id, { kind: "PRODUCT_LOT", code: product.code }, NOW),
    );
    expect(r.totalG).toBe(product.massG);
    for (const s of tableSums(r.all)) expect(s).toBe(product.massG);
    expect(r.feedstock.totalG + r.reagentsG + r.otherG).toBe(product.massG);
    for (const s of tableSums(r.feedstock)) expect(s).toBe(r.feedstock.totalG);
    expect(sum(r.feedstock.byLot.map((x) => x.pct))).toBeCloseTo(100, 9);
    expect(sum(r.origins.map((o) => o.grams))).toBe(product.massG);
    expect(r.reagentsG).toBeGreaterThan(0);
    const madeOf = await getMadeOf(t.db, site.id, product.holderId, NOW);
    if (madeOf === null) throw new Error("product page trace failed");
    for (const share of madeOf.shares.filter((s) => s.kind === "LOT")) {
      expect(r.all.byLot.find((row) => row.lotCode === share.code)?.grams, share.code).toBe(share.grams);
    }
    // Water is never an ingredient of the product; methanol and catalyst are reagents, listed apart.
    expect(madeOf.shares.every((s) => s.kind !== "REAGENT_LOT")).toBe(true);
    expect(madeOf.reagents.some((s) => s.reagent === "WATER")).toBe(false);
    expect(sum(madeOf.shares.map((s) => s.pct))).toBeCloseTo(100, 9);
    for (const share of madeOf.reagents) {
      expect(r.reagents.find((row) => row.key === share.code)?.grams, share.code).toBe(share.grams);
    }
    // The graph apportions the same mass: everything arriving at the target is the target's mass.
    const target = r.graph?.nodes.find((n) => n.target);
    expect(target?.grams).toBe(product.massG);
  });

  it("follows an early lot forward to where the backward traces of the places it reached find it", async () => {
    const lot = await t.db.feedstockLot.findFirstOrThrow({
      where: { status: { in: ["ACCEPTED", "CONSUMED"] }, certified: true },
      orderBy: [{ receivedAt: "asc" }, { id: "asc" }],
      skip: 2,
    });
    const f = value(await traceForwardReport(t.db, site.id, { kind: "LOT", code: lot.code }, NOW));
    const flow = await getLotFlow(t.db, site.id, lot.holderId, NOW);
    expect(flow.method).toBe("trace");
    expect(f.enteredG).toBe(flow.enteredG);
    expect(sum(f.heldByStage.map((s) => s.grams))).toBe(f.enteredG);
    for (const d of flow.destinations) {
      const row = f.holders.find((h) => h.holder.id === d.holder.id);
      expect([row?.receivedG, row?.heldG], `${d.holder.kind} ${d.holder.code}`).toEqual([d.receivedG, d.heldG]);
    }
    const reached = f.holders.filter(
      (h) =>
        (h.holder.kind === "PRODUCT_LOT" || h.holder.kind === "SHIPMENT" || h.holder.kind === "BATCH") &&
        h.receivedG > 0,
    );
    expect(reached.some((h) => h.holder.kind === "PRODUCT_LOT")).toBe(true);
    for (const h of reached.slice(0, 12)) {
      const kind =
        h.holder.kind === "PRODUCT_LOT" ? "PRODUCT_LOT" : h.holder.kind === "SHIPMENT" ? "SHIPMENT" : "BATCH";
      const back = value(await traceBackwardReport(t.db, site.id, { kind, code: h.holder.code }, NOW));
      expect(back.all.byLot.find((row) => row.lotCode === lot.code)?.grams, `${kind} ${h.holder.code}`).toBe(
        h.receivedG,
      );
    }
  });

  it("answers the trace API with the page's service result", async () => {
    const product = await t.db.productLot.findFirstOrThrow({ orderBy: [{ producedAt: "desc" }, { id: "desc" }] });
    const nell = await t.db.user.findUniqueOrThrow({ where: { login: "compliance.nell" } });
    session.user = { siteId: site.id, userId: nell.id, now: NOW, role: "COMPLIANCE" };
    const { GET } = await import("@/app/api/trace/backward/route");
    const res = await GET(new Request(`http://127.0.0.1/api/trace/backward?kind=PRODUCT_LOT&code=${product.code}`));
    expect(res.status).toBe(200);
    const body = (await res.json()) as {
      ok: true;
      value: { totalG: number; all: { byLot: Array<{ key: string; grams: number }> } };
    };
    const direct = value(await traceBackwardReport(t.db, site.id, { kind: "PRODUCT_LOT", code: product.code }, NOW));
    expect(body.value.totalG).toBe(product.massG);
    expect(body.value.all.byLot).toEqual(
      direct.all.byLot.map((r) => expect.objectContaining({ key: r.key, grams: r.grams })),
    );
    const bad = await GET(new Request("http://127.0.0.1/api/trace/backward?kind=TANK&code=NOPE"));
    expect(bad.status).toBe(404);
  });

  it("refuses a reopen without a reason, records one with a reason", async () => {
    const closed = await t.db.accountingPeriod.findFirstOrThrow({
      where: { siteId: site.id, status: "CLOSED" },
      orderBy: { startsAt: "asc" },
    });
    const nell = await t.db.user.findUniqueOrThrow({ where: { login: "compliance.nell" } });
    const tess = await t.db.user.findUniqueOrThrow({ where: { login: "production.tess" } });
    const eventsBefore = await t.db.periodEvent.count({ where: { periodId: closed.id } });
    const service = await reopenPeriod(t.db, { siteId: site.id, userId: nell.id, now: NOW }, { periodId: closed.id });
    expect(service.ok ? [] : service.issues.map((i) => [i.code, i.field])).toEqual([["INPUT.INVALID", "reason"]]);
    const { POST } = await import("@/app/api/periods/reopen/route");
    session.user = { siteId: site.id, userId: nell.id, now: NOW, role: "COMPLIANCE" };
    const noReason = await POST(post("/api/periods/reopen", { periodId: closed.id, reason: "  " }));
    expect(noReason.status).toBe(422);
    expect(((await noReason.json()) as { issues: Array<{ field: string }> }).issues[0]?.field).toBe("reason");
    session.user = { siteId: site.id, userId: tess.id, now: NOW, role: "PRODUCTION" };
    expect(
      (await POST(post("/api/periods/reopen", { periodId: closed.id, reason: "A late delivery note to book" }))).status,
    ).toBe(403);
    expect((await t.db.accountingPeriod.findUniqueOrThrow({ where: { id: closed.id } })).status).toBe("CLOSED");
    expect(await t.db.periodEvent.count({ where: { periodId: closed.id } })).toBe(eventsBefore);

    session.user = { siteId: site.id, userId: nell.id, now: NOW, role: "COMPLIANCE" };
    const reopened = await POST(
      post("/api/periods/reopen", { periodId: closed.id, reason: "A late delivery note to book" }),
    );
    expect(reopened.status).toBe(200);
    expect((await t.db.accountingPeriod.findUniqueOrThrow({ where: { id: closed.id } })).status).toBe("OPEN");
    const event = await t.db.periodEvent.findFirstOrThrow({ where: { periodId: closed.id }, orderBy: { id: "desc" } });
    expect([event.action, event.reason, event.byId]).toEqual(["REOPEN", "A late delivery note to book", nell.id]);
    const { POST: close } = await import("@/app/api/periods/close/route");
    expect((await close(post("/api/periods/close", { periodId: closed.id }))).status).toBe(200);
    const page = value(
      await getBalanceReport(
        t.db,
        site,
        {
          period: "CUSTOM",
          start: closed.startsAt.toISOString().slice(0, 10),
          end: closed.endsAt.toISOString().slice(0, 10),
        },
        NOW,
      ),
    );
    expect(page.accountingPeriod?.status).toBe("CLOSED");
    expect(page.events.map((e) => e.action).slice(0, 2)).toEqual(["CLOSE", "REOPEN"]);
  });

  it("flags exactly the certified claims that exceed the methyl-ester credit at their booking", async () => {
    const r = value(await getCustodyReport(t.db, site, {}, NOW));
    // Certified input: oil entering at pickups or delivered lots whose lot is marked certified and whose source held a valid certificate then.
    const entries = await t.db.movement.findMany({
      where: { fromHolderId: null },
      select: {
        at: true,
        massG: true,
        toHolder: {
          select: {
            pickup: {
              select: {
                source: { select: { certificateNo: true, certificateExpires: true } },
                lot: { select: { certified: true } },
              },
            },
            lot: {
              select: {
                certified: true,
                origin: true,
                supplier: { select: { certificateNo: true, certificateExpires: true } },
              },
            },
          },
        },
      },
    });
    const valid = (s: { certificateNo: string | null; certificateExpires: Date | null } | null | undefined, at: Date) =>
      !!s?.certificateNo && (s.certificateExpires === null || s.certificateExpires >= at);
    const certifiedIn = sum(
      entries
        .filter((e) => {
          const p = e.toHolder.pickup;
          const l = e.toHolder.lot;
          return p
            ? p.lot?.certified === true && valid(p.source, e.at)
            : l
              ? l.certified && l.origin === "DELIVERY" && valid(l.supplier, e.at)
              : false;
        })
        .map((e) => e.massG),
    );
    expect(sum(r.sets.map((s) => s.inputG))).toBe(certifiedIn);
    expect(certifiedIn).toBeGreaterThan(0);
    // Conversion credit = certified oil × (ester out ÷ oil in), rounded down (Reg. (EU) 2022/996 conversion factor per step, from memory).
    for (const c of r.conversions) {
      for (const s of c.bySet) {
        expect(s.certifiedOilG).toBeLessThanOrEqual(c.oilG);
        expect(s.fameCreditG, c.batchCode).toBe(Number((BigInt(s.certifiedOilG) * BigInt(c.esterG)) / BigInt(c.oilG)));
      }
    }
    // Walk the claims with a plain running balance per set (carry-forward keeps positive balances, so period ends change nothing).
    const credit = new Map<string, number>();
    const events = [
      ...r.conversions.flatMap((c) =>
        c.bySet
          .filter((s) => s.accepted)
          .map((s) => ({
            at: c.completedAt.getTime(),
            order: 0,
            setKey: s.setKey,
            grams: s.fameCreditG,
            claim: null as null | string,
          })),
      ),
      ...r.claims.map((c) => ({ at: c.at.getTime(), order: 1, setKey: c.setKey, grams: c.massG, claim: c.documentNo })),
    ].sort((a, b) => a.at - b.at || a.order - b.order);
    const over: string[] = [];
    for (const e of events) {
      const have = credit.get(e.setKey) ?? 0;
      if (e.claim === null) credit.set(e.setKey, have + e.grams);
      else if (e.grams > have) over.push(e.claim);
      else credit.set(e.setKey, have - e.grams);
    }
    const claimsOnDemo = await t.db.shipment.count({ where: { certifiedClaim: true } });
    expect(r.claims.length).toBe(claimsOnDemo);
    expect(r.claims.filter((c) => !c.accepted).map((c) => c.documentNo)).toEqual(over);
    expect(
      r.failures
        .filter((f) => f.code === "CUSTODY.CLAIM_EXCEEDS_BALANCE")
        .map((f) => f.bookingId.replace(/^CLAIM:/, "")),
    ).toEqual(over);
    expect(r.failures.filter((f) => f.code !== "CUSTODY.CLAIM_EXCEEDS_BALANCE")).toEqual([]);
    for (const c of r.claims.filter((x) => !x.accepted)) expect(c.shortfallG).toBe(c.massG - c.availableG);
    // Every account's balance is its credits less its debits over all periods (nothing lapses under CARRY_POSITIVE).
    for (const a of r.accounts)
      expect(a.balanceG, `${a.setKey} ${a.material}`).toBe(sum(a.periods.map((p) => p.creditsG - p.debitsG)));
    expect(r.ruleSet.id).toBe("EU_2022_996");
    expect(r.periodMonths).toBe(3);
  });
});
