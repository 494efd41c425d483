import Link from "next/link";
import { labelOf } from "@/lib/core/vocabulary";
import { DEFAULT_COST_PER_KG } from "@/lib/batch/plan";
import type { PlanCandidate } from "@/lib/batch/plan";
import { kg, num, pct } from "@/app/_ui/format";
import { Empty } from "@/app/_ui/ui";
import { firstParam } from "@/app/plan/plan-query";
import type { SearchParams } from "@/app/plan/plan-query";
import { TableHead, numeric } from "@/app/_ui/kit/table-head";

function CandidateRow({
  c,
  cost,
  costError,
  excluded,
  drawnG,
}: {
  c: PlanCandidate;
  cost: string;
  costError: string | undefined;
  excluded: boolean;
  drawnG: number | undefined;
}) {
  const costName = `cost.${c.ref}`;
  return (
    <tr key={c.ref}>
      <td>
        {c.kind === "LOT" ? "Lot" : "Tank"}{" "}
        <Link href={c.kind === "LOT" ? `/lots/${encodeURIComponent(c.code)}` : `/tanks/${encodeURIComponent(c.code)}`}>
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
          defaultValue={cost}
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
          defaultChecked={excluded}
          aria-label={`Leave out ${c.code}`}
        />
      </td>
      <td className="num">{drawnG === undefined ? "" : kg(drawnG)}</td>
    </tr>
  );
}

/** The accepted lots and feedstock tanks the planner may draw from, with costs and leave-outs. */
export function CandidatesTable({
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
        <TableHead
          headings={[
            "From",
            "Material or tank",
            numeric("Holds"),
            numeric("FFA as oleic"),
            numeric("Water"),
            numeric("Age"),
            "Cost per kg",
            "Leave out",
            numeric("Proposed draw"),
          ]}
        />
        <tbody>
          {candidates.map((c) => (
            <CandidateRow
              key={c.ref}
              c={c}
              cost={firstParam(params, `cost.${c.ref}`)}
              costError={errors[`costs.${c.ref}`]}
              excluded={excluded.has(c.ref)}
              drawnG={drawn.get(c.ref)}
            />
          ))}
        </tbody>
      </table>
    </div>
  );
}
