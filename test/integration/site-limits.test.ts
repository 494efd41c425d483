import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type { TestDb } from "./support/test-db";
import { createTestDb, PROVIDERS } from "./support/test-db";
import type { TestPlant } from "./support/plant";
import { acceptedLot, createTestPlant } from "./support/plant";
import type { Result } from "@/lib/core/result";
import { transferToTank } from "@/lib/tank/tank.service";
import { completeBatch, planBatch, receiveReagent, startBatch } from "@/lib/batch/batch.service";
import { recordLabTest } from "@/lib/feedstock/lot.service";
import { proposeBatchPlan } from "@/lib/batch/plan.service";
import { getBalanceReport } from "@/lib/mass-balance/balance.service";
import { listRecordHistory } from "@/lib/audit/audit.store";
import {
  getSiteLimitHistory,
  getSiteLimits,
  setClosureTolerance,
  setWaterLimits,
} from "@/lib/mass-balance/site-limits.service";

function value<T>(r: Result<T>): T {
  if (!r.ok) throw new Error(`expected success, got ${JSON.stringify(r.issues)}`);
  return r.value;
}
function issue<T>(r: Result<T>): { code: string; field?: string; message: string } {
  if (r.ok) throw new Error("expected a refusal");
  const i = r.issues[0]!;
  return { code: i.code, message: i.message, ...(i.field === undefined ? {} : { field: i.field }) };
}

// The site's own limits are what the books are checked against: a changed closure tolerance changes the
// flag on a batch and on the month, and a changed water limit changes what the planner accepts. Each
// check below would fail if the built-in defaults were still read.
describe.each(PROVIDERS)("site limits on %s", (provider) => {
  let t: TestDb;
  let plant: TestPlant;
  const site = () => ({ id: plant.siteId, timeZone: "UTC" });
  const FEB = { period: "MONTH", year: "2026", month: "2" };
  const NOW = new Date("2026-03-01T12:00:00Z");

  const runBatch = async (code: string, day: string, esterKg: number) => {
    value(
      await planBatch(t.db, plant.production, {
        code,
        plannedAt: `2026-02-${day}T07:00:00Z`,
        targetOilKg: 100,
        catalyst: "KOH",
      }),
    );
    value(
      await startBatch(t.db, plant.production, {
        batchCode: code,
        startedAt: `2026-02-${day}T08:00:00Z`,
        charges: [
          { fromKind: "TANK", fromCode: "T1", role: "OIL", massKg: 100 },
          { fromKind: "REAGENT_LOT", fromCode: "MEOH-1", role: "METHANOL", massKg: 20 },
        ],
      }),
    );
    return value(
      await completeBatch(t.db, plant.production, {
        batchCode: code,
        completedAt: `2026-02-${day}T12:00:00Z`,
        outputs: [
          { role: "ESTER", toKind: "PRODUCT_LOT", toCode: `P-${code}`, massKg: esterKg },
          { role: "RECOVERED_METHANOL", toKind: "TANK", toCode: "M1", massKg: 19.545 },
        ],
      }),
    );
  };

  beforeAll(async () => {
    t = await createTestDb(provider);
    plant = await createTestPlant(t.db);
    await acceptedLot(t.db, plant, { lot: "L-1", pickup: "PU-1", day: 10, volumeL: 400 });
    value(
      await recordLabTest(t.db, plant.production, {
        lotCode: "L-1",
        testedAt: "2026-02-10T18:00:00Z",
        kind: "WATER",
        method: "Karl Fischer",
        valuePct: 0.05,
      }),
    );
    value(
      await transferToTank(t.db, plant.production, {
        fromKind: "LOT",
        fromCode: "L-1",
        toTankCode: "T1",
        at: "2026-02-11T08:00:00Z",
        massKg: 250,
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
  });
  afterAll(async () => {
    await t.drop();
  });

  it("flags a batch and the month against the site's tolerance, not the built-in one", async () => {
    // 120 kg charged; 99.45 kg ester + 19.545 kg methanol measured out → 1.005 kg unmeasured = 0.8375 %.
    const first = await runBatch("B-1", "14", 99.45);
    expect(first.unmeasuredG).toBe(1005);
    expect(first.closure.flag).toBe("WARN"); // default: warn above 0.5 %, fail above 2 % (common practice)
    const before = value(await getBalanceReport(t.db, site(), FEB, NOW));
    expect(before.process.completed.find((b) => b.unmeasuredG === 1005)?.closure.flag).toBe("WARN");

    value(
      await setClosureTolerance(t.db, plant.compliance, {
        warnPct: 0.2,
        failPct: 0.5,
        reason: "auditor asked for a tighter closure on batches",
      }),
    );
    const after = value(await getBalanceReport(t.db, site(), FEB, NOW));
    expect(after.tolerance).toMatchObject({ warnPct: 0.2, failPct: 0.5 });
    expect(after.process.completed.find((b) => b.unmeasuredG === 1005)?.closure.flag).toBe("FAIL");
    const second = await runBatch("B-2", "15", 99.7);
    expect(second.unmeasuredG).toBe(755);
    expect(second.closure.flag).toBe("FAIL");

    const limits = await getSiteLimits(t.db, plant.siteId);
    expect(limits.closureChange).toMatchObject({ by: "q", reason: "auditor asked for a tighter closure on batches" });
    const audit = await listRecordHistory(t.db, plant.siteId, "SiteLimits", "closure tolerance");
    expect(audit.at(-1)).toMatchObject({ action: "CHANGE", reason: "auditor asked for a tighter closure on batches" });
  });

  it("refuses a bad tolerance naming the field, and keeps the one in force", async () => {
    expect(
      issue(await setClosureTolerance(t.db, plant.compliance, { warnPct: 1, failPct: 0.5, reason: "swap them round" })),
    ).toMatchObject({
      field: "warnPct",
      message: "Warn above must be below the fail level",
    });
    expect(
      issue(await setClosureTolerance(t.db, plant.compliance, { warnPct: 0.3, failPct: 1, reason: "" })),
    ).toMatchObject({
      field: "reason",
    });
    expect(
      issue(
        await setWaterLimits(t.db, plant.compliance, { baseStepPct: 9, acidStepPct: 0.5, reason: "too wet to matter" }),
      ),
    ).toMatchObject({
      field: "baseStepPct",
    });
    expect((await getSiteLimits(t.db, plant.siteId)).closure.warnPct).toBe(0.2);
  });

  it("plans against the site's water limit for the base-catalysed step", async () => {
    const ask = { targetOilKg: 100, maxFfaPct: 2.5, catalyst: "KOH" }; // below 3 % FFA the blend goes to the base step
    const fits = value(await proposeBatchPlan(t.db, plant.production, ask));
    expect(fits.outcome.ok).toBe(true); // 0.05 % water is within the default 0.06 %
    if (fits.outcome.ok) expect(fits.outcome.card.blend.maxWaterPct).toBe(0.06);

    value(
      await setWaterLimits(t.db, plant.compliance, {
        baseStepPct: 0.04,
        acidStepPct: 0.4,
        reason: "our catalyst supplier advises drier oil",
      }),
    );
    const refused = value(await proposeBatchPlan(t.db, plant.production, ask));
    expect(refused.outcome.ok).toBe(false);
    if (!refused.outcome.ok) expect(refused.outcome.stage).toBe("BLEND");
    const history = await getSiteLimitHistory(t.db, plant.siteId);
    expect(history.map((h) => h.key)).toEqual(["WATER_LIMITS", "CLOSURE_TOLERANCE"]);
    expect(history[0]?.water).toMatchObject({ baseStepPct: 0.04, acidStepPct: 0.4 });
  });
});
