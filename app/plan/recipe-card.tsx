import type { RecipeCard } from "@/lib/batch/plan";
import type { SourcedValue } from "@/lib/chemistry/sourced-value";
import { WATER_LIMIT_BY_STEP } from "@/lib/recipe/recipe-defaults";
import { labelOf } from "@/lib/core/vocabulary";
import { formatFixed } from "@/lib/quantity/units";
import { CardAcidStep, CardBaseStep, CardDraws, CardExpected, StepCautions, kgText } from "@/app/plan/card-sections";

const ROUTE_LABEL: Record<string, string> = {
  DIRECT_BASE: "Base catalysis",
  BASE_WITH_EXTRA_CATALYST: "Base catalysis with extra catalyst for the FFA",
  ACID_PRETREATMENT: "Acid pretreatment, then base catalysis",
};

/** The recipe card: what to draw, what to add at each step, what to expect, and the cautions at each step. */
export function RecipeCardView({
  card,
  heading = "Recipe card",
  printedAt,
  waterLimit = WATER_LIMIT_BY_STEP.BASE_STEP,
}: {
  card: RecipeCard;
  heading?: string;
  printedAt?: string;
  /** The site's water limit for the base step, shown beside the oil going into it. */
  waterLimit?: SourcedValue;
}) {
  const base = card.baseStep;
  const acid = card.acidStep;
  return (
    <article className="recipe-card" aria-labelledby="card-h">
      <header className="card-head">
        <h2 id="card-h">
          {heading}
          {card.code ? ` — batch ${card.code}` : ""}
        </h2>
        <p>
          {kgText(card.blend.massG / 1000, 1)} oil · {ROUTE_LABEL[card.route.route] ?? card.route.route} ·{" "}
          {labelOf(base.catalyst.type)} · {formatFixed(base.molarRatio, 1)} : 1 methanol ·{" "}
          {formatFixed(base.reactionTempC, 1)} °C{printedAt ? ` · printed ${printedAt}` : ""}
        </p>
      </header>

      <section aria-labelledby="card-safety-h" className="card-safety">
        <h3 id="card-safety-h">Before you start</h3>
        <StepCautions cautions={card.cautions} steps={["GENERAL", "HOT_OIL"]} />
      </section>

      <CardDraws card={card} />
      {acid ? <CardAcidStep card={card} acid={acid} /> : null}
      <CardBaseStep card={card} waterLimit={waterLimit} />
      <CardExpected card={card} />
      {card.warnings.length > 0 ? (
        <section aria-labelledby="card-warn-h">
          <h3 id="card-warn-h">Warnings</h3>
          <ul className="card-warnings">
            {card.warnings.map((w, i) => (
              <li key={`${w.code}-${i}`}>{w.message}</li>
            ))}
          </ul>
        </section>
      ) : null}
      <section aria-labelledby="card-notes-h">
        <h3 id="card-notes-h">Basis of the figures</h3>
        <ul className="note">
          {card.notes.map((n) => (
            <li key={n}>{n}</li>
          ))}
          <li>
            Planned figures at full conversion; record what was actually charged and what came out on the batch page.
          </li>
        </ul>
      </section>
    </article>
  );
}
