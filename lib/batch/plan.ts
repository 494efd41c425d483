// Batch planning from the plant's stock: which lots and tanks to draw (blend optimiser), then the
// recipe for that blend (direct base step, or acid pretreatment and base step), as a printable card.
// Pure: stock, reagents and the clock come in as arguments.
import { z } from "zod";
import { failMany, ok } from "@/lib/core/result";
import type { DomainIssue, Result } from "@/lib/core/result";
import { CATALYSTS } from "@/lib/core/vocabulary";
import type { Catalyst } from "@/lib/core/vocabulary";
import { code, oneOf, text, when } from "@/lib/core/fields";
import { parseInput } from "@/lib/ledger/parse";
import { BLEND_OBJECTIVES, MAX_BLEND_CANDIDATES, MAX_COST_PER_KG } from "@/lib/blend/blend.schema";
import type { BlendCandidate, BlendObjective, BlendRequest } from "@/lib/blend/blend.schema";
import { diagnoseBlend, optimiseBlend } from "@/lib/blend/optimise";
import type { BlendDiagnosis, BlendPlan } from "@/lib/blend/optimise";
import { defineSourced } from "@/lib/chemistry/sourced-value";
import type { SourcedValue } from "@/lib/chemistry/sourced-value";
import { CATALYSTS as CATALYST_PROFILES } from "@/lib/recipe/catalyst";
import { DEFAULT_RECIPE_LIMITS, DEFAULT_RECIPE_SETTINGS, WATER_LIMIT_BY_STEP } from "@/lib/recipe/recipe-defaults";
import {
  MAX_ACID_PCT_OF_FFA,
  MAX_BASE_DOSE_PCT_OF_OIL,
  MAX_METHANOL_TO_FFA_RATIO,
  MAX_REACTION_TEMP_C,
  MAX_TG_MOLAR_MASS,
  MAX_WASHES,
  MAX_WATER_PER_WASH_PCT_OF_ESTER,
  MIN_REACTION_TEMP_C,
  MIN_TG_MOLAR_MASS,
  MAX_SAPONIFICATION_VALUE,
  MIN_SAPONIFICATION_VALUE,
  PretreatmentInputSchema,
} from "@/lib/recipe/recipe.schema";
import type { BatchActuals, PretreatmentInput } from "@/lib/recipe/recipe.schema";
import { DEFAULT_ACID_STEP_SETTINGS, DEFAULT_PRETREATMENT_LIMITS, planPretreatment } from "@/lib/recipe/pretreatment";
import type { PretreatmentPlan, PretreatmentRoute } from "@/lib/recipe/pretreatment";
import { planRecipe } from "@/lib/recipe/recipe";
import type { RecipePlan } from "@/lib/recipe/recipe";
import { computeBatchYield } from "@/lib/recipe/yield";
import type { BatchYield } from "@/lib/recipe/yield";
import { MAX_MOLAR_RATIO, MIN_MOLAR_RATIO } from "@/lib/batch/batch.schema";

// ---- defaults ---------------------------------------------------------------------------------

/** Blend limits the planner starts from; a planner may tighten or relax them per batch. */
export const DEFAULT_BLEND_LIMITS: { maxFfaPct: SourcedValue; maxWaterPct: SourcedValue } = {
  maxFfaPct: DEFAULT_RECIPE_LIMITS.baseCatalysisMaxFfaPct,
  maxWaterPct: WATER_LIMIT_BY_STEP.ACID_STEP,
};

/** The books hold no feedstock prices; every candidate costs this unless a cost is entered. */
export const DEFAULT_COST_PER_KG: SourcedValue = defineSourced(
  0,
  "per kg",
  "site default: no feedstock prices are recorded",
  "common practice",
  "with every cost at 0 the lowest-cost objective accepts any blend within the limits",
);

export const PLAN_OBJECTIVE_LABELS: Readonly<Record<BlendObjective, string>> = {
  MIN_COST: "Lowest cost",
  OLDEST_FIRST: "Oldest stock first",
  HIGHEST_FFA_FIRST: "Highest FFA first (use up difficult stock)",
};

export const MS_PER_DAY = 86_400_000;

// ---- request ----------------------------------------------------------------------------------

const num = (what: string, unit: string) => z.number({ error: `${what} must be a number (${unit})` });

/** What a planner asks for: the batch, the blend limits, the objective and the recipe settings. */
export const BatchPlanRequestSchema = z
  .object({
    /** Needed only when the plan is recorded. */
    code: code("Batch number").optional(),
    plannedAt: when("Planned time").optional(),
    targetOilKg: num("Oil to charge", "kg")
      .positive("Oil to charge must be more than 0 kg")
      .max(2_000_000, "Oil to charge must be at most 2,000,000 kg"),
    maxFfaPct: num("Blend FFA limit", "%")
      .min(0, "Blend FFA limit must be at least 0 %")
      .max(100, "Blend FFA limit must be at most 100 %")
      .default(DEFAULT_BLEND_LIMITS.maxFfaPct.value),
    /** Empty: the water limit of the step the blend goes into first (see blendWaterLimit). */
    maxWaterPct: num("Blend water limit", "%")
      .min(0, "Blend water limit must be at least 0 %")
      .max(100, "Blend water limit must be at most 100 %")
      .optional(),
    objective: z
      .enum(BLEND_OBJECTIVES, { error: `Objective must be one of ${BLEND_OBJECTIVES.join(", ")}` })
      .default("OLDEST_FIRST"),
    minDrawKg: num("Smallest draw", "kg")
      .positive("Smallest draw must be more than 0 kg")
      .max(2_000_000, "Smallest draw must be at most 2,000,000 kg")
      .optional(),
    catalyst: oneOf("Catalyst", CATALYSTS).default("KOH"),
    /** Purity of a solid catalyst, or strength of a methoxide solution; from the supplier's certificate. */
    assayPct: num("Catalyst purity or strength", "%")
      .gt(0, "Catalyst purity or strength must be more than 0 %")
      .max(100, "Catalyst purity or strength must be at most 100 %")
      .optional(),
    molarRatio: num("Methanol : oil molar ratio", "mol/mol")
      .min(
        MIN_MOLAR_RATIO,
        `Methanol : oil molar ratio must be at least ${MIN_MOLAR_RATIO}:1 (the stoichiometric minimum)`,
      )
      .max(MAX_MOLAR_RATIO, `Methanol : oil molar ratio must be at most ${MAX_MOLAR_RATIO}:1`)
      .default(DEFAULT_RECIPE_SETTINGS.molarRatio.value),
    reactionTempC: num("Reaction temperature", "°C")
      .min(MIN_REACTION_TEMP_C, `Reaction temperature must be at least ${MIN_REACTION_TEMP_C} °C`)
      .max(MAX_REACTION_TEMP_C, `Reaction temperature must be at most ${MAX_REACTION_TEMP_C} °C`)
      .default(DEFAULT_RECIPE_SETTINGS.reactionTempC.value),
    baseDosePctOfOil: num("Base catalyst dose", "% of oil")
      .min(0, "Base catalyst dose must be at least 0 %")
      .max(MAX_BASE_DOSE_PCT_OF_OIL, `Base catalyst dose must be at most ${MAX_BASE_DOSE_PCT_OF_OIL} % of the oil`)
      .optional(),
    meanTgMolarMass: num("Mean oil molar mass", "g/mol")
      .min(MIN_TG_MOLAR_MASS, `Mean oil molar mass must be at least ${MIN_TG_MOLAR_MASS} g/mol`)
      .max(MAX_TG_MOLAR_MASS, `Mean oil molar mass must be at most ${MAX_TG_MOLAR_MASS} g/mol`)
      .optional(),
    /** The lab's saponification value (AOCS Cd 3-25 / ISO 3657); the recipe turns it into the mean oil molar mass. */
    saponificationValueMgKohG: num("Saponification value", "mg KOH/g")
      .min(MIN_SAPONIFICATION_VALUE, `Saponification value must be at least ${MIN_SAPONIFICATION_VALUE} mg KOH/g`)
      .max(MAX_SAPONIFICATION_VALUE, `Saponification value must be at most ${MAX_SAPONIFICATION_VALUE} mg KOH/g`)
      .optional(),
    washes: num("Number of washes", "washes")
      .int("Number of washes must be a whole number")
      .min(0, "Number of washes must be 0 or more")
      .max(MAX_WASHES, `Number of washes must be at most ${MAX_WASHES}`)
      .optional(),
    waterPerWashPctOfEster: num("Water per wash", "% of ester")
      .min(0, "Water per wash must be at least 0 %")
      .max(
        MAX_WATER_PER_WASH_PCT_OF_ESTER,
        `Water per wash must be at most ${MAX_WATER_PER_WASH_PCT_OF_ESTER} % of the ester`,
      )
      .optional(),
    acidMethanolToFfaRatio: num("Acid step methanol : FFA ratio", "mol/mol")
      .positive("Acid step methanol : FFA ratio must be more than 0")
      .max(MAX_METHANOL_TO_FFA_RATIO, `Acid step methanol : FFA ratio must be at most ${MAX_METHANOL_TO_FFA_RATIO}:1`)
      .optional(),
    acidPctOfFfa: num("Sulfuric acid dose", "% of FFA mass")
      .min(0, "Sulfuric acid dose must be at least 0 %")
      .max(MAX_ACID_PCT_OF_FFA, `Sulfuric acid dose must be at most ${MAX_ACID_PCT_OF_FFA} % of the FFA mass`)
      .optional(),
    acidPurityPct: num("Sulfuric acid assay", "%")
      .gt(0, "Sulfuric acid assay must be more than 0 %")
      .max(100, "Sulfuric acid assay must be at most 100 %")
      .optional(),
    residualFfaPct: num("FFA left after the acid step", "%")
      .min(0, "FFA left after the acid step must be at least 0 %")
      .max(100, "FFA left after the acid step must be at most 100 %")
      .optional(),
    defaultCostPerKg: num("Default cost", "per kg")
      .min(0, "Default cost must be 0 or more per kg")
      .max(MAX_COST_PER_KG, `Default cost must be at most ${MAX_COST_PER_KG} per kg`)
      .default(DEFAULT_COST_PER_KG.value),
    /** Cost per kg by candidate reference (e.g. "lot:L-0191"). */
    costs: z
      .record(
        z.string(),
        num("Cost", "per kg")
          .min(0, "Cost must be 0 or more per kg")
          .max(MAX_COST_PER_KG, `Cost must be at most ${MAX_COST_PER_KG} per kg`),
      )
      .default({}),
    /** Candidate references the planner leaves out. */
    exclude: z
      .array(z.string())
      .max(MAX_BLEND_CANDIDATES * 5, "Too many left-out candidates")
      .default([]),
    notes: text("Notes", 1000).default(""),
  })
  .refine((r) => r.meanTgMolarMass === undefined || r.saponificationValueMgKohG === undefined, {
    message: "Give either the mean oil molar mass or the saponification value, not both",
    path: ["saponificationValueMgKohG"],
  });
export type BatchPlanRequestInput = z.input<typeof BatchPlanRequestSchema>;
export type BatchPlanRequest = z.output<typeof BatchPlanRequestSchema>;

// ---- stock and candidates -----------------------------------------------------------------------

export interface LotStock {
  code: string;
  material: string;
  receivedAt: Date;
  stockG: number;
  /** Mean of the lot's valid titrations. */
  ffaPct: number | null;
  /** Latest valid water test. */
  waterPct: number | null;
}

/** One feedstock lot's share of what a tank holds now (lotCode null: material not traced to a lot). */
export interface TankShare {
  lotCode: string | null;
  grams: number;
  ffaPct: number | null;
  waterPct: number | null;
  receivedAt: Date | null;
}

export interface TankStock {
  code: string;
  name: string;
  stockG: number;
  /** Null when the ledger could not be replayed, so the contents are unknown. */
  contents: TankShare[] | null;
}

export interface PlanStock {
  lots: LotStock[];
  tanks: TankStock[];
}

export interface ReagentStock {
  code: string;
  reagent: string;
  strengthPct: number;
  receivedAt: Date;
  stockG: number;
}

export interface ContentQuality {
  ffaPct: number | null;
  waterPct: number | null;
  /** Share of the contents' mass with an FFA (water) result, %. */
  ffaCoveredPct: number;
  waterCoveredPct: number;
  /** Mass-weighted age of the contents with a receipt date; null when none has one. */
  ageDays: number | null;
}

function weightedMean(parts: ReadonlyArray<{ grams: number; value: number | null }>): {
  mean: number | null;
  coveredG: number;
} {
  let coveredG = 0;
  let sum = 0;
  for (const p of parts) {
    if (p.value === null || !(p.grams > 0)) continue;
    coveredG += p.grams;
    sum += p.grams * p.value;
  }
  return { mean: coveredG > 0 ? sum / coveredG : null, coveredG };
}

/** Mass-weighted FFA, water and age of a tank's contents, over the shares that have a result. */
export function summariseContents(contents: readonly TankShare[], now: Date): ContentQuality {
  const totalG = contents.reduce((s, c) => s + Math.max(0, c.grams), 0);
  const ffa = weightedMean(contents.map((c) => ({ grams: c.grams, value: c.ffaPct })));
  const water = weightedMean(contents.map((c) => ({ grams: c.grams, value: c.waterPct })));
  const age = weightedMean(
    contents.map((c) => ({
      grams: c.grams,
      value: c.receivedAt === null ? null : Math.max(0, (now.getTime() - c.receivedAt.getTime()) / MS_PER_DAY),
    })),
  );
  const share = (g: number) => (totalG > 0 ? (g * 100) / totalG : 0);
  return {
    ffaPct: ffa.mean,
    waterPct: water.mean,
    ffaCoveredPct: share(ffa.coveredG),
    waterCoveredPct: share(water.coveredG),
    ageDays: age.mean,
  };
}

export type CandidateKind = "LOT" | "TANK";

export interface PlanCandidate {
  /** "lot:<code>" or "tank:<code>": unique even when a lot and a tank share a code. */
  ref: string;
  kind: CandidateKind;
  code: string;
  /** Material (lots) or tank name. */
  label: string;
  availableG: number;
  ffaPct: number | null;
  waterPct: number | null;
  ffaCoveredPct: number;
  waterCoveredPct: number;
  ageDays: number;
  costPerKg: number;
  /** Why the candidate is not offered to the optimiser; null when it is. */
  leftOutBecause: string | null;
}

export function candidateRef(kind: CandidateKind, code: string): string {
  return `${kind === "LOT" ? "lot" : "tank"}:${code}`;
}

export function parseCandidateRef(ref: string): { kind: CandidateKind; code: string } | null {
  const m = /^(lot|tank):(.+)$/.exec(ref);
  if (!m || m[2] === undefined) return null;
  return { kind: m[1] === "lot" ? "LOT" : "TANK", code: m[2] };
}

/** Accepted lots with stock and feedstock tanks, with the quality the optimiser blends on. */
export function buildCandidates(
  stock: PlanStock,
  request: Pick<BatchPlanRequest, "costs" | "defaultCostPerKg" | "exclude">,
  now: Date,
): PlanCandidate[] {
  const excluded = new Set(request.exclude);
  const costOf = (ref: string) => request.costs[ref] ?? request.defaultCostPerKg;
  const out: PlanCandidate[] = [];
  for (const lot of stock.lots) {
    if (!(lot.stockG > 0)) continue;
    const ref = candidateRef("LOT", lot.code);
    out.push({
      ref,
      kind: "LOT",
      code: lot.code,
      label: lot.material,
      availableG: lot.stockG,
      ffaPct: lot.ffaPct,
      waterPct: lot.waterPct,
      ffaCoveredPct: lot.ffaPct === null ? 0 : 100,
      waterCoveredPct: lot.waterPct === null ? 0 : 100,
      ageDays: Math.max(0, (now.getTime() - lot.receivedAt.getTime()) / MS_PER_DAY),
      costPerKg: costOf(ref),
      leftOutBecause: excluded.has(ref)
        ? "left out by the planner"
        : lot.ffaPct === null
          ? "no FFA result"
          : lot.waterPct === null
            ? "no water result"
            : null,
    });
  }
  for (const tank of stock.tanks) {
    if (!(tank.stockG > 0)) continue;
    const ref = candidateRef("TANK", tank.code);
    const q = tank.contents === null ? null : summariseContents(tank.contents, now);
    out.push({
      ref,
      kind: "TANK",
      code: tank.code,
      label: tank.name,
      availableG: tank.stockG,
      ffaPct: q?.ffaPct ?? null,
      waterPct: q?.waterPct ?? null,
      ffaCoveredPct: q?.ffaCoveredPct ?? 0,
      waterCoveredPct: q?.waterCoveredPct ?? 0,
      ageDays: q?.ageDays ?? 0,
      costPerKg: costOf(ref),
      leftOutBecause: excluded.has(ref)
        ? "left out by the planner"
        : q === null
          ? "contents could not be traced"
          : q.ffaPct === null
            ? "no FFA result for its contents"
            : q.waterPct === null
              ? "no water result for its contents"
              : null,
    });
  }
  return out;
}

/**
 * The blend's water limit: the planner's own figure, else the site setting of the step the blend goes into
 * first — the base step when the FFA limit keeps every blend below the acid-pretreatment threshold, the
 * acid step otherwise. The recipe and pretreatment warnings use the same two settings.
 */
export function blendWaterLimit(request: Pick<BatchPlanRequest, "maxWaterPct" | "maxFfaPct">): {
  value: number;
  step: "BASE_STEP" | "ACID_STEP" | null;
} {
  if (request.maxWaterPct !== undefined) return { value: request.maxWaterPct, step: null };
  const step = request.maxFfaPct < DEFAULT_RECIPE_LIMITS.baseCatalysisMaxFfaPct.value ? "BASE_STEP" : "ACID_STEP";
  return { value: WATER_LIMIT_BY_STEP[step].value, step };
}

export function toBlendRequest(request: BatchPlanRequest, candidates: readonly PlanCandidate[]): BlendRequest {
  const usable = candidates.filter((c) => c.leftOutBecause === null && c.ffaPct !== null && c.waterPct !== null);
  return {
    candidates: usable.map((c): BlendCandidate => ({
      ref: c.ref,
      availableKg: c.availableG / 1000,
      ffaPct: c.ffaPct ?? 0,
      waterPct: c.waterPct ?? 0,
      costPerKg: c.costPerKg,
      ageDays: c.ageDays,
    })),
    targetKg: request.targetOilKg,
    limits: { maxFfaPct: request.maxFfaPct, maxWaterPct: blendWaterLimit(request).value },
    objective: request.objective,
    ...(request.minDrawKg === undefined ? {} : { minDrawKg: request.minDrawKg }),
  };
}

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

function renameFields(issues: readonly DomainIssue[]): DomainIssue[] {
  return issues.map((i) => {
    const field = toRequestField(i.field);
    return field === undefined ? { code: i.code, message: i.message } : { ...i, field };
  });
}

// ---- the card -----------------------------------------------------------------------------------

export type CautionStep = "METHANOL" | "CATALYST" | "ACID" | "HOT_OIL" | "GLYCEROL" | "GENERAL";

export interface Caution {
  step: CautionStep;
  text: string;
}

/** Our own short cautions; they point to the safety data sheets and site procedures, they do not replace them. */
export function listCautions(opts: { catalyst: Catalyst; acidStep: boolean }): Caution[] {
  const methoxide = CATALYST_PROFILES[opts.catalyst].form === "METHANOL_SOLUTION";
  const cautions: Caution[] = [
    {
      step: "METHANOL",
      text: "Methanol is toxic if swallowed, breathed in or absorbed through the skin, and highly flammable: its vapour ignites easily and its flame is hard to see. No ignition sources, good ventilation, bond and earth containers when transferring.",
    },
    {
      step: "CATALYST",
      text: methoxide
        ? "Methoxide solution is corrosive and flammable and reacts with water and moist air; keep it closed and dry. Wear eye and face protection and chemical gloves."
        : "Sodium and potassium hydroxide are corrosive to eyes and skin and react with water and with methanol, giving off heat; the methoxide they form in methanol is corrosive too. Keep them dry, mix in a closed vessel, wear eye and face protection and chemical gloves.",
    },
  ];
  if (opts.acidStep) {
    cautions.push({
      step: "ACID",
      text: "Concentrated sulfuric acid is corrosive and reacts violently with water, giving off heat: add the acid slowly to the methanol, never water or methanol onto the acid. Eye and face protection, acid-resistant gloves.",
    });
  }
  cautions.push(
    {
      step: "HOT_OIL",
      text: "Hot oil and a warm reactor cause burns; water in hot oil can boil and spatter. Keep the reaction below the methanol boiling point unless the vessel is rated for it.",
    },
    {
      step: "GLYCEROL",
      text: "The glycerol phase and recovered methanol contain methanol: flammable, store and handle them like methanol.",
    },
    {
      step: "GENERAL",
      text: "Work to the safety data sheets of every chemical, the site's own procedures and local fire and building codes; only trained staff run a batch.",
    },
  );
  return cautions;
}

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

export function composeCard(args: {
  request: BatchPlanRequest;
  blend: BlendPlan;
  candidates: readonly PlanCandidate[];
  plan: PretreatmentPlan;
  assay: CatalystAssay | null;
  acidAssay?: CatalystAssay | null;
}): RecipeCard {
  const { request, blend, candidates, plan, assay } = args;
  const acidAssay = args.acidAssay ?? null;
  const byRef = new Map(candidates.map((c) => [c.ref, c]));
  const base = plan.baseStep;
  const acid = plan.acidStep;
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
    notes.push(
      `Catalyst ${base.catalyst.assayKind === "PURITY" ? "purity" : "solution strength"} ${assay.pct} %: ${assay.source}.`,
    );
  notes.push(
    "Tank FFA and water are the mass-weighted means of the lab results of the lots it holds now (traced through the ledger).",
  );
  const acidPurityPct = acidAssay?.pct ?? DEFAULT_ACID_STEP_SETTINGS.acidPurityPct.value;
  if (acid !== null) {
    notes.push(
      acidAssay === null
        ? `Sulfuric acid assay: ${acidPurityPct} % (${DEFAULT_ACID_STEP_SETTINGS.acidPurityPct.source}); enter the certificate value.`
        : `Sulfuric acid assay ${acidAssay.pct} %: ${acidAssay.source}.`,
    );
  }
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
      maxWaterPct: blendWaterLimit(request).value,
      costTotal: blend.costTotal,
      meanAgeDays: blend.meanAgeDays,
    },
    route: { route: plan.decision.route, reason: describeRoute(plan) },
    acidStep:
      acid === null
        ? null
        : {
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
          },
    baseStep: {
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
    },
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

/** What is stored with a planned batch: the recipe core's input (to recompute) and the card as printed. */
export interface StoredRecipe {
  format: typeof CARD_FORMAT;
  inputs: PretreatmentInput;
  card: RecipeCard;
}

export type PlanOutcome =
  | { ok: true; blend: BlendPlan; plan: PretreatmentPlan; card: RecipeCard; stored: StoredRecipe }
  | { ok: false; stage: "CANDIDATES" | "BLEND" | "RECIPE"; issues: DomainIssue[]; diagnosis: BlendDiagnosis | null };

export interface PlanProposal {
  request: BatchPlanRequest;
  candidates: PlanCandidate[];
  assay: CatalystAssay | null;
  acidAssay: CatalystAssay | null;
  outcome: PlanOutcome;
}

/** Candidates → blend (HiGHS) → route and recipe → card. A blend that cannot be made says which limit fails and by how much. */
export async function draftBatchPlan(
  request: BatchPlanRequest,
  stock: PlanStock,
  reagents: readonly ReagentStock[],
  now: Date,
): Promise<PlanProposal> {
  const candidates = buildCandidates(stock, request, now);
  const assay = pickAssay(request.catalyst, request.assayPct, reagents);
  const acidAssay = pickAssay("H2SO4", request.acidPurityPct, reagents);
  const done = (outcome: PlanOutcome): PlanProposal => ({ request, candidates, assay, acidAssay, outcome });
  const blendRequest = toBlendRequest(request, candidates);
  if (blendRequest.candidates.length === 0) {
    return done({
      ok: false,
      stage: "CANDIDATES",
      diagnosis: null,
      issues: [
        {
          code: "PLAN.NO_CANDIDATES",
          message: "No accepted lot or feedstock tank with stock and lab results is available to blend.",
          field: "targetOilKg",
        },
      ],
    });
  }
  const blend = await optimiseBlend(blendRequest);
  if (!blend.ok) {
    const diagnosis = await diagnoseBlend(blendRequest);
    return done({ ok: false, stage: "BLEND", issues: renameFields(blend.issues), diagnosis });
  }
  const inputs = toPretreatmentInput(request, blend.value.draws, candidates, assay, acidAssay);
  const parsed = parseInput(PretreatmentInputSchema, inputs);
  if (!parsed.ok) return done({ ok: false, stage: "RECIPE", issues: renameFields(parsed.issues), diagnosis: null });
  const plan = planPretreatment(parsed.value);
  if (!plan.ok) return done({ ok: false, stage: "RECIPE", issues: renameFields(plan.issues), diagnosis: null });
  const card = composeCard({ request, blend: blend.value, candidates, plan: plan.value, assay, acidAssay });
  return done({
    ok: true,
    blend: blend.value,
    plan: plan.value,
    card,
    stored: { format: CARD_FORMAT, inputs: parsed.value, card },
  });
}

// ---- after the batch: charges, outputs and yield ---------------------------------------------------

const StoredInputsSchema = z.object({ format: z.literal(CARD_FORMAT), inputs: PretreatmentInputSchema });

/** Recipes recorded before cards were stored (the demo's batches): the plan's headline figures only. */
const LegacyRecipeSchema = z.object({
  blendFfaPct: z.number().min(0).max(100),
  methanolKg: z.number().min(0),
  catalystKg: z.number().min(0),
  acidKg: z.number().min(0).default(0),
  pretreatMethanolKg: z.number().min(0).default(0),
  washWaterKg: z.number().min(0).default(0),
});

const FORCE_ACID_ROUTE = defineSourced(0, "% FFA", "batch recorded as pretreated", "computed");

export interface BatchFacts {
  recipeJson: string;
  pretreated: boolean;
  targetOilG: number;
  molarRatio: number;
  /** As stored; a value outside the catalyst list means no plan can be rebuilt. */
  catalyst: string;
  reactionTempC: number;
}

function toCatalyst(value: string): Catalyst | null {
  return (CATALYSTS as readonly string[]).includes(value) ? (value as Catalyst) : null;
}

/** The figures an actual batch is compared with: what to charge and what should come out. */
export interface PlannedFigures {
  basis: "card" | "legacy";
  /** Oil (feed) the plan is for, kg. */
  oilKg: number;
  /** Methanol to add over both steps, kg. */
  methanolKg: number;
  catalyst: Catalyst;
  catalystProductKg: number;
  acidProductKg: number;
  washWaterKg: number;
  expectedEsterKg: number;
  expectedGlycerolKg: number;
  /** Oil draws (card basis only). */
  draws: Array<{ kind: CandidateKind; code: string; massG: number }>;
  /** A plan in the recipe core's shape whose oil mass, ester, glycerol, catalyst and methanol are the figures above. */
  yieldPlan: RecipePlan;
  notes: string[];
}

function parseJson(json: string): unknown {
  try {
    return JSON.parse(json);
  } catch {
    return null;
  }
}

function asFeedPlan(
  plan: PretreatmentPlan,
  overrides: { methanolKg?: number; catalystProductKg?: number } = {},
): RecipePlan {
  const base = plan.baseStep;
  const feedKg = plan.acidStep?.feedKg ?? base.oil.massKg;
  const methanolKg = overrides.methanolKg ?? base.methanol.toAddKg + (plan.acidStep?.methanolKg ?? 0);
  return {
    ...base,
    oil: { ...base.oil, massKg: feedKg },
    methanol: { ...base.methanol, toAddKg: methanolKg },
    catalyst: { ...base.catalyst, productKg: overrides.catalystProductKg ?? base.catalyst.productKg },
  };
}

/** Rebuilds the plan a batch was recorded with; null when its stored recipe is in neither known form. */
export function readPlannedFigures(batch: BatchFacts): PlannedFigures | null {
  const catalyst = toCatalyst(batch.catalyst);
  if (catalyst === null) return null;
  const raw = parseJson(batch.recipeJson);
  const card = StoredInputsSchema.safeParse(raw);
  if (card.success) {
    const plan = planPretreatment(card.data.inputs);
    if (!plan.ok) return null;
    const p = plan.value;
    const yieldPlan = asFeedPlan(p);
    return {
      basis: "card",
      oilKg: yieldPlan.oil.massKg,
      methanolKg: yieldPlan.methanol.toAddKg,
      catalyst,
      catalystProductKg: p.baseStep.catalyst.productKg,
      acidProductKg: p.acidStep?.acidProductKg ?? 0,
      washWaterKg: p.baseStep.washWater.totalKg,
      expectedEsterKg: p.baseStep.products.fameKg,
      expectedGlycerolKg: p.baseStep.products.glycerolKg,
      draws: card.data.inputs.lots.flatMap((l) => {
        const ref = parseCandidateRef(l.lotRef);
        return ref === null ? [] : [{ ...ref, massG: Math.round(l.massKg * 1000) }];
      }),
      yieldPlan,
      notes: [],
    };
  }
  const legacy = LegacyRecipeSchema.safeParse(raw);
  if (!legacy.success) return null;
  const l = legacy.data;
  const lots = [{ lotRef: "batch", massKg: batch.targetOilG / 1000, ffaPct: l.blendFfaPct, waterPct: 0 }];
  const settings = { catalyst, molarRatio: batch.molarRatio, reactionTempC: batch.reactionTempC };
  let plan: Result<PretreatmentPlan>;
  if (batch.pretreated) {
    // The stored batch says it was pretreated: force the acid route whatever its FFA.
    plan = planPretreatment(
      { lots, settings },
      { directBaseMaxFfaPct: FORCE_ACID_ROUTE, baseCatalysisMaxFfaPct: FORCE_ACID_ROUTE },
    );
  } else {
    const base = planRecipe({ lots, settings });
    plan = base.ok
      ? ok({
          decision: {
            route: "DIRECT_BASE",
            ffaPct: l.blendFfaPct,
            directBaseMaxFfaPct: 0,
            baseCatalysisMaxFfaPct: 0,
            reason: "batch recorded without pretreatment",
          },
          acidStep: null,
          baseStep: base.value,
          warnings: [],
        })
      : base;
  }
  if (!plan.ok) return null;
  const methanolKg = l.methanolKg + l.pretreatMethanolKg;
  const yieldPlan = asFeedPlan(plan.value, { methanolKg, catalystProductKg: l.catalystKg });
  return {
    basis: "legacy",
    oilKg: yieldPlan.oil.massKg,
    methanolKg,
    catalyst,
    catalystProductKg: l.catalystKg,
    acidProductKg: l.acidKg,
    washWaterKg: l.washWaterKg,
    expectedEsterKg: plan.value.baseStep.products.fameKg,
    expectedGlycerolKg: plan.value.baseStep.products.glycerolKg,
    draws: [],
    yieldPlan,
    notes: [
      `Planned before recipe cards were stored: the theory is rebuilt from the batch's target oil, its recorded blend FFA ${l.blendFfaPct} % (water taken as 0 %) and its settings, with the default oil molar mass; planned methanol and catalyst are the batch's stored figures.`,
    ],
  };
}

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
