import type { Metadata } from "next";
import Link from "next/link";
import { getBalanceReportCached } from "@/lib/mass-balance/balance-cache.service";
import type { BalanceReport } from "@/lib/mass-balance/balance.service";
import { labelOf } from "@/lib/core/vocabulary";
import { day, kgExact, when } from "@/app/_ui/format";
import { loadSite } from "@/app/_ui/site";
import { Empty, Facts, NoSite, Note } from "@/app/_ui/ui";
import { ClosureChip, ToleranceNote } from "@/app/balance/closure";
import { PeriodActionForm } from "@/app/balance/period-form";
import { FlowsPicture } from "@/app/balance/flows-picture";
import { BalanceForm } from "@/app/balance/balance-form";
import { EventTable, FlowsTable, GaugeTable, IdentityTable, MaterialTable } from "@/app/balance/balance-tables";
import { ProcessTable } from "@/app/balance/process-table";
import { ReportLinks } from "@/app/_ui/report-view";
import { queryValue } from "@/app/_ui/links";
import type { SearchParams } from "@/app/_ui/links";

export const dynamic = "force-dynamic";
export const metadata: Metadata = { title: "Period balance" };

const FIELDS = ["period", "year", "month", "quarter", "start", "end", "warnPct", "failPct"] as const;

export default async function BalancePage({ searchParams }: { searchParams: Promise<SearchParams> }) {
  const { db, site, user } = await loadSite();
  if (!site) return <NoSite />;
  const sp = await searchParams;
  const typed = Object.fromEntries(FIELDS.map((f) => [f, queryValue(sp[f])])) as Record<
    (typeof FIELDS)[number],
    string
  >;
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

function BalanceFacts({ r }: { r: BalanceReport }) {
  const s = r.stock;
  const ap = r.accountingPeriod;
  return (
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
  );
}

function BalanceResult({ r, timeZone, canClose }: { r: BalanceReport; timeZone: string; canClose: boolean }) {
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
      <BalanceFacts r={r} />
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
      <CloseSection r={r} timeZone={timeZone} canClose={canClose} lastDay={lastDay} />
      <StockSections r={r} timeZone={timeZone} />
    </section>
  );
}

function CloseSection({
  r,
  timeZone,
  canClose,
  lastDay,
}: {
  r: BalanceReport;
  timeZone: string;
  canClose: boolean;
  lastDay: string;
}) {
  const ap = r.accountingPeriod;
  return (
    <>
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
            <PeriodActionForm
              periodId={ap.id}
              action={ap.status === "CLOSED" ? "reopen" : "close"}
              periodLabel={r.period.label}
            />
          ) : (
            <Note>Only a compliance user can close or reopen a period.</Note>
          )}
          <EventTable events={r.events} timeZone={timeZone} />
        </>
      )}
    </>
  );
}

function StockSections({ r, timeZone }: { r: BalanceReport; timeZone: string }) {
  const s = r.stock;
  const unaccounted = { key: "unaccounted", label: "Unaccounted (in − out − closing)", grams: s.imbalanceG };
  return (
    <>
      <h3>Site stock</h3>
      <div className="balance-grid">
        <IdentityTable caption="Into the stock" lines={r.inputs} totalLabel="Total in" totalG={r.inputsG} />
        <IdentityTable
          caption="Out of the stock, and what is left"
          lines={[...r.outputs, unaccounted]}
          totalLabel="Total out + closing + unaccounted"
          totalG={r.outputsG + s.imbalanceG}
        />
      </div>
      <Note>
        Product, glycerol phase, wash water and recovered methanol stay in the site&apos;s stock (product lots and
        tanks, waste containers, the methanol tank) until they are shipped or hauled away, so they count in the closing
        stock; the flows between the site&apos;s own places are listed below and in the batch view.
      </Note>

      <h3>Flows inside the site</h3>
      <FlowsTable lines={r.internal} />

      <h3>Batches finished in the period</h3>
      <ProcessTable r={r} />

      <h3>By material kind</h3>
      <MaterialTable rows={r.byMaterial} />
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
        <GaugeTable gauges={r.gauges} timeZone={timeZone} />
      )}
      <Note>
        The latest reading of each tank on or before the period&apos;s last day, against the book stock at the moment of
        the reading; the same tolerance, as a share of book stock. A gauge is a level, temperature and density estimate,
        not a weighing.
      </Note>
    </>
  );
}
