// The printable recipe card composed from the blend and the recipe plan. Pure.
import type { DomainIssue } from "@/lib/core/result";
import type { Catalyst } from "@/lib/core/vocabulary";
import type { BlendObjective } from "@/lib/blend/blend.schema";
import type { BlendPlan } from "@/lib/blend/optimise";
import { DEFAULT_ACID_STEP_SETTINGS, DEFAULT_PRETREATMENT_LIMITS } from "@/lib/recipe/pretreatment";
import type { PretreatmentPlan, PretreatmentRoute } from "@/lib/recipe/pretreatment";
import { DEFAULT_COST_PER_KG } from "@/lib/batch/plan-request";
import type { BatchPlanRequest } from "@/lib/batch/plan-request";
import { blendWaterLimit, parseCandidateRef } from "@/lib/batch/plan-candidates";
import type { CandidateKind, PlanCandidate } from "@/lib/batch/plan-candidates";
import { renameFields } from "@/lib/batch/plan-inputs";
import type { WaterLimits } from "@/lib/recipe/recipe-defaults";
import type { CatalystAssay } from "@/lib/batch/plan-inputs";
import { listCautions } from "@/lib/batch/plan-cautions";
import type { Caution } from "@/lib/batch/plan-cautions";

export interface CardDraw {
  ref: string;
  kind: CandidateKind;
  code: string;
  massG: number;
  ffaPct: number;
  waterPct: number;
}

export interface RecipeCard {
  format: typeof CARD_FORMAT;
  code: string | null;
  objective: BlendObjective;
  draws: CardDraw[];
  blend: {
    massG: number;
    ffaPct: number;
    waterPct: number;
    maxFfaPct: number;
    maxWaterPct: number;
    costTotal: number | null;
    meanAgeDays: number;
  };
  route: { route: PretreatmentRoute; reason: string };
  acidStep: null | {
    feedKg: number;
    methanolKg: number;
    methanolL20C: number;
    methanolToFfaMolarRatio: number;
    acidPctOfFfa: number;
    acidPureKg: number;
    acidProductKg: number;
    acidPurityPct: number;
    waterFormedKg: number;
    residualFfaPct: number;
    oilPhaseKg: number;
    alcoholPhaseKg: number;
  };
  baseStep: {
    oilKg: number;
    ffaPct: number;
    /** The fatty acid the FFA is expressed as; older cards have none (oleic). */
    ffaBasis?: string;
    acidValueMgKohG?: number;
    meanTgMolarMass?: number;
    /** Present when the molar mass came from the lab's saponification value. */
    molarMassFromSv?: { saponificationValueMgKohG: number; acidValueMgKohG: number } | null;
    waterPct: number;
    molarRatio: number;
    reactionTempC: number;
    methanol: { chargeKg: number; fromCatalystSolutionKg: number; toAddKg: number; toAddL20C: number; totalKg: number };
    catalyst: {
      type: Catalyst;
      productKg: number;
      pureKg: number;
      baseKg: number;
      neutralisationKg: number;
      assayPct: number;
      assayKind: "PURITY" | "SOLUTION_STRENGTH";
      assaySource: string;
    };
  };
  expected: {
    esterKg: number;
    glycerolKg: number;
    soapKg: number;
    excessMethanolKg: number;
    washes: number;
    washWaterKg: number;
  };
  /** Methanol to add in both steps (kg, and litres at 20 °C). */
  methanolTotal: { kg: number; l20C: number };
  warnings: DomainIssue[];
  cautions: Caution[];
  notes: string[];
}

export const CARD_FORMAT = "tracevat.recipe-card/1";

function fixed(n: number, digits: number): string {
  return Number(n.toFixed(digits)).toString();
}

/** The route in words, with the thresholds' sources. */
export function describeRoute(plan: Pick<PretreatmentPlan, "decision">): string {
  const d = plan.decision;
  const ffa = `Blend FFA ${fixed(d.ffaPct, 2)} %`;
  const limits = DEFAULT_PRETREATMENT_LIMITS;
  switch (d.route) {
    case "DIRECT_BASE":
      return `${ffa} is below ${d.directBaseMaxFfaPct} %: direct base catalysis (${limits.directBaseMaxFfaPct.source}).`;
    case "BASE_WITH_EXTRA_CATALYST":
      return `${ffa} is from ${d.directBaseMaxFfaPct} % to below ${d.baseCatalysisMaxFfaPct} %: base catalysis with extra catalyst to neutralise the FFA (${limits.baseCatalysisMaxFfaPct.source}).`;
    case "ACID_PRETREATMENT":
      return `${ffa} is ${d.baseCatalysisMaxFfaPct} % or more: acid esterification of the FFA first, then the base step (${limits.baseCatalysisMaxFfaPct.source}; two-step process after Canakci & Van Gerpen 2001).`;
  }
}

function cardAcidStep(acid: NonNullable<PretreatmentPlan["acidStep"]>, acidPurityPct: number): RecipeCard["acidStep"] {
  return {
    feedKg: acid.feedKg,
    methanolKg: acid.methanolKg,
    methanolL20C: acid.methanolL20C,
    methanolToFfaMolarRatio: acid.methanolToFfaMolarRatio,
    acidPctOfFfa: acid.acidPctOfFfa,
    acidPureKg: acid.acidPureKg,
    acidProductKg: acid.acidProductKg,
    acidPurityPct,
    waterFormedKg: acid.waterFormedKg,
    residualFfaPct: acid.residualFfaPct,
    oilPhaseKg: acid.oilPhase.massKg,
    alcoholPhaseKg: acid.alcoholPhase.totalKg,
  };
}

function cardBaseStep(
  request: BatchPlanRequest,
  base: PretreatmentPlan["baseStep"],
  assay: CatalystAssay | null,
): RecipeCard["baseStep"] {
  return {
    oilKg: base.oil.massKg,
    ffaPct: base.oil.ffaPct,
    ffaBasis: base.oil.ffaBasis,
    acidValueMgKohG: base.oil.acidValueMgKohG,
    meanTgMolarMass: base.oil.meanTgMolarMass,
    molarMassFromSv: base.oil.molarMassFromSv,
    waterPct: base.oil.waterPct,
    molarRatio: base.methanol.molarRatio,
    reactionTempC: base.reactionTempC,
    methanol: {
      chargeKg: base.methanol.chargeKg,
      fromCatalystSolutionKg: base.methanol.fromCatalystSolutionKg,
      toAddKg: base.methanol.toAddKg,
      toAddL20C: base.methanol.toAddL20C,
      totalKg: base.methanol.totalKg,
    },
    catalyst: {
      type: request.catalyst,
      productKg: base.catalyst.productKg,
      pureKg: base.catalyst.pureKg,
      baseKg: base.catalyst.baseKg,
      neutralisationKg: base.catalyst.neutralisationKg,
      assayPct: base.catalyst.assayPct,
      assayKind: base.catalyst.assayKind,
      assaySource: assay?.source ?? "recipe default",
    },
  };
}

/** The basis of the card's figures: costs, assays and where tank quality comes from. */
function cardNotes(
  request: BatchPlanRequest,
  blend: BlendPlan,
  assay: CatalystAssay | null,
  acidAssay: CatalystAssay | null,
  assayKind: string,
  acidStep: boolean,
): string[] {
  const notes: string[] = [];
  const pricedRefs = blend.draws.filter((d) => request.costs[d.ref] !== undefined).length;
  if (pricedRefs < blend.draws.length) {
    notes.push(
      `Cost: ${request.defaultCostPerKg} per kg for every lot or tank without an entered cost (${DEFAULT_COST_PER_KG.source}); the cost total counts only what was entered.`,
    );
  }
  if (assay === null)
    notes.push(
      "Catalyst purity/strength: no value entered and no reagent lot in stock; the recipe default is used (see warnings).",
    );
  else
    notes.push(`Catalyst ${assayKind === "PURITY" ? "purity" : "solution strength"} ${assay.pct} %: ${assay.source}.`);
  notes.push(
    "Tank FFA and water are the mass-weighted means of the lab results of the lots it holds now (traced through the ledger).",
  );
  const acidPurityPct = acidAssay?.pct ?? DEFAULT_ACID_STEP_SETTINGS.acidPurityPct.value;
  if (acidStep) {
    notes.push(
      acidAssay === null
        ? `Sulfuric acid assay: ${acidPurityPct} % (${DEFAULT_ACID_STEP_SETTINGS.acidPurityPct.source}); enter the certificate value.`
        : `Sulfuric acid assay ${acidAssay.pct} %: ${acidAssay.source}.`,
    );
  }
  return notes;
}

export function composeCard(args: {
  request: BatchPlanRequest;
  blend: BlendPlan;
  candidates: readonly PlanCandidate[];
  plan: PretreatmentPlan;
  assay: CatalystAssay | null;
  acidAssay?: CatalystAssay | null;
  water?: WaterLimits;
}): RecipeCard {
  const { request, blend, candidates, plan, assay } = args;
  const acidAssay = args.acidAssay ?? null;
  const byRef = new Map(candidates.map((c) => [c.ref, c]));
  const base = plan.baseStep;
  const acid = plan.acidStep;
  const notes = cardNotes(request, blend, assay, acidAssay, base.catalyst.assayKind, acid !== null);
  const acidPurityPct = acidAssay?.pct ?? DEFAULT_ACID_STEP_SETTINGS.acidPurityPct.value;
  const methanolTotalKg = base.methanol.toAddKg + (acid?.methanolKg ?? 0);
  return {
    format: CARD_FORMAT,
    code: request.code ?? null,
    objective: request.objective,
    draws: blend.draws.map((d) => {
      const c = byRef.get(d.ref);
      const parsed = parseCandidateRef(d.ref);
      return {
        ref: d.ref,
        kind: parsed?.kind ?? "LOT",
        code: parsed?.code ?? d.ref,
        massG: d.massG,
        ffaPct: c?.ffaPct ?? 0,
        waterPct: c?.waterPct ?? 0,
      };
    }),
    blend: {
      massG: blend.totalG,
      ffaPct: blend.blendFfaPct,
      waterPct: blend.blendWaterPct,
      maxFfaPct: request.maxFfaPct,
      maxWaterPct: blendWaterLimit(request, args.water).value,
      costTotal: blend.costTotal,
      meanAgeDays: blend.meanAgeDays,
    },
    route: { route: plan.decision.route, reason: describeRoute(plan) },
    acidStep: acid === null ? null : cardAcidStep(acid, acidPurityPct),
    baseStep: cardBaseStep(request, base, assay),
    expected: {
      esterKg: base.products.fameKg,
      glycerolKg: base.products.glycerolKg,
      soapKg: base.products.soapKg,
      excessMethanolKg: base.products.excessMethanolKg,
      washes: base.washWater.washes,
      washWaterKg: base.washWater.totalKg,
    },
    methanolTotal: { kg: methanolTotalKg, l20C: base.methanol.toAddL20C + (acid?.methanolL20C ?? 0) },
    warnings: [...blend.warnings, ...plan.warnings, ...renameFields(base.warnings)],
    cautions: listCautions({ catalyst: request.catalyst, acidStep: acid !== null }),
    notes,
  };
}
