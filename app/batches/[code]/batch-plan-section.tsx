import Link from "next/link";
import type { BatchDetail } from "@/lib/batch/batch.store";
import { computeRecordedYield } from "@/lib/batch/plan";
import type { BatchYield, UsageComparison } from "@/lib/recipe/yield";
import { num } from "@/app/_ui/format";
import { loadSite } from "@/app/_ui/site";
import { Note } from "@/app/_ui/ui";
import { TableHead, numeric } from "@/app/_ui/kit/table-head";

function Usage({ label, u }: { label: string; u: UsageComparison }) {
  return (
    <tr>
      <th scope="row">{label}</th>
      <td className="num">{num(u.plannedKg, 3)} kg</td>
      <td className="num">{num(u.actualKg, 3)} kg</td>
      <td className="num">
        {u.deltaKg >= 0 ? "+" : ""}
        {num(u.deltaKg, 3)} kg
      </td>
      <td className="num">{u.ratio === null ? "—" : `${num(u.ratio * 100, 1)} %`}</td>
    </tr>
  );
}

function YieldFacts({ y }: { y: BatchYield }) {
  return (
    <dl className="facts">
      <div>
        <dt>Ester vs theory</dt>
        <dd data-testid="ester-yield">{num(y.esterYieldVsTheory * 100, 1)} %</dd>
      </div>
      <div>
        <dt>Ester per kg oil</dt>
        <dd>{num(y.esterPerKgOil, 3)} kg</dd>
      </div>
      <div>
        <dt>Theoretical ester</dt>
        <dd>{num(y.theoreticalEsterKg, 1)} kg</dd>
      </div>
      <div>
        <dt>Glycerol phase per kg oil</dt>
        <dd>
          {num(y.glycerolPhasePerKgOil, 3)} kg{" "}
          <span className="muted">(pure glycerol in theory {num(y.theoreticalGlycerolPerKgOil, 3)} kg)</span>
        </dd>
      </div>
    </dl>
  );
}

/** On the batch page: the link to record the start or finish, and the computed yield once the batch is finished. */
export async function BatchPlanSection({ batch }: { batch: BatchDetail }) {
  const { user } = await loadSite();
  const href = `/batches/${encodeURIComponent(batch.code)}/record`;
  const recordLink =
    user.role === "PRODUCTION" && (batch.status === "PLANNED" || batch.status === "RUNNING") ? (
      <p>
        <Link href={href} className="button-link">
          {batch.status === "PLANNED" ? "Record the start (charges)" : "Record the finish (outputs)"}
        </Link>
      </p>
    ) : null;
  if (batch.status !== "COMPLETE") return recordLink;
  const y = computeRecordedYield(batch, batch.charges, batch.outputs);
  return (
    <section aria-labelledby="yield-h">
      <h2 id="yield-h">Yield</h2>
      {!y.ok ? (
        <Note>{y.issues.map((i) => i.message).join(" ")}</Note>
      ) : (
        <>
          <YieldFacts y={y.value.yield} />
          <div className="table-wrap">
            <table>
              <caption>Used vs planned (scaled to the oil charged)</caption>
              <TableHead
                headings={["Reagent", numeric("Planned"), numeric("Used"), numeric("Difference"), numeric("Of plan")]}
              />
              <tbody>
                <Usage label="Catalyst (as bought)" u={y.value.yield.catalyst} />
                <Usage label="Methanol" u={y.value.yield.methanol} />
              </tbody>
            </table>
          </div>
          {y.value.yield.warnings.map((w, i) => (
            <p key={`${w.code}-${i}`} className="warning">
              {w.message}
            </p>
          ))}
          {y.value.planned.notes.map((n) => (
            <Note key={n}>{n}</Note>
          ))}
        </>
      )}
    </section>
  );
}
