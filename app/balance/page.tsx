import type { Metadata } from "next";
import Link from "next/link";
import { getBalanceReportCached } from "@/lib/mass-balance/balance-cache.service";
import type { BalanceReport, BatchRow } from "@/lib/mass-balance/balance.service";
import { labelOf } from "@/lib/core/vocabulary";
import type { DomainIssue } from "@/lib/core/result";
import { day, kg, kgExact, num, when } from "@/app/_ui/format";
import { loadSite } from "@/app/_ui/site";
import { Empty, Facts, HolderLink, NoSite, Note } from "@/app/_ui/ui";
import { ClosureChip, ToleranceNote } from "@/app/balance/closure";
import { PeriodActionForm } from "@/app/balance/period-form";
import { FlowsPicture } from "@/app/balance/flows-picture";
import { ReportLinks } from "@/app/_ui/report-view";

export const dynamic = "force-dynamic";
export const metadata: Metadata = { title: "Period balance" };

type Search = Record<string, string | string[] | undefined>;

function one(v: string | string[] | undefined): string {
  return (Array.isArray(v) ? v[0] : v) ?? "";
}

const FIELDS = ["period", "year", "month", "quarter", "start", "end", "warnPct", "failPct"] as const;

export default async function BalancePage({ searchParams }: { searchParams: Promise<Search> }) {
  const { db, site, user } = await loadSite();
  if (!site) return <NoSite />;
  const sp = await searchParams;
  const typed = Object.fromEntries(FIELDS.map((f) => [f, one(sp[f])])) as Record<(typeof FIELDS)[number], string>;
  const result = await getBalanceReportCached(db, site, typed, user.now);
  const tz = site.timeZone;
  return (
    <>
      <h1>Period balance</h1>
      <p className="lede">
        Everything that entered and left the site&apos;s books in a period, in whole grams: opening stock and receipts
        against shipments, waste hauled, recorded losses and closing stock; the batches finished in the period; book
        stock against the tank gauges. <Link href="/balance/custody">Chain of custody</Link> is on its own page.
      </p>
      <BalanceForm typed={typed} report={result.ok ? result.value : null} issues={result.ok ? [] : result.issues} />
      {result.ok ? <BalanceResult r={result.value} timeZone={tz} canClose={user.role === "COMPLIANCE"} /> : null}
      {result.ok ? <FlowsPicture db={db} siteId={site.id} period={result.value.period} /> : null}
    </>
  );
}

function BalanceForm({
  typed,
  report,
  issues,
}: {
  typed: Record<string, string>;
  report: BalanceReport | null;
  issues: DomainIssue[];
}) {
  const q = report?.query;
  const value = (f: string, fallback: string | number | undefined) =>
    typed[f] !== "" ? typed[f] : fallback === undefined ? "" : String(fallback);
  const bad = (f: string) => (issues.some((i) => i.field === f) ? true : undefined);
  return (
    <form method="get" action="/balance" className="query-form" noValidate>
      <fieldset>
        <legend>Period</legend>
        <label>
          Kind
          <select name="period" defaultValue={value("period", q?.period ?? "MONTH")}>
            <option value="MONTH">Month</option>
            <option value="QUARTER">Quarter</option>
            <option value="CUSTOM">Custom dates</option>
          </select>
        </label>
        <label>
          Year
          <input
            name="year"
            inputMode="numeric"
            size={5}
            defaultValue={value("year", q?.year)}
            aria-invalid={bad("year")}
          />
        </label>
        <label>
          Month (1–12)
          <input
            name="month"
            inputMode="numeric"
            size={3}
            defaultValue={value("month", q?.month)}
            aria-invalid={bad("month")}
          />
        </label>
        <label>
          Quarter (1–4)
          <input
            name="quarter"
            inputMode="numeric"
            size={3}
            defaultValue={value("quarter", q?.quarter)}
            aria-invalid={bad("quarter")}
          />
        </label>
        <label>
          From (custom)
          <input
            name="start"
            type="date"
            defaultValue={value("start", q?.start)}
            aria-invalid={bad("start") ?? bad("startDate")}
          />
        </label>
        <label>
          Up to, not including
          <input
            name="end"
            type="date"
            defaultValue={value("end", q?.end)}
            aria-invalid={bad("end") ?? bad("endDate")}
          />
        </label>
        <label>
          Warn above (%)
          <input
            name="warnPct"
            inputMode="decimal"
            size={5}
            defaultValue={value("warnPct", q?.warnPct)}
            aria-invalid={bad("warnPct")}
          />
        </label>
        <label>
          Fail above (%)
          <input
            name="failPct"
            inputMode="decimal"
            size={5}
            defaultValue={value("failPct", q?.failPct)}
            aria-invalid={bad("failPct")}
          />
        </label>
        <button type="submit">Show balance</button>
        {issues.map((i) => (
          <p key={`${i.field ?? ""}${i.message}`} className="form-error" role="alert">
            {i.field ? `${i.field}: ` : ""}
            {i.message}
          </p>
        ))}
      </fieldset>
    </form>
  );
}

function Amount({ grams }: { grams: number }) {
  return <>{kgExact(grams)}</>;
}

/** The same period as GS1 EPCIS 2.0 events (GET /api/epcis/period takes the balance's own query). */
function epcisPeriodHref(q: BalanceReport["query"]): string {
  const params: Record<string, string> =
    q.period === "MONTH"
      ? { period: "MONTH", year: String(q.year), month: String(q.month) }
      : q.period === "QUARTER"
        ? { period: "QUARTER", year: String(q.year), quarter: String(q.quarter) }
        : { period: "CUSTOM", start: q.start, end: q.end };
  return `/api/epcis/period?${new URLSearchParams(params).toString()}`;
}

function BalanceResult({ r, timeZone, canClose }: { r: BalanceReport; timeZone: string; canClose: boolean }) {
  const s = r.stock;
  const ap = r.accountingPeriod;
  const lastDay = day(new Date(r.period.endsAt.getTime() - 1), timeZone);
  return (
    <section aria-labelledby="bal-h">
      <h2 id="bal-h">
        Balance {r.period.label}{" "}
        <span className="muted">
          ({day(r.period.startsAt, timeZone)} to {lastDay})
        </span>
      </h2>
      <ReportLinks
        base={`/balance/report?${new URLSearchParams(Object.entries(r.query).map(([k, v]) => [k, String(v)])).toString()}`}
        pdfLabel="Period balance statement"
        tables={[
          ["statement", "Statement"],
          ["materials", "By material kind"],
          ["batches", "Batches"],
          ["gauges", "Gauges"],
        ]}
      />
      <Facts
        items={[
          [
            "Closure (measured against the books)",
            <span key="d" data-testid="measured-closure">
              <ClosureChip closure={r.differences.closure} />
            </span>,
          ],
          ["Unmeasured batch differences", <Amount key="ub" grams={r.differences.unmeasuredG} />],
          ["Receiving differences", <Amount key="rd" grams={r.differences.receivingG} />],
          [
            "Gauges vs book (book − measured)",
            r.gauges ? <Amount key="gd" grams={r.differences.gaugeG} /> : "no readings",
          ],
          [
            "Batches finished",
            <span key="p">
              {r.process.completed.length} <ClosureChip closure={r.process.closure} />
            </span>,
          ],
          [
            "Books complete (stock identity)",
            <span key="c">
              <ClosureChip closure={s.closure} /> unaccounted <Amount grams={s.imbalanceG} />
            </span>,
          ],
          [
            "Accounting period",
            ap ? (
              <span key="a" className={`status status-${ap.status === "OPEN" ? "open-period" : "closed"}`}>
                {ap.status === "OPEN" ? "Open" : "Closed"}
              </span>
            ) : (
              "none with these dates"
            ),
          ],
        ]}
      />
      <Note>
        <ToleranceNote tolerance={r.tolerance} /> The closure is the sum of the batches&apos; unmeasured differences
        (charged less everything weighed or gauged out), the receiving differences (pickup estimates less the
        plant&apos;s measurement) and book stock less the latest gauge readings, as a share of what entered the stock in
        the period. Recorded losses (a spill with its reason) are outputs, not differences. The stock identity only
        checks that no movement is missing.
      </Note>
      <p>
        <a href={epcisPeriodHref(r.query)} download className="csv-link">
          EPCIS 2.0 events
        </a>{" "}
        <span className="muted">
          — this period&apos;s receipts, moves, batches and shipments in the GS1 standard format a trading
          partner&apos;s system reads
        </span>
      </p>
      {r.negativeStock.length > 0 ? (
        <ul className="warning" aria-label="Negative book stock">
          {r.negativeStock.map((n) => (
            <li key={`${n.moveId}`}>
              {n.holder ? `${labelOf(n.holder.kind)} ${n.holder.code}` : "A holder"} went to {kgExact(n.balanceG)} at{" "}
              {when(n.at, timeZone)} (movement no. {n.moveId}): a movement in is missing.
            </li>
          ))}
        </ul>
      ) : null}

      <h3>Close or reopen</h3>
      {ap === null ? (
        <Empty>No accounting period with exactly these dates; periods are kept per month on the periods page.</Empty>
      ) : (
        <>
          <p>
            Accounting period {day(ap.startsAt, timeZone)} – {lastDay}:{" "}
            {ap.status === "CLOSED"
              ? `closed ${when(ap.closedAt, timeZone)} by ${ap.closedBy ?? "—"}`
              : "open; movements dated in it can still be booked"}
            .
          </p>
          {canClose ? (
            ap.status === "CLOSED" ? (
              <PeriodActionForm periodId={ap.id} action="reopen" periodLabel={r.period.label} />
            ) : (
              <PeriodActionForm periodId={ap.id} action="close" periodLabel={r.period.label} />
            )
          ) : (
            <Note>Only a compliance user can close or reopen a period.</Note>
          )}
          <EventTable events={r.events} timeZone={timeZone} />
        </>
      )}

      <h3>Site stock</h3>
      <div className="balance-grid">
        <div className="table-wrap" tabIndex={0} role="region" aria-label="Into the stock">
          <table className="identity">
            <caption>Into the stock</caption>
            <tbody>
              {r.inputs.map((l) => (
                <tr key={l.key}>
                  <td>{l.label}</td>
                  <td className="num">
                    <Amount grams={l.grams} />
                  </td>
                </tr>
              ))}
            </tbody>
            <tfoot>
              <tr>
                <td>Total in</td>
                <td className="num">
                  <Amount grams={r.inputsG} />
                </td>
              </tr>
            </tfoot>
          </table>
        </div>
        <div className="table-wrap" tabIndex={0} role="region" aria-label="Out of the stock, and what is left">
          <table className="identity">
            <caption>Out of the stock, and what is left</caption>
            <tbody>
              {r.outputs.map((l) => (
                <tr key={l.key}>
                  <td>{l.label}</td>
                  <td className="num">
                    <Amount grams={l.grams} />
                  </td>
                </tr>
              ))}
              <tr>
                <td>Unaccounted (in − out − closing)</td>
                <td className="num">
                  <Amount grams={s.imbalanceG} />
                </td>
              </tr>
            </tbody>
            <tfoot>
              <tr>
                <td>Total out + closing + unaccounted</td>
                <td className="num">
                  <Amount grams={r.outputsG + s.imbalanceG} />
                </td>
              </tr>
            </tfoot>
          </table>
        </div>
      </div>
      <Note>
        Product, glycerol phase, wash water and recovered methanol stay in the site&apos;s stock (product lots and
        tanks, waste containers, the methanol tank) until they are shipped or hauled away, so they count in the closing
        stock; the flows between the site&apos;s own places are listed below and in the batch view.
      </Note>

      <h3>Flows inside the site</h3>
      <div className="table-wrap" tabIndex={0} role="region" aria-label="Flows inside the site">
        <table>
          <thead>
            <tr>
              <th scope="col">Flow</th>
              <th scope="col" className="num">
                Mass in the period
              </th>
            </tr>
          </thead>
          <tbody>
            {r.internal.map((l) => (
              <tr key={l.key}>
                <td>{l.label}</td>
                <td className="num">{kg(l.grams, 3)}</td>
              </tr>
            ))}
          </tbody>
        </table>
      </div>

      <h3>Batches finished in the period</h3>
      <ProcessTable r={r} />

      <h3>By material kind</h3>
      <div className="table-wrap" tabIndex={0} role="region" aria-label="By material kind">
        <table>
          <thead>
            <tr>
              <th scope="col">Material</th>
              <th scope="col" className="num">
                Opening
              </th>
              <th scope="col" className="num">
                Received
              </th>
              <th scope="col" className="num">
                From other kinds
              </th>
              <th scope="col" className="num">
                Shipped, hauled, lost
              </th>
              <th scope="col" className="num">
                To other kinds
              </th>
              <th scope="col" className="num">
                Closing
              </th>
              <th scope="col" className="num">
                Unaccounted
              </th>
              <th scope="col">Books</th>
              <th scope="col" className="num">
                Differences
              </th>
              <th scope="col">Closure</th>
            </tr>
          </thead>
          <tbody>
            {r.byMaterial.map((m) => (
              <tr key={m.materialKind}>
                <td>{m.label}</td>
                <td className="num">{kg(m.openingG, 3)}</td>
                <td className="num">{kg(m.receiptsG, 3)}</td>
                <td className="num">{kg(m.inG - m.receiptsG, 3)}</td>
                <td className="num">{kg(m.outputsG, 3)}</td>
                <td className="num">{kg(m.transfersOutG, 3)}</td>
                <td className="num">{kg(m.closingG, 3)}</td>
                <td className="num">{kgExact(m.imbalanceG)}</td>
                <td>
                  <ClosureChip closure={m.closure} />
                </td>
                <td className="num">{kgExact(m.differences.totalG)}</td>
                <td>
                  <ClosureChip closure={m.differences.closure} />
                </td>
              </tr>
            ))}
          </tbody>
        </table>
      </div>
      <Note>
        A material kind&apos;s stock is the places that carry it: feedstock lots and pickups by their material,
        feedstock tanks as pooled feedstock, product lots and tanks as methyl ester, batches as material in reaction,
        reagent lots by reagent, waste containers by stream. A move between two kinds (a lot into a tank, oil into a
        batch) leaves one and enters the other.
      </Note>

      <h3>Book stock against the latest tank gauges</h3>
      {r.gauges === null ? (
        <Empty>No tank was gauged before the end of this period.</Empty>
      ) : (
        <div className="table-wrap" tabIndex={0} role="region" aria-label="Gauges against the book">
          <table>
            <thead>
              <tr>
                <th scope="col">Tank</th>
                <th scope="col">Gauged</th>
                <th scope="col" className="num">
                  Book stock then
                </th>
                <th scope="col" className="num">
                  Measured
                </th>
                <th scope="col" className="num">
                  Measured − book
                </th>
                <th scope="col">Closure</th>
              </tr>
            </thead>
            <tbody>
              {r.gauges.rows.map((g) => (
                <tr key={g.tankCode}>
                  <td>
                    <HolderLink holder={{ kind: "TANK", code: g.tankCode }} showKind={false} />
                  </td>
                  <td className="nowrap">{when(g.at, timeZone)}</td>
                  <td className="num">{kg(g.bookG, 3)}</td>
                  <td className="num">{kg(g.measuredG, 3)}</td>
                  <td className="num">{kg(g.differenceG, 3)}</td>
                  <td>
                    <ClosureChip closure={g.closure} what="of book stock" />
                  </td>
                </tr>
              ))}
            </tbody>
            <tfoot>
              <tr>
                <td colSpan={2}>All gauged tanks</td>
                <td className="num">{kg(r.gauges.total.bookG, 3)}</td>
                <td className="num">{kg(r.gauges.total.measuredG, 3)}</td>
                <td className="num">{kg(r.gauges.total.differenceG, 3)}</td>
                <td>
                  <ClosureChip closure={r.gauges.total.closure} what="of book stock" />
                </td>
              </tr>
            </tfoot>
          </table>
        </div>
      )}
      <Note>
        The latest reading of each tank on or before the period&apos;s last day, against the book stock at the moment of
        the reading; the same tolerance, as a share of book stock. A gauge is a level, temperature and density estimate,
        not a weighing.
      </Note>
    </section>
  );
}

function EventTable({ events, timeZone }: { events: BalanceReport["events"]; timeZone: string }) {
  if (events.length === 0) return <Empty>No close or reopen recorded for this period yet.</Empty>;
  return (
    <div className="table-wrap" tabIndex={0} role="region" aria-label="Closes and reopens">
      <table>
        <caption>Closes and reopens of this period</caption>
        <thead>
          <tr>
            <th scope="col">When</th>
            <th scope="col">Action</th>
            <th scope="col">By</th>
            <th scope="col">Reason</th>
          </tr>
        </thead>
        <tbody>
          {events.map((e) => (
            <tr key={e.id}>
              <td className="nowrap">{when(e.at, timeZone)}</td>
              <td>{e.action === "CLOSE" ? "Closed" : "Reopened"}</td>
              <td>{e.by}</td>
              <td>{e.reason}</td>
            </tr>
          ))}
        </tbody>
      </table>
    </div>
  );
}

function roleSum(rec: Partial<Record<string, number>>, role: string): number {
  return rec[role] ?? 0;
}

function ProcessTable({ r }: { r: BalanceReport }) {
  const p = r.process;
  if (p.completed.length === 0 && p.inProgress.length === 0) return <Empty>No batch ran in this period.</Empty>;
  const flagged = p.completed.filter((b) => b.closure.flag !== "OK");
  const rows: Array<[string, string, number]> = [
    ["in", "Oil", roleSum(p.inputsByRole, "OIL")],
    ["in", "Methanol", roleSum(p.inputsByRole, "METHANOL")],
    ["in", "Catalyst", roleSum(p.inputsByRole, "CATALYST")],
    ["in", "Acid", roleSum(p.inputsByRole, "ACID")],
    ["in", "Water (batches booked before washing was recorded apart)", roleSum(p.inputsByRole, "WATER")],
    ["out", "Product (methyl ester)", roleSum(p.outputsByRole, "ESTER")],
    ["out", "Glycerol phase", roleSum(p.outputsByRole, "GLYCEROL_PHASE")],
    ["out", "Washed out with the wash water (the water itself left out)", roleSum(p.outputsByRole, "WASH_WATER")],
    ["out", "Recovered methanol", roleSum(p.outputsByRole, "RECOVERED_METHANOL")],
    ["out", "Recorded losses", roleSum(p.outputsByRole, "LOSS")],
  ];
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
            {rows
              .filter(([side]) => side === "in")
              .map(([, label, g]) => (
                <tr key={`in-${label}`}>
                  <td>{label}</td>
                  <td className="num">{kgExact(g)}</td>
                </tr>
              ))}
            <tr className="group">
              <td>Total charged</td>
              <td className="num">{kgExact(p.inputsG)}</td>
            </tr>
            <tr className="group">
              <td colSpan={2}>Drawn off</td>
            </tr>
            {rows
              .filter(([side]) => side === "out")
              .map(([, label, g]) => (
                <tr key={`out-${label}`}>
                  <td>{label}</td>
                  <td className="num">{kgExact(g)}</td>
                </tr>
              ))}
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

function BatchTable({ rows }: { rows: BatchRow[] }) {
  return (
    <div className="table-wrap" tabIndex={0} role="region" aria-label="Batches">
      <table>
        <thead>
          <tr>
            <th scope="col">Batch</th>
            <th scope="col" className="num">
              Charged
            </th>
            <th scope="col" className="num">
              Drawn off
            </th>
            <th scope="col" className="num">
              Unmeasured difference, or still in it
            </th>
            <th scope="col" className="num">
              Ester ÷ oil
            </th>
            <th scope="col">Closure</th>
          </tr>
        </thead>
        <tbody>
          {rows.map((b) => {
            const oil = b.inputsByRole.OIL ?? 0;
            const ester = b.outputsByRole.ESTER ?? 0;
            return (
              <tr key={b.holderId}>
                <td>
                  <HolderLink holder={{ kind: "BATCH", code: b.code }} showKind={false} />
                  {b.completedAt === null ? <span className="tag">in progress</span> : null}
                </td>
                <td className="num">{kg(b.inputsG, 3)}</td>
                <td className="num">{kg(b.outputsG, 3)}</td>
                <td className="num">{kgExact(b.imbalanceG)}</td>
                <td className="num">{oil > 0 ? num(ester / oil, 4) : "—"}</td>
                <td>
                  {b.completedAt === null ? (
                    <span className="muted">not flagged</span>
                  ) : (
                    <ClosureChip closure={b.closure} />
                  )}
                </td>
              </tr>
            );
          })}
        </tbody>
      </table>
    </div>
  );
}
