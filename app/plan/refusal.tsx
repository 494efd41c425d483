import type { PlanProposal } from "@/lib/batch/plan";
import { num, pct } from "@/app/_ui/format";
import { Note } from "@/app/_ui/ui";

/** Why no plan came out: the failing limit and what the stock can give. */
export function Refusal({ proposal, waterLimitPct }: { proposal: PlanProposal; waterLimitPct: number }) {
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
            <dd>{d.minWaterPct === null ? "—" : `${pct(d.minWaterPct, 3)} (limit ${pct(waterLimitPct, 3)})`}</dd>
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
