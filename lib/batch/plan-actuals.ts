// After the batch: recorded charges and outputs, the recorded yield, and suggestions for the start and finish forms. Pure.
import { failMany, ok } from "@/lib/core/result";
import type { Result } from "@/lib/core/result";
import type { BatchActuals } from "@/lib/recipe/recipe.schema";
import { computeBatchYield } from "@/lib/recipe/yield";
import type { BatchYield } from "@/lib/recipe/yield";
import type { ReagentStock } from "@/lib/batch/plan-candidates";
import { readPlannedFigures } from "@/lib/batch/plan-figures";
import type { BatchFacts, PlannedFigures } from "@/lib/batch/plan-figures";

export interface MassMove {
  role: string;
  massG: number;
}

export interface RecordedActuals extends BatchActuals {
  acidKg: number;
  waterKg: number;
  washWaterOutKg: number;
  recoveredMethanolKg: number;
  lossKg: number;
}

function sumRole(moves: readonly MassMove[], role: string): number {
  return moves.filter((m) => m.role === role).reduce((s, m) => s + m.massG, 0) / 1000;
}

/** The batch's charges and outputs by role, in kg. */
export function collectBatchActuals(charges: readonly MassMove[], outputs: readonly MassMove[]): RecordedActuals {
  return {
    oilChargedKg: sumRole(charges, "OIL"),
    methanolAddedKg: sumRole(charges, "METHANOL"),
    catalystProductUsedKg: sumRole(charges, "CATALYST"),
    acidKg: sumRole(charges, "ACID"),
    waterKg: sumRole(charges, "WATER"),
    esterKg: sumRole(outputs, "ESTER"),
    glycerolPhaseKg: sumRole(outputs, "GLYCEROL_PHASE"),
    washWaterOutKg: sumRole(outputs, "WASH_WATER"),
    recoveredMethanolKg: sumRole(outputs, "RECOVERED_METHANOL"),
    lossKg: sumRole(outputs, "LOSS"),
  };
}

export interface RecordedYield {
  planned: PlannedFigures;
  actuals: RecordedActuals;
  yield: BatchYield;
}

/** Yield of a finished batch against its plan (computeBatchYield on the recorded charges and outputs). */
export function computeRecordedYield(
  batch: BatchFacts,
  charges: readonly MassMove[],
  outputs: readonly MassMove[],
): Result<RecordedYield> {
  const planned = readPlannedFigures(batch);
  if (planned === null) {
    return failMany([
      { code: "YIELD.NO_PLAN", message: "This batch has no recipe in a form the yield can be computed from." },
    ]);
  }
  const actuals = collectBatchActuals(charges, outputs);
  if (!((actuals.oilChargedKg ?? 0) > 0))
    return failMany([{ code: "YIELD.NO_OIL", message: "No oil has been charged yet.", field: "oilChargedKg" }]);
  const y = computeBatchYield(planned.yieldPlan, actuals);
  return y.ok ? ok({ planned, actuals, yield: y.value }) : y;
}

// ---- suggestions for the start and finish forms ----------------------------------------------------

export interface ChargeSuggestion {
  fromKind: "LOT" | "TANK" | "REAGENT_LOT";
  fromCode: string;
  role: "OIL" | "METHANOL" | "CATALYST" | "ACID" | "WATER";
  massKg: number;
}

/** Splits a planned reagent mass over the reagent lots in stock, oldest first. */
function drawReagent(
  reagents: readonly ReagentStock[],
  reagent: string,
  grams: number,
): { parts: Array<{ code: string; grams: number }>; shortG: number } {
  const lots = reagents
    .filter((r) => r.reagent === reagent && r.stockG > 0)
    .sort((a, b) => a.receivedAt.getTime() - b.receivedAt.getTime() || a.code.localeCompare(b.code));
  const parts: Array<{ code: string; grams: number }> = [];
  let left = grams;
  for (const l of lots) {
    if (left <= 0) break;
    const take = Math.min(l.stockG, left);
    parts.push({ code: l.code, grams: take });
    left -= take;
  }
  return { parts, shortG: Math.max(0, left) };
}

/** Start-form rows from the plan: the oil draws, then methanol, catalyst and acid from reagent lots in stock (wash water is used when the batch finishes). */
export function suggestCharges(
  planned: PlannedFigures,
  reagents: readonly ReagentStock[],
): { rows: ChargeSuggestion[]; notices: string[] } {
  const rows: ChargeSuggestion[] = planned.draws.map((d) => ({
    fromKind: d.kind,
    fromCode: d.code,
    role: "OIL",
    massKg: d.massG / 1000,
  }));
  const notices: string[] = [];
  // A plan without stored draws still needs its oil: one row for the planner to say where from.
  if (rows.length === 0) {
    rows.push({ fromKind: "TANK", fromCode: "", role: "OIL", massKg: planned.oilKg });
    notices.push("Oil: the plan stores no draws; say which tank or lot the oil comes from");
  }
  const add = (reagent: string, kg: number, role: ChargeSuggestion["role"], label: string) => {
    const grams = Math.round(kg * 1000);
    if (grams <= 0) return;
    const { parts, shortG } = drawReagent(reagents, reagent, grams);
    for (const p of parts) rows.push({ fromKind: "REAGENT_LOT", fromCode: p.code, role, massKg: p.grams / 1000 });
    if (shortG > 0) notices.push(`${label}: ${(shortG / 1000).toFixed(3)} kg more than the reagent lots in stock hold`);
  };
  add("METHANOL", planned.methanolKg, "METHANOL", "Methanol");
  add(planned.catalyst, planned.catalystProductKg, "CATALYST", "Catalyst");
  add("H2SO4", planned.acidProductKg, "ACID", "Sulfuric acid");
  return { rows, notices };
}
