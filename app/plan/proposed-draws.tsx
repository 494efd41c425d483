import Link from "next/link";
import type { PlanOutcome } from "@/lib/batch/plan";
import type { SourcedValue } from "@/lib/chemistry/sourced-value";
import { kg, pct } from "@/app/_ui/format";
import { RecipeCardView } from "@/app/plan/recipe-card";
import { RecordPlanForm } from "@/app/plan/record-form";
import { TableHead, numeric } from "@/app/_ui/kit/table-head";

/** The draws proposed for a plan that worked out, its card, and (for production) the form to record it. */
export function ProposedDraws({
  outcome,
  query,
  printedAt,
  canWrite,
  suggestedCode,
  baseWaterLimit,
}: {
  outcome: Extract<PlanOutcome, { ok: true }>;
  query: string;
  printedAt: string;
  canWrite: boolean;
  suggestedCode: string;
  baseWaterLimit: SourcedValue;
}) {
  return (
    <section aria-labelledby="proposal-h">
      <h2 id="proposal-h">Proposed draws</h2>
      <div className="table-wrap">
        <table>
          <TableHead headings={["Draw from", numeric("Mass"), numeric("FFA as oleic"), numeric("Water")]} />
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
      <RecipeCardView card={outcome.card} printedAt={printedAt} waterLimit={baseWaterLimit} />
      {canWrite ? (
        <>
          <h2>Record as planned</h2>
          <RecordPlanForm query={query} suggestedCode={suggestedCode} />
        </>
      ) : null}
    </section>
  );
}
