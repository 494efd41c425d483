import type { Metadata } from "next";
import Link from "next/link";
import { DEFAULT_CLOSURE_TOLERANCE } from "@/lib/mass-balance/period-balance";
import { WATER_LIMIT_BY_STEP } from "@/lib/recipe/recipe-defaults";
import { getSiteLimitHistory, getSiteLimits } from "@/lib/mass-balance/site-limits.service";
import type { LimitChange } from "@/lib/mass-balance/site-limits";
import { levelOf, screenText } from "@/lib/spec/source-text";
import type { SourceLevel } from "@/lib/spec/source-text";
import { when } from "@/app/_ui/format";
import { loadSite } from "@/app/_ui/site";
import { NoSite, Note } from "@/app/_ui/ui";
import { ConfidenceMark } from "@/app/_ui/kit";
import { ClosureToleranceForm, WaterLimitsForm } from "@/app/limits/limits-forms";
import { LimitHistory } from "@/app/limits/limit-history";
import { TableHead } from "@/app/_ui/kit/table-head";

export const dynamic = "force-dynamic";
export const metadata: Metadata = { title: "Site limits" };

interface LimitRow {
  key: string;
  label: string;
  value: string;
  defaultValue: string;
  defaultSource: string;
  level: SourceLevel;
  anchor: string;
}

function LimitTable({ caption, rows }: { caption: string; rows: readonly LimitRow[] }) {
  return (
    <div className="table-wrap">
      <table>
        <caption>{caption}</caption>
        <TableHead headings={["Limit", "In force", "Default", "Source of the default", "Reliance"]} />
        <tbody>
          {rows.map((r) => (
            <tr key={r.key}>
              <td>{r.label}</td>
              <td data-testid={`in-force-${r.key}`}>{r.value}</td>
              <td>{r.defaultValue}</td>
              <td>{r.defaultSource}</td>
              <td>
                <ConfidenceMark level={r.level} anchor={r.anchor} />
              </td>
            </tr>
          ))}
        </tbody>
      </table>
    </div>
  );
}

function Changed({ change, timeZone }: { change: LimitChange | null; timeZone: string }) {
  if (change === null) return <Note>No change recorded: the defaults are in force.</Note>;
  return (
    <p>
      Changed {when(change.at, timeZone)} by {change.by}: {change.reason}
    </p>
  );
}

export default async function SiteLimitsPage() {
  const { db, site, user } = await loadSite();
  if (!site) return <NoSite />;
  const [limits, history] = await Promise.all([getSiteLimits(db, site.id), getSiteLimitHistory(db, site.id)]);
  const canChange = user.role === "ADMIN" || user.role === "COMPLIANCE";
  const d = DEFAULT_CLOSURE_TOLERANCE;
  const closureSource = "common practice";
  const closureRows: LimitRow[] = [
    ["warnPct", "Warn above", limits.closure.warnPct, d.warnPct],
    ["failPct", "Fail above", limits.closure.failPct, d.failPct],
  ].map(([key, label, value, dv]) => ({
    key: String(key),
    label: String(label),
    value: `${value} % of inputs`,
    defaultValue: `${dv} % of inputs`,
    defaultSource: closureSource,
    level: "common practice" as const,
    anchor: `balance-${String(key)}`,
  }));
  const waterRows: LimitRow[] = (
    [
      ["baseStepPct", "Base-catalysed step", "BASE_STEP", "recipe-maxWaterPct"],
      ["acidStepPct", "Acid step", "ACID_STEP", "recipe-acidStepMaxWaterPct"],
    ] as const
  ).map(([key, label, step, anchor]) => ({
    key,
    label,
    value: `${limits.water[step].value} % w/w`,
    defaultValue: `${WATER_LIMIT_BY_STEP[step].value} % w/w`,
    defaultSource: screenText(WATER_LIMIT_BY_STEP[step].source),
    level: levelOf(WATER_LIMIT_BY_STEP[step].status),
    anchor,
  }));
  return (
    <>
      <h1>Site limits</h1>
      <p className="lede">
        The limits this site works to. The closure tolerance flags a batch, a month and each material kind when what was
        measured out falls short of what went in; the water limits are checked by the batch planner, the recipe and the
        acid step alike. Each change is kept with who made it, when and why.
      </p>
      <section aria-labelledby="closure-h">
        <h2 id="closure-h">Mass-balance closure tolerance</h2>
        <LimitTable caption="Closure tolerance, as a share of the inputs" rows={closureRows} />
        <Changed change={limits.closureChange} timeZone={site.timeZone} />
        {canChange ? <ClosureToleranceForm current={limits.closure} /> : null}
      </section>
      <section aria-labelledby="water-h">
        <h2 id="water-h">Water in the oil, per reaction step</h2>
        <LimitTable caption="Highest water in the oil going into each step" rows={waterRows} />
        <Changed change={limits.waterChange} timeZone={site.timeZone} />
        {canChange ? (
          <WaterLimitsForm
            current={{ baseStepPct: limits.water.BASE_STEP.value, acidStepPct: limits.water.ACID_STEP.value }}
          />
        ) : null}
      </section>
      {canChange ? null : <Note>A compliance officer or an administrator changes the site&apos;s limits.</Note>}
      <LimitHistory rows={history} timeZone={site.timeZone} />
      <p>
        Where the defaults come from: <Link href="/references">References</Link>.
      </p>
    </>
  );
}
