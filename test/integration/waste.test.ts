import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type { TestDb } from "./support/test-db";
import { createTestDb, PROVIDERS } from "./support/test-db";
import type { TestPlant } from "./support/plant";
import { acceptedLot, createTestPlant } from "./support/plant";
import { transferToTank } from "@/lib/tank/tank.service";
import { completeBatch, planBatch, receiveReagent, startBatch } from "@/lib/batch/batch.service";
import {
  markContainerFull,
  openWasteContainer,
  recordCharacterisation,
  recordDisposal,
} from "@/lib/waste/container.service";
import { getWasteContainerDetail } from "@/lib/waste/container.store";
import { closePeriod, openPeriod } from "@/lib/period/period.service";
import { listRecordHistory } from "@/lib/audit/audit.store";
import { statusFor } from "@/lib/http";
import { buildOpenApi } from "@/lib/api/openapi";
import { ENDPOINTS } from "@/lib/api/endpoints";
import { getWasteDueReport } from "@/app/waste/due/due-report";
import { chooseWasteRules } from "@/lib/waste/site-rules.service";
import type { Result } from "@/lib/core/result";

function value<T>(r: Result<T>): T {
  if (!r.ok) throw new Error(`expected success, got ${JSON.stringify(r.issues)}`);
  return r.value;
}
function refusal<T>(r: Result<T>): { code: string; field?: string; message: string; status: number } {
  if (r.ok) throw new Error("expected a refusal");
  const i = r.issues[0];
  if (!i) throw new Error("no issue");
  return {
    code: i.code,
    message: i.message,
    status: statusFor(r.issues),
    ...(i.field === undefined ? {} : { field: i.field }),
  };
}

describe.each(PROVIDERS)("waste containers on %s", (provider) => {
  let t: TestDb;
  let plant: TestPlant;
  const now = new Date("2026-03-01T12:00:00Z");
  const site = () => ({ id: plant.siteId, timeZone: "UTC" });
  const dueRow = async (code: string) => {
    const r = value(await getWasteDueReport(t.db, site(), {}, now));
    return r.containers.find((c) => c.code === code);
  };
  const counts = async () => ({
    disposals: await t.db.disposal.count(),
    holders: await t.db.holder.count(),
    movements: await t.db.movement.count(),
    audit: await t.db.auditEvent.count(),
  });

  beforeAll(async () => {
    t = await createTestDb(provider);
    plant = await createTestPlant(t.db);
    await acceptedLot(t.db, plant, { lot: "L-1", pickup: "PU-1", day: 2 });
    value(
      await transferToTank(t.db, plant.production, {
        fromKind: "LOT",
        fromCode: "L-1",
        toTankCode: "T1",
        at: "2026-02-03T08:00:00Z",
        massKg: 100,
      }),
    );
    value(
      await receiveReagent(t.db, plant.production, {
        code: "MEOH-1",
        reagent: "METHANOL",
        supplier: "S",
        strengthPct: 99.9,
        receivedAt: "2026-02-01T08:00:00Z",
        massKg: 100,
      }),
    );
    value(
      await openWasteContainer(t.db, plant.compliance, {
        code: "gly-1",
        stream: "GLYCEROL_PHASE",
        location: "Glycerol pad",
        accumulationStart: "2026-02-10T06:00:00Z",
        capacityL: 1000,
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
    value(
      await startBatch(t.db, plant.production, {
        batchCode: "B-1",
        startedAt: "2026-02-14T08:00:00Z",
        charges: [
          { fromKind: "TANK", fromCode: "T1", role: "OIL", massKg: 30 },
          { fromKind: "REAGENT_LOT", fromCode: "MEOH-1", role: "METHANOL", massKg: 8 },
        ],
      }),
    );
    value(
      await completeBatch(t.db, plant.production, {
        batchCode: "B-1",
        completedAt: "2026-02-14T12:00:00Z",
        outputs: [
          { role: "ESTER", toKind: "PRODUCT_LOT", toCode: "P-1", massKg: 29 },
          { role: "GLYCEROL_PHASE", toKind: "WASTE_CONTAINER", toCode: "GLY-1", massKg: 8 },
          { role: "LOSS", massKg: 1, reason: "spilled at the decanter" },
        ],
      }),
    );
  });
  afterAll(async () => {
    await t.drop();
  });

  it("the site's chosen rule set moves a due date, and the federal set moves it back (40 CFR 262.17(a): 90 days)", async () => {
    value(
      await openWasteContainer(t.db, plant.compliance, {
        code: "OWN-1",
        stream: "METHANOL_RICH",
        accumulationStart: "2026-02-20T06:00:00Z",
        capacityL: 200,
      }),
    );
    expect((await dueRow("OWN-1"))?.due?.limitDays).toBe(90);
    value(
      await chooseWasteRules(t.db, plant.compliance, {
        choice: "SITE_OWN",
        generatorCategory: "LQG",
        name: "Own set",
        hazardousMaxDays: 30,
        reason: "permit condition",
      }),
    );
    const own = await dueRow("OWN-1");
    expect(own?.due).toMatchObject({ limitDays: 30, dueDate: "2026-03-22" });
    expect(
      refusal(
        await chooseWasteRules(t.db, plant.compliance, {
          choice: "SITE_OWN",
          generatorCategory: "LQG",
          name: "",
          hazardousMaxDays: 30,
          reason: "r",
        }),
      ).field,
    ).toBe("name");
    value(
      await chooseWasteRules(t.db, plant.compliance, {
        choice: "US_FEDERAL",
        generatorCategory: "LQG",
        reason: "back to federal",
      }),
    );
    expect((await dueRow("OWN-1"))?.due?.limitDays).toBe(90);
  });

  it("opens a container with its location and shows the batch output it received", async () => {
    const c = await getWasteContainerDetail(t.db, plant.siteId, "GLY-1");
    expect(c).toMatchObject({
      code: "GLY-1",
      location: "Glycerol pad",
      status: "OPEN",
      stockG: 8000,
      characterisedAt: null,
    });
    expect(c?.movements).toEqual([
      expect.objectContaining({
        direction: "IN",
        role: "GLYCEROL_PHASE",
        massG: 8000,
        otherKind: "BATCH",
        otherCode: "B-1",
      }),
    ]);
    expect(
      refusal(
        await openWasteContainer(t.db, plant.compliance, {
          code: "GLY-1",
          stream: "GLYCEROL_PHASE",
          accumulationStart: "2026-02-10T06:00:00Z",
          capacityL: 1000,
        }),
      ),
    ).toMatchObject({ code: "RECORD.DUPLICATE", status: 409 });
  });

  it("a characterisation changes the hazard assessment and the due basis at once, and is audited", async () => {
    expect((await dueRow("GLY-1"))?.hazard.overall).toBe("NEEDS_CHARACTERISATION");
    expect(
      refusal(
        await recordCharacterisation(t.db, plant.production, {
          containerCode: "GLY-1",
          testedAt: "2026-02-15T09:00:00Z",
        }),
      ),
    ).toMatchObject({ field: "methanolPct" });
    // 40 CFR 261.21(a)(1): a liquid with a closed-cup flash point below 60 °C is ignitable (D001)
    value(
      await recordCharacterisation(t.db, plant.production, {
        containerCode: "GLY-1",
        testedAt: "2026-02-15T09:00:00Z",
        methanolPct: 12,
        pH: 10.2,
        flashPointC: 41,
        waterPct: 6,
      }),
    );
    const hazardous = await dueRow("GLY-1");
    expect(hazardous?.hazard.overall).toBe("HAZARDOUS");
    expect(hazardous?.hazard.ignitable.status).toBe("YES");
    // 40 CFR 262.17(a): 90 days for a large quantity generator (the site's assumed category)
    expect(hazardous?.due).toMatchObject({ basis: "LQG_ACCUMULATION", limitDays: 90, dueDate: "2026-05-11" });
    // 40 CFR 261.21(a)(1): 60 °C or above is not ignitable; 40 CFR 261.22(a)(1): pH between 2 and 12.5 is not corrosive
    value(
      await recordCharacterisation(t.db, plant.production, {
        containerCode: "GLY-1",
        testedAt: "2026-02-16T09:00:00Z",
        pH: 8,
        flashPointC: 95,
      }),
    );
    const clean = await dueRow("GLY-1");
    expect(clean?.hazard.overall).toBe("NON_HAZARDOUS");
    expect(clean?.due?.basis).toBe("NON_HAZARDOUS_SITE_RULE");
    const stored = await getWasteContainerDetail(t.db, plant.siteId, "GLY-1");
    expect(stored).toMatchObject({
      methanolPct: null,
      pH: 8,
      flashPointC: 95,
      waterPct: null,
      characterisedAt: new Date("2026-02-16T09:00:00Z"),
    });
    const history = await listRecordHistory(t.db, plant.siteId, "WasteContainer", "GLY-1");
    expect(history.filter((h) => h.action === "CHANGE")).toHaveLength(2);
    // Put the hazardous result back for the rest of the story.
    value(
      await recordCharacterisation(t.db, plant.production, {
        containerCode: "GLY-1",
        testedAt: "2026-02-16T10:00:00Z",
        methanolPct: 12,
        pH: 10.2,
        flashPointC: 41,
        waterPct: 6,
      }),
    );
  });

  it("refuses a haul of more than the container holds, naming what it holds, and writes nothing", async () => {
    const before = await counts();
    const r = refusal(
      await recordDisposal(t.db, plant.compliance, {
        containerCode: "GLY-1",
        documentNo: "MAN-1",
        hauler: "Test Hauler",
        disposedAt: "2026-02-20T10:00:00Z",
        massKg: 9,
        destination: "Test Recovery",
      }),
    );
    expect(r).toMatchObject({ code: "LEDGER.OVERDRAW", field: "massKg", status: 409 });
    expect(r.message).toContain("holds 8 kg");
    expect(await counts()).toEqual(before);
    expect((await getWasteContainerDetail(t.db, plant.siteId, "GLY-1"))?.stockG).toBe(8000);
  });

  it("refuses a haul before the accumulation start, in a closed period, or under a manifest already used", async () => {
    expect(
      refusal(
        await recordDisposal(t.db, plant.compliance, {
          containerCode: "GLY-1",
          documentNo: "MAN-0",
          hauler: "H",
          disposedAt: "2026-02-09T10:00:00Z",
          massKg: 1,
          destination: "D",
        }),
      ),
    ).toMatchObject({ code: "WASTE.BEFORE_START", field: "disposedAt", status: 422 });
    const period = value(
      await openPeriod(t.db, plant.compliance, { startsAt: "2026-02-17T00:00:00Z", endsAt: "2026-02-19T00:00:00Z" }),
    );
    value(await closePeriod(t.db, plant.compliance, { periodId: period.id }));
    expect(
      refusal(
        await recordDisposal(t.db, plant.compliance, {
          containerCode: "GLY-1",
          documentNo: "MAN-0",
          hauler: "H",
          disposedAt: "2026-02-18T10:00:00Z",
          massKg: 1,
          destination: "D",
        }),
      ),
    ).toMatchObject({ code: "PERIOD.CLOSED", status: 409 });
    value(
      await recordDisposal(t.db, plant.compliance, {
        containerCode: "GLY-1",
        documentNo: "man-1",
        hauler: "Test Hauler",
        disposedAt: "2026-02-20T10:00:00Z",
        massKg: 5,
        destination: "Test Recovery",
      }),
    );
    const dup = refusal(
      await recordDisposal(t.db, plant.compliance, {
        containerCode: "GLY-1",
        documentNo: "MAN-1",
        hauler: "H",
        disposedAt: "2026-02-21T10:00:00Z",
        massKg: 1,
        destination: "D",
      }),
    );
    expect(dup).toMatchObject({ code: "RECORD.DUPLICATE", field: "documentNo", status: 409 });
    expect((await getWasteContainerDetail(t.db, plant.siteId, "GLY-1"))?.status).toBe("OPEN");
  });

  it("marks a container full once, dated on or after its start", async () => {
    expect(
      refusal(
        await markContainerFull(t.db, plant.production, { containerCode: "GLY-1", fullAt: "2026-02-01T10:00:00Z" }),
      ),
    ).toMatchObject({ code: "WASTE.BEFORE_START", field: "fullAt" });
    value(await markContainerFull(t.db, plant.production, { containerCode: "GLY-1", fullAt: "2026-02-21T10:00:00Z" }));
    expect(
      refusal(
        await markContainerFull(t.db, plant.compliance, { containerCode: "GLY-1", fullAt: "2026-02-22T10:00:00Z" }),
      ),
    ).toMatchObject({ code: "WASTE.ALREADY_FULL", status: 409 });
    const c = await getWasteContainerDetail(t.db, plant.siteId, "GLY-1");
    expect(c).toMatchObject({ status: "FULL", fullAt: new Date("2026-02-21T10:00:00Z") });
    expect((await dueRow("GLY-1"))?.status).toBe("FULL");
  });

  it("a haul that empties the container marks it hauled away; it leaves the due list and takes nothing more", async () => {
    value(
      await recordDisposal(t.db, plant.compliance, {
        containerCode: "GLY-1",
        documentNo: "MAN-2",
        hauler: "Test Hauler",
        disposedAt: "2026-02-25T10:00:00Z",
        massKg: 3,
        destination: "Test Recovery",
      }),
    );
    const c = await getWasteContainerDetail(t.db, plant.siteId, "GLY-1");
    expect(c).toMatchObject({ status: "SHIPPED", stockG: 0 });
    expect(c?.disposals.map((d) => [d.documentNo, d.massG, d.destination])).toEqual([
      ["MAN-1", 5000, "Test Recovery"],
      ["MAN-2", 3000, "Test Recovery"],
    ]);
    expect(await t.db.disposal.findFirstOrThrow({ where: { documentNo: "MAN-2" } })).toMatchObject({
      containerCode: "GLY-1",
      destination: "Test Recovery",
    });
    expect(await dueRow("GLY-1")).toBeUndefined();
    expect(
      refusal(
        await recordDisposal(t.db, plant.compliance, {
          containerCode: "GLY-1",
          documentNo: "MAN-3",
          hauler: "H",
          disposedAt: "2026-02-26T10:00:00Z",
          massKg: 1,
          destination: "D",
        }),
      ),
    ).toMatchObject({ code: "WASTE.ALREADY_HAULED", status: 409 });
    expect(
      refusal(
        await markContainerFull(t.db, plant.compliance, { containerCode: "GLY-1", fullAt: "2026-02-26T10:00:00Z" }),
      ),
    ).toMatchObject({ code: "WASTE.ALREADY_HAULED", status: 409 });
    expect(
      refusal(
        await recordCharacterisation(t.db, plant.compliance, {
          containerCode: "GLY-1",
          testedAt: "2026-02-26T10:00:00Z",
          pH: 7,
        }),
      ),
    ).toMatchObject({ code: "WASTE.ALREADY_HAULED", status: 409 });
    // Book stock equals the ledger: in 8 kg, out 5 + 3 kg.
    const moves = c?.movements.map((m) => (m.direction === "IN" ? m.massG : -m.massG)) ?? [];
    expect(moves.reduce((s, g) => s + g, 0)).toBe(0);
  });

  it("documents the four endpoints in the OpenAPI document", () => {
    const doc = buildOpenApi(ENDPOINTS, { title: "t", version: "v", description: "d" }) as {
      paths: Record<string, unknown>;
    };
    for (const p of ["/api/waste/containers", "/api/waste/characterisation", "/api/waste/full", "/api/waste/disposals"])
      expect(doc.paths[p]).toBeDefined();
  });
});
