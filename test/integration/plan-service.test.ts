import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type { TestDb } from "./support/test-db";
import { createTestDb, PROVIDERS } from "./support/test-db";
import type { TestPlant } from "./support/plant";
import { createTestPlant } from "./support/plant";
import type { Result } from "@/lib/core/result";
import { decideLot, receiveDelivery, recordLabTest } from "@/lib/feedstock/lot.service";
import { recordTitration } from "@/lib/feedstock/titration.service";
import { transferToTank } from "@/lib/tank/tank.service";
import { completeBatch, receiveReagent, startBatch } from "@/lib/batch/batch.service";
import { getBatchDetail } from "@/lib/batch/batch.store";
import { CARD_FORMAT, computeRecordedYield, readPlannedFigures, suggestCharges } from "@/lib/batch/plan";
import { listReagentStock, loadPlanStock } from "@/lib/batch/plan.store";
import { proposeBatchPlan, recordPlannedBatch } from "@/lib/batch/plan.service";
import { DEFAULT_DENSITY_TABLE } from "@/lib/quantity/density";

function value<T>(r: Result<T>): T {
  if (!r.ok) throw new Error(`expected success, got ${JSON.stringify(r.issues)}`);
  return r.value;
}

const uco = DEFAULT_DENSITY_TABLE.USED_COOKING_OIL;
const rho15 = uco.model === "linear" ? uco.densityAt15KgM3 : Number.NaN;
// 1000 L observed at the reference temperature weighs V × ρ15.
const LOT_G = Math.round(1000 * rho15);

describe.each(PROVIDERS)("batch planning from stock on %s", (provider) => {
  let t: TestDb;
  let plant: TestPlant;

  beforeAll(async () => {
    t = await createTestDb(provider);
    plant = await createTestPlant(t.db);
    const p = plant.production;
    // AOCS Ca 5a-40 titres (AOCS Ca 5a-40, computed): 10 mL × 0.1 N / 28.2 g → 1 %; 5 mL × 0.25 N / 7.05 g → 5 %; 2 mL → 2 %.
    const lots = [
      { code: "D-1", titre: { sampleMassG: 28.2, concentrationMolL: 0.1, titreMl: 10 }, water: 0.1, day: "2026-02-01" },
      { code: "D-2", titre: { sampleMassG: 7.05, concentrationMolL: 0.25, titreMl: 5 }, water: 0.3, day: "2026-02-05" },
      {
        code: "D-3",
        titre: { sampleMassG: 7.05, concentrationMolL: 0.25, titreMl: 2 },
        water: 0.05,
        day: "2026-02-10",
      },
    ];
    for (const l of lots) {
      value(
        await receiveDelivery(t.db, p, {
          code: l.code,
          material: "USED_COOKING_OIL",
          receivedAt: `${l.day}T10:00:00Z`,
          observedVolumeL: 1000,
          observedTempC: 15,
          supplierCode: "R1",
          deliveryDocument: `DN-${l.code}`,
        }),
      );
      value(
        await recordTitration(t.db, p, {
          lotCode: l.code,
          testedAt: `${l.day}T12:00:00Z`,
          titrant: "NAOH",
          ...l.titre,
        }),
      );
      value(
        await recordLabTest(t.db, p, {
          lotCode: l.code,
          testedAt: `${l.day}T12:10:00Z`,
          kind: "WATER",
          method: "Karl Fischer",
          valuePct: l.water,
        }),
      );
      value(await decideLot(t.db, p, { lotCode: l.code, status: "ACCEPTED" }));
    }
    value(
      await transferToTank(t.db, p, {
        fromKind: "LOT",
        fromCode: "D-1",
        toTankCode: "T1",
        at: "2026-02-11T08:00:00Z",
        massKg: LOT_G / 1000,
      }),
    );
    value(
      await transferToTank(t.db, p, {
        fromKind: "LOT",
        fromCode: "D-2",
        toTankCode: "T1",
        at: "2026-02-11T09:00:00Z",
        massKg: LOT_G / 2000,
      }),
    );
    for (const [code, reagent, kg, pct] of [
      ["MEOH-1", "METHANOL", 600, 99.9],
      ["KOH-1", "KOH", 60, 90],
      ["WATER-1", "WATER", 3000, 100],
    ] as const) {
      value(
        await receiveReagent(t.db, p, {
          code,
          reagent,
          supplier: "S",
          strengthPct: pct,
          receivedAt: "2026-02-01T08:00:00Z",
          massKg: kg,
        }),
      );
    }
  });
  afterAll(async () => {
    await t.drop();
  });

  it("a tank's FFA and water are the mass-weighted means of the lots it holds: 2 parts 1 % + 1 part 5 % = 7/3 %", async () => {
    const stock = await loadPlanStock(t.db, plant.siteId);
    expect(stock.lots.map((l) => [l.code, l.stockG])).toEqual([
      ["D-2", LOT_G - LOT_G / 2],
      ["D-3", LOT_G],
    ]);
    const proposal = value(await proposeBatchPlan(t.db, plant.production, { targetOilKg: 100 }));
    const tank = proposal.candidates.find((c) => c.ref === "tank:T1");
    expect(tank?.availableG).toBe(LOT_G + LOT_G / 2);
    // (2 × 1 + 1 × 5) / 3 = 2.3333 % FFA; (2 × 0.1 + 1 × 0.3) / 3 = 0.16667 % water (hand arithmetic)
    expect(tank?.ffaPct).toBeCloseTo(7 / 3, 6);
    expect(tank?.waterPct).toBeCloseTo(0.5 / 3, 6);
    expect(tank?.ffaCoveredPct).toBeCloseTo(100, 9);
  });

  it("an impossible limit is refused with the gap: lowest FFA for 2000 kg is (918.2·2 + 1081.8·7/3)/2000 = 2.180 %", async () => {
    const before = await t.db.batch.count();
    const proposal = value(
      await proposeBatchPlan(t.db, plant.production, { targetOilKg: 2000, maxFfaPct: 1.5, maxWaterPct: 1 }),
    );
    expect(proposal.outcome.ok).toBe(false);
    if (proposal.outcome.ok) return;
    expect(proposal.outcome.issues.map((i) => [i.code, i.field])).toEqual([
      ["BLEND.FFA_LIMIT_UNREACHABLE", "maxFfaPct"],
    ]);
    // D-3 whole at 2 %, the rest from T1 at 7/3 % (hand arithmetic with the lot masses)
    const d3Kg = LOT_G / 1000;
    const lowest = (d3Kg * 2 + (2000 - d3Kg) * (7 / 3)) / 2000;
    expect(proposal.outcome.diagnosis?.minFfaPct).toBeCloseTo(lowest, 4);
    expect(proposal.outcome.diagnosis?.ffaGapPct).toBeCloseTo(lowest - 1.5, 4);
    const recorded = await recordPlannedBatch(t.db, plant.production, {
      code: "B-NO",
      targetOilKg: 2000,
      maxFfaPct: 1.5,
      maxWaterPct: 1,
    });
    expect(recorded.ok).toBe(false);
    expect(await t.db.batch.count()).toBe(before);
  });

  it("records a planned batch with the card and the draws, and refuses the same number twice", async () => {
    const recorded = value(
      await recordPlannedBatch(t.db, plant.production, { code: "b-p1", targetOilKg: 1000, objective: "OLDEST_FIRST" }),
    );
    expect(recorded.code).toBe("B-P1");
    expect(recorded.card.draws.reduce((s, d) => s + d.massG, 0)).toBe(1_000_000);
    expect(recorded.card.blend.ffaPct).toBeLessThanOrEqual(3 + 1e-9);
    const b = await getBatchDetail(t.db, plant.siteId, "B-P1");
    expect(b?.status).toBe("PLANNED");
    expect(b?.targetOilG).toBe(1_000_000);
    const stored = JSON.parse(b?.recipeJson ?? "{}") as {
      format: string;
      card: { code: string; cautions: unknown[] };
      inputs: { lots: unknown[] };
    };
    expect(stored.format).toBe(CARD_FORMAT);
    expect(stored.card.code).toBe("B-P1");
    expect(stored.card.cautions.length).toBeGreaterThan(0);
    // KOH purity taken from reagent lot KOH-1 (90 %)
    expect(recorded.card.baseStep.catalyst.assayPct).toBe(90);
    const again = await recordPlannedBatch(t.db, plant.production, { code: "B-P1", targetOilKg: 1000 });
    expect(again.ok ? [] : again.issues.map((i) => [i.code, i.field])).toEqual([["RECORD.DUPLICATE", "code"]]);
    const noCode = await recordPlannedBatch(t.db, plant.production, { targetOilKg: 1000 });
    expect(noCode.ok ? [] : noCode.issues.map((i) => i.field)).toEqual(["code"]);
  });

  it("starts from the suggested charges, finishes, and computes the yield against the card", async () => {
    const b = await getBatchDetail(t.db, plant.siteId, "B-P1");
    if (!b) throw new Error("batch missing");
    const planned = readPlannedFigures(b);
    expect(planned?.basis).toBe("card");
    if (!planned) return;
    const { rows, notices } = suggestCharges(planned, await listReagentStock(t.db, plant.siteId));
    expect(notices).toEqual([]);
    value(
      await startBatch(t.db, plant.production, { batchCode: "B-P1", startedAt: "2026-03-01T08:00:00Z", charges: rows }),
    );
    const charged = (await getBatchDetail(t.db, plant.siteId, "B-P1"))?.stockG ?? 0;
    const esterG = 950_000;
    value(
      await completeBatch(t.db, plant.production, {
        batchCode: "B-P1",
        completedAt: "2026-03-01T12:00:00Z",
        outputs: [
          // Only the ester is measured here: the rest is booked as the batch's unmeasured difference.
          { role: "ESTER", toKind: "PRODUCT_LOT", toCode: "P-P1", massKg: esterG / 1000 },
        ],
      }),
    );
    const done = await getBatchDetail(t.db, plant.siteId, "B-P1");
    if (!done) throw new Error("batch missing");
    expect(done.unmeasured.reduce((g, m) => g + m.massG, 0)).toBe(charged - esterG);
    const y = value(computeRecordedYield(done, done.charges, done.outputs));
    // Theory on the triolein model: triglyceride = oil × (1 − FFA − water), 1.00455 kg ester per kg (triolein model, IUPAC 2021 atomic weights, computed)
    const { ffaPct, waterPct } = (
      JSON.parse(done.recipeJson) as { card: { blend: { ffaPct: number; waterPct: number } } }
    ).card.blend;
    const theory = 1000 * (1 - ffaPct / 100 - waterPct / 100) * 1.00455;
    expect(y.yield.theoreticalEsterKg).toBeCloseTo(theory, 0);
    expect(y.yield.esterYieldVsTheory).toBeCloseTo(950 / theory, 3);
    // Charged as suggested: on plan to the gram the charges were rounded to.
    expect(y.yield.catalyst.ratio).toBeCloseTo(1, 4);
    expect(y.yield.methanol.ratio).toBeCloseTo(1, 4);
  });
});
