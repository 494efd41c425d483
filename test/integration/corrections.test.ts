import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type { TestDb } from "./support/test-db";
import { createTestDb, PROVIDERS } from "./support/test-db";
import type { TestPlant } from "./support/plant";
import { createTestPlant } from "./support/plant";
import { recordPickup } from "@/lib/feedstock/pickup.service";
import { decideLot, receiveLotFromPickups } from "@/lib/feedstock/lot.service";
import { recordTitration } from "@/lib/feedstock/titration.service";
import { createTank, transferToTank } from "@/lib/tank/tank.service";
import { reverseMovement, voidLabResult } from "@/lib/correction/correction.service";
import { listRecordHistory } from "@/lib/audit/audit.store";
import { loadTraceLedger } from "@/lib/ledger/movement.store";
import { completeBatch, planBatch, receiveReagent, startBatch } from "@/lib/batch/batch.service";
import { getBatchDetail } from "@/lib/batch/batch.store";
import { loadBalanceLedger } from "@/lib/mass-balance/balance.store";
import type { Result } from "@/lib/core/result";

function value<T>(r: Result<T>): T {
  if (!r.ok) throw new Error(`expected success, got ${JSON.stringify(r.issues)}`);
  return r.value;
}
function issue<T>(r: Result<T>): { code: string; field?: string } {
  if (r.ok) throw new Error("expected a refusal");
  return { code: r.issues[0]?.code ?? "", ...(r.issues[0]?.field === undefined ? {} : { field: r.issues[0].field }) };
}

// integrity.md (ALCOA+, 21 CFR 11.10(e)): records are never deleted; a mistake is corrected with a
// reason that the audit trail keeps, and the original stays visible.
describe.each(PROVIDERS)("corrections on %s", (provider) => {
  let t: TestDb;
  let plant: TestPlant;
  let transferId = 0;
  let titrationId = 0;
  const stock = async (kind: string, code: string) =>
    (await t.db.holder.findUniqueOrThrow({ where: { siteId_kind_code: { siteId: plant.siteId, kind, code } } })).stockG;

  beforeAll(async () => {
    t = await createTestDb(provider);
    plant = await createTestPlant(t.db);
    value(
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
      await receiveLotFromPickups(t.db, plant.production, {
        code: "L-1",
        material: "USED_COOKING_OIL",
        receivedAt: "2026-02-10T16:00:00Z",
        observedVolumeL: 600,
        observedTempC: 15,
        pickupCodes: ["PU-1"],
      }),
    );
    titrationId = value(
      await recordTitration(t.db, plant.production, {
        lotCode: "L-1",
        testedAt: "2026-02-11T07:30:00Z",
        sampleMassG: 7.05,
        titrant: "NAOH",
        concentrationMolL: 0.25,
        titreMl: 2,
        basis: "OLEIC",
      }),
    ).id;
    value(await decideLot(t.db, plant.production, { lotCode: "L-1", status: "ACCEPTED" }));
    value(
      await transferToTank(t.db, plant.production, {
        fromKind: "LOT",
        fromCode: "L-1",
        toTankCode: "T1",
        at: "2026-02-11T08:00:00Z",
        massKg: 100,
      }),
    );
    transferId = (await t.db.movement.findFirstOrThrow({ where: { role: "TRANSFER" }, orderBy: { id: "desc" } })).id;
  });
  afterAll(async () => {
    await t.drop();
  });

  it("reverses a mistaken transfer with a linked opposite movement, restoring both stocks", async () => {
    const lotBefore = await stock("LOT", "L-1");
    const tankBefore = await stock("TANK", "T1");
    expect(issue(await reverseMovement(t.db, plant.production, { movementId: transferId, reason: "" }))).toEqual({
      code: "INPUT.INVALID",
      field: "reason",
    });
    const r = value(
      await reverseMovement(t.db, plant.production, { movementId: transferId, reason: "Booked into the wrong tank" }),
    );
    expect(await stock("LOT", "L-1")).toBe(lotBefore + 100_000);
    expect(await stock("TANK", "T1")).toBe(tankBefore - 100_000);
    const reversal = await t.db.movement.findUniqueOrThrow({ where: { id: r.reversalId } });
    expect(reversal).toMatchObject({ reversesId: transferId, fromHolderId: expect.any(Number), massG: 100_000 });
    // The original stays; genealogy leaves the pair out.
    expect(await t.db.movement.count({ where: { id: transferId } })).toBe(1);
    expect((await loadTraceLedger(t.db, plant.siteId)).reversedPairsLeftOut).toBe(2);
    const history = await listRecordHistory(t.db, plant.siteId, "Movement", String(transferId));
    expect(history.at(-1)).toMatchObject({ action: "VOID", reason: "Booked into the wrong tank" });
  });

  it("refuses a second reversal, reversing a reversal, and reversing a receipt, naming the movement", async () => {
    expect(issue(await reverseMovement(t.db, plant.production, { movementId: transferId, reason: "again" }))).toEqual({
      code: "CORRECTION.ALREADY_REVERSED",
      field: "movementId",
    });
    const reversal = await t.db.movement.findFirstOrThrow({ where: { reversesId: transferId } });
    expect(
      issue(await reverseMovement(t.db, plant.production, { movementId: reversal.id, reason: "undo the undo" })),
    ).toEqual({ code: "CORRECTION.IS_REVERSAL", field: "movementId" });
    const receiving = await t.db.movement.findFirstOrThrow({ where: { role: "TRANSFER", toHolder: { kind: "LOT" } } });
    expect(
      issue(await reverseMovement(t.db, plant.production, { movementId: receiving.id, reason: "wrong lot" })),
    ).toEqual({ code: "CORRECTION.NOT_REVERSIBLE", field: "movementId" });
    const receipt = await t.db.movement.findFirstOrThrow({ where: { fromHolderId: null } });
    expect(issue(await reverseMovement(t.db, plant.production, { movementId: receipt.id, reason: "wrong" }))).toEqual({
      code: "CORRECTION.NOT_REVERSIBLE",
      field: "movementId",
    });
    expect(issue(await reverseMovement(t.db, plant.production, { movementId: 987_654, reason: "wrong" }))).toEqual({
      code: "RECORD.NOT_FOUND",
      field: "movementId",
    });
  });

  it("refuses to reverse a transfer whose material has moved on", async () => {
    value(
      await transferToTank(t.db, plant.production, {
        fromKind: "LOT",
        fromCode: "L-1",
        toTankCode: "T1",
        at: "2026-02-12T08:00:00Z",
        massKg: 50,
      }),
    );
    const second = (
      await t.db.movement.findFirstOrThrow({ where: { role: "TRANSFER", reversesId: null }, orderBy: { id: "desc" } })
    ).id;
    const held = await stock("TANK", "T1");
    // Empty the tank into another so T1 no longer holds the 50 kg.
    value(
      await createTank(t.db, plant.production, {
        code: "T2",
        name: "Second feed",
        service: "FEEDSTOCK",
        capacityL: 50_000,
      }),
    );
    value(
      await transferToTank(t.db, plant.production, {
        fromKind: "TANK",
        fromCode: "T1",
        toTankCode: "T2",
        at: "2026-02-13T08:00:00Z",
        massKg: held / 1000,
      }),
    );
    const before = await t.db.movement.count();
    // The reversal is dated at the original transfer, so the check is "short at a later booking".
    expect(
      issue(await reverseMovement(t.db, plant.production, { movementId: second, reason: "wrong tank" })).code,
    ).toBe("LEDGER.OVERDRAW_IN_TIME");
    expect(await t.db.movement.count()).toBe(before);
  });

  it("takes back a charge of a reacting batch; refuses once the batch is finished, and never reverses an output", async () => {
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
      await planBatch(t.db, plant.production, {
        code: "B-1",
        plannedAt: "2026-02-14T07:00:00Z",
        targetOilKg: 30,
        catalyst: "KOH",
      }),
    );
    const oilBefore = await stock("TANK", "T2");
    value(
      await startBatch(t.db, plant.production, {
        batchCode: "B-1",
        startedAt: "2026-02-14T08:00:00Z",
        charges: [
          { fromKind: "TANK", fromCode: "T2", role: "OIL", massKg: 30 },
          { fromKind: "REAGENT_LOT", fromCode: "MEOH-1", role: "METHANOL", massKg: 40 },
        ],
      }),
    );
    // 40 kg of methanol was typed where 22 kg went in: take the charge back and book it again.
    const wrong = await t.db.movement.findFirstOrThrow({
      where: { role: "METHANOL", toHolder: { kind: "BATCH", code: "B-1" } },
    });
    const back = value(
      await reverseMovement(t.db, plant.production, {
        movementId: wrong.id,
        reason: "Typed 40 kg; the meter read 22 kg",
      }),
    );
    expect(await stock("BATCH", "B-1")).toBe(30_000);
    expect(await stock("REAGENT_LOT", "MEOH-1")).toBe(500_000);
    expect(await t.db.movement.findUniqueOrThrow({ where: { id: back.reversalId } })).toMatchObject({
      role: "METHANOL",
      reversesId: wrong.id,
      massG: 40_000,
    });
    const detail = await getBatchDetail(t.db, plant.siteId, "B-1");
    expect(detail?.charges.map((m) => m.role)).toEqual(["OIL"]);
    expect(detail?.takenBack.map((m) => m.id)).toEqual([wrong.id]);
    expect(detail?.outputs).toEqual([]);
    // Genealogy and balances leave the pair out: the batch is made of the oil only.
    expect(
      (await loadTraceLedger(t.db, plant.siteId)).moves.some((m) => m.id === wrong.id || m.id === back.reversalId),
    ).toBe(false);
    expect(
      (await loadBalanceLedger(t.db, plant.siteId)).moves.some((m) => m.id === wrong.id || m.id === back.reversalId),
    ).toBe(false);
    const history = await listRecordHistory(t.db, plant.siteId, "Movement", String(wrong.id));
    expect(history.at(-1)).toMatchObject({ action: "VOID", reason: "Typed 40 kg; the meter read 22 kg" });
    // Finish the batch (30 kg oil in): its charges and outputs are then not reversed here.
    value(
      await completeBatch(t.db, plant.production, {
        batchCode: "B-1",
        completedAt: "2026-02-14T12:00:00Z",
        outputs: [
          { role: "ESTER", toKind: "PRODUCT_LOT", toCode: "P-1", massKg: 29 },
          { role: "LOSS", massKg: 1, reason: "spilled at the decanter" },
        ],
      }),
    );
    const oil = await t.db.movement.findFirstOrThrow({
      where: { role: "OIL", toHolder: { kind: "BATCH", code: "B-1" } },
    });
    expect(issue(await reverseMovement(t.db, plant.production, { movementId: oil.id, reason: "wrong tank" }))).toEqual({
      code: "CORRECTION.BATCH_NOT_RUNNING",
      field: "movementId",
    });
    const ester = await t.db.movement.findFirstOrThrow({ where: { role: "ESTER" } });
    expect(issue(await reverseMovement(t.db, plant.production, { movementId: ester.id, reason: "wrong lot" }))).toEqual(
      { code: "CORRECTION.NOT_REVERSIBLE", field: "movementId" },
    );
    expect(await stock("TANK", "T2")).toBe(oilBefore - 30_000);
  });

  it("voids a titration: kept on record, no longer counted, reason in the history; not twice", async () => {
    value(
      await voidLabResult(t.db, plant.production, {
        kind: "TITRATION",
        resultId: titrationId,
        reason: "Wrong titrant strength entered",
      }),
    );
    const row = await t.db.titration.findUniqueOrThrow({ where: { id: titrationId } });
    expect(row.voided).toBe(true);
    expect(
      issue(await voidLabResult(t.db, plant.production, { kind: "TITRATION", resultId: titrationId, reason: "again" })),
    ).toEqual({ code: "CORRECTION.ALREADY_VOIDED", field: "resultId" });
    const history = await listRecordHistory(t.db, plant.siteId, ["Titration"], "L-1");
    expect(history.at(-1)).toMatchObject({ action: "VOID", reason: "Wrong titrant strength entered" });
    expect(JSON.parse(history.at(-1)?.before ?? "{}")).toMatchObject({ resultId: titrationId, voided: false });
  });
});
