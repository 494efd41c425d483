import type { BalanceReport } from "@/lib/mass-balance/balance.service";
import { kgExact } from "@/app/_ui/format";
import { Empty, HolderLink } from "@/app/_ui/ui";
import { BatchTable } from "@/app/balance/balance-tables";
import { ClosureChip } from "@/app/balance/closure";

const CHARGED: ReadonlyArray<[string, string]> = [
  ["OIL", "Oil"],
  ["METHANOL", "Methanol"],
  ["CATALYST", "Catalyst"],
  ["ACID", "Acid"],
  ["WATER", "Water (batches booked before washing was recorded apart)"],
];
const DRAWN_OFF: ReadonlyArray<[string, string]> = [
  ["ESTER", "Product (methyl ester)"],
  ["GLYCEROL_PHASE", "Glycerol phase"],
  ["WASH_WATER", "Washed out with the wash water (the water itself left out)"],
  ["RECOVERED_METHANOL", "Recovered methanol"],
  ["LOSS", "Recorded losses"],
];

function RoleRows({
  side,
  roles,
  byRole,
}: {
  side: string;
  roles: typeof CHARGED;
  byRole: Partial<Record<string, number>>;
}) {
  return roles.map(([role, label]) => (
    <tr key={`${side}-${role}`}>
      <td>{label}</td>
      <td className="num">{kgExact(byRole[role] ?? 0)}</td>
    </tr>
  ));
}

/** The batches finished in the period as one identity (charged = drawn off + unmeasured), then each batch. */
export function ProcessTable({ r }: { r: BalanceReport }) {
  const p = r.process;
  if (p.completed.length === 0 && p.inProgress.length === 0) return <Empty>No batch ran in this period.</Empty>;
  const flagged = p.completed.filter((b) => b.closure.flag !== "OK");
  return (
    <>
      <div className="table-wrap" tabIndex={0} role="region" aria-label="Batches finished, closure">
        <table className="identity">
          <caption>
            {p.completed.length} batches finished: charged = measured out + recorded losses + unmeasured difference{" "}
            <ClosureChip closure={p.closure} />
          </caption>
          <tbody>
            <tr className="group">
              <td colSpan={2}>Charged</td>
            </tr>
            <RoleRows side="in" roles={CHARGED} byRole={p.inputsByRole} />
            <tr className="group">
              <td>Total charged</td>
              <td className="num">{kgExact(p.inputsG)}</td>
            </tr>
            <tr className="group">
              <td colSpan={2}>Drawn off</td>
            </tr>
            <RoleRows side="out" roles={DRAWN_OFF} byRole={p.outputsByRole} />
            <tr>
              <td>Unmeasured difference</td>
              <td className="num">{kgExact(p.imbalanceG)}</td>
            </tr>
          </tbody>
          <tfoot>
            <tr>
              <td>Total drawn off + unmeasured difference</td>
              <td className="num">{kgExact(p.outputsG + p.imbalanceG)}</td>
            </tr>
          </tfoot>
        </table>
      </div>
      {flagged.length > 0 ? (
        <p className="warning" data-testid="batches-above-tolerance">
          Above tolerance:{" "}
          {flagged.map((b, i) => (
            <span key={b.holderId}>
              {i > 0 ? ", " : ""}
              <HolderLink holder={{ kind: "BATCH", code: b.code }} showKind={false} /> {kgExact(b.imbalanceG)}{" "}
              <ClosureChip closure={b.closure} what="of the charge" />
            </span>
          ))}
        </p>
      ) : null}
      <details className="more-rows">
        <summary>
          Each batch ({p.completed.length} finished
          {p.inProgress.length > 0 ? `, ${p.inProgress.length} still in progress at the period end` : ""})
        </summary>
        <BatchTable rows={[...p.completed, ...p.inProgress]} />
      </details>
    </>
  );
}
