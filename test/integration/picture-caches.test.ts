// The pictures drawn on the server for a tank, a source and a period's flows, kept by ledger position
// (app/tanks/[code]/stock-picture.tsx, app/sources/[code]/ffa-picture.tsx, app/balance/flows-picture.tsx):
// the same picture at the same position is handed out from memory; a booking makes the next ask read
// and draw again, and the new drawing shows it.
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type { TestDb } from "./support/test-db";
import { createTestDb, PROVIDERS } from "./support/test-db";
import type { TestPlant } from "./support/plant";
import { acceptedLot, createTestPlant } from "./support/plant";
import { transferToTank } from "@/lib/tank/tank.service";
import { clearTankPictures, keptStockDrawing } from "@/app/tanks/[code]/stock-picture";
import { clearFfaPictures, keptFfaDrawing } from "@/app/sources/[code]/ffa-picture";
import { clearFlowsPictures, keptFlows } from "@/app/balance/flows-picture";
import type { Result } from "@/lib/core/result";

function value<T>(r: Result<T>): T {
  if (!r.ok) throw new Error(`expected success, got ${JSON.stringify(r.issues)}`);
  return r.value;
}

// Each database starts from the same site id and position, so the kept pictures are forgotten between them.
function clearPictures(): void {
  clearTankPictures();
  clearFfaPictures();
  clearFlowsPictures();
}

describe.each(PROVIDERS)("pictures kept by ledger position on %s", (provider) => {
  let t: TestDb;
  let plant: TestPlant;
  let source: { id: number; code: string };
  const now = new Date("2026-03-01T12:00:00Z");
  const tank = { code: "T1", capacityG: 46_000_000 };
  const february = { startsAt: new Date("2026-02-01T00:00:00Z"), endsAt: new Date("2026-03-01T00:00:00Z") };

  beforeAll(async () => {
    clearPictures();
    t = await createTestDb(provider);
    plant = await createTestPlant(t.db);
    await acceptedLot(t.db, plant, { lot: "L-1", pickup: "PU-1", day: 2 });
    const row = await t.db.source.findFirstOrThrow({ where: { siteId: plant.siteId, code: "R1" } });
    source = { id: row.id, code: row.code };
    value(
      await transferToTank(t.db, plant.production, {
        fromKind: "LOT",
        fromCode: "L-1",
        toTankCode: "T1",
        at: "2026-02-03T08:00:00Z",
        massKg: 100,
      }),
    );
  }, 120_000);
  afterAll(async () => {
    clearPictures();
    await t.drop();
  });

  it("hands out the same drawing at the same position", async () => {
    const stock = await keptStockDrawing(t.db, plant.siteId, tank, "UTC", now);
    const stockAgain = await keptStockDrawing(t.db, plant.siteId, tank, "UTC", now);
    expect([stock.outcome, stockAgain.outcome]).toEqual(["computed", "same-position"]);
    expect(stockAgain.value.drawn?.svg).toContain("<svg");
    const ffa = await keptFfaDrawing(t.db, plant.siteId, source, "UTC");
    const ffaAgain = await keptFfaDrawing(t.db, plant.siteId, source, "UTC");
    expect([ffa.outcome, ffaAgain.outcome]).toEqual(["computed", "same-position"]);
    expect(ffaAgain.value.drawn?.svg).toContain("<svg");
    const flows = await keptFlows(t.db, plant.siteId, february);
    const flowsAgain = await keptFlows(t.db, plant.siteId, february);
    expect([flows.outcome, flowsAgain.outcome]).toEqual(["computed", "same-position"]);
    expect(flowsAgain.value.svg).toContain("<svg");
    // Another tank's time zone, another quarter-hour or another period is another picture.
    expect((await keptStockDrawing(t.db, plant.siteId, tank, "UTC", new Date(now.getTime() + 900_000))).outcome).toBe(
      "computed",
    );
    const january = { startsAt: new Date("2026-01-01T00:00:00Z"), endsAt: february.startsAt };
    expect((await keptFlows(t.db, plant.siteId, january)).outcome).toBe("computed");
  });

  it("a booking makes each picture read and draw again, and the drawing shows it", async () => {
    const stockBefore = (await keptStockDrawing(t.db, plant.siteId, tank, "UTC", now)).value;
    const ffaBefore = (await keptFfaDrawing(t.db, plant.siteId, source, "UTC")).value;
    const flowsBefore = (await keptFlows(t.db, plant.siteId, february)).value;
    await acceptedLot(t.db, plant, { lot: "L-2", pickup: "PU-2", day: 9 });
    value(
      await transferToTank(t.db, plant.production, {
        fromKind: "LOT",
        fromCode: "L-2",
        toTankCode: "T1",
        at: "2026-02-10T08:00:00Z",
        massKg: 50,
      }),
    );
    const stock = await keptStockDrawing(t.db, plant.siteId, tank, "UTC", now);
    expect(stock.outcome).toBe("computed");
    expect(stock.value.s.closingG).toBe(stockBefore.s.closingG + 50_000);
    expect(stock.value.drawn?.summary).not.toBe(stockBefore.drawn?.summary);
    const ffa = await keptFfaDrawing(t.db, plant.siteId, source, "UTC");
    expect(ffa.outcome).toBe("computed");
    expect(ffa.value.s?.points.map((p) => p.lotCode)).toEqual([
      ...(ffaBefore.s?.points.map((p) => p.lotCode) ?? []),
      "L-2",
    ]);
    const flows = await keptFlows(t.db, plant.siteId, february);
    expect(flows.outcome).toBe("computed");
    expect(flows.value.f.movedG).toBeGreaterThan(flowsBefore.f.movedG);
  });
});
