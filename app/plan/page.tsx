import type { Metadata } from "next";
import Link from "next/link";
import type { ReactNode } from "react";
import type { DomainIssue } from "@/lib/core/result";
import { CATALYSTS, labelOf } from "@/lib/core/vocabulary";
import { BLEND_OBJECTIVES } from "@/lib/blend/blend.schema";
import {
  DEFAULT_BLEND_LIMITS,
  DEFAULT_COST_PER_KG,
  PLAN_OBJECTIVE_LABELS,
  blendWaterLimit,
  buildCandidates,
} from "@/lib/batch/plan";
import type { PlanCandidate, PlanProposal } from "@/lib/batch/plan";
import { loadPlanStock } from "@/lib/batch/plan.store";
import { proposeBatchPlan } from "@/lib/batch/plan.service";
import { listBatches } from "@/lib/batch/batch.store";
import { DEFAULT_RECIPE_LIMITS, DEFAULT_RECIPE_SETTINGS, WATER_LIMIT_BY_STEP } from "@/lib/recipe/recipe-defaults";
import { levelOf, screenText } from "@/lib/spec/source-text";
import { ConfidenceMark } from "@/app/_ui/kit";
import { DEFAULT_ACID_STEP_SETTINGS, DEFAULT_PRETREATMENT_LIMITS } from "@/lib/recipe/pretreatment";
import { kg, num, pct, when } from "@/app/_ui/format";
import { loadSite } from "@/app/_ui/site";
import { Empty, NoSite, Note } from "@/app/_ui/ui";
import { toFormErrors } from "@/app/_ui/kit/form-state";
import { RecipeCardView } from "@/app/plan/recipe-card";
import { RecordPlanForm } from "@/app/plan/record-form";
import {
  PLAN_NUMBER_FIELDS,
  PLAN_TEXT_FIELDS,
  firstParam,
  planQueryString,
  planRequestFromParams,
} from "@/app/plan/plan-query";
import type { SearchParams } from "@/app/plan/plan-query";

export const dynamic = "force-dynamic";
export const metadata: Metadata = { title: "Plan a batch" };

const KNOWN_FIELDS: string[] = [...PLAN_NUMBER_FIELDS, ...PLAN_TEXT_FIELDS];

function nextBatchCode(latest: string | undefined): string {
  const m = latest ? /^(.*?)(\d+)$/.exec(latest) : null;
  if (!m || m[1] === undefined || m[2] === undefined) return "B-0001";
  return `${m[1]}${String(Number(m[2]) + 1).padStart(m[2].length, "0")}`;
}

function Field({
  name,
  label,
  params,
  errors,
  hint,
  placeholder,
}: {
  name: string;
  label: string;
  params: SearchParams;
  errors: Record<string, string>;
  hint?: ReactNode;
  placeholder?: string;
}) {
  const error = errors[name];
  return (
    <div className="field">
      <label>
        {label}
        <input
          name={name}
          inputMode="decimal"
          autoComplete="off"
          defaultValue={firstParam(params, name)}
          placeholder={placeholder}
          aria-invalid={error ? true : undefined}
          aria-describedby={error ? `${name}-err` : undefined}
        />
      </label>
      {error ? (
        <span className="field-error" id={`${name}-err`}>
          {error}
        </span>
      ) : null}
      {hint ? <span className="hint">{hint}</span> : null}
    </div>
  );
}

function CandidatesTable({
  candidates,
  params,
  errors,
  drawn,
}: {
  candidates: PlanCandidate[];
  params: SearchParams;
  errors: Record<string, string>;
  drawn: Map<string, number>;
}) {
  const excluded = new Set(Array.isArray(params.exclude) ? params.exclude : params.exclude ? [params.exclude] : []);
  if (candidates.length === 0) return <Empty>No accepted lot or feedstock tank holds stock.</Empty>;
  return (
    <div className="table-wrap">
      <table>
        <caption>Candidates: accepted lots with stock and feedstock tanks</caption>
        <thead>
          <tr>
            <th scope="col">From</th>
            <th scope="col">Material or tank</th>
            <th scope="col" className="num">
              Holds
            </th>
            <th scope="col" className="num">
              FFA as oleic
            </th>
            <th scope="col" className="num">
              Water
            </th>
            <th scope="col" className="num">
              Age
            </th>
            <th scope="col">Cost per kg</th>
            <th scope="col">Leave out</th>
            <th scope="col" className="num">
              Proposed draw
            </th>
          </tr>
        </thead>
        <tbody>
          {candidates.map((c) => {
            const costName = `cost.${c.ref}`;
            const costError = errors[`costs.${c.ref}`];
            return (
              <tr key={c.ref}>
                <td>
                  {c.kind === "LOT" ? "Lot" : "Tank"}{" "}
                  <Link
                    href={
                      c.kind === "LOT" ? `/lots/${encodeURIComponent(c.code)}` : `/tanks/${encodeURIComponent(c.code)}`
                    }
                  >
                    {c.code}
                  </Link>
                </td>
                <td>
                  {c.kind === "LOT" ? labelOf(c.label) : c.label}
                  {c.kind === "TANK" && c.ffaPct !== null && c.ffaCoveredPct < 99.95 ? (
                    <span className="tag">results for {num(c.ffaCoveredPct, 0)} % of contents</span>
                  ) : null}
                  {c.leftOutBecause && c.leftOutBecause !== "left out by the planner" ? (
                    <span className="tag">not offered: {c.leftOutBecause}</span>
                  ) : null}
                </td>
                <td className="num">{kg(c.availableG)}</td>
                <td className="num">{c.ffaPct === null ? "—" : pct(c.ffaPct)}</td>
                <td className="num">{c.waterPct === null ? "—" : pct(c.waterPct, 3)}</td>
                <td className="num">{num(c.ageDays, 0)} d</td>
                <td>
                  <input
                    className="narrow"
                    name={costName}
                    inputMode="decimal"
                    aria-label={`Cost per kg, ${c.code}`}
                    defaultValue={firstParam(params, costName)}
                    placeholder={String(DEFAULT_COST_PER_KG.value)}
                    aria-invalid={costError ? true : undefined}
                  />
                  {costError ? <span className="field-error">{costError}</span> : null}
                </td>
                <td>
                  <input
                    type="checkbox"
                    name="exclude"
                    value={c.ref}
                    defaultChecked={excluded.has(c.ref)}
                    aria-label={`Leave out ${c.code}`}
                  />
                </td>
                <td className="num">{drawn.has(c.ref) ? kg(drawn.get(c.ref) ?? 0) : ""}</td>
              </tr>
            );
          })}
        </tbody>
      </table>
    </div>
  );
}

function Refusal({ proposal }: { proposal: PlanProposal }) {
  const o = proposal.outcome;
  if (o.ok) return null;
  const d = o.diagnosis;
  return (
    <section aria-labelledby="refusal-h" className="refusal">
      <h2 id="refusal-h">
        {o.stage === "BLEND"
          ? "No blend meets the limits"
          : o.stage === "CANDIDATES"
            ? "Nothing to blend"
            : "The recipe cannot be planned"}
      </h2>
      <ul>
        {o.issues.map((i, n) => (
          <li key={`${i.code}-${n}`} className="form-error">
            {i.message}
          </li>
        ))}
      </ul>
      {d ? (
        <dl className="facts">
          <div>
            <dt>Usable stock</dt>
            <dd>
              {num(d.usableStockKg, 1)} kg for a target of {num(d.targetKg, 1)} kg
            </dd>
          </div>
          <div>
            <dt>Lowest FFA this stock can give</dt>
            <dd>
              {d.minFfaPct === null ? "—" : `${pct(d.minFfaPct, 3)} (limit ${pct(proposal.request.maxFfaPct, 3)})`}
            </dd>
          </div>
          <div>
            <dt>Lowest water this stock can give</dt>
            <dd>
              {d.minWaterPct === null
                ? "—"
                : `${pct(d.minWaterPct, 3)} (limit ${pct(blendWaterLimit(proposal.request).value, 3)})`}
            </dd>
          </div>
          <div>
            <dt>Lowest FFA within the water limit</dt>
            <dd>
              {d.minFfaPctWithinWaterLimit === null
                ? "none meets the water limit"
                : pct(d.minFfaPctWithinWaterLimit, 3)}
            </dd>
          </div>
        </dl>
      ) : null}
      <Note>
        Relax the limit that fails, lower the target, or leave fewer candidates out. Stock with a high FFA can still be
        used in a batch with acid pretreatment.
      </Note>
    </section>
  );
}

export default async function PlanPage({ searchParams }: { searchParams: Promise<SearchParams> }) {
  const { db, site, user } = await loadSite();
  if (!site) return <NoSite />;
  const params = await searchParams;
  // Any query means the form was sent: a missing target is then an error next to its field.
  const asked = Object.keys(params).length > 0;
  const actor = { siteId: site.id, userId: user.userId, now: user.now };
  const proposal = asked ? await proposeBatchPlan(db, actor, planRequestFromParams(params)) : null;
  const candidates = proposal?.ok
    ? proposal.value.candidates
    : buildCandidates(
        await loadPlanStock(db, site.id),
        { costs: {}, defaultCostPerKg: DEFAULT_COST_PER_KG.value, exclude: [] },
        user.now,
      );
  const issues: DomainIssue[] =
    proposal === null
      ? []
      : proposal.ok
        ? proposal.value.outcome.ok
          ? []
          : proposal.value.outcome.issues
        : proposal.issues;
  const { errors, general } = toFormErrors(issues, [...KNOWN_FIELDS, ...candidates.map((c) => `costs.${c.ref}`)]);
  const outcome = proposal?.ok ? proposal.value.outcome : null;
  const drawn = new Map(outcome?.ok ? outcome.blend.draws.map((d) => [d.ref, d.massG]) : []);
  const query = planQueryString(params);
  const latest = (await listBatches(db, site.id, { take: 1 })).rows[0]?.code;
  const catalyst = firstParam(params, "catalyst") || "KOH";
  const objective = firstParam(params, "objective") || "OLDEST_FIRST";
  const canWrite = user.role === "PRODUCTION";

  return (
    <>
      <h1>Plan a batch</h1>
      <p className="lede">
        Say how much oil the batch takes and the blend limits; the planner proposes what to draw from accepted lots and
        feedstock tanks, then works out the recipe for that blend — with acid pretreatment when its FFA needs it — as a
        printable card.
      </p>
      {!canWrite ? <Note>Anyone can work out a plan here; only production staff can record it.</Note> : null}
      <aside className="cautions" aria-label="Cautions for the batch">
        <p className="cautions-title">Before anyone charges the reactor</p>
        <ul>
          <li>
            Methanol is toxic and highly flammable; its vapour ignites easily. No ignition sources; ventilate; keep
            containers closed.
          </li>
          <li>
            Sodium and potassium hydroxide and methoxide are corrosive and react with water, giving off heat: eye and
            face protection, gloves.
          </li>
          <li>Sulfuric acid for pretreatment is corrosive: add acid to methanol slowly, never the reverse.</li>
          <li>
            Hot oil burns and spatters if water is present; keep the reaction below methanol&apos;s boiling point unless
            the vessel is rated for it.
          </li>
          <li>
            Work to the safety data sheets, the plant&apos;s procedures and local fire and building codes. The recipe
            card repeats these at each step.
          </li>
        </ul>
      </aside>

      <form method="get" action="/plan" className="plan-form" noValidate aria-label="Plan settings">
        <fieldset>
          <legend>Batch and blend</legend>
          <div className="lab-grid">
            <Field
              name="targetOilKg"
              label="Oil to charge (kg)"
              params={params}
              errors={errors}
              placeholder="e.g. 7000"
            />
            <Field
              name="maxFfaPct"
              label="Blend FFA limit (%)"
              params={params}
              errors={errors}
              placeholder={String(DEFAULT_BLEND_LIMITS.maxFfaPct.value)}
              hint={`Default ${DEFAULT_BLEND_LIMITS.maxFfaPct.value} %: ${DEFAULT_BLEND_LIMITS.maxFfaPct.source}`}
            />
            <Field
              name="maxWaterPct"
              label="Blend water limit (%)"
              params={params}
              errors={errors}
              placeholder="the step's limit"
              hint={
                <>
                  Empty: the limit of the step the blend goes into first — base step{" "}
                  {WATER_LIMIT_BY_STEP.BASE_STEP.value} % ({screenText(WATER_LIMIT_BY_STEP.BASE_STEP.source)}){" "}
                  <ConfidenceMark level={levelOf(WATER_LIMIT_BY_STEP.BASE_STEP.status)} anchor="recipe-maxWaterPct" />{" "}
                  when the FFA limit is below {DEFAULT_RECIPE_LIMITS.baseCatalysisMaxFfaPct.value} %, otherwise acid
                  step {WATER_LIMIT_BY_STEP.ACID_STEP.value} % ({screenText(WATER_LIMIT_BY_STEP.ACID_STEP.source)}){" "}
                  <ConfidenceMark
                    level={levelOf(WATER_LIMIT_BY_STEP.ACID_STEP.status)}
                    anchor="recipe-acidStepMaxWaterPct"
                  />
                  . The recipe warns against the same limits; dry the oil before the base step.
                </>
              }
            />
            <div className="field">
              <label>
                Objective
                <select name="objective" defaultValue={objective}>
                  {BLEND_OBJECTIVES.map((o) => (
                    <option key={o} value={o}>
                      {PLAN_OBJECTIVE_LABELS[o]}
                    </option>
                  ))}
                </select>
              </label>
              {errors.objective ? <span className="field-error">{errors.objective}</span> : null}
            </div>
            <Field
              name="minDrawKg"
              label="Smallest draw from a lot or tank (kg, optional)"
              params={params}
              errors={errors}
            />
            <Field
              name="defaultCostPerKg"
              label="Cost per kg when none is entered"
              params={params}
              errors={errors}
              placeholder={String(DEFAULT_COST_PER_KG.value)}
              hint={DEFAULT_COST_PER_KG.note}
            />
          </div>
        </fieldset>
        <fieldset>
          <legend>Recipe</legend>
          <div className="lab-grid">
            <div className="field">
              <label>
                Catalyst
                <select name="catalyst" defaultValue={catalyst}>
                  {CATALYSTS.map((c) => (
                    <option key={c} value={c}>
                      {labelOf(c)}
                    </option>
                  ))}
                </select>
              </label>
              {errors.catalyst ? <span className="field-error">{errors.catalyst}</span> : null}
            </div>
            <Field
              name="assayPct"
              label="Catalyst purity or solution strength (%)"
              params={params}
              errors={errors}
              placeholder="from the reagent lot"
              hint="From the supplier's certificate; when empty, the newest reagent lot in stock."
            />
            <Field
              name="molarRatio"
              label="Methanol : oil molar ratio"
              params={params}
              errors={errors}
              placeholder={String(DEFAULT_RECIPE_SETTINGS.molarRatio.value)}
              hint={DEFAULT_RECIPE_SETTINGS.molarRatio.source}
            />
            <Field
              name="reactionTempC"
              label="Reaction temperature (°C)"
              params={params}
              errors={errors}
              placeholder={String(DEFAULT_RECIPE_SETTINGS.reactionTempC.value)}
              hint="Keep below the methanol boiling point (64.7 °C at sea level) unless the vessel is built for it."
            />
            <Field
              name="baseDosePctOfOil"
              label="Base catalyst dose (% of oil, optional)"
              params={params}
              errors={errors}
              placeholder="catalyst default"
            />
            <Field
              name="saponificationValueMgKohG"
              label="Saponification value (mg KOH/g, optional)"
              params={params}
              errors={errors}
              placeholder="from the lab"
              hint="As the lab reports it (AOCS Cd 3-25 or ISO 3657). The card shows the oil molar mass worked out from it: 3 × 56.1 × 1000 ÷ (saponification value − acid value)."
            />
            <Field
              name="meanTgMolarMass"
              label="Or mean oil molar mass (g/mol, optional)"
              params={params}
              errors={errors}
              placeholder={num(DEFAULT_RECIPE_SETTINGS.meanTgMolarMass.value, 1)}
              hint="Only when no saponification value is given."
            />
            <Field
              name="washes"
              label="Washes"
              params={params}
              errors={errors}
              placeholder={String(DEFAULT_RECIPE_SETTINGS.washes.value)}
            />
            <Field
              name="waterPerWashPctOfEster"
              label="Water per wash (% of ester)"
              params={params}
              errors={errors}
              placeholder={String(DEFAULT_RECIPE_SETTINGS.waterPerWashPctOfEster.value)}
              hint={DEFAULT_RECIPE_SETTINGS.waterPerWashPctOfEster.note}
            />
          </div>
        </fieldset>
        <details
          className="acid-settings"
          open={["acidMethanolToFfaRatio", "acidPctOfFfa", "acidPurityPct", "residualFfaPct"].some(
            (n) => firstParam(params, n) !== "" || errors[n] !== undefined,
          )}
        >
          <summary>Acid pretreatment settings (used only when the blend FFA needs it)</summary>
          <div className="lab-grid">
            <Field
              name="acidMethanolToFfaRatio"
              label="Methanol : FFA molar ratio"
              params={params}
              errors={errors}
              placeholder={String(DEFAULT_ACID_STEP_SETTINGS.methanolToFfaMolarRatio.value)}
              hint={`${DEFAULT_ACID_STEP_SETTINGS.methanolToFfaMolarRatio.source} (${DEFAULT_ACID_STEP_SETTINGS.methanolToFfaMolarRatio.status})`}
            />
            <Field
              name="acidPctOfFfa"
              label="Sulfuric acid (% of FFA mass)"
              params={params}
              errors={errors}
              placeholder={String(DEFAULT_ACID_STEP_SETTINGS.acidPctOfFfa.value)}
              hint={`${DEFAULT_ACID_STEP_SETTINGS.acidPctOfFfa.source} (${DEFAULT_ACID_STEP_SETTINGS.acidPctOfFfa.status})`}
            />
            <Field
              name="acidPurityPct"
              label="Sulfuric acid assay (%)"
              params={params}
              errors={errors}
              placeholder="from the reagent lot"
            />
            <Field
              name="residualFfaPct"
              label="FFA left after the acid step (%)"
              params={params}
              errors={errors}
              placeholder={String(DEFAULT_PRETREATMENT_LIMITS.residualFfaTargetPct.value)}
              hint={DEFAULT_PRETREATMENT_LIMITS.residualFfaTargetPct.source}
            />
          </div>
        </details>
        <CandidatesTable candidates={candidates} params={params} errors={errors} drawn={drawn} />
        <Note>
          FFA is shown as oleic for every candidate so that lots titrated as palmitic or lauric compare and blend by
          their moles of acid. A tank&apos;s FFA and water are the mass-weighted means of the lab results of the lots it
          holds now, traced through the movement ledger. Costs are optional: the books hold no prices, so every
          candidate costs {DEFAULT_COST_PER_KG.value} per kg unless you enter one.
        </Note>
        {proposal !== null && !proposal.ok ? (
          <p className="form-error" role="alert">
            {general.length > 0 ? general.join(" ") : "Not planned: check the marked fields."}
          </p>
        ) : null}
        <button type="submit" className="primary">
          Propose draws and recipe
        </button>
      </form>

      {proposal?.ok ? <Refusal proposal={proposal.value} /> : null}

      {outcome?.ok ? (
        <section aria-labelledby="proposal-h">
          <h2 id="proposal-h">Proposed draws</h2>
          <div className="table-wrap">
            <table>
              <thead>
                <tr>
                  <th scope="col">Draw from</th>
                  <th scope="col" className="num">
                    Mass
                  </th>
                  <th scope="col" className="num">
                    FFA as oleic
                  </th>
                  <th scope="col" className="num">
                    Water
                  </th>
                </tr>
              </thead>
              <tbody>
                {outcome.card.draws.map((d) => (
                  <tr key={d.ref}>
                    <td>
                      {d.kind === "LOT" ? "Lot" : "Tank"} <span className="code">{d.code}</span>
                    </td>
                    <td className="num">{kg(d.massG, 3)}</td>
                    <td className="num">{pct(d.ffaPct)}</td>
                    <td className="num">{pct(d.waterPct, 3)}</td>
                  </tr>
                ))}
              </tbody>
              <tfoot>
                <tr>
                  <td>Blend</td>
                  <td className="num">{kg(outcome.blend.totalG, 3)}</td>
                  <td className="num">{pct(outcome.blend.blendFfaPct)}</td>
                  <td className="num">{pct(outcome.blend.blendWaterPct, 3)}</td>
                </tr>
              </tfoot>
            </table>
          </div>
          <p>
            <Link href={`/plan/card?${query}`}>Printable recipe card</Link>
          </p>
          <RecipeCardView card={outcome.card} printedAt={when(user.now, site.timeZone)} />
          {canWrite ? (
            <>
              <h2>Record as planned</h2>
              <RecordPlanForm query={query} suggestedCode={nextBatchCode(latest)} />
            </>
          ) : null}
        </section>
      ) : null}
    </>
  );
}
