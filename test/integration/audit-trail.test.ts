import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type { TestDb } from "./support/test-db";
import { createTestDb, PROVIDERS } from "./support/test-db";
import type { TestPlant } from "./support/plant";
import { createTestPlant } from "./support/plant";
import { recordPickup } from "@/lib/feedstock/pickup.service";
import { decideLot, receiveLotFromPickups } from "@/lib/feedstock/lot.service";
import { recordTitration } from "@/lib/feedstock/titration.service";
import { transferToTank } from "@/lib/tank/tank.service";
import { listRecordHistory, loadChain } from "@/lib/audit/audit.store";
import { verifyChain } from "@/lib/audit/chain";

describe.each(PROVIDERS)("audit trail on %s", (provider) => {
  let t: TestDb;
  let plant: TestPlant;
  beforeAll(async () => {
    t = await createTestDb(provider);
    plant = await createTestPlant(t.db);
  });
  afterAll(async () => {
    await t.drop();
  });

  const events = () => t.db.auditEvent.count();

  it("writes exactly one event per accepted change, with who, server time, old and new values", async () => {
    const start = await events();
    const now = new Date("2026-03-02T10:00:00Z");
    const p = await recordPickup(
      t.db,
      { ...plant.collector, now },
      {
        code: "PU-A",
        sourceCode: "R1",
        material: "USED_COOKING_OIL",
        observedAt: "2026-03-02T09:00:00Z",
        containers: 1,
        volumeL: 100,
        tempC: 15,
      },
    );
    expect(p.ok).toBe(true);
    expect(await events()).toBe(start + 1);
    await receiveLotFromPickups(t.db, plant.production, {
      code: "L-A",
      material: "USED_COOKING_OIL",
      receivedAt: "2026-03-02T16:00:00Z",
      observedVolumeL: 100,
      observedTempC: 15,
      pickupCodes: ["PU-A"],
    });
    await recordTitration(t.db, plant.production, {
      lotCode: "L-A",
      testedAt: "2026-03-03T08:00:00Z",
      sampleMassG: 7.05,
      titrant: "NAOH",
      concentrationMolL: 0.25,
      titreMl: 3,
    });
    await decideLot(t.db, plant.production, { lotCode: "L-A", status: "ACCEPTED" });
    expect(await events()).toBe(start + 4);
    const history = await listRecordHistory(t.db, plant.siteId, "FeedstockLot", "L-A");
    expect(history.map((h) => h.action)).toEqual(["CREATE", "CHANGE"]);
    expect(JSON.parse(history[1]?.before ?? "{}")).toEqual({ status: "QUARANTINED" });
    expect(JSON.parse(history[1]?.after ?? "{}")).toEqual({ status: "ACCEPTED" });
    const pickupEvent = (await listRecordHistory(t.db, plant.siteId, "Pickup", "PU-A"))[0];
    expect(pickupEvent?.actor).toBe("c");
    expect(pickupEvent?.at.toISOString()).toBe(now.toISOString());
  });

  it("writes no event for a refused change", async () => {
    const start = await events();
    const r = await transferToTank(t.db, plant.production, {
      fromKind: "LOT",
      fromCode: "L-A",
      toTankCode: "T1",
      at: "2026-03-03T09:00:00Z",
      massKg: 10_000,
    });
    expect(r.ok).toBe(false);
    expect(await events()).toBe(start);
  });

  it("chains every event so the stored trail verifies", async () => {
    const chain = await loadChain(t.db, plant.siteId);
    expect(chain.length).toBeGreaterThan(4);
    const v = verifyChain(chain);
    expect(v.ok ? v.value.events : v.issues).toBe(chain.length);
  });

  it("refuses UPDATE and DELETE of audit events at the database level", async () => {
    await expect(t.db.$executeRawUnsafe(`UPDATE "AuditEvent" SET "reason" = 'x'`)).rejects.toThrow(/APPEND_ONLY/);
    await expect(t.db.$executeRawUnsafe(`DELETE FROM "AuditEvent"`)).rejects.toThrow(/APPEND_ONLY/);
  });

  it("detects an event altered outside the app (with the trigger removed by someone with database access)", async () => {
    if (provider === "sqlite") {
      await t.db.$executeRawUnsafe(`DROP TRIGGER "AuditEvent_no_update"`);
    } else {
      await t.db.$executeRawUnsafe(`ALTER TABLE "AuditEvent" DISABLE TRIGGER "AuditEvent_no_update_delete"`);
    }
    await t.db.$executeRawUnsafe(`UPDATE "AuditEvent" SET "after" = '{"status":"REJECTED"}' WHERE "seq" = 3`);
    const v = verifyChain(await loadChain(t.db, plant.siteId));
    expect(v.ok ? "verified" : v.issues[0]?.code).toBe("AUDIT.EVENT_ALTERED");
  });
});
