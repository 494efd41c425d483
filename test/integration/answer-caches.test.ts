// The waste-due list and the recall answer kept by ledger position (app/waste/due/due-report-cache.ts,
// lib/trace/recall-cache.service.ts): the same question at the same position is answered from memory
// with the same answer; a booking, or an audited change that moves no material, makes the next ask
// compute again and the new answer shows the change; another site's booking changes nothing here.
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type { TestDb } from "./support/test-db";
import { createTestDb, PROVIDERS } from "./support/test-db";
import type { TestPlant } from "./support/plant";
import { acceptedLot, createTestPlant } from "./support/plant";
import { transferToTank } from "@/lib/tank/tank.service";
import { openWasteContainer } from "@/lib/waste/container.service";
import { closePeriod, openPeriod } from "@/lib/period/period.service";
import { insertSite, insertUser } from "@/lib/site/site.store";
import { clearWasteDueCache, getWasteDueReportTraced } from "@/app/waste/due/due-report-cache";
import { getWasteDueReport } from "@/app/waste/due/due-report";
import { clearRecallCache, recallReportTraced } from "@/lib/trace/recall-cache.service";
import { recallReport } from "@/lib/trace/recall.service";
import type { Result } from "@/lib/core/result";

function value<T>(r: Result<T>): T {
  if (!r.ok) throw new Error(`expected success, got ${JSON.stringify(r.issues)}`);
  return r.value;
}

describe.each(PROVIDERS)("waste-due and recall answers kept by ledger position on %s", (provider) => {
  let t: TestDb;
  let plant: TestPlant;
  const now = new Date("2026-03-01T12:00:00Z");
  const site = () => ({ id: plant.siteId, timeZone: "UTC" });
  const recall = { kind: "LOT", code: "L-1" };
  const opts = { withCustomers: true };

  beforeAll(async () => {
    clearWasteDueCache();
    clearRecallCache();
    t = await createTestDb(provider);
    plant = await createTestPlant(t.db);
    await acceptedLot(t.db, plant, { lot: "L-1", pickup: "PU-1", day: 2 });
    value(
      await openWasteContainer(t.db, plant.compliance, {
        code: "GLY-1",
        stream: "GLYCEROL_PHASE",
        accumulationStart: "2026-02-10T06:00:00Z",
        capacityL: 1000,
      }),
    );
  }, 120_000);
  afterAll(async () => {
    clearWasteDueCache();
    clearRecallCache();
    await t.drop();
  });

  it("answers the same question at the same position from memory, equal to a fresh computation", async () => {
    const first = await recallReportTraced(t.db, plant.siteId, recall, now, opts);
    const again = await recallReportTraced(t.db, plant.siteId, recall, now, opts);
    expect([first.outcome, again.outcome]).toEqual(["computed", "same-position"]);
    expect(value(again.result)).toEqual(value(await recallReport(t.db, plant.siteId, recall, now, opts)));
    const due = await getWasteDueReportTraced(t.db, site(), {}, now);
    const dueAgain = await getWasteDueReportTraced(t.db, site(), {}, now);
    expect([due.outcome, dueAgain.outcome]).toEqual(["computed", "same-position"]);
    expect(value(dueAgain.result)).toEqual(value(await getWasteDueReport(t.db, site(), {}, now)));
    // Another reader's question (no customers) is another answer.
    expect((await recallReportTraced(t.db, plant.siteId, recall, now, { withCustomers: false })).outcome).toBe(
      "computed",
    );
  });

  it("a booking makes both compute again, and the new answers show it", async () => {
    const before = value((await recallReportTraced(t.db, plant.siteId, recall, now, opts)).result);
    expect(before.holders.some((h) => h.holder.code === "T1")).toBe(false);
    value(
      await transferToTank(t.db, plant.production, {
        fromKind: "LOT",
        fromCode: "L-1",
        toTankCode: "T1",
        at: "2026-02-03T08:00:00Z",
        massKg: 100,
      }),
    );
    const after = await recallReportTraced(t.db, plant.siteId, recall, now, opts);
    expect(after.outcome).toBe("computed");
    const t1 = value(after.result).holders.find((h) => h.holder.code === "T1");
    expect(t1?.heldG).toBe(100_000);
    value(
      await openWasteContainer(t.db, plant.compliance, {
        code: "MEOH-W1",
        stream: "METHANOL_RICH",
        accumulationStart: "2026-02-20T06:00:00Z",
        capacityL: 200,
      }),
    );
    const due = await getWasteDueReportTraced(t.db, site(), {}, now);
    expect(due.outcome).toBe("computed");
    expect(value(due.result).containers.map((c) => c.code)).toContain("MEOH-W1");
  });

  it("an audited change that moves no material (a period closed) also recomputes; another site's booking does not", async () => {
    await recallReportTraced(t.db, plant.siteId, recall, now, opts);
    await getWasteDueReportTraced(t.db, site(), {}, now);
    const other = await insertSite(t.db, { code: "OTH", name: "Other Works", town: "Otherford", timeZone: "UTC" });
    const otherUser = await insertUser(t.db, { siteId: other.id, login: "oth", fullName: "Oth", role: "ADMIN" });
    const holder = await t.db.holder.create({ data: { siteId: other.id, kind: "LOT", code: "L-1" } });
    await t.db.movement.create({
      data: {
        siteId: other.id,
        at: now,
        role: "RECEIPT",
        toHolderId: holder.id,
        massG: 5_000,
        recordedById: otherUser.id,
      },
    });
    expect((await recallReportTraced(t.db, plant.siteId, recall, now, opts)).outcome).toBe("same-position");
    expect((await getWasteDueReportTraced(t.db, site(), {}, now)).outcome).toBe("same-position");
    const period = value(
      await openPeriod(t.db, plant.compliance, { startsAt: "2026-01-01T00:00:00Z", endsAt: "2026-02-01T00:00:00Z" }),
    );
    value(await closePeriod(t.db, plant.compliance, { periodId: period.id }));
    expect((await recallReportTraced(t.db, plant.siteId, recall, now, opts)).outcome).toBe("computed");
    expect((await getWasteDueReportTraced(t.db, site(), {}, now)).outcome).toBe("computed");
  });
});
