import fc from "fast-check";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type { TestDb } from "./support/test-db";
import { createTestDb, PROVIDERS } from "./support/test-db";
import type { TestPlant } from "./support/plant";
import { createTestPlant } from "./support/plant";
import type { Result } from "@/lib/core/result";
import type { Actor } from "@/lib/core/actor";
import type { Db } from "@/lib/core/connect";
import { importPickups, recordPickup } from "@/lib/feedstock/pickup.service";
import { decideLot, receiveDelivery, receiveLotFromPickups, recordLabTest } from "@/lib/feedstock/lot.service";
import { recordTitration } from "@/lib/feedstock/titration.service";
import { createTank, recordGauge, transferToTank } from "@/lib/tank/tank.service";
import { completeBatch, planBatch, receiveReagent, startBatch } from "@/lib/batch/batch.service";
import { decideProductLot, recordQcResult, shipProduct } from "@/lib/product/product.service";
import { openWasteContainer, recordDisposal } from "@/lib/waste/container.service";
import { closePeriod, openPeriod, reopenPeriod } from "@/lib/period/period.service";
import { createSource } from "@/lib/source/source.service";

type Write = (db: Db, actor: Actor, input: unknown) => Promise<Result<unknown>>;
const WRITES: Array<[string, Write]> = [
  ["recordPickup", (db, a, i) => recordPickup(db, a, i)],
  ["importPickups", (db, a, i) => importPickups(db, a, i)],
  ["receiveLotFromPickups", (db, a, i) => receiveLotFromPickups(db, a, i)],
  ["receiveDelivery", (db, a, i) => receiveDelivery(db, a, i)],
  ["recordLabTest", recordLabTest],
  ["decideLot", decideLot],
  ["recordTitration", recordTitration],
  ["createTank", createTank],
  ["recordGauge", recordGauge],
  ["transferToTank", transferToTank],
  ["receiveReagent", receiveReagent],
  ["planBatch", planBatch],
  ["startBatch", startBatch],
  ["completeBatch", completeBatch],
  ["recordQcResult", recordQcResult],
  ["decideProductLot", decideProductLot],
  ["shipProduct", shipProduct],
  ["openWasteContainer", openWasteContainer],
  ["recordDisposal", recordDisposal],
  ["openPeriod", openPeriod],
  ["closePeriod", closePeriod],
  ["reopenPeriod", reopenPeriod],
  ["createSource", createSource],
];

// Field names the schemas use, so generated objects hit real fields with wrong values as well as junk.
const FIELDS = [
  "code",
  "sourceCode",
  "material",
  "observedAt",
  "containers",
  "containerTags",
  "volumeL",
  "tempC",
  "lotCode",
  "testedAt",
  "sampleMassG",
  "titrant",
  "concentrationMolL",
  "titreMl",
  "blankMl",
  "basis",
  "status",
  "fromKind",
  "fromCode",
  "toTankCode",
  "at",
  "massKg",
  "reagent",
  "supplier",
  "strengthPct",
  "receivedAt",
  "batchCode",
  "startedAt",
  "charges",
  "completedAt",
  "outputs",
  "productLotCode",
  "property",
  "method",
  "value",
  "unit",
  "specRef",
  "decision",
  "documentNo",
  "customer",
  "shippedAt",
  "stream",
  "accumulationStart",
  "capacityL",
  "containerCode",
  "disposedAt",
  "hauler",
  "startsAt",
  "endsAt",
  "periodId",
  "reason",
  "pickupCodes",
  "observedVolumeL",
  "observedTempC",
  "rows",
  "name",
  "kind",
  "materials",
  "service",
  "targetOilKg",
  "catalyst",
  "plannedAt",
];
const nasty = fc.oneof(
  fc.constant(null),
  fc.constant(undefined),
  fc.constant(Number.NaN),
  fc.constant(Number.POSITIVE_INFINITY),
  fc.constant(-1),
  fc.constant(0),
  fc.constant(1e12),
  fc.constant(""),
  fc.constant(" "),
  fc.constant("a\u0000b"),
  fc.constant("R1\u0000"),
  fc.constant('=HYPERLINK("x")'),
  fc.constant("2026-02-30"),
  fc.constant("USED_COOKING_OIL"),
  fc.constant("T1"),
  fc.constant("R1"),
  fc.string(),
  fc.integer(),
  fc.double(),
  fc.boolean(),
  fc.date({ noInvalidDate: false }),
  fc.array(fc.anything(), { maxLength: 3 }),
  fc.object({ maxDepth: 1 }),
);
const input = fc.oneof(
  { weight: 4, arbitrary: fc.dictionary(fc.constantFrom(...FIELDS), nasty, { maxKeys: 12 }) },
  { weight: 1, arbitrary: fc.anything() },
);

describe.each(PROVIDERS)("malformed input to every write service on %s", (provider) => {
  let t: TestDb;
  let plant: TestPlant;
  beforeAll(async () => {
    t = await createTestDb(provider);
    plant = await createTestPlant(t.db);
  });
  afterAll(async () => {
    await t.drop();
  });

  it(`never throws, and every refusal names its code and field (10,000 cases)`, async () => {
    const before = await t.db.movement.count();
    let refused = 0;
    await fc.assert(
      fc.asyncProperty(fc.integer({ min: 0, max: WRITES.length - 1 }), input, async (w, payload) => {
        const [name, write] = WRITES[w] ?? WRITES[0]!;
        const r = await write(t.db, plant.production, payload);
        if (r.ok) return;
        refused++;
        expect(r.issues.length, name).toBeGreaterThan(0);
        for (const issue of r.issues) {
          expect(issue.code, name).toMatch(/^[A-Z_]+\.[A-Z_0-9]+$/);
          expect(issue.message.length, name).toBeGreaterThan(3);
          if (
            issue.code === "INPUT.INVALID" &&
            payload !== null &&
            typeof payload === "object" &&
            !Array.isArray(payload)
          )
            expect(issue.field, `${name}: ${issue.message}`).toBeTruthy();
        }
      }),
      { numRuns: 10_000, seed: 20261202 },
    );
    expect(refused).toBeGreaterThan(0);
    // Junk may occasionally form a valid record, but never a half-written one: stocks still match the ledger.
    const holders = await t.db.holder.findMany({ select: { id: true, stockG: true } });
    const moves = await t.db.movement.findMany({ select: { fromHolderId: true, toHolderId: true, massG: true } });
    for (const h of holders)
      expect(h.stockG).toBe(
        moves.reduce((s, m) => s + (m.toHolderId === h.id ? m.massG : 0) - (m.fromHolderId === h.id ? m.massG : 0), 0),
      );
    expect(await t.db.movement.count()).toBeGreaterThanOrEqual(before);
  }, 600_000);
});
