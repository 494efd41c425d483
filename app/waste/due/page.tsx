import type { Metadata } from "next";
import Link from "next/link";
import { GENERATOR_CATEGORIES } from "@/lib/waste/waste.schema";
import type { DomainIssue } from "@/lib/core/result";
import { day, num } from "@/app/_ui/format";
import { loadSite } from "@/app/_ui/site";
import { Empty, Facts, NoSite, Note } from "@/app/_ui/ui";
import { Cautions } from "@/app/_ui/kit";
import { DEFAULT_DUE_DAYS } from "@/app/waste/due/due-report";
import { getWasteDueReportCached } from "@/app/waste/due/due-report-cache";
import type { WasteDueReport } from "@/app/waste/due/due-report";
import { ReportLinks } from "@/app/_ui/report-view";
import { ContainersOnSiteTable, HazardRulesNote, RuleLimitsTable, StreamTable } from "@/app/waste/due/due-tables";
import { queryValue } from "@/app/_ui/links";
import type { SearchParams } from "@/app/_ui/links";
import { QueryForm } from "@/app/_ui/query-form";

export const dynamic = "force-dynamic";
export const metadata: Metadata = { title: "Waste due for haul-away" };

const CATEGORY_WORDS: Readonly<Record<string, string>> = {
  LQG: "Large quantity generator (LQG)",
  SQG: "Small quantity generator (SQG)",
  VSQG: "Very small quantity generator (VSQG)",
};

export default async function WasteDuePage({ searchParams }: { searchParams: Promise<SearchParams> }) {
  const { db, site, user } = await loadSite();
  if (!site) return <NoSite />;
  const sp = await searchParams;
  const typed = { days: queryValue(sp.days), category: queryValue(sp.category), tsdfMiles: queryValue(sp.tsdfMiles) };
  const result = await getWasteDueReportCached(db, site, typed, user.now);
  const tz = site.timeZone;
  return (
    <>
      <p className="crumbs">
        <Link href="/waste">Waste</Link> /
      </p>
      <h1>Waste due for haul-away</h1>
      <p className="lede">
        Every container on site with its hazard flags and the date it must go under the active rule set, and what falls
        due in the next days, by stream, with totals for the hauler.
      </p>
      <Cautions
        title="Before moving or loading these streams"
        items={[
          "The glycerol phase and methanol-rich liquid carry methanol and are flammable: keep ignition sources, hot work and sparks away; bond and ground drums, totes and the tanker while transferring; ventilate; no smoking.",
          "Wash water may carry methanol, soap and catalyst residue and is often alkaline: wear eye protection and chemical-resistant gloves; keep it out of drains unless your discharge permit allows it.",
          "Oily or methanol-wet spent filter media can heat itself: keep it in closed metal bins away from buildings.",
          "Hand waste only to a licensed hauler with the manifest or shipping document filled in.",
        ]}
      />
      <DueForm typed={typed} report={result.ok ? result.value : null} issues={result.ok ? [] : result.issues} />
      {result.ok ? (
        <ReportLinks
          base={`/waste/due/report?${new URLSearchParams({ days: String(result.value.query.days), category: result.value.query.category, ...(result.value.query.tsdfMiles === null ? {} : { tsdfMiles: String(result.value.query.tsdfMiles) }) }).toString()}`}
          pdfLabel="Waste list for the hauler"
          tables={[
            ["containers", "Containers"],
            ["due-by-stream", "Due by stream"],
          ]}
        />
      ) : null}
      {result.ok ? <DueResult r={result.value} timeZone={tz} /> : null}
    </>
  );
}

function DueForm({
  typed,
  report,
  issues,
}: {
  typed: Record<string, string>;
  report: WasteDueReport | null;
  issues: DomainIssue[];
}) {
  const bad = (f: string) => (issues.some((i) => i.field === f) ? true : undefined);
  return (
    <QueryForm action="/waste/due" legend="Due within" submitLabel="List what is due" issues={issues}>
      <label>
        Days ahead
        <input
          name="days"
          inputMode="numeric"
          size={5}
          defaultValue={typed.days !== "" ? typed.days : String(report?.query.days ?? DEFAULT_DUE_DAYS)}
          aria-invalid={bad("days")}
        />
      </label>
      <label>
        Generator category
        <select name="category" defaultValue={typed.category || report?.query.category || "LQG"}>
          {GENERATOR_CATEGORIES.map((c) => (
            <option key={c} value={c}>
              {CATEGORY_WORDS[c] ?? c}
            </option>
          ))}
        </select>
      </label>
      <label>
        Miles to the treatment facility (SQG only)
        <input
          name="tsdfMiles"
          inputMode="decimal"
          size={6}
          defaultValue={typed.tsdfMiles}
          aria-invalid={bad("tsdfMiles")}
        />
      </label>
    </QueryForm>
  );
}

function DueResult({ r, timeZone }: { r: WasteDueReport; timeZone: string }) {
  return (
    <>
      <DueSummary r={r} timeZone={timeZone} />
      <h2>Due in the next {r.query.days} days, by stream</h2>
      {r.groups.length === 0 ? (
        <Empty>Nothing falls due in the next {r.query.days} days.</Empty>
      ) : (
        r.groups.map((g) => <StreamTable key={g.stream} g={g} />)
      )}
      <Note>{r.densityNote}</Note>

      <h2>Every container on site</h2>
      <ContainersOnSiteTable containers={r.containers} timeZone={timeZone} />
      <HazardRulesNote rs={r.ruleSet} />

      <h2>Limits of the rule set</h2>
      <RuleLimitsTable rs={r.ruleSet} />
      <Note>Edition: {r.ruleSet.edition}</Note>
    </>
  );
}

function DueSummary({ r, timeZone }: { r: WasteDueReport; timeZone: string }) {
  return (
    <>
      <Facts
        items={[
          [
            "Rule set",
            <Link key="rs" href="/waste/rules">
              {r.ruleSet.name}
            </Link>,
          ],
          [
            "Generator category used",
            `${CATEGORY_WORDS[r.query.category] ?? r.query.category}${r.categoryAssumed ? " (assumed)" : ""}`,
          ],
          ["Due within", `${r.query.days} days (to ${day(r.horizonAt, timeZone)})`],
          ["Containers on site", String(r.containers.length)],
          [
            "Due in that time",
            `${r.totals.count}: ${num(r.totals.kg, 1)} kg, ${num(r.totals.litres, 1)} L, ${num(r.totals.usGallons, 1)} US gal`,
          ],
        ]}
      />
      <p className="warning">
        {r.localRulesNote}{" "}
        {r.categoryAssumed
          ? r.assumptionNote
          : r.chosen
            ? `The site's rule set, chosen by ${r.chosen.by}: ${r.chosen.reason}`
            : `Category ${r.query.category} as chosen in the form.`}
      </p>
      {r.issues.length > 0 ? (
        <ul className="warning" aria-label="Waste warnings">
          {r.issues.map((i) => (
            <li key={i.message}>{i.message}</li>
          ))}
        </ul>
      ) : null}
    </>
  );
}
