import type { Metadata } from "next";
import Link from "next/link";
import { labelOf } from "@/lib/core/vocabulary";
import type { HazardFlag } from "@/lib/waste/waste-due";
import { GENERATOR_CATEGORIES } from "@/lib/waste/waste.schema";
import { convertVolume } from "@/lib/quantity/units";
import type { DomainIssue } from "@/lib/core/result";
import { day, kg, litres, num, pct } from "@/app/_ui/format";
import { loadSite } from "@/app/_ui/site";
import { Empty, Facts, NoSite, Note } from "@/app/_ui/ui";
import { Cautions, ConfidenceMark } from "@/app/_ui/kit";
import { levelOf, screenText, statusNote } from "@/lib/spec/source-text";
import { DEFAULT_DUE_DAYS } from "@/app/waste/due/due-report";
import { getWasteDueReportCached } from "@/app/waste/due/due-report-cache";
import type { ContainerDueRow, WasteDueReport } from "@/app/waste/due/due-report";
import { ReportLinks } from "@/app/_ui/report-view";

export const dynamic = "force-dynamic";
export const metadata: Metadata = { title: "Waste due for haul-away" };

type Search = Record<string, string | string[] | undefined>;

function one(v: string | string[] | undefined): string {
  return (Array.isArray(v) ? v[0] : v) ?? "";
}

const CATEGORY_WORDS: Readonly<Record<string, string>> = {
  LQG: "Large quantity generator (LQG)",
  SQG: "Small quantity generator (SQG)",
  VSQG: "Very small quantity generator (VSQG)",
};

const HAZARD_WORDS: Readonly<Record<string, string>> = {
  HAZARDOUS: "Hazardous",
  NEEDS_CHARACTERISATION: "Needs characterisation",
  NON_HAZARDOUS: "Not hazardous",
};

export default async function WasteDuePage({ searchParams }: { searchParams: Promise<Search> }) {
  const { db, site, user } = await loadSite();
  if (!site) return <NoSite />;
  const sp = await searchParams;
  const typed = { days: one(sp.days), category: one(sp.category), tsdfMiles: one(sp.tsdfMiles) };
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
    <form method="get" action="/waste/due" className="query-form" noValidate>
      <fieldset>
        <legend>Due within</legend>
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
        <button type="submit">List what is due</button>
        {issues.map((i) => (
          <p key={`${i.field ?? ""}${i.message}`} className="form-error" role="alert">
            {i.message}
          </p>
        ))}
      </fieldset>
    </form>
  );
}

function HaulLink({ code }: { code: string }) {
  return (
    <Link href={`/waste/${encodeURIComponent(code)}#haul-away`} aria-label={`Record haul-away of ${code}`}>
      Record haul-away
    </Link>
  );
}

function Flag({ f }: { f: HazardFlag }) {
  const cls = f.status === "YES" ? "status-fail" : f.status === "UNKNOWN" ? "status-warn" : "status-pass";
  const word = f.status === "YES" ? `${f.code} yes` : f.status === "UNKNOWN" ? `${f.code} unknown` : `${f.code} no`;
  return (
    <span className={`status ${cls}`} title={`${f.reason} (${screenText(f.source)})`}>
      {word}
    </span>
  );
}

function characterisationText(c: ContainerDueRow["characterisation"]): string {
  const parts = [
    c.methanolPct === null ? null : `methanol ${pct(c.methanolPct, 1)}`,
    c.pH === null ? null : `pH ${num(c.pH, 1)}`,
    c.flashPointC === null ? null : `flash ${num(c.flashPointC, 0)} °C`,
    c.waterPct === null ? null : `water ${pct(c.waterPct, 1)}`,
  ].filter((p): p is string => p !== null);
  return parts.length === 0 ? "not measured" : parts.join(", ");
}

function DueResult({ r, timeZone }: { r: WasteDueReport; timeZone: string }) {
  const rs = r.ruleSet;
  return (
    <>
      <Facts
        items={[
          [
            "Rule set",
            <Link key="rs" href="/waste/rules">
              {rs.name}
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

      <h2>Due in the next {r.query.days} days, by stream</h2>
      {r.groups.length === 0 ? (
        <Empty>Nothing falls due in the next {r.query.days} days.</Empty>
      ) : (
        r.groups.map((g) => (
          <div key={g.stream} className="table-wrap">
            <table>
              <caption>
                {labelOf(g.stream)}: {g.totals.count} container{g.totals.count === 1 ? "" : "s"}, {num(g.totals.kg, 1)}{" "}
                kg, {num(g.totals.litres, 1)} L, {num(g.totals.usGallons, 1)} US gal
              </caption>
              <thead>
                <tr>
                  <th scope="col">Container</th>
                  <th scope="col">Due</th>
                  <th scope="col" className="num">
                    Days left
                  </th>
                  <th scope="col">Basis</th>
                  <th scope="col" className="num">
                    Mass
                  </th>
                  <th scope="col" className="num">
                    Volume (est.)
                  </th>
                  <th scope="col" className="num">
                    US gal (est.)
                  </th>
                  <th scope="col">Haul-away</th>
                </tr>
              </thead>
              <tbody>
                {g.items.map((d) => (
                  <tr key={d.code}>
                    <td>
                      <Link href={`/waste/${encodeURIComponent(d.code)}`}>{d.code}</Link>
                    </td>
                    <td className="nowrap">
                      {d.dueDate} {d.overdue ? <span className="status status-overdue">overdue</span> : null}
                    </td>
                    <td className="num">{d.daysLeft}</td>
                    <td>
                      {d.limitDays === null ? "" : `${d.limitDays} days, `}
                      {screenText(d.source)}
                    </td>
                    <td className="num">{kg(d.massG, 1)}</td>
                    <td className="num">{litres(d.volumeMl, 1)}</td>
                    <td className="num">{num(convertVolume(d.volumeMl, "mL", "gal"), 1)}</td>
                    <td>
                      <HaulLink code={d.code} />
                    </td>
                  </tr>
                ))}
              </tbody>
              <tfoot>
                <tr>
                  <td colSpan={4}>For the hauler</td>
                  <td className="num">{num(g.totals.kg, 1)} kg</td>
                  <td className="num">{num(g.totals.litres, 1)} L</td>
                  <td className="num">{num(g.totals.usGallons, 1)}</td>
                  <td />
                </tr>
              </tfoot>
            </table>
          </div>
        ))
      )}
      <Note>{r.densityNote}</Note>

      <h2>Every container on site</h2>
      {r.containers.length === 0 ? (
        <Empty>No waste container is on site.</Empty>
      ) : (
        <div className="table-wrap">
          <table>
            <thead>
              <tr>
                <th scope="col">Container</th>
                <th scope="col">Stream</th>
                <th scope="col">Accumulation start</th>
                <th scope="col" className="num">
                  Quantity
                </th>
                <th scope="col">Characterisation</th>
                <th scope="col">Ignitable</th>
                <th scope="col">Corrosive</th>
                <th scope="col">Assessment</th>
                <th scope="col">Must go by</th>
                <th scope="col">Haul-away</th>
              </tr>
            </thead>
            <tbody>
              {r.containers.map((c) => (
                <tr key={c.code}>
                  <td className="nowrap">
                    <Link href={`/waste/${encodeURIComponent(c.code)}`}>{c.code}</Link>
                    {c.satellite ? <span className="tag">satellite</span> : null}
                  </td>
                  <td>{labelOf(c.stream)}</td>
                  <td className="nowrap">{day(c.accumulationStart, timeZone)}</td>
                  <td className="num">
                    {kg(c.massG, 1)}
                    <br />
                    <span className="muted">{litres(c.volumeMl, 0)}</span>
                  </td>
                  <td>{characterisationText(c.characterisation)}</td>
                  <td>
                    <Flag f={c.hazard.ignitable} />
                  </td>
                  <td>
                    <Flag f={c.hazard.corrosive} />
                  </td>
                  <td>{HAZARD_WORDS[c.hazard.overall] ?? c.hazard.overall}</td>
                  <td className="nowrap">
                    {c.due === null ? (
                      <span className="muted">not assessed</span>
                    ) : c.due.dueDate === null ? (
                      <span className="muted">no time limit</span>
                    ) : (
                      <span title={screenText(c.due.source)}>
                        {c.due.dueDate}{" "}
                        {c.overdue ? (
                          <span className="status status-overdue">overdue</span>
                        ) : (
                          <span className="muted">({c.daysLeft} d)</span>
                        )}
                      </span>
                    )}
                  </td>
                  <td>
                    <HaulLink code={c.code} />
                  </td>
                </tr>
              ))}
            </tbody>
          </table>
        </div>
      )}
      <Note>
        Ignitable (D001): a liquid with a closed-cup flash point below {rs.ignitableFlashPointBelowC.value} °C, unless
        aqueous with less than {rs.ignitableAqueousAlcoholBelowPctVol.value} % alcohol (
        {rs.ignitableFlashPointBelowC.source}). Corrosive (D002): aqueous with pH ≤ {rs.corrosivePhAtMost.value} or ≥{" "}
        {rs.corrosivePhAtLeast.value} ({rs.corrosivePhAtLeast.source}). A container without the measurements is handled
        as hazardous until characterised.
      </Note>

      <h2>Limits of the rule set</h2>
      <div className="table-wrap">
        <table>
          <thead>
            <tr>
              <th scope="col">Limit</th>
              <th scope="col" className="num">
                Value
              </th>
              <th scope="col">Source</th>
              <th scope="col">How sure</th>
            </tr>
          </thead>
          <tbody>
            {(
              [
                ["LQG accumulation", rs.lqgMaxDays],
                ["SQG accumulation", rs.sqgMaxDays],
                ["SQG, treatment facility far away", rs.sqgLongHaulMaxDays],
                ["SQG long-haul distance", rs.sqgLongHaulMinMiles],
                ["SQG on-site quantity", rs.sqgMaxOnSiteKg],
                ["VSQG on-site quantity", rs.vsqgMaxOnSiteKg],
                ["Satellite area volume", rs.satelliteMaxUsGal],
                ["Satellite excess removed within", rs.satelliteExcessDays],
                ["Non-hazardous streams (site rule)", rs.nonHazardousMaxStorageDays],
              ] as const
            ).map(([label, v]) => (
              <tr key={label}>
                <td>{label}</td>
                <td className="num nowrap">
                  {v.value} {v.unit}
                </td>
                <td>{screenText(v.source)}</td>
                <td>
                  <ConfidenceMark level={levelOf(v.status)} anchor={`waste-${label}`} /> {statusNote(v.status)}
                </td>
              </tr>
            ))}
          </tbody>
        </table>
      </div>
      <Note>Edition: {rs.edition}</Note>
    </>
  );
}
