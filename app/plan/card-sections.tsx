import type { Caution, CautionStep, RecipeCard } from "@/lib/batch/plan";
import { PLAN_OBJECTIVE_LABELS } from "@/lib/batch/plan";
import type { SourcedValue } from "@/lib/chemistry/sourced-value";
import { levelOf, screenText } from "@/lib/spec/source-text";
import { labelOf } from "@/lib/core/vocabulary";
import { formatFixed } from "@/lib/quantity/units";
import { ConfidenceMark } from "@/app/_ui/kit";
import { TableHead, numeric } from "@/app/_ui/kit/table-head";

// The recipe card's steps, one component each; the card (recipe-card.tsx) puts them in order.

export function kgText(kg: number, d = 2): string {
  return `${formatFixed(kg, d)} kg`;
}

export function pctText(p: number, d = 2): string {
  return `${formatFixed(p, d)} %`;
}

export function StepCautions({ cautions, steps }: { cautions: readonly Caution[]; steps: readonly CautionStep[] }) {
  const shown = cautions.filter((c) => steps.includes(c.step));
  if (shown.length === 0) return null;
  return (
    <ul className="card-cautions">
      {shown.map((c) => (
        <li key={c.step}>
          <strong>Caution:</strong> {c.text}
        </li>
      ))}
    </ul>
  );
}

/** Step 1: what to draw from which lot or tank, with the blend against its limits. */
export function CardDraws({ card }: { card: RecipeCard }) {
  return (
    <section aria-labelledby="card-draws-h">
      <h3 id="card-draws-h">1. Oil to draw ({PLAN_OBJECTIVE_LABELS[card.objective]})</h3>
      <table>
        <TableHead
          headings={[
            "From",
            numeric("Mass"),
            numeric("FFA as oleic"),
            numeric("Water"),
            { header: "Drawn", align: "tick" },
          ]}
        />
        <tbody>
          {card.draws.map((d) => (
            <tr key={d.ref}>
              <td>
                {d.kind === "LOT" ? "Lot" : "Tank"} <span className="code">{d.code}</span>
              </td>
              <td className="num">{kgText(d.massG / 1000, 3)}</td>
              <td className="num">{pctText(d.ffaPct)}</td>
              <td className="num">{pctText(d.waterPct, 3)}</td>
              <td className="tick">☐</td>
            </tr>
          ))}
        </tbody>
        <tfoot>
          <tr>
            <td>Blend</td>
            <td className="num">{kgText(card.blend.massG / 1000, 3)}</td>
            <td className="num">
              {pctText(card.blend.ffaPct)} <span className="muted">(limit {pctText(card.blend.maxFfaPct)})</span>
            </td>
            <td className="num">
              {pctText(card.blend.waterPct, 3)}{" "}
              <span className="muted">(limit {pctText(card.blend.maxWaterPct, 3)})</span>
            </td>
            <td />
          </tr>
        </tfoot>
      </table>
      <p className="note">{card.route.reason}</p>
    </section>
  );
}

/** The acid step: methanol and sulfuric acid for the FFA, then settle and titrate. */
export function CardAcidStep({ card, acid }: { card: RecipeCard; acid: NonNullable<RecipeCard["acidStep"]> }) {
  return (
    <section aria-labelledby="card-acid-h">
      <h3 id="card-acid-h">2. Acid step: esterify the free fatty acids</h3>
      <dl className="card-figures">
        <div>
          <dt>Methanol</dt>
          <dd>
            {kgText(acid.methanolKg)} ({formatFixed(acid.methanolL20C, 1)} L at 20 °C) —{" "}
            {formatFixed(acid.methanolToFfaMolarRatio, 0)} : 1 on the FFA
          </dd>
        </div>
        <div>
          <dt>Sulfuric acid</dt>
          <dd>
            {kgText(acid.acidProductKg, 3)} of {formatFixed(acid.acidPurityPct, 1)} % acid ({kgText(acid.acidPureKg, 3)}{" "}
            as H₂SO₄, {formatFixed(acid.acidPctOfFfa, 1)} % of the FFA)
          </dd>
        </div>
        <div>
          <dt>Water formed</dt>
          <dd>{kgText(acid.waterFormedKg)}</dd>
        </div>
        <div>
          <dt>Then</dt>
          <dd>
            settle and draw off the alcohol/water phase (≈ {kgText(acid.alcoholPhaseKg, 1)}); the oil phase (≈{" "}
            {kgText(acid.oilPhaseKg, 1)}) should test below {pctText(acid.residualFfaPct, 1)} FFA before the base step —
            titrate it.
          </dd>
        </div>
      </dl>
      <StepCautions cautions={card.cautions} steps={["ACID", "METHANOL"]} />
    </section>
  );
}

/** The base step: methanol and catalyst, the oil going in and the site's water limit for the step. */
export function CardBaseStep({ card, waterLimit }: { card: RecipeCard; waterLimit: SourcedValue }) {
  const base = card.baseStep;
  const acid = card.acidStep;
  const methoxide = base.catalyst.assayKind === "SOLUTION_STRENGTH";
  return (
    <section aria-labelledby="card-base-h">
      <h3 id="card-base-h">{acid ? "3" : "2"}. Base step: transesterification</h3>
      <dl className="card-figures">
        <div>
          <dt>Methanol to add</dt>
          <dd>
            <strong>{kgText(base.methanol.toAddKg)}</strong> ({formatFixed(base.methanol.toAddL20C, 1)} L at 20 °C)
          </dd>
        </div>
        {methoxide ? (
          <div>
            <dt>Methanol in the methoxide solution</dt>
            <dd>{kgText(base.methanol.fromCatalystSolutionKg)} — counted toward the charge</dd>
          </div>
        ) : null}
        <div>
          <dt>Methanol in the reactor</dt>
          <dd>
            {kgText(base.methanol.totalKg)} ({formatFixed(base.molarRatio, 1)} : 1 asks for{" "}
            {kgText(base.methanol.chargeKg)})
          </dd>
        </div>
        <div>
          <dt>{labelOf(base.catalyst.type)}</dt>
          <dd>
            <strong>{kgText(base.catalyst.productKg, 3)}</strong> of {formatFixed(base.catalyst.assayPct, 1)} %{" "}
            {methoxide ? "solution" : "product"} ({kgText(base.catalyst.pureKg, 3)} pure:{" "}
            {kgText(base.catalyst.baseKg, 3)} base dose + {kgText(base.catalyst.neutralisationKg, 3)} to neutralise the
            FFA). Strength from {base.catalyst.assaySource}.
          </dd>
        </div>
        <div>
          <dt>Oil into this step</dt>
          <dd>
            {kgText(base.oilKg, 1)} at {pctText(base.ffaPct)} FFA as {(base.ffaBasis ?? "OLEIC").toLowerCase()}
            {base.acidValueMgKohG === undefined ? "" : ` (acid value ${formatFixed(base.acidValueMgKohG, 2)} mg KOH/g)`}
            , {pctText(base.waterPct, 3)} water; the FFA is neutralised by its moles as{" "}
            {(base.ffaBasis ?? "OLEIC").toLowerCase()} acid
          </dd>
        </div>
        {base.meanTgMolarMass === undefined ? null : (
          <div>
            <dt>Mean oil molar mass</dt>
            <dd>
              {formatFixed(base.meanTgMolarMass, 1)} g/mol
              {base.molarMassFromSv
                ? ` from saponification value ${formatFixed(base.molarMassFromSv.saponificationValueMgKohG, 1)} mg KOH/g: 3 × 56.1 × 1000 ÷ (${formatFixed(base.molarMassFromSv.saponificationValueMgKohG, 1)} − ${formatFixed(base.molarMassFromSv.acidValueMgKohG, 2)} acid value)`
                : ""}
            </dd>
          </div>
        )}
        <div>
          <dt>Water limit for this step</dt>
          <dd>
            {pctText(waterLimit.value, 2)} ({screenText(waterLimit.source)}){" "}
            <ConfidenceMark
              level={waterLimit.source.startsWith("the site's own choice") ? "site choice" : levelOf(waterLimit.status)}
              anchor="recipe-maxWaterPct"
            />
          </dd>
        </div>
        <div>
          <dt>Reaction temperature</dt>
          <dd>{formatFixed(base.reactionTempC, 1)} °C</dd>
        </div>
      </dl>
      <StepCautions cautions={card.cautions} steps={acid ? ["CATALYST"] : ["METHANOL", "CATALYST"]} />
    </section>
  );
}

/** What the batch should give at full conversion. */
export function CardExpected({ card }: { card: RecipeCard }) {
  const acid = card.acidStep;
  return (
    <section aria-labelledby="card-out-h">
      <h3 id="card-out-h">{acid ? "4" : "3"}. Expected at full conversion</h3>
      <dl className="card-figures">
        <div>
          <dt>Ester</dt>
          <dd>{kgText(card.expected.esterKg, 1)}</dd>
        </div>
        <div>
          <dt>Glycerol (pure)</dt>
          <dd>
            {kgText(card.expected.glycerolKg, 1)} — the glycerol phase is heavier: it carries methanol, soap and
            catalyst
          </dd>
        </div>
        <div>
          <dt>Soap</dt>
          <dd>{kgText(card.expected.soapKg, 1)}</dd>
        </div>
        <div>
          <dt>Methanol left over</dt>
          <dd>{kgText(card.expected.excessMethanolKg, 1)} to recover</dd>
        </div>
        <div>
          <dt>Wash water</dt>
          <dd>
            {kgText(card.expected.washWaterKg, 1)} over {card.expected.washes} wash
            {card.expected.washes === 1 ? "" : "es"}
          </dd>
        </div>
        <div>
          <dt>Methanol, all steps</dt>
          <dd>
            {kgText(card.methanolTotal.kg)} ({formatFixed(card.methanolTotal.l20C, 1)} L at 20 °C)
          </dd>
        </div>
      </dl>
      <StepCautions cautions={card.cautions} steps={["GLYCEROL"]} />
    </section>
  );
}
