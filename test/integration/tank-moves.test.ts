import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type { TestDb } from "./support/test-db";
import { createTestDb, PROVIDERS } from "./support/test-db";
import type { TestPlant } from "./support/plant";
import { acceptedLot, createTestPlant } from "./support/plant";
import { recordPickup } from "@/lib/feedstock/pickup.service";
import { receiveLotIntoTank } from "@/lib/feedstock/receive-tank.service";
import { createTank, recordGauge, transferToTank } from "@/lib/tank/tank.service";
import { closePeriod, openPeriod } from "@/lib/period/period.service";
import { applyMeasuredDensity, DEFAULT_DENSITY_TABLE, densityAt, requireDensityEntry } from "@/lib/quantity/density";
import { toGrams } from "@/lib/quantity/units";
import type { Result } from "@/lib/core/result";

function value<T>(r: Result<T>): T {
  if (!r.ok) throw new Error(`expected success, got ${JSON.stringify(r.issues)}`);
  return r.value;
}
function issue<T>(r: Result<T>): { code: string; field?: string } {
  if (r.ok) throw new Error("expected a refusal");
  return { code: r.issues[0]?.code ?? "", ...(r.issues[0]?.field === undefined ? {} : { field: r.issues[0].field }) };
}

// Used cooking oil in the default density table (lib/quantity/density.ts): ρ15 918.2 kg/m³, slope
// −0.64 kg/m³/K (JAOCS 76:1415–1419 (1999)); the lot's own density at 15 °C replaces the level.
const UCO = requireDensityEntry(DEFAULT_DENSITY_TABLE, "USED_COOKING_OIL");
// Calibration table read in straight lines between rows (common practice).
const TABLE = [
  [0, 0],
  [100, 300],
  [1100, 2800],
  [2100, 5300],
];

describe.each(PROVIDERS)("tank moves and gauges on %s", (provider) => {
  let t: TestDb;
  let plant: TestPlant;
  const stock = async (kind: string, code: string) =>
    (await t.db.holder.findUniqueOrThrow({ where: { siteId_kind_code: { siteId: plant.siteId, kind, code } } })).stockG;

  beforeAll(async () => {
    t = await createTestDb(provider);
    plant = await createTestPlant(t.db);
    value(
      await createTank(t.db, plant.production, {
        code: "T2",
        name: "Second feed",
        service: "FEEDSTOCK",
        capacityL: 5_300,
        strapping: TABLE,
      }),
    );
    value(
      await createTank(t.db, plant.production, { code: "T8", name: "Day tank", service: "FEEDSTOCK", capacityL: 200 }),
    );
    await acceptedLot(t.db, plant, { lot: "L-1", pickup: "PU-1", day: 10, volumeL: 600 });
  });
  afterAll(async () => {
    await t.drop();
  });

  it("moves a volume read at a temperature as the mass the lot's density gives", async () => {
    const lot = await t.db.feedstockLot.findFirstOrThrow({ where: { code: "L-1" } });
    const before = await stock("TANK", "T1");
    const r = value(
      await transferToTank(t.db, plant.production, {
        fromKind: "LOT",
        fromCode: "L-1",
        toTankCode: "T1",
        at: "2026-02-11T08:00:00Z",
        volumeL: 100,
        tempC: 40,
      }),
    );
    const rho = densityAt(
      applyMeasuredDensity(UCO, { densityKgM3: lot.densityKgM3, atTempC: lot.referenceTempC, source: "lot" }),
      40,
    );
    expect(r.massG).toBe(toGrams((100 * rho) / 1000));
    expect(r.fromVolume?.densityKgM3).toBeCloseTo(rho, 9);
    expect((await stock("TANK", "T1")) - before).toBe(r.massG);
    const mv = await t.db.movement.findUniqueOrThrow({ where: { id: r.movementId } });
    expect(mv).toMatchObject({ volumeMl: 100_000, tempC: 40, massG: r.massG });
  });

  it("refuses a volume without its temperature, an over-draw and an over-fill, each on its field", async () => {
    expect(
      issue(
        await transferToTank(t.db, plant.production, {
          fromKind: "LOT",
          fromCode: "L-1",
          toTankCode: "T1",
          at: "2026-02-11T09:00:00Z",
          volumeL: 10,
        }),
      ),
    ).toEqual({ code: "INPUT.INVALID", field: "tempC" });
    expect(
      issue(
        await transferToTank(t.db, plant.production, {
          fromKind: "LOT",
          fromCode: "L-1",
          toTankCode: "T1",
          at: "2026-02-11T09:00:00Z",
          volumeL: 5_000,
          tempC: 20,
        }),
      ),
    ).toEqual({ code: "LEDGER.OVERDRAW", field: "volumeL" });
    expect(
      issue(
        await transferToTank(t.db, plant.production, {
          fromKind: "LOT",
          fromCode: "L-1",
          toTankCode: "T8",
          at: "2026-02-11T09:00:00Z",
          massKg: 300,
        }),
      ),
    ).toEqual({ code: "TANK.OVERFILL", field: "massKg" });
    expect(
      issue(
        await transferToTank(t.db, plant.production, {
          fromKind: "TANK",
          fromCode: "T1",
          toTankCode: "T1",
          at: "2026-02-11T09:00:00Z",
          massKg: 1,
        }),
      ),
    ).toEqual({ code: "TANK.SAME_TANK", field: "toTankCode" });
  });

  it("moves all that is left, and the lot is used up", async () => {
    const left = await stock("LOT", "L-1");
    const r = value(
      await transferToTank(t.db, plant.production, {
        fromKind: "LOT",
        fromCode: "L-1",
        toTankCode: "T2",
        at: "2026-02-12T08:00:00Z",
        all: true,
      }),
    );
    expect(r.massG).toBe(left);
    expect(await stock("LOT", "L-1")).toBe(0);
    expect((await t.db.feedstockLot.findFirstOrThrow({ where: { code: "L-1" } })).status).toBe("CONSUMED");
  });

  it("keeps the book stock at the gauge's own time beside the reading", async () => {
    const inT1 = await stock("TANK", "T1");
    // Gauged between the first move (02-11 08:00) and a later one: the book then is the first move only.
    value(
      await transferToTank(t.db, plant.production, {
        fromKind: "TANK",
        fromCode: "T1",
        toTankCode: "T2",
        at: "2026-02-13T08:00:00Z",
        massKg: 10,
      }),
    );
    const g = value(
      await recordGauge(t.db, plant.production, {
        tankCode: "T1",
        at: "2026-02-12T17:00:00Z",
        volumeL: 95,
        tempC: 20,
        note: "dip after move",
      }),
    );
    expect(g.bookStockG).toBe(inT1);
    const rho20 = densityAt(UCO, 20);
    expect(g.massG).toBe(toGrams((95 * rho20) / 1000));
    expect(g.differenceG).toBe(g.massG - inT1);
    expect(g.differencePct).toBeCloseTo(((g.massG - inT1) * 100) / inT1, 9);
    const row = await t.db.tankGauge.findUniqueOrThrow({ where: { id: g.id } });
    expect(row).toMatchObject({
      method: "VOLUME",
      levelMm: null,
      densityKgM3: null,
      bookStockG: inT1,
      note: "dip after move",
      recordedById: plant.production.userId,
      volumeMl: 95_000,
    });
  });

  it("reads a level through the calibration table, with a measured density, and refuses outside it", async () => {
    // 150 mm lies between rows [100, 300] and [1100, 2800]: 300 + 50/1000 × 2,500 = 425 L.
    // Measured 921.0 kg/m³ at 15 °C, gauged at 30 °C: 921.0 − 0.64 × 15 = 911.4 kg/m³ → 387.345 kg.
    const g = value(
      await recordGauge(t.db, plant.production, {
        tankCode: "T2",
        at: "2026-02-14T17:00:00Z",
        method: "LEVEL",
        levelMm: 150,
        tempC: 30,
        densityKgM3: 921,
      }),
    );
    expect(g.volumeMl).toBe(425_000);
    expect(g.densityKgM3).toBeCloseTo(911.4, 9);
    expect(g.massG).toBe(387_345);
    expect(await t.db.tankGauge.findUniqueOrThrow({ where: { id: g.id } })).toMatchObject({
      method: "LEVEL",
      levelMm: 150,
      densityKgM3: 921,
    });
    expect(
      issue(
        await recordGauge(t.db, plant.production, {
          tankCode: "T2",
          at: "2026-02-14T18:00:00Z",
          method: "LEVEL",
          levelMm: 2_500,
          tempC: 30,
        }),
      ),
    ).toEqual({ code: "TANK.LEVEL_OUTSIDE_TABLE", field: "levelMm" });
    expect(
      issue(
        await recordGauge(t.db, plant.production, {
          tankCode: "T1",
          at: "2026-02-14T18:00:00Z",
          method: "LEVEL",
          levelMm: 100,
          tempC: 30,
        }),
      ),
    ).toEqual({ code: "TANK.NO_CALIBRATION", field: "levelMm" });
    expect(
      issue(
        await recordGauge(t.db, plant.production, {
          tankCode: "T2",
          at: "2026-02-14T18:00:00Z",
          method: "LEVEL",
          tempC: 30,
        }),
      ),
    ).toEqual({ code: "INPUT.INVALID", field: "levelMm" });
  });

  it("refuses a gauge or a move dated in a closed period, on the time field", async () => {
    const p = value(
      await openPeriod(t.db, plant.compliance, { startsAt: "2026-01-01T00:00:00Z", endsAt: "2026-02-01T00:00:00Z" }),
    );
    value(await closePeriod(t.db, plant.compliance, { periodId: p.id, reason: "month end close" }));
    const before = await t.db.tankGauge.count();
    expect(
      issue(
        await recordGauge(t.db, plant.production, {
          tankCode: "T1",
          at: "2026-01-20T17:00:00Z",
          volumeL: 10,
          tempC: 20,
        }),
      ),
    ).toEqual({ code: "PERIOD.CLOSED", field: "at" });
    expect(
      issue(
        await transferToTank(t.db, plant.production, {
          fromKind: "TANK",
          fromCode: "T2",
          toTankCode: "T1",
          at: "2026-01-20T17:00:00Z",
          massKg: 1,
        }),
      ),
    ).toEqual({ code: "PERIOD.CLOSED", field: "at" });
    expect(await t.db.tankGauge.count()).toBe(before);
  });
});

describe.each(PROVIDERS)("receiving pickups straight into a tank on %s", (provider) => {
  let t: TestDb;
  let plant: TestPlant;
  const stock = async (kind: string, code: string) =>
    (await t.db.holder.findUniqueOrThrow({ where: { siteId_kind_code: { siteId: plant.siteId, kind, code } } })).stockG;
  const input = (o: Record<string, unknown>) => ({
    code: "L-POOL",
    material: "USED_COOKING_OIL",
    receivedAt: "2026-02-20T16:00:00Z",
    observedVolumeL: 500,
    observedTempC: 15,
    pickupCodes: ["PU-A", "PU-B"],
    tankCode: "T1",
    acceptReason: "tank sample titrated",
    ...o,
  });

  beforeAll(async () => {
    t = await createTestDb(provider);
    plant = await createTestPlant(t.db);
    value(
      await createTank(t.db, plant.production, {
        code: "T7",
        name: "Small tank",
        service: "FEEDSTOCK",
        capacityL: 300,
      }),
    );
    for (const code of ["PU-A", "PU-B"]) {
      value(
        await recordPickup(t.db, plant.collector, {
          code,
          sourceCode: "R1",
          material: "USED_COOKING_OIL",
          observedAt: "2026-02-20T09:00:00Z",
          containers: 4,
          volumeL: 250,
          tempC: 15,
        }),
      );
    }
  });
  afterAll(async () => {
    await t.drop();
  });

  it("writes nothing at all when the tank is too small", async () => {
    const counts = async () => ({
      lots: await t.db.feedstockLot.count(),
      moves: await t.db.movement.count(),
      audit: await t.db.auditEvent.count(),
      holders: await t.db.holder.count(),
    });
    const before = await counts();
    expect(issue(await receiveLotIntoTank(t.db, plant.production, input({ tankCode: "T7" })))).toEqual({
      code: "TANK.OVERFILL",
      field: "tankCode",
    });
    expect(await counts()).toEqual(before);
    expect(await t.db.pickup.count({ where: { lotId: { not: null } } })).toBe(0);
    expect(await stock("PICKUP", "PU-A")).toBeGreaterThan(0);
  });

  it("needs the reason for accepting and a feedstock tank", async () => {
    expect(issue(await receiveLotIntoTank(t.db, plant.production, input({ acceptReason: "" })))).toEqual({
      code: "INPUT.INVALID",
      field: "acceptReason",
    });
    expect(issue(await receiveLotIntoTank(t.db, plant.production, input({ tankCode: "P1" })))).toEqual({
      code: "TANK.WRONG_SERVICE",
      field: "tankCode",
    });
  });

  it("makes the lot, accepts it with who and why in the trail, and moves all of it into the tank", async () => {
    const before = await stock("TANK", "T1");
    const r = value(await receiveLotIntoTank(t.db, plant.production, input({})));
    expect((await stock("TANK", "T1")) - before).toBe(r.massG);
    expect(await stock("LOT", "L-POOL")).toBe(0);
    const lot = await t.db.feedstockLot.findFirstOrThrow({ where: { code: "L-POOL" }, include: { pickups: true } });
    expect(lot.pickups.map((p) => p.code).sort()).toEqual(["PU-A", "PU-B"]);
    expect(lot.status).toBe("CONSUMED");
    const accepted = await t.db.auditEvent.findFirstOrThrow({
      where: { entity: "FeedstockLot", entityKey: "L-POOL", action: "CHANGE" },
    });
    expect(accepted.reason).toBe("tank sample titrated");
    expect(accepted.actorId).toBe(plant.production.userId);
    expect(JSON.parse(accepted.after)).toMatchObject({ status: "ACCEPTED" });
    const into = await t.db.movement.findFirstOrThrow({ where: { id: r.movementId } });
    expect(into.massG).toBe(r.massG);
  });
});
