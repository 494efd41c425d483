import type { Metadata } from "next";
import Link from "next/link";
import { labelOf } from "@/lib/core/vocabulary";
import { listTraceChoices } from "@/lib/trace/trace.store";
import type { TraceChoices } from "@/lib/trace/trace.store";
import { traceBackwardReport, traceForwardReport } from "@/lib/trace/trace.service";
import { BACKWARD_KINDS, FORWARD_KINDS } from "@/lib/trace/trace-query.schema";
import type { BackwardTraceReport, ForwardTraceReport } from "@/lib/trace/trace.service";
import { CustomerName, CustomerShares } from "@/app/trace/customer-shares";
import type { DomainIssue } from "@/lib/core/result";
import { kg, kgExact, pct, when } from "@/app/_ui/format";
import { hrefOf } from "@/app/_ui/links";
import { loadSite } from "@/app/_ui/site";
import { Empty, Facts, HolderLink, NoSite, Note } from "@/app/_ui/ui";
import { ContributionTable, FreshnessNote } from "@/app/trace/trace-tables";
import { TraceGraphView } from "@/app/trace/trace-graph";
import { toSiteInstant } from "@/app/trace/site-time";
import { canRead } from "@/lib/auth/read-matrix";

export const dynamic = "force-dynamic";
export const metadata: Metadata = { title: "Trace" };

type Search = Record<string, string | string[] | undefined>;

function one(v: string | string[] | undefined): string {
  return (Array.isArray(v) ? v[0] : v) ?? "";
}

const KIND_WORDS: Readonly<Record<string, string>> = {
  PRODUCT_LOT: "Product lot",
  TANK: "Tank (at a time)",
  SHIPMENT: "Shipment (document no.)",
  BATCH: "Batch",
  SOURCE: "Source",
  PICKUP: "Pickup",
  LOT: "Feedstock lot",
};

export default async function TracePage({ searchParams }: { searchParams: Promise<Search> }) {
  const { db, site, user } = await loadSite();
  if (!site) return <NoSite />;
  const sp = await searchParams;
  const dir = one(sp.dir);
  const kind = one(sp.kind);
  const code = one(sp.code);
  const atLocal = one(sp.at);
  const view = one(sp.view) === "feedstock" ? "feedstock" : "all";
  const tz = site.timeZone;
  const choices = await listTraceChoices(db, site.id);
  const back =
    dir === "back" && code !== ""
      ? await traceBackwardReport(db, site.id, { kind, code, at: toSiteInstant(atLocal, tz) }, user.now)
      : null;
  const fwd =
    dir === "fwd" && code !== ""
      ? await traceForwardReport(db, site.id, { kind, code }, user.now, {
          withCustomers: canRead(user.role, "/customers"),
        })
      : null;
  return (
    <>
      <h1>Trace</h1>
      <p className="lede">
        Which feedstock went into a product lot, a tank, a shipment or a batch, and where the oil of a source, a pickup
        or a lot went. Masses come from replaying the movement ledger under each tank&apos;s mixing model, in whole
        grams.
      </p>
      <div className="trace-forms">
        <TraceForm
          legend="What is in it? (backward)"
          dir="back"
          kinds={BACKWARD_KINDS}
          kind={dir === "back" ? kind : "PRODUCT_LOT"}
          code={dir === "back" ? code : ""}
          atLocal={dir === "back" ? atLocal : ""}
          issues={back && !back.ok ? back.issues : []}
        />
        <TraceForm
          legend="Where did it go? (forward)"
          dir="fwd"
          kinds={FORWARD_KINDS}
          kind={dir === "fwd" ? kind : "LOT"}
          code={dir === "fwd" ? code : ""}
          atLocal=""
          issues={fwd && !fwd.ok ? fwd.issues : []}
        />
      </div>
      <ChoiceLists choices={choices} />
      {back?.ok ? <BackwardResult r={back.value} view={view} atLocal={atLocal} timeZone={tz} /> : null}
      {fwd?.ok ? <ForwardResult r={fwd.value} timeZone={tz} /> : null}
      {back === null && fwd === null ? <Empty>Choose what to trace above.</Empty> : null}
    </>
  );
}

function TraceForm({
  legend,
  dir,
  kinds,
  kind,
  code,
  atLocal,
  issues,
}: {
  legend: string;
  dir: "back" | "fwd";
  kinds: readonly string[];
  kind: string;
  code: string;
  atLocal: string;
  issues: DomainIssue[];
}) {
  const field = (name: string) => issues.find((i) => i.field === name);
  const general = issues.filter((i) => i.field !== "kind" && i.field !== "code" && i.field !== "at");
  return (
    <form method="get" action="/trace" className="trace-form" noValidate>
      <fieldset>
        <legend>{legend}</legend>
        <input type="hidden" name="dir" value={dir} />
        <label>
          Kind
          <select
            name="kind"
            defaultValue={kinds.includes(kind) ? kind : kinds[0]}
            aria-invalid={field("kind") ? true : undefined}
          >
            {kinds.map((k) => (
              <option key={k} value={k}>
                {KIND_WORDS[k] ?? labelOf(k)}
              </option>
            ))}
          </select>
        </label>
        <label>
          Code
          <input
            name="code"
            defaultValue={code}
            required
            list={`choices-${dir}`}
            autoComplete="off"
            aria-invalid={field("code") ? true : undefined}
            aria-describedby={field("code") ? `${dir}-code-error` : undefined}
          />
        </label>
        {dir === "back" ? (
          <label>
            Tank time <span className="muted">(tanks only; site time)</span>
            <input
              name="at"
              type="datetime-local"
              defaultValue={atLocal}
              aria-invalid={field("at") ? true : undefined}
            />
          </label>
        ) : null}
        <button type="submit">{dir === "back" ? "Trace back" : "Trace forward"}</button>
        {["kind", "code", "at"].map((f) => {
          const issue = field(f);
          return issue ? (
            <p key={f} id={`${dir}-${f}-error`} className="form-error" role="alert">
              {issue.message}
            </p>
          ) : null;
        })}
        {general.map((i) => (
          <p key={i.code + i.message} className="form-error" role="alert">
            {i.message}
          </p>
        ))}
      </fieldset>
    </form>
  );
}

/** Suggestions for the code fields, newest first; any code can be typed. */
function ChoiceLists({ choices }: { choices: TraceChoices }) {
  const lists: Array<[string, string[]]> = [
    ["back", [...choices.productLots, ...choices.tanks, ...choices.shipments, ...choices.batches]],
    ["fwd", [...choices.lots, ...choices.sources, ...choices.pickups]],
  ];
  return (
    <>
      {lists.map(([k, codes]) => (
        <datalist key={k} id={`choices-${k}`}>
          {[...new Set(codes)].map((c) => (
            <option key={c} value={c} />
          ))}
        </datalist>
      ))}
    </>
  );
}

function csvHref(params: Record<string, string>): string {
  return `/trace/csv?${new URLSearchParams(Object.entries(params).filter(([, v]) => v !== "")).toString()}`;
}

/** The trace answer as GS1 EPCIS 2.0 events, for a trading partner's systems. */
function EpcisLink({ params }: { params: Record<string, string | undefined> }) {
  const query = new URLSearchParams(
    Object.entries(params).filter((e): e is [string, string] => e[1] !== undefined && e[1] !== ""),
  ).toString();
  return (
    <p>
      <a href={`/api/epcis/trace?${query}`} download className="csv-link">
        EPCIS 2.0 events
      </a>{" "}
      <span className="muted">
        — the movements behind this answer in the GS1 standard format a trading partner&apos;s system reads
      </span>
    </p>
  );
}

function BackwardResult({
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
  const t = view === "feedstock" ? r.feedstock : r.all;
  const csv = (table: string) => csvHref({ ...base, table, ...(view === "feedstock" ? { view } : {}) });
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
                folded into &quot;others&quot;. Dashed arrows run against the stage order (recovered methanol returning
                to its tank).
              </Note>
            </>
          ) : (
            <Empty>No graph for an empty trace.</Empty>
          )}
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
      )}
    </section>
  );
}

function ForwardResult({ r, timeZone }: { r: ForwardTraceReport; timeZone: string }) {
  const csv = csvHref({ dir: "fwd", kind: r.query.kind, code: r.query.code, table: "holders" });
  const downstream = r.holders.filter((h) => h.holder.kind !== "PICKUP");
  const pickups = r.holders.filter((h) => h.holder.kind === "PICKUP");
  const heldTotal = r.heldByStage.reduce((s, x) => s + x.grams, 0);
  const subjectWord = r.subject.kind === "SOURCE" ? "source" : labelOf(r.subject.kind).toLowerCase();
  return (
    <section aria-labelledby="fwd-h" className="trace-result">
      <h2 id="fwd-h">
        Where {subjectWord} {r.subject.code} went
      </h2>
      <Facts
        items={[
          ["Followed", r.subject.label],
          ["Entered the books", <strong key="e">{kgExact(r.enteredG)}</strong>],
          ["Origins followed", String(r.origins)],
          ["Movements that carried part of it", String(r.movesCarried)],
          ["Last movement included", r.asOf ? `no. ${r.asOf.moveId}, ${when(r.asOf.at, timeZone)}` : "none"],
        ]}
      />
      <Note>
        Every place that received part of this material and how much of it is still there, by replaying the ledger
        forward. Recovered methanol carries its share of a batch into the methanol tank and on into later batches, so
        later batches can hold a little of it.
      </Note>
      <FreshnessNote f={r.freshness} />
      <EpcisLink params={{ dir: "fwd", kind: r.query.kind, code: r.query.code }} />
      {r.enteredG === 0 ? (
        <Empty>No material of this {subjectWord} has entered the books.</Empty>
      ) : (
        <>
          <h3>Where it is now</h3>
          <div className="table-wrap">
            <table>
              <thead>
                <tr>
                  <th scope="col">Stage</th>
                  <th scope="col" className="num">
                    Places
                  </th>
                  <th scope="col" className="num">
                    Held there
                  </th>
                  <th scope="col" className="num">
                    Share
                  </th>
                </tr>
              </thead>
              <tbody>
                {r.heldByStage.map((s) => (
                  <tr key={s.label}>
                    <td>{s.label}</td>
                    <td className="num">{s.holders}</td>
                    <td className="num">{kg(s.grams, 3)}</td>
                    <td className="num">{pct((s.grams * 100) / r.enteredG, 2)}</td>
                  </tr>
                ))}
              </tbody>
              <tfoot>
                <tr>
                  <td>Total (equals what entered)</td>
                  <td />
                  <td className="num">{kg(heldTotal, 3)}</td>
                  <td className="num">{pct((heldTotal * 100) / r.enteredG, 2)}</td>
                </tr>
              </tfoot>
            </table>
          </div>
          <CustomerShares rows={r.byCustomer} enteredG={r.enteredG} />
          <h3>Graph</h3>
          {r.graph ? (
            <>
              <TraceGraphView
                graph={r.graph}
                title={`Where the material of ${subjectWord} ${r.subject.code} went, by stage`}
              />
              <Note>{r.graph.note} Small boxes are folded into &quot;others&quot; per stage.</Note>
            </>
          ) : null}
          <h3>Every place it reached</h3>
          <div className="table-wrap">
            <table>
              <caption>
                {downstream.length} places after the pickups{" "}
                <a href={csv} download className="csv-link">
                  Download CSV
                </a>
              </caption>
              <thead>
                <tr>
                  <th scope="col">Stage</th>
                  <th scope="col">Place</th>
                  <th scope="col">First reached</th>
                  <th scope="col" className="num">
                    Received of it
                  </th>
                  <th scope="col" className="num">
                    Still held
                  </th>
                </tr>
              </thead>
              <tbody>
                {downstream.map((h) => (
                  <tr key={h.holder.id}>
                    <td>{h.stageLabel}</td>
                    <td>
                      <HolderLink holder={h.holder} />
                      {h.customer ? (
                        <>
                          {" "}
                          to <CustomerName customer={h.customer} />
                        </>
                      ) : null}
                    </td>
                    <td className="nowrap">{when(h.firstAt, timeZone)}</td>
                    <td className="num">{kg(h.receivedG, 3)}</td>
                    <td className="num">{h.heldG === 0 ? <span className="muted">0</span> : kg(h.heldG, 3)}</td>
                  </tr>
                ))}
              </tbody>
            </table>
          </div>
          {pickups.length > 0 ? (
            <details className="more-rows">
              <summary>{pickups.length} pickups</summary>
              <ul className="code-list">
                {pickups.map((p) => (
                  <li key={p.holder.id}>
                    <HolderLink holder={p.holder} showKind={false} /> {kg(p.receivedG, 1)}
                  </li>
                ))}
              </ul>
            </details>
          ) : null}
        </>
      )}
    </section>
  );
}
