import type { LimitHistoryRow } from "@/lib/mass-balance/site-limits.store";
import { when } from "@/app/_ui/format";
import { TableHead } from "@/app/_ui/kit/table-head";

function what(r: LimitHistoryRow): string {
  if (r.closure) return `Closure tolerance: warn above ${r.closure.warnPct} %, fail above ${r.closure.failPct} %`;
  if (r.water) return `Water limits: base-catalysed step ${r.water.baseStepPct} %, acid step ${r.water.acidStepPct} %`;
  return "A version that no longer reads as a limit";
}

/** Every saved version of the site's limits, newest first. */
export function LimitHistory({ rows, timeZone }: { rows: readonly LimitHistoryRow[]; timeZone: string }) {
  if (rows.length === 0) return null;
  return (
    <section aria-labelledby="limit-history-h">
      <h2 id="limit-history-h">Changes</h2>
      <div className="table-wrap">
        <table>
          <caption>Every change to the site&apos;s limits, newest first</caption>
          <TableHead headings={["When", "Who", "Set to", "Why"]} />
          <tbody>
            {rows.map((r) => (
              <tr key={r.id}>
                <td>{when(r.change.at, timeZone)}</td>
                <td>{r.change.by}</td>
                <td>{what(r)}</td>
                <td>{r.change.reason}</td>
              </tr>
            ))}
          </tbody>
        </table>
      </div>
    </section>
  );
}
