// The recipe core's input for a proposed blend, and recipe refusals renamed to the planner's fields. Pure.
import type { DomainIssue } from "@/lib/core/result";
import { CATALYSTS as CATALYST_PROFILES } from "@/lib/recipe/catalyst";
import { DEFAULT_RECIPE_SETTINGS } from "@/lib/recipe/recipe-defaults";
import type { PretreatmentInput } from "@/lib/recipe/recipe.schema";
import type { BatchPlanRequest } from "@/lib/batch/plan-request";
import type { PlanCandidate, ReagentStock } from "@/lib/batch/plan-candidates";

// ---- recipe inputs ------------------------------------------------------------------------------

export interface CatalystAssay {
  pct: number;
  source: string;
}

/** A reagent's purity (or methoxide strength): as entered, else the newest reagent lot of it in stock. */
export function pickAssay(
  reagent: string,
  entered: number | undefined,
  reagents: readonly ReagentStock[],
): CatalystAssay | null {
  if (entered !== undefined) return { pct: entered, source: "entered by the planner" };
  const newest = reagents
    .filter((r) => r.reagent === reagent && r.stockG > 0)
    .sort((a, b) => b.receivedAt.getTime() - a.receivedAt.getTime() || a.code.localeCompare(b.code))[0];
  return newest ? { pct: newest.strengthPct, source: `reagent lot ${newest.code} as received` } : null;
}

/** The recipe core's input for the proposed draws, with the planner's settings. */
export function toPretreatmentInput(
  request: BatchPlanRequest,
  draws: ReadonlyArray<{ ref: string; massG: number }>,
  candidates: readonly PlanCandidate[],
  assay: CatalystAssay | null,
  acidAssay: CatalystAssay | null = null,
): PretreatmentInput {
  const byRef = new Map(candidates.map((c) => [c.ref, c]));
  const solid = CATALYST_PROFILES[request.catalyst].form === "SOLID";
  const washPractice =
    request.washes === undefined && request.waterPerWashPctOfEster === undefined
      ? undefined
      : {
          washes: request.washes ?? DEFAULT_RECIPE_SETTINGS.washes.value,
          waterPerWashPctOfEster:
            request.waterPerWashPctOfEster ?? DEFAULT_RECIPE_SETTINGS.waterPerWashPctOfEster.value,
        };
  const acidStep = {
    ...(request.acidMethanolToFfaRatio === undefined
      ? {}
      : { methanolToFfaMolarRatio: request.acidMethanolToFfaRatio }),
    ...(request.acidPctOfFfa === undefined ? {} : { acidPctOfFfa: request.acidPctOfFfa }),
    ...(acidAssay === null ? {} : { acidPurityPct: acidAssay.pct }),
    ...(request.residualFfaPct === undefined ? {} : { residualFfaPct: request.residualFfaPct }),
  };
  return {
    lots: draws.map((d) => {
      const c = byRef.get(d.ref);
      return { lotRef: d.ref, massKg: d.massG / 1000, ffaPct: c?.ffaPct ?? 0, waterPct: c?.waterPct ?? 0 };
    }),
    settings: {
      catalyst: request.catalyst,
      molarRatio: request.molarRatio,
      reactionTempC: request.reactionTempC,
      ...(assay === null ? {} : solid ? { purityPct: assay.pct } : { solutionStrengthPct: assay.pct }),
      ...(request.baseDosePctOfOil === undefined ? {} : { baseDosePctOfOil: request.baseDosePctOfOil }),
      ...(request.meanTgMolarMass === undefined ? {} : { meanTgMolarMass: request.meanTgMolarMass }),
      ...(request.saponificationValueMgKohG === undefined
        ? {}
        : { saponificationValueMgKohG: request.saponificationValueMgKohG }),
      ...(washPractice === undefined ? {} : { washPractice }),
    },
    ...(Object.keys(acidStep).length === 0 ? {} : { acidStep }),
  };
}

/** Recipe-core field paths → the planner's own field names, so a refusal lands next to the right input. */
const RECIPE_FIELD_TO_REQUEST: ReadonlyArray<readonly [RegExp, string]> = [
  [/^settings\.(purityPct|solutionStrengthPct)$/, "assayPct"],
  [/^settings\.molarRatio$/, "molarRatio"],
  [/^settings\.reactionTempC$/, "reactionTempC"],
  [/^settings\.baseDosePctOfOil$/, "baseDosePctOfOil"],
  [/^settings\.meanTgMolarMass$/, "meanTgMolarMass"],
  [/^settings\.saponificationValueMgKohG$/, "saponificationValueMgKohG"],
  [/^settings\.washPractice\.washes$/, "washes"],
  [/^settings\.washPractice\.waterPerWashPctOfEster$/, "waterPerWashPctOfEster"],
  [/^acidStep\.methanolToFfaMolarRatio$/, "acidMethanolToFfaRatio"],
  [/^acidStep\.acidPctOfFfa$/, "acidPctOfFfa"],
  [/^acidStep\.acidPurityPct$/, "acidPurityPct"],
  [/^acidStep\.residualFfaPct$/, "residualFfaPct"],
  [/^limits\.maxFfaPct$/, "maxFfaPct"],
  [/^limits\.maxWaterPct$/, "maxWaterPct"],
];

export function toRequestField(field: string | undefined): string | undefined {
  if (field === undefined) return undefined;
  for (const [pattern, name] of RECIPE_FIELD_TO_REQUEST) if (pattern.test(field)) return name;
  return field;
}

export function renameFields(issues: readonly DomainIssue[]): DomainIssue[] {
  return issues.map((i) => {
    const field = toRequestField(i.field);
    return field === undefined ? { code: i.code, message: i.message } : { ...i, field };
  });
}
