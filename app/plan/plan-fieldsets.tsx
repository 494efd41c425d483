import Link from "next/link";
import type { ReactNode } from "react";
import { BLEND_OBJECTIVES } from "@/lib/blend/blend.schema";
import { CATALYSTS, labelOf } from "@/lib/core/vocabulary";
import { DEFAULT_BLEND_LIMITS, DEFAULT_COST_PER_KG, PLAN_OBJECTIVE_LABELS } from "@/lib/batch/plan";
import type { SourcedValue } from "@/lib/chemistry/sourced-value";
import { DEFAULT_RECIPE_LIMITS, DEFAULT_RECIPE_SETTINGS } from "@/lib/recipe/recipe-defaults";
import type { WaterLimits } from "@/lib/recipe/recipe-defaults";
import { DEFAULT_ACID_STEP_SETTINGS, DEFAULT_PRETREATMENT_LIMITS } from "@/lib/recipe/pretreatment";
import { levelOf, screenText } from "@/lib/spec/source-text";
import type { SourceLevel } from "@/lib/spec/source-text";
import { ConfidenceMark } from "@/app/_ui/kit";
import { num } from "@/app/_ui/format";
import { PlanChoice, PlanInputs } from "@/app/plan/plan-field";
import type { PlanInput } from "@/app/plan/plan-field";
import { firstParam } from "@/app/plan/plan-query";
import type { SearchParams } from "@/app/plan/plan-query";

interface FieldsetProps {
  params: SearchParams;
  errors: Record<string, string>;
}

/** A water limit the site set itself is its own choice; a default keeps its source's standing. */
export function waterLevel(v: SourcedValue): SourceLevel {
  return v.source.startsWith("the site's own choice") ? "site choice" : levelOf(v.status);
}

/** The short cautions shown before any figure: the card repeats them step by step. */
export function PlanCautions() {
  return (
    <aside className="cautions" aria-label="Cautions for the batch">
      <p className="cautions-title">Before anyone charges the reactor</p>
      <ul>
        <li>
          Methanol is toxic and highly flammable; its vapour ignites easily. No ignition sources; ventilate; keep
          containers closed.
        </li>
        <li>
          Sodium and potassium hydroxide and methoxide are corrosive and react with water, giving off heat: eye and face
          protection, gloves.
        </li>
        <li>Sulfuric acid for pretreatment is corrosive: add acid to methanol slowly, never the reverse.</li>
        <li>
          Hot oil burns and spatters if water is present; keep the reaction below methanol&apos;s boiling point unless
          the vessel is rated for it.
        </li>
        <li>
          Work to the safety data sheets, the plant&apos;s procedures and local fire and building codes. The recipe card
          repeats these at each step.
        </li>
      </ul>
    </aside>
  );
}

/** A default's hint: where it comes from and how firm it is. */
function sourcedHint(v: { source: string; status: string }): string {
  return `${v.source} (${v.status})`;
}

/** The blend water limit's hint: the site's limit for each step the blend may go into first. */
function WaterLimitHint({ water }: { water: WaterLimits }): ReactNode {
  return (
    <>
      Empty: the site&apos;s limit for the step the blend goes into first — base step{" "}
      <span data-testid="water-limit-base">{water.BASE_STEP.value} %</span> ({screenText(water.BASE_STEP.source)}){" "}
      <ConfidenceMark level={waterLevel(water.BASE_STEP)} anchor="recipe-maxWaterPct" /> when the FFA limit is below{" "}
      {DEFAULT_RECIPE_LIMITS.baseCatalysisMaxFfaPct.value} %, otherwise acid step{" "}
      <span data-testid="water-limit-acid">{water.ACID_STEP.value} %</span> ({screenText(water.ACID_STEP.source)}){" "}
      <ConfidenceMark level={waterLevel(water.ACID_STEP)} anchor="recipe-acidStepMaxWaterPct" />. The recipe warns
      against the same limits; dry the oil before the base step. <Link href="/limits">Site limits</Link>
    </>
  );
}

function blendInputs(water: WaterLimits): PlanInput[] {
  return [
    { name: "targetOilKg", label: "Oil to charge (kg)", placeholder: "e.g. 7000" },
    {
      name: "maxFfaPct",
      label: "Blend FFA limit (%)",
      placeholder: String(DEFAULT_BLEND_LIMITS.maxFfaPct.value),
      hint: `Default ${DEFAULT_BLEND_LIMITS.maxFfaPct.value} %: ${DEFAULT_BLEND_LIMITS.maxFfaPct.source}`,
    },
    {
      name: "maxWaterPct",
      label: "Blend water limit (%)",
      placeholder: "the step's limit",
      hint: <WaterLimitHint water={water} />,
    },
  ];
}

const DRAW_AND_COST_INPUTS: readonly PlanInput[] = [
  { name: "minDrawKg", label: "Smallest draw from a lot or tank (kg, optional)" },
  {
    name: "defaultCostPerKg",
    label: "Cost per kg when none is entered",
    placeholder: String(DEFAULT_COST_PER_KG.value),
    hint: DEFAULT_COST_PER_KG.note,
  },
];

/** Target, blend limits (the water limit is the site's, per step), objective and costs. */
export function BlendFieldset({
  params,
  errors,
  objective,
  water,
}: FieldsetProps & { objective: string; water: WaterLimits }) {
  return (
    <fieldset>
      <legend>Batch and blend</legend>
      <div className="lab-grid">
        <PlanInputs inputs={blendInputs(water)} params={params} errors={errors} />
        <PlanChoice
          name="objective"
          label="Objective"
          value={objective}
          options={BLEND_OBJECTIVES.map((o) => [o, PLAN_OBJECTIVE_LABELS[o]] as const)}
          errors={errors}
        />
        <PlanInputs inputs={DRAW_AND_COST_INPUTS} params={params} errors={errors} />
      </div>
    </fieldset>
  );
}

/** Catalyst strength, ratio, temperature, dose, the oil's saponification value or molar mass, and washing. */
const RECIPE_INPUTS: readonly PlanInput[] = [
  {
    name: "assayPct",
    label: "Catalyst purity or solution strength (%)",
    placeholder: "from the reagent lot",
    hint: "From the supplier's certificate; when empty, the newest reagent lot in stock.",
  },
  {
    name: "molarRatio",
    label: "Methanol : oil molar ratio",
    placeholder: String(DEFAULT_RECIPE_SETTINGS.molarRatio.value),
    hint: DEFAULT_RECIPE_SETTINGS.molarRatio.source,
  },
  {
    name: "reactionTempC",
    label: "Reaction temperature (°C)",
    placeholder: String(DEFAULT_RECIPE_SETTINGS.reactionTempC.value),
    hint: "Keep below the methanol boiling point (64.7 °C at sea level) unless the vessel is built for it.",
  },
  { name: "baseDosePctOfOil", label: "Base catalyst dose (% of oil, optional)", placeholder: "catalyst default" },
  {
    name: "saponificationValueMgKohG",
    label: "Saponification value (mg KOH/g, optional)",
    placeholder: "from the lab",
    hint: "As the lab reports it (AOCS Cd 3-25 or ISO 3657). The card shows the oil molar mass worked out from it: 3 × 56.1 × 1000 ÷ (saponification value − acid value).",
  },
  {
    name: "meanTgMolarMass",
    label: "Or mean oil molar mass (g/mol, optional)",
    placeholder: num(DEFAULT_RECIPE_SETTINGS.meanTgMolarMass.value, 1),
    hint: "Only when no saponification value is given.",
  },
  { name: "washes", label: "Washes", placeholder: String(DEFAULT_RECIPE_SETTINGS.washes.value) },
  {
    name: "waterPerWashPctOfEster",
    label: "Water per wash (% of ester)",
    placeholder: String(DEFAULT_RECIPE_SETTINGS.waterPerWashPctOfEster.value),
    hint: DEFAULT_RECIPE_SETTINGS.waterPerWashPctOfEster.note,
  },
];

/** Catalyst, ratio, temperature, oil molar mass (or saponification value) and washing. */
export function RecipeFieldset({ params, errors, catalyst }: FieldsetProps & { catalyst: string }) {
  return (
    <fieldset>
      <legend>Recipe</legend>
      <div className="lab-grid">
        <PlanChoice
          name="catalyst"
          label="Catalyst"
          value={catalyst}
          options={CATALYSTS.map((c) => [c, labelOf(c)] as const)}
          errors={errors}
        />
        <PlanInputs inputs={RECIPE_INPUTS} params={params} errors={errors} />
      </div>
    </fieldset>
  );
}

const ACID_INPUTS: readonly PlanInput[] = [
  {
    name: "acidMethanolToFfaRatio",
    label: "Methanol : FFA molar ratio",
    placeholder: String(DEFAULT_ACID_STEP_SETTINGS.methanolToFfaMolarRatio.value),
    hint: sourcedHint(DEFAULT_ACID_STEP_SETTINGS.methanolToFfaMolarRatio),
  },
  {
    name: "acidPctOfFfa",
    label: "Sulfuric acid (% of FFA mass)",
    placeholder: String(DEFAULT_ACID_STEP_SETTINGS.acidPctOfFfa.value),
    hint: sourcedHint(DEFAULT_ACID_STEP_SETTINGS.acidPctOfFfa),
  },
  { name: "acidPurityPct", label: "Sulfuric acid assay (%)", placeholder: "from the reagent lot" },
  {
    name: "residualFfaPct",
    label: "FFA left after the acid step (%)",
    placeholder: String(DEFAULT_PRETREATMENT_LIMITS.residualFfaTargetPct.value),
    hint: DEFAULT_PRETREATMENT_LIMITS.residualFfaTargetPct.source,
  },
];

/** The acid-step settings, open when one of them was entered or refused. */
export function AcidSettings({ params, errors }: FieldsetProps) {
  return (
    <details
      className="acid-settings"
      open={ACID_INPUTS.some((i) => firstParam(params, i.name) !== "" || errors[i.name] !== undefined)}
    >
      <summary>Acid pretreatment settings (used only when the blend FFA needs it)</summary>
      <div className="lab-grid">
        <PlanInputs inputs={ACID_INPUTS} params={params} errors={errors} />
      </div>
    </details>
  );
}
