import { randomUUID } from "node:crypto";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type { TestDb } from "./support/test-db";
import { createTestDb, PROVIDERS } from "./support/test-db";
import type { TestPlant } from "./support/plant";
import { at, createTestPlant } from "./support/plant";
import { recordPickup } from "@/lib/feedstock/pickup.service";
import { decideLot, receiveLotFromPickups } from "@/lib/feedstock/lot.service";
import { recordTitration } from "@/lib/feedstock/titration.service";
import { transferToTank } from "@/lib/tank/tank.service";
import { completeBatch, correctBatchOutput, planBatch, receiveReagent, startBatch } from "@/lib/batch/batch.service";
import { decideProductLot, recordQcResult, shipProduct } from "@/lib/product/product.service";
import { demoQcResults } from "@/seeds/qc";
import { openWasteContainer, recordDisposal } from "@/lib/waste/container.service";
import { closePeriod, openPeriod, reopenPeriod } from "@/lib/period/period.service";
import { DEFAULT_DENSITY_TABLE } from "@/lib/quantity/density";
import type { Result } from "@/lib/core/result";

function value<T>(r: Result<T>): T {
  if (!r.ok) throw new Error(`expected success, got ${JSON.stringify(r.issues)}`);
  return r.value;
}

function codes<T>(r: Result<T>): Array<{ code: string; field?: string }> {
  if (r.ok) throw new Error("expected a refusal");
  return r.issues.map((i) => (i.field === undefined ? { code: i.code } : { code: i.code, field: i.field }));
}

const ucoEntry = DEFAULT_DENSITY_TABLE.USED_COOKING_OIL;
const rho15 = ucoEntry.model === "linear" ? ucoEntry.densityAt15KgM3 : NaN;

describe.each(PROVIDERS)("movement ledger on %s", (provider) => {
  let t: TestDb;
  let plant: TestPlant;
  beforeAll(async () => {
    t = await createTestDb(provider);
    plant = await createTestPlant(t.db);
  });
  afterAll(async () => {
    await t.drop();
  });

  const movements = () => t.db.movement.count();
  const stock = async (kind: string, code: string) =>
    (await t.db.holder.findUniqueOrThrow({ where: { siteId_kind_code: { siteId: plant.siteId, kind, code } } })).stockG;

  it("records pickups at observed volume and temperature, in integer grams", async () => {
    const a = value(
      await recordPickup(t.db, plant.collector, {
        code: "PU-1",
        sourceCode: "R1",
        material: "USED_COOKING_OIL",
        observedAt: "2026-02-10T09:00:00Z",
        containers: 10,
        volumeL: 600,
        tempC: 15,
      }),
    );
    value(
      await recordPickup(t.db, plant.collector, {
        code: "PU-2",
        sourceCode: "R1",
        material: "USED_COOKING_OIL",
        observedAt: "2026-02-10T11:00:00Z",
        containers: 7,
        volumeL: 400,
        tempC: 15,
      }),
    );
    // At the reference temperature, mass = V × ρ15 (L × kg/m³ / 1000 = kg).
    expect(a.massG).toBe(Math.round(600 * rho15));
    expect(await stock("PICKUP", "PU-1")).toBe(Math.round(600 * rho15));
  });

  it("refuses an unknown source and a duplicate container label, naming the field, and writes nothing", async () => {
    const before = await movements();
    expect(
      codes(
        await recordPickup(t.db, plant.collector, {
          code: "PU-X",
          sourceCode: "NOPE",
          material: "USED_COOKING_OIL",
          observedAt: "2026-02-10T09:00:00Z",
          containers: 1,
          volumeL: 10,
          tempC: 15,
        }),
      ),
    ).toEqual([{ code: "RECORD.NOT_FOUND", field: "sourceCode" }]);
    const dup = codes(
      await recordPickup(t.db, plant.collector, {
        code: "PU-Y",
        sourceCode: "R1",
        material: "USED_COOKING_OIL",
        observedAt: "2026-02-10T09:00:00Z",
        containers: 2,
        containerTags: ["C-1", "C-1"],
        volumeL: 10,
        tempC: 15,
      }),
    );
    expect(dup).toContainEqual({ code: "INPUT.INVALID", field: "containerTags.1" });
    expect(await movements()).toBe(before);
    expect(await t.db.pickup.count({ where: { code: { in: ["PU-X", "PU-Y"] } } })).toBe(0);
  });

  it("records a retried pickup once and answers with the first result", async () => {
    const key = randomUUID();
    const input = {
      code: "PU-3",
      sourceCode: "R1",
      material: "USED_COOKING_OIL",
      observedAt: "2026-02-11T09:00:00Z",
      containers: 1,
      volumeL: 50,
      tempC: 15,
      idempotencyKey: key,
    };
    const first = value(await recordPickup(t.db, plant.collector, input));
    const again = value(await recordPickup(t.db, plant.collector, input));
    expect(again.id).toBe(first.id);
    expect(await t.db.pickup.count({ where: { idempotencyKey: key } })).toBe(1);
  });

  it("pools pickups into a lot and books the plant's measurement difference as a recorded loss", async () => {
    const lot = value(
      await receiveLotFromPickups(t.db, plant.production, {
        code: "L-1",
        material: "USED_COOKING_OIL",
        receivedAt: "2026-02-10T16:00:00Z",
        observedVolumeL: 995,
        observedTempC: 15,
        pickupCodes: ["PU-1", "PU-2"],
      }),
    );
    expect(lot.massG).toBe(Math.round(995 * rho15));
    expect(lot.receivingDifferenceG).toBe(Math.round(995 * rho15) - Math.round(600 * rho15) - Math.round(400 * rho15));
    expect(await stock("PICKUP", "PU-1")).toBe(0);
    expect(await stock("LOT", "L-1")).toBe(lot.massG);
    expect(
      codes(
        await receiveLotFromPickups(t.db, plant.production, {
          code: "L-2",
          material: "USED_COOKING_OIL",
          receivedAt: "2026-02-10T16:00:00Z",
          observedVolumeL: 10,
          observedTempC: 15,
          pickupCodes: ["PU-1"],
        }),
      ),
    ).toEqual([{ code: "PICKUP.ALREADY_RECEIVED", field: "pickupCodes.0" }]);
  });

  it("holds a lot until its FFA is titrated and it is accepted", async () => {
    expect(
      codes(
        await transferToTank(t.db, plant.production, {
          fromKind: "LOT",
          fromCode: "L-1",
          toTankCode: "T1",
          at: "2026-02-11T08:00:00Z",
          massKg: 100,
        }),
      ),
    ).toEqual([{ code: "LOT.NOT_ACCEPTED", field: "fromCode" }]);
    expect(codes(await decideLot(t.db, plant.production, { lotCode: "L-1", status: "ACCEPTED" }))).toEqual([
      { code: "LOT.NO_FFA", field: "status" },
    ]);
    const tit = value(
      await recordTitration(t.db, plant.production, {
        lotCode: "L-1",
        testedAt: "2026-02-11T07:30:00Z",
        sampleMassG: 7.05,
        titrant: "NAOH",
        concentrationMolL: 0.25,
        titreMl: 2,
        basis: "OLEIC",
      }),
    );
    // AOCS Ca 5a-40, calculation (a): 2.00 mL × 0.25 N × 28.2 / 7.05 g = 2.000 % as oleic.
    expect(tit.ffaPct).toBeCloseTo(2.0, 10);
    // EN 14104 form: AV = 56.1 × 2.00 × 0.25 / 7.05 = 3.9787 mg KOH/g.
    expect(tit.acidValue).toBeCloseTo((56.1 * 2 * 0.25) / 7.05, 10);
    value(await decideLot(t.db, plant.production, { lotCode: "L-1", status: "ACCEPTED" }));
  });

  it("refuses to draw more than a lot holds, and leaves every record as it was", async () => {
    const before = await movements();
    const held = await stock("LOT", "L-1");
    const r = await transferToTank(t.db, plant.production, {
      fromKind: "LOT",
      fromCode: "L-1",
      toTankCode: "T1",
      at: "2026-02-11T08:00:00Z",
      massKg: held / 1000 + 0.001,
    });
    expect(codes(r)).toEqual([{ code: "LEDGER.OVERDRAW", field: "massKg" }]);
    expect(await movements()).toBe(before);
    expect(await stock("LOT", "L-1")).toBe(held);
    expect(await stock("TANK", "T1")).toBe(0);
  });

  it("refuses a back-dated draw the holder could not have made at that time", async () => {
    // The lot was received at 16:00 on 10 Feb; drawing from it at 12:00 that day is impossible.
    const r = await transferToTank(t.db, plant.production, {
      fromKind: "LOT",
      fromCode: "L-1",
      toTankCode: "T1",
      at: "2026-02-10T12:00:00Z",
      massKg: 1,
    });
    expect(codes(r)).toEqual([{ code: "LEDGER.OVERDRAW_IN_TIME", field: "massKg" }]);
  });

  it("moves the lot into its tank and marks it used up", async () => {
    const held = await stock("LOT", "L-1");
    value(
      await transferToTank(t.db, plant.production, {
        fromKind: "LOT",
        fromCode: "L-1",
        toTankCode: "T1",
        at: "2026-02-11T08:00:00Z",
        massKg: held / 1000,
      }),
    );
    expect(await stock("TANK", "T1")).toBe(held);
    expect((await t.db.feedstockLot.findFirstOrThrow({ where: { code: "L-1" } })).status).toBe("CONSUMED");
    expect(
      codes(
        await transferToTank(t.db, plant.production, {
          fromKind: "TANK",
          fromCode: "T1",
          toTankCode: "P1",
          at: "2026-02-11T08:00:00Z",
          massKg: 1,
        }),
      ),
    ).toEqual([{ code: "TANK.WRONG_SERVICE", field: "toTankCode" }]);
  });

  it("runs a batch: charges are guarded; the measured outputs are the record and the rest is the unmeasured difference", async () => {
    value(
      await receiveReagent(t.db, plant.production, {
        code: "MEOH-1",
        reagent: "METHANOL",
        supplier: "S",
        strengthPct: 99.9,
        receivedAt: "2026-02-01T08:00:00Z",
        massKg: 500,
      }),
    );
    value(
      await receiveReagent(t.db, plant.production, {
        code: "KOH-1",
        reagent: "KOH",
        supplier: "S",
        strengthPct: 90,
        receivedAt: "2026-02-01T08:00:00Z",
        massKg: 50,
      }),
    );
    value(
      await receiveReagent(t.db, plant.production, {
        code: "W-1",
        reagent: "WATER",
        supplier: "mains",
        strengthPct: 100,
        receivedAt: "2026-02-01T08:00:00Z",
        massKg: 1000,
      }),
    );
    value(
      await openWasteContainer(t.db, plant.compliance, {
        code: "GLY-1",
        stream: "GLYCEROL_PHASE",
        accumulationStart: "2026-02-01T00:00:00Z",
        capacityL: 1000,
        methanolPct: 12,
        pH: 10,
        flashPointC: 35,
      }),
    );
    value(
      await planBatch(t.db, plant.production, {
        code: "B-1",
        plannedAt: "2026-02-12T07:00:00Z",
        targetOilKg: 800,
        catalyst: "KOH",
      }),
    );
    const charges = [
      { fromKind: "TANK", fromCode: "T1", role: "OIL", massKg: 800 },
      { fromKind: "REAGENT_LOT", fromCode: "MEOH-1", role: "METHANOL", massKg: 176 },
      { fromKind: "REAGENT_LOT", fromCode: "KOH-1", role: "CATALYST", massKg: 10 },
    ];
    // Water is not an ingredient: charging it at the start is refused (it is used at the washing step).
    const water = { fromKind: "REAGENT_LOT", fromCode: "W-1", role: "WATER", massKg: 160 };
    expect(
      codes(
        await startBatch(t.db, plant.production, {
          batchCode: "B-1",
          startedAt: "2026-02-12T08:00:00Z",
          charges: [...charges, water],
        }),
      ).map((i) => i.field),
    ).toEqual(["charges.3.role"]);
    expect(
      codes(
        await startBatch(t.db, plant.production, {
          batchCode: "B-1",
          startedAt: "2026-02-12T08:00:00Z",
          charges: [...charges, { fromKind: "REAGENT_LOT", fromCode: "KOH-1", role: "CATALYST", massKg: 41 }],
        }),
      ),
    ).toEqual([{ code: "LEDGER.OVERDRAW", field: "charges.3.massKg" }]);
    expect(await stock("REAGENT_LOT", "KOH-1")).toBe(50_000);
    value(await startBatch(t.db, plant.production, { batchCode: "B-1", startedAt: "2026-02-12T08:00:00Z", charges }));
    expect(await stock("BATCH", "B-1")).toBe(986_000);
    const outputs = [
      { role: "ESTER", toKind: "PRODUCT_LOT", toCode: "P-1", massKg: 780 },
      { role: "GLYCEROL_PHASE", toKind: "WASTE_CONTAINER", toCode: "GLY-1", massKg: 120 },
      // 165 kg drawn off after washing with 160 kg of water: 5 kg came out of the batch.
      {
        role: "WASH_WATER",
        toKind: "WASTE_CONTAINER",
        toCode: "GLY-1",
        massKg: 165,
        waterFromCode: "W-1",
        waterKg: 160,
      },
      { role: "RECOVERED_METHANOL", toKind: "TANK", toCode: "M1", massKg: 78 },
    ];
    // A recorded loss says what happened; the remainder is never typed.
    expect(
      codes(
        await completeBatch(t.db, plant.production, {
          batchCode: "B-1",
          completedAt: "2026-02-12T12:00:00Z",
          outputs: [...outputs, { role: "LOSS", massKg: 1 }],
        }),
      ),
    ).toEqual([{ code: "INPUT.INVALID", field: "outputs.4.reason" }]);
    expect(await t.db.productLot.count()).toBe(0);
    // 986 kg charged − (780 + 120 + 5 + 78) kg measured = 3 kg unmeasured difference, booked by the service.
    expect(
      value(
        await completeBatch(t.db, plant.production, { batchCode: "B-1", completedAt: "2026-02-12T12:00:00Z", outputs }),
      ).unmeasuredG,
    ).toBe(3_000);
    expect(await stock("BATCH", "B-1")).toBe(0);
    expect(await stock("DIFFERENCE", "UNMEASURED")).toBe(3_000);
    expect(await stock("PRODUCT_LOT", "P-1")).toBe(780_000);
    expect(await stock("REAGENT_LOT", "W-1")).toBe(840_000);
    expect(await stock("WASTE_CONTAINER", "GLY-1")).toBe(285_000);
    // The water went straight to the wash-water stream: no water movement into the batch.
    const b1 = await t.db.holder.findFirstOrThrow({ where: { kind: "BATCH", code: "B-1" } });
    expect(await t.db.movement.count({ where: { toHolderId: b1.id, role: "WATER" } })).toBe(0);
  });

  it("corrects a finished batch's output typed wrong with a correcting entry, re-booking its unmeasured difference", async () => {
    const b1 = await t.db.holder.findFirstOrThrow({ where: { kind: "BATCH", code: "B-1" } });
    const ester = await t.db.movement.findFirstOrThrow({ where: { fromHolderId: b1.id, role: "ESTER" } });
    // Typed 780 for a ticket that read 779: the difference grows to 4 kg.
    expect(
      value(
        await correctBatchOutput(t.db, plant.production, {
          batchCode: "B-1",
          movementId: ester.id,
          massKg: 779,
          reason: "ticket read 779 kg",
        }),
      ).unmeasuredG,
    ).toBe(4_000);
    expect(await stock("PRODUCT_LOT", "P-1")).toBe(779_000);
    expect((await t.db.productLot.findFirstOrThrow({ where: { code: "P-1" } })).massG).toBe(779_000);
    expect(
      codes(
        await correctBatchOutput(t.db, plant.production, {
          batchCode: "B-1",
          movementId: ester.id,
          massKg: 780,
          reason: "again",
        }),
      ),
    ).toEqual([{ code: "BATCH.OUTPUT_CORRECTED", field: "movementId" }]);
    expect(
      codes(
        await correctBatchOutput(t.db, plant.production, {
          batchCode: "B-1",
          movementId: ester.id,
          massKg: 780,
          reason: "",
        }),
      )[0]?.field,
    ).toBe("reason");
    // The ticket was right after all: correct the correcting entry back; nothing is edited or deleted.
    const again = await t.db.movement.findFirstOrThrow({
      where: { fromHolderId: b1.id, role: "ESTER", reversesId: null, reversedBy: null },
    });
    expect(
      value(
        await correctBatchOutput(t.db, plant.production, {
          batchCode: "B-1",
          movementId: again.id,
          massKg: 780,
          reason: "second look: the ticket read 780 kg",
        }),
      ).unmeasuredG,
    ).toBe(3_000);
    expect(await stock("PRODUCT_LOT", "P-1")).toBe(780_000);
    expect(await stock("BATCH", "B-1")).toBe(0);
    expect(await t.db.movement.count({ where: { fromHolderId: b1.id, role: "ESTER" } })).toBe(3);
    expect(await t.db.auditEvent.count({ where: { entity: "Batch", entityKey: "B-1", reason: { not: "" } } })).toBe(2);
  });

  it("releases product only after passing QC, then ships it", async () => {
    expect(
      codes(await decideProductLot(t.db, plant.compliance, { productLotCode: "P-1", decision: "RELEASE" })),
    ).toEqual([{ code: "PRODUCT.NOT_RELEASABLE", field: "decision" }]);
    // Every required property of ASTM D6751-23a No. 2-B S15 (the default specification), inside its Table 1 limits.
    for (const r of demoQcResults("P-1", new Date("2026-02-13T09:00:00Z"), false))
      value(await recordQcResult(t.db, plant.compliance, r));
    expect(
      codes(
        await shipProduct(t.db, plant.production, {
          documentNo: "BOL-1",
          customer: "C",
          shippedAt: "2026-02-13T10:00:00Z",
          fromKind: "PRODUCT_LOT",
          fromCode: "P-1",
          massKg: 100,
          volumeL: 113,
        }),
      ),
    ).toEqual([{ code: "PRODUCT.NOT_RELEASED", field: "fromCode" }]);
    value(await decideProductLot(t.db, plant.compliance, { productLotCode: "P-1", decision: "RELEASE" }));
    value(
      await transferToTank(t.db, plant.production, {
        fromKind: "PRODUCT_LOT",
        fromCode: "P-1",
        toTankCode: "P1",
        at: "2026-02-13T11:00:00Z",
        massKg: 780,
      }),
    );
    value(
      await shipProduct(t.db, plant.production, {
        documentNo: "BOL-1",
        customer: "C",
        shippedAt: "2026-02-14T10:00:00Z",
        fromKind: "TANK",
        fromCode: "P1",
        massKg: 500,
        volumeL: 568,
      }),
    );
    expect(await stock("TANK", "P1")).toBe(280_000);
    value(
      await recordDisposal(t.db, plant.compliance, {
        documentNo: "MAN-1",
        hauler: "H",
        disposedAt: "2026-02-20T10:00:00Z",
        containerCode: "GLY-1",
        massKg: 285,
        destination: "Test Recovery",
      }),
    );
    expect((await t.db.wasteContainer.findFirstOrThrow({ where: { code: "GLY-1" } })).status).toBe("SHIPPED");
  });

  it("keeps every holder's book stock equal to its ledger, and conserves mass", async () => {
    const holders = await t.db.holder.findMany({ select: { id: true, stockG: true } });
    const moves = await t.db.movement.findMany({ select: { fromHolderId: true, toHolderId: true, massG: true } });
    for (const h of holders) {
      const net = moves.reduce(
        (s, m) => s + (m.toHolderId === h.id ? m.massG : 0) - (m.fromHolderId === h.id ? m.massG : 0),
        0,
      );
      expect(h.stockG, `holder ${h.id}`).toBe(net);
    }
    const entered = moves.filter((m) => m.fromHolderId === null).reduce((s, m) => s + m.massG, 0);
    expect(holders.reduce((s, h) => s + h.stockG, 0)).toBe(entered);
  });

  it("refuses bookings into a closed period", async () => {
    const p = value(
      await openPeriod(t.db, plant.compliance, { startsAt: "2026-01-01T00:00:00Z", endsAt: "2026-02-01T00:00:00Z" }),
    );
    value(await closePeriod(t.db, { ...plant.compliance, now: at("2026-02-05T00:00:00Z") }, { periodId: p.id }));
    const old = {
      code: "PU-OLD",
      sourceCode: "R1",
      material: "USED_COOKING_OIL",
      observedAt: "2026-01-20T09:00:00Z",
      containers: 1,
      volumeL: 20,
      tempC: 15,
    };
    expect(codes(await recordPickup(t.db, plant.collector, old))).toEqual([{ code: "PERIOD.CLOSED", field: "at" }]);
    expect(await t.db.pickup.count({ where: { code: "PU-OLD" } })).toBe(0);
    expect(codes(await reopenPeriod(t.db, plant.compliance, { periodId: p.id, reason: "" }))).toEqual([
      { code: "INPUT.INVALID", field: "reason" },
    ]);
    value(await reopenPeriod(t.db, plant.compliance, { periodId: p.id, reason: "late pickup sheet found in truck 2" }));
    value(await recordPickup(t.db, plant.collector, old));
    const events = await t.db.periodEvent.findMany({ where: { periodId: p.id }, orderBy: { id: "asc" } });
    expect(events.map((e) => [e.action, e.reason, e.byId])).toEqual([
      ["CLOSE", "period end", plant.compliance.userId],
      ["REOPEN", "late pickup sheet found in truck 2", plant.compliance.userId],
    ]);
  });

  it("refuses UPDATE and DELETE on the ledger at the database level", async () => {
    await expect(t.db.$executeRawUnsafe(`UPDATE "Movement" SET "massG" = "massG" + 1`)).rejects.toThrow(/APPEND_ONLY/);
    await expect(t.db.$executeRawUnsafe(`DELETE FROM "Movement"`)).rejects.toThrow(/APPEND_ONLY/);
    await expect(t.db.$executeRawUnsafe(`UPDATE "Holder" SET "stockG" = -1`)).rejects.toThrow();
  });
});
