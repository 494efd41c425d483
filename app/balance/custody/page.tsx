import type { Metadata } from "next";
import Link from "next/link";
import { getCustodyReport } from "@/lib/custody/custody.service";
import type { AccountView, CustodyReport } from "@/lib/custody/custody.service";
import { OPERATOR_TYPES } from "@/lib/custody/custody-balance";
import type { DomainIssue } from "@/lib/core/result";
import { day, kg, kgExact, num, when } from "@/app/_ui/format";
import { loadSite } from "@/app/_ui/site";
import { Empty, Facts, HolderLink, NoSite, Note } from "@/app/_ui/ui";
import { ReportLinks } from "@/app/_ui/report-view";

export const dynamic = "force-dynamic";
export const metadata: Metadata = { title: "Chain of custody" };

type Search = Record<string, string | string[] | undefined>;

function one(v: string | string[] | undefined): string {
  return (Array.isArray(v) ? v[0] : v) ?? "";
}

const OPERATOR_WORDS: Readonly<Record<string, string>> = {
  OTHER_OPERATOR: "Processing plant or trader (other operator)",
  AGRI_FOREST_PRODUCER_OR_FIRST_GATHERING_POINT: "Producer of biomass or first gathering point",
};

export default async function CustodyPage({ searchParams }: { searchParams: Promise<Search> }) {
  const { db, site, user } = await loadSite();
  if (!site) return <NoSite />;
  const sp = await searchParams;
  const typed = {
    period: one(sp.period),
    operatorType: one(sp.operatorType),
    claimKg: one(sp.claimKg),
    claimSet: one(sp.claimSet),
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
    <form method="get" action="/balance/custody" className="query-form" noValidate>
      <fieldset>
        <legend>Balance period and claim check</legend>
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
          <input
            name="claimKg"
            inputMode="decimal"
            size={9}
            defaultValue={typed.claimKg}
            aria-invalid={bad("claimKg")}
          />
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
        <button type="submit">Show</button>
        {issues.map((i) => (
          <p key={`${i.field ?? ""}${i.message}`} className="form-error" role="alert">
            {i.message}
          </p>
        ))}
      </fieldset>
    </form>
  );
}

function CustodyResult({ r, timeZone }: { r: CustodyReport; timeZone: string }) {
  const rs = r.ruleSet;
  const months = r.periodMonths;
  const claimed = r.claims.reduce((s, c) => s + c.massG, 0);
  const refused = r.claims.filter((c) => !c.accepted);
  return (
    <>
      <section aria-labelledby="rules-h">
        <h2 id="rules-h">Active rule set</h2>
        <Facts
          items={[
            ["Rule set", rs.name],
            ["Source", rs.source],
            [
              "Balance period",
              `${months} months (${rs.balancePeriodMonths[r.query.operatorType].source}; ${rs.balancePeriodMonths[r.query.operatorType].status})`,
            ],
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
        {r.failures.length > 0 ? (
          <div className="warning" role="alert">
            <strong>Bookings that exceeded the certified balance (all periods)</strong>
            <ul>
              {r.failures.map((f) => (
                <li key={`${f.bookingId}${f.at}`}>
                  {periodOf(r, f.at)}: {f.description} on {when(new Date(f.at), timeZone)}: {kgExact(f.requestedG)}{" "}
                  asked, {kgExact(f.availableG)} available in {f.setKey} ({f.material}), short by{" "}
                  {kgExact(f.shortfallG)}. Not applied: later bookings see the balance without it.
                </li>
              ))}
            </ul>
          </div>
        ) : (
          <p className="form-ok">No booking exceeded the certified balance.</p>
        )}
        <h3>Balances in {r.selected.label}</h3>
        <div className="table-wrap">
          <table>
            <thead>
              <tr>
                <th scope="col">Characteristic set</th>
                <th scope="col">Material</th>
                <th scope="col" className="num">
                  Opening
                </th>
                <th scope="col" className="num">
                  Credits
                </th>
                <th scope="col" className="num">
                  Debits
                </th>
                <th scope="col" className="num">
                  Closing
                </th>
                <th scope="col" className="num">
                  Carried forward
                </th>
              </tr>
            </thead>
            <tbody>
              {r.accounts.map((a) => (
                <tr key={`${a.setKey}|${a.material}`}>
                  <td>{a.setKey}</td>
                  <td>{a.materialLabel}</td>
                  <td className="num">{a.selected ? kg(a.selected.openingG, 3) : "—"}</td>
                  <td className="num">{a.selected ? kg(a.selected.creditsG, 3) : "—"}</td>
                  <td className="num">{a.selected ? kg(a.selected.debitsG, 3) : "—"}</td>
                  <td className="num">{a.selected ? kg(a.selected.closingG, 3) : "—"}</td>
                  <td className="num">
                    {a.selected === null ? (
                      "—"
                    ) : a.selected.carriedForwardG === null ? (
                      <span className="muted">period open</span>
                    ) : (
                      kg(a.selected.carriedForwardG, 3)
                    )}
                  </td>
                </tr>
              ))}
            </tbody>
          </table>
        </div>
        <h3>Running balance in {r.selected.label}</h3>
        {r.accounts.map((a) => (
          <RunningBalance key={`${a.setKey}|${a.material}`} a={a} timeZone={timeZone} />
        ))}
      </section>

      <section aria-labelledby="in-h">
        <h2 id="in-h">Certified inputs by characteristic set</h2>
        {r.sets.length === 0 ? (
          <Empty>No certified feedstock has been received.</Empty>
        ) : (
          <div className="table-wrap">
            <table>
              <thead>
                <tr>
                  <th scope="col">Characteristic set</th>
                  <th scope="col">Source certificate</th>
                  <th scope="col">Sources</th>
                  <th scope="col" className="num">
                    Certified input (all periods)
                  </th>
                </tr>
              </thead>
              <tbody>
                {r.sets.flatMap((s) =>
                  s.certificates.map((c, i) => (
                    <tr key={`${s.key}|${c.certificate}`}>
                      <td>{i === 0 ? s.key : ""}</td>
                      <td>{c.certificate}</td>
                      <td>
                        {c.sources.map((code, j) => (
                          <span key={code}>
                            {j > 0 ? ", " : ""}
                            <a href={`/sources/${encodeURIComponent(code)}`}>{code}</a>
                          </span>
                        ))}
                      </td>
                      <td className="num">{kg(c.grams, 3)}</td>
                    </tr>
                  )),
                )}
              </tbody>
            </table>
          </div>
        )}
        <Note>
          Not credited: {kg(r.notCredited.lotOnlyG, 0)} in lots marked certified from sources without a valid
          certificate, {kg(r.notCredited.sourceOnlyG, 0)} from certified sources in lots not marked certified,{" "}
          {kg(r.notCredited.surplusG, 0)} measured above the pickups&apos; estimate at receiving (no source).
          {r.notCredited.withheldG > 0
            ? ` Withheld after confirmed screening flags: ${kg(r.notCredited.withheldG, 0)} from ${r.notCredited.withheldSources.join(", ")}, until compliance clears the source.`
            : ""}
        </Note>
      </section>

      <section aria-labelledby="conv-h">
        <h2 id="conv-h">Conversion factors per batch (measured)</h2>
        <details className="more-rows">
          <summary>{r.conversions.length} finished batches: ester out ÷ oil in, certified oil converted</summary>
          <div className="table-wrap">
            <table>
              <thead>
                <tr>
                  <th scope="col">Batch</th>
                  <th scope="col">Finished</th>
                  <th scope="col" className="num">
                    Oil in
                  </th>
                  <th scope="col" className="num">
                    Ester out
                  </th>
                  <th scope="col" className="num">
                    Factor
                  </th>
                  <th scope="col">Certified oil → ester credit</th>
                </tr>
              </thead>
              <tbody>
                {r.conversions.map((c) => (
                  <tr key={c.batchCode}>
                    <td>
                      <HolderLink holder={{ kind: "BATCH", code: c.batchCode }} showKind={false} />
                    </td>
                    <td className="nowrap">{when(c.completedAt, timeZone)}</td>
                    <td className="num">{kg(c.oilG, 3)}</td>
                    <td className="num">{kg(c.esterG, 3)}</td>
                    <td className="num">{num(c.factor, 4)}</td>
                    <td>
                      {c.bySet.length === 0 ? (
                        <span className="muted">no certified oil</span>
                      ) : (
                        c.bySet.map((s) => (
                          <div key={s.setKey}>
                            {s.setKey}: {kg(s.certifiedOilG, 1)} → {kg(s.fameCreditG, 1)}
                            {s.accepted ? "" : <span className="status status-fail">over the balance</span>}
                          </div>
                        ))
                      )}
                    </td>
                  </tr>
                ))}
              </tbody>
            </table>
          </div>
        </details>
        <Note>
          Credit = certified oil × (ester out ÷ oil in of that batch), rounded down to whole grams so credit is never
          overstated.
        </Note>
      </section>

      <section aria-labelledby="claims-h">
        <h2 id="claims-h">Certified claims on shipments</h2>
        {r.claims.length === 0 ? (
          <Empty>No shipment was claimed certified.</Empty>
        ) : (
          <div className="table-wrap">
            <table>
              <thead>
                <tr>
                  <th scope="col">Shipment</th>
                  <th scope="col">Shipped</th>
                  <th scope="col">Customer</th>
                  <th scope="col">Set</th>
                  <th scope="col" className="num">
                    Claimed
                  </th>
                  <th scope="col" className="num">
                    Credit before
                  </th>
                  <th scope="col">Check</th>
                </tr>
              </thead>
              <tbody>
                {r.claims.map((c) => (
                  <tr key={c.documentNo}>
                    <td>
                      <HolderLink holder={{ kind: "SHIPMENT", code: c.documentNo }} showKind={false} />
                    </td>
                    <td className="nowrap">{when(c.at, timeZone)}</td>
                    <td>{c.customer}</td>
                    <td>{c.setKey}</td>
                    <td className="num">{kg(c.massG, 3)}</td>
                    <td className="num">{kg(c.availableG, 3)}</td>
                    <td>
                      {c.accepted ? (
                        <span className="status status-pass">within balance</span>
                      ) : (
                        <span className="status status-fail">exceeds by {kg(c.shortfallG, 1)}</span>
                      )}
                    </td>
                  </tr>
                ))}
              </tbody>
            </table>
          </div>
        )}
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

function RunningBalance({ a, timeZone }: { a: AccountView; timeZone: string }) {
  if (a.entries.length === 0) return null;
  return (
    <details className="more-rows">
      <summary>
        {a.setKey} · {a.materialLabel}: {a.entries.length} bookings, balance now {kg(a.balanceG, 3)}
      </summary>
      <div className="table-wrap">
        <table>
          <thead>
            <tr>
              <th scope="col">When</th>
              <th scope="col">Booking</th>
              <th scope="col" className="num">
                Change
              </th>
              <th scope="col" className="num">
                Balance
              </th>
              <th scope="col">Check</th>
            </tr>
          </thead>
          <tbody>
            {a.entries.map((e, i) => (
              <tr key={`${e.bookingId ?? "end"}-${i}`}>
                <td className="nowrap">{when(new Date(e.at), timeZone)}</td>
                <td>{e.description}</td>
                <td className="num">{kgExact(e.deltaG)}</td>
                <td className="num">{kgExact(e.balanceG)}</td>
                <td>
                  {e.accepted ? (
                    <span className="muted">ok</span>
                  ) : (
                    <span className="status status-fail">refused, short {kgExact(e.shortfallG ?? 0)}</span>
                  )}
                </td>
              </tr>
            ))}
          </tbody>
        </table>
      </div>
    </details>
  );
}
