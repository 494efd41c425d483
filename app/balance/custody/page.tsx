import type { Metadata } from "next";
import Link from "next/link";
import { getCustodyReport } from "@/lib/custody/custody.service";
import type { CustodyReport } from "@/lib/custody/custody.service";
import { OPERATOR_TYPES } from "@/lib/custody/custody-balance";
import type { DomainIssue } from "@/lib/core/result";
import { day, kg, kgExact, when } from "@/app/_ui/format";
import { loadSite } from "@/app/_ui/site";
import { Facts, NoSite, Note } from "@/app/_ui/ui";
import { ReportLinks } from "@/app/_ui/report-view";
import {
  AccountsTable,
  ClaimsTable,
  ConversionTable,
  InputsTable,
  RunningBalance,
} from "@/app/balance/custody/custody-tables";
import { queryValue } from "@/app/_ui/links";
import type { SearchParams } from "@/app/_ui/links";
import { QueryForm } from "@/app/_ui/query-form";

export const dynamic = "force-dynamic";
export const metadata: Metadata = { title: "Chain of custody" };

const OPERATOR_WORDS: Readonly<Record<string, string>> = {
  OTHER_OPERATOR: "Processing plant or trader (other operator)",
  AGRI_FOREST_PRODUCER_OR_FIRST_GATHERING_POINT: "Producer of biomass or first gathering point",
};

export default async function CustodyPage({ searchParams }: { searchParams: Promise<SearchParams> }) {
  const { db, site, user } = await loadSite();
  if (!site) return <NoSite />;
  const sp = await searchParams;
  const typed = {
    period: queryValue(sp.period),
    operatorType: queryValue(sp.operatorType),
    claimKg: queryValue(sp.claimKg),
    claimSet: queryValue(sp.claimSet),
  };
  const result = await getCustodyReport(db, site, typed, user.now);
  const tz = site.timeZone;
  return (
    <>
      <p className="crumbs">
        <Link href="/balance">Balance</Link> /
      </p>
      <h1>Chain of custody</h1>
      <p className="lede">
        Certified credit by characteristic set, booked in time order: certified feedstock in, conversion to methyl ester
        at each batch&apos;s measured yield, certified claims on shipments out. A claim larger than the credit at its
        booking is flagged.
      </p>
      <CustodyForm typed={typed} report={result.ok ? result.value : null} issues={result.ok ? [] : result.issues} />
      {result.ok ? (
        <ReportLinks
          base={`/balance/custody/report?${new URLSearchParams({ period: result.value.selected.label, operatorType: result.value.query.operatorType }).toString()}`}
          pdfLabel="Chain-of-custody statement"
          tables={[
            ["inputs", "Certified inputs"],
            ["conversions", "Conversions"],
            ["claims", "Claims"],
            ["accounts", "Accounts"],
          ]}
        />
      ) : null}
      {result.ok ? <CustodyResult r={result.value} timeZone={tz} /> : null}
    </>
  );
}

function CustodyForm({
  typed,
  report,
  issues,
}: {
  typed: Record<string, string>;
  report: CustodyReport | null;
  issues: DomainIssue[];
}) {
  const bad = (f: string) => (issues.some((i) => i.field === f) ? true : undefined);
  return (
    <QueryForm action="/balance/custody" legend="Balance period and claim check" submitLabel="Show" issues={issues}>
      <label>
        Balance period
        {report ? (
          <select name="period" defaultValue={report.query.period}>
            {report.periods.map((p) => (
              <option key={p.label} value={p.label}>
                {p.label}
                {p.closed ? "" : " (open)"}
              </option>
            ))}
          </select>
        ) : (
          <input name="period" defaultValue={typed.period} size={9} aria-invalid={bad("period")} />
        )}
      </label>
      <label>
        Operator type
        <select
          name="operatorType"
          defaultValue={report?.query.operatorType ?? (typed.operatorType || "OTHER_OPERATOR")}
        >
          {OPERATOR_TYPES.map((o) => (
            <option key={o} value={o}>
              {OPERATOR_WORDS[o] ?? o}
            </option>
          ))}
        </select>
      </label>
      <label>
        Try a claim now (kg of ester)
        <input name="claimKg" inputMode="decimal" size={9} defaultValue={typed.claimKg} aria-invalid={bad("claimKg")} />
      </label>
      <label>
        Against set
        <select name="claimSet" defaultValue={typed.claimSet}>
          <option value="">the set with the most credit</option>
          {(report?.sets ?? []).map((s) => (
            <option key={s.key} value={s.key}>
              {s.key}
            </option>
          ))}
        </select>
      </label>
    </QueryForm>
  );
}

function RuleSetSection({ r }: { r: CustodyReport }) {
  const rs = r.ruleSet;
  const period = rs.balancePeriodMonths[r.query.operatorType];
  return (
    <section aria-labelledby="rules-h">
      <h2 id="rules-h">Active rule set</h2>
      <Facts
        items={[
          ["Rule set", rs.name],
          ["Source", rs.source],
          ["Balance period", `${r.periodMonths} months (${period.source}; ${period.status})`],
          ["Period start", `month ${rs.periodAnchorMonth.value} (${rs.periodAnchorMonth.status})`],
          [
            "Carry-forward",
            `${rs.carryForward.value === "CARRY_POSITIVE" ? "a positive closing balance opens the next period" : "the balance lapses at period end"} (${rs.carryForward.status})`,
          ],
          [
            "Negative balance",
            `${rs.negativeBalance.value === "NEVER_NEGATIVE_AT_ANY_BOOKING" ? "refused at any booking" : "allowed inside a period, not at its end"} (${rs.negativeBalance.status})`,
          ],
        ]}
      />
      <Note>Edition: {rs.edition}</Note>
      <details className="more-rows" open>
        <summary>Notes on the rule set and how far each point is confirmed</summary>
        <ul>
          {rs.notes.map((n) => (
            <li key={n}>{n}</li>
          ))}
          <li>Carry-forward source: {rs.carryForward.source}.</li>
          <li>Negative-balance source: {rs.negativeBalance.source}.</li>
        </ul>
      </details>
      <Note>
        How Tracevat books it (our rules, common practice, no source): certified input is the oil of lots marked
        certified whose source held a valid certificate on the day, per characteristic set (scheme and raw material);
        the certified share of a batch&apos;s oil comes from the genealogy (tank mixing), and converts at the
        batch&apos;s measured ester ÷ oil; receiving shortfalls are written off; a shipment does not record a set, so
        each certified claim is booked against the set with the most ester credit at the shipment time.
      </Note>
    </section>
  );
}

function FailureList({ r, timeZone }: { r: CustodyReport; timeZone: string }) {
  if (r.failures.length === 0) return <p className="form-ok">No booking exceeded the certified balance.</p>;
  return (
    <div className="warning" role="alert">
      <strong>Bookings that exceeded the certified balance (all periods)</strong>
      <ul>
        {r.failures.map((f) => (
          <li key={`${f.bookingId}${f.at}`}>
            {periodOf(r, f.at)}: {f.description} on {when(new Date(f.at), timeZone)}: {kgExact(f.requestedG)} asked,{" "}
            {kgExact(f.availableG)} available in {f.setKey} ({f.material}), short by {kgExact(f.shortfallG)}. Not
            applied: later bookings see the balance without it.
          </li>
        ))}
      </ul>
    </div>
  );
}

function PeriodSection({ r, timeZone }: { r: CustodyReport; timeZone: string }) {
  const claimed = r.claims.reduce((s, c) => s + c.massG, 0);
  const refused = r.claims.filter((c) => !c.accepted);
  return (
    <section aria-labelledby="per-h">
      <h2 id="per-h">
        Balance period {r.selected.label}{" "}
        <span className="muted">
          ({day(r.selected.startsAt, timeZone)} to {day(new Date(r.selected.endsAt.getTime() - 1), timeZone)})
        </span>
      </h2>
      <Facts
        items={[
          ["Claims checked (all periods)", `${r.claims.length} shipments, ${kg(claimed, 0)}`],
          [
            "Claims over the balance (all periods)",
            refused.length === 0 ? "none" : <strong key="x">{refused.length}</strong>,
          ],
          ["Bookings", String(r.bookings)],
        ]}
      />
      {r.claimCheck ? <ClaimCheckResult c={r.claimCheck} /> : null}
      <FailureList r={r} timeZone={timeZone} />
      <h3>Balances in {r.selected.label}</h3>
      <AccountsTable r={r} />
      <h3>Running balance in {r.selected.label}</h3>
      {r.accounts.map((a) => (
        <RunningBalance key={`${a.setKey}|${a.material}`} a={a} timeZone={timeZone} />
      ))}
    </section>
  );
}

function CustodyResult({ r, timeZone }: { r: CustodyReport; timeZone: string }) {
  const nc = r.notCredited;
  return (
    <>
      <RuleSetSection r={r} />
      <PeriodSection r={r} timeZone={timeZone} />
      <section aria-labelledby="in-h">
        <h2 id="in-h">Certified inputs by characteristic set</h2>
        <InputsTable sets={r.sets} />
        <Note>
          Not credited: {kg(nc.lotOnlyG, 0)} in lots marked certified from sources without a valid certificate,{" "}
          {kg(nc.sourceOnlyG, 0)} from certified sources in lots not marked certified, {kg(nc.surplusG, 0)} measured
          above the pickups&apos; estimate at receiving (no source).
          {nc.withheldG > 0
            ? ` Withheld after confirmed screening flags: ${kg(nc.withheldG, 0)} from ${nc.withheldSources.join(", ")}, until compliance clears the source.`
            : ""}
        </Note>
      </section>
      <section aria-labelledby="conv-h">
        <h2 id="conv-h">Conversion factors per batch (measured)</h2>
        <details className="more-rows">
          <summary>{r.conversions.length} finished batches: ester out ÷ oil in, certified oil converted</summary>
          <ConversionTable rows={r.conversions} timeZone={timeZone} />
        </details>
        <Note>
          Credit = certified oil × (ester out ÷ oil in of that batch), rounded down to whole grams so credit is never
          overstated.
        </Note>
      </section>
      <section aria-labelledby="claims-h">
        <h2 id="claims-h">Certified claims on shipments</h2>
        <ClaimsTable rows={r.claims} timeZone={timeZone} />
      </section>
      <Note>
        Genealogy used for the certified share: {r.trace.movements} movements, indexed at{" "}
        {when(r.trace.indexedAt, timeZone)}.
      </Note>
    </>
  );
}

function periodOf(r: CustodyReport, at: number): string {
  return r.periods.find((p) => p.startsAt.getTime() <= at && at < p.endsAt.getTime())?.label ?? "";
}

function ClaimCheckResult({ c }: { c: NonNullable<CustodyReport["claimCheck"]> }) {
  return c.ok ? (
    <p className="form-ok" role="status">
      A claim of {kgExact(c.massG)} against {c.setKey} now would pass: {kgExact(c.check.availableG)} available,{" "}
      {kgExact(c.check.balanceAfterG)} left after it. Nothing was saved.
    </p>
  ) : (
    <div className="form-error" role="alert">
      A claim of {kgExact(c.massG)} against {c.setKey} now would be refused:
      <ul>
        {c.issues.map((i) => (
          <li key={i.message}>{i.message}</li>
        ))}
      </ul>
    </div>
  );
}
