import Link from "next/link";
import { labelOf } from "@/lib/core/vocabulary";
import type { BackwardTraceReport } from "@/lib/trace/trace.service";
import { kg, kgExact, pct, when } from "@/app/_ui/format";
import { hrefOf } from "@/app/_ui/links";
import { Empty, Facts, HolderLink, Note } from "@/app/_ui/ui";
import { ContributionTable, FreshnessNote } from "@/app/trace/trace-tables";
import { TraceGraphView } from "@/app/trace/trace-graph";
import { csvHref, EpcisLink } from "@/app/trace/trace-links";
import { toSiteInstant } from "@/app/trace/site-time";

type View = "all" | "feedstock";

export function BackwardResult({
  r,
  view,
  atLocal,
  timeZone,
}: {
  r: BackwardTraceReport;
  view: "all" | "feedstock";
  atLocal: string;
  timeZone: string;
}) {
  const base = { dir: "back", kind: r.query.kind, code: r.query.code, at: atLocal };
  const switchTo = (v: "all" | "feedstock") =>
    `/trace?${new URLSearchParams({ ...base, ...(v === "feedstock" ? { view: v } : {}) }).toString()}`;
  const targetHref = hrefOf(r.target.kind, r.target.code);
  const what =
    r.basis === "STOCK" ? `held ${r.asOf ? `at ${when(r.asOf.at, timeZone)}` : "before any movement"}` : "received";
  return (
    <section aria-labelledby="back-h" className="trace-result">
      <h2 id="back-h">
        What {labelOf(r.target.kind).toLowerCase()} {r.target.code} {r.basis === "STOCK" ? "held" : "is made of"}
      </h2>
      <Facts
        items={[
          ["Traced", <HolderLink key="t" holder={r.target} />],
          [r.basis === "STOCK" ? "Stock traced" : "Everything received", <strong key="g">{kgExact(r.totalG)}</strong>],
          [
            "Feedstock",
            `${kgExact(r.feedstock.totalG)} (${pct(r.totalG === 0 ? 0 : (r.feedstock.totalG * 100) / r.totalG, 2)})`,
          ],
          ["Reagents", `${kgExact(r.reagentsG)} (${pct(r.totalG === 0 ? 0 : (r.reagentsG * 100) / r.totalG, 2)})`],
          ...(r.otherG > 0 ? ([["Other entries", kgExact(r.otherG)]] as Array<[string, string]>) : []),
          ["Last movement included", r.asOf ? `no. ${r.asOf.moveId}, ${when(r.asOf.at, timeZone)}` : "none"],
        ]}
      />
      <Note>
        The mass {what} by {r.target.code}, split over every origin (a pickup&apos;s oil, a delivery, a reagent receipt,
        a receiving surplus). A tank mixes what it holds, so a batch drawn from it carries its share of every lot in it;
        the grams of each table add up exactly to its total. Certification: the lot&apos;s own marking and whether the
        source held a certificate valid on the day the oil entered.{" "}
        {targetHref && (r.target.kind === "PRODUCT_LOT" || r.target.kind === "BATCH") ? (
          <>
            The same trace by lot is on the <Link href={targetHref}>{labelOf(r.target.kind).toLowerCase()} page</Link>.
          </>
        ) : null}
      </Note>
      <FreshnessNote f={r.freshness} />
      <EpcisLink
        params={{ dir: "back", kind: r.query.kind, code: r.query.code, at: toSiteInstant(atLocal, timeZone) }}
      />
      <nav className="view-switch" aria-label="Trace view">
        {view === "all" ? (
          <span aria-current="page">All material</span>
        ) : (
          <Link href={switchTo("all")}>All material</Link>
        )}
        {view === "feedstock" ? (
          <span aria-current="page">Feedstock only</span>
        ) : (
          <Link href={switchTo("feedstock")}>Feedstock only</Link>
        )}
      </nav>
      {view === "feedstock" ? (
        <Note>
          Feedstock only: shares renormalised over the {kg(r.feedstock.totalG, 3)} of feedstock; the{" "}
          {kg(r.reagentsG, 3)} of reagents (methanol, catalyst, acid, process water) are listed separately below.
        </Note>
      ) : null}
      {r.totalG === 0 ? (
        <Empty>Nothing to trace: the {labelOf(r.target.kind).toLowerCase()} held nothing at that time.</Empty>
      ) : (
        <BackwardTables r={r} view={view} atLocal={atLocal} />
      )}
    </section>
  );
}

/** The graph and the contribution tables of a backward trace, with their CSV and the PDF report. */
function BackwardTables({ r, view, atLocal }: { r: BackwardTraceReport; view: View; atLocal: string }) {
  const base = { dir: "back", kind: r.query.kind, code: r.query.code, at: atLocal };
  const t = view === "feedstock" ? r.feedstock : r.all;
  const csv = (table: string) => csvHref({ ...base, table, ...(view === "feedstock" ? { view } : {}) });
  return (
    <>
      <BackwardGraph r={r} />
      <h3>By source</h3>
      <ContributionTable
        caption={`Sources (${view === "feedstock" ? "feedstock only" : "all material"})`}
        first="Source"
        rows={t.bySource}
        totalG={t.totalG}
        columns="source"
        csvHref={csv("sources")}
      />
      <h3>By feedstock lot</h3>
      <ContributionTable
        caption={`Lots (${view === "feedstock" ? "feedstock only" : "all material"})`}
        first="Lot"
        rows={t.byLot}
        totalG={t.totalG}
        columns="lot"
        csvHref={csv("lots")}
        shown={30}
      />
      <h3>By pickup</h3>
      <ContributionTable
        caption={`Pickups (${view === "feedstock" ? "feedstock only" : "all material"})`}
        first="Pickup"
        rows={t.byPickup}
        totalG={t.totalG}
        columns="pickup"
        csvHref={csv("pickups")}
        shown={25}
      />
      <div className="two-tables">
        <div>
          <h3>By material kind</h3>
          <ContributionTable
            caption="Material kinds"
            first="Material"
            rows={t.byMaterial}
            totalG={t.totalG}
            columns="plain"
            csvHref={csv("materials")}
          />
        </div>
        <div>
          <h3>By certification</h3>
          <ContributionTable
            caption="Certification"
            first="Status"
            rows={t.byCertification}
            totalG={t.totalG}
            columns="plain"
            csvHref={csv("certification")}
          />
        </div>
      </div>
      <ReagentsAndDownloads r={r} base={base} csv={csv} />
    </>
  );
}

function BackwardGraph({ r }: { r: BackwardTraceReport }) {
  return (
    <>
      <h3>Graph</h3>
      {r.graph ? (
        <>
          <TraceGraphView
            graph={r.graph}
            title={`Where the material of ${labelOf(r.target.kind).toLowerCase()} ${r.target.code} came from, by stage`}
          />
          <Note>
            {r.graph.note} Boxes under {r.graph.foldBelowPct} % of the total (or beyond the largest per stage) are
            folded into &quot;others&quot;. Dashed arrows run against the stage order (recovered methanol returning to
            its tank).
          </Note>
        </>
      ) : (
        <Empty>No graph for an empty trace.</Empty>
      )}
    </>
  );
}

function ReagentsAndDownloads({
  r,
  base,
  csv,
}: {
  r: BackwardTraceReport;
  base: Record<string, string>;
  csv: (table: string) => string;
}) {
  return (
    <>
      <h3>Reagents</h3>
      {r.reagents.length === 0 ? (
        <Empty>No reagents in this trace.</Empty>
      ) : (
        <ContributionTable
          caption="Reagent lots (share of everything traced)"
          first="Reagent lot"
          rows={r.reagents}
          totalG={r.reagentsG}
          totalPct={r.totalG === 0 ? 0 : (r.reagentsG * 100) / r.totalG}
          columns="plain"
          csvHref={csvHref({ ...base, table: "reagents" })}
        />
      )}
      <p>
        <a href={csv("origins")} download className="csv-link">
          Download every origin as CSV
        </a>{" "}
        <a
          href={`/trace/report?${new URLSearchParams(Object.entries(base).filter(([, v]) => v !== "")).toString()}&format=pdf`}
          download
          className="report-downloads"
        >
          Trace report (PDF)
        </a>{" "}
        <span className="muted">
          ({r.origins.length} origins: movement, pickup, lot, source, material, certification, grams)
        </span>
      </p>
    </>
  );
}
