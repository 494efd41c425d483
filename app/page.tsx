import Link from "next/link";
import { labelOf } from "@/lib/ledger/kinds";
import { getDashboard, getUtcOffsetMin } from "@/lib/site/dashboard.store";
import { getWasteDueBoard } from "@/lib/waste/container.store";
import { day, daysBetween, kg, litres, pct, when } from "@/app/_ui/format";
import { loadSite } from "@/app/_ui/site";
import { DensityNote, FillBar } from "@/app/_ui/tank-ui";
import { CodeLink, Empty, NoSite, Note, Status } from "@/app/_ui/ui";

export const dynamic = "force-dynamic";

export default async function TodayPage() {
  const { db, site } = await loadSite();
  if (!site) return <NoSite />;
  const now = new Date();
  const [d, waste] = await Promise.all([getDashboard(db, site, now), getWasteDueBoard(db, site.id, now, getUtcOffsetMin(site.timeZone, now))]);
  const tz = site.timeZone;
  return (
    <>
      <h1>Today at {site.name}</h1>
      <p className="lede">
        Tracevat keeps the feedstock inventory and traceability of a biodiesel plant. Oil collected at restaurants and delivered by
        suppliers is recorded as pickups, pooled into lots that wait for the lab, moved into tanks and charged into reaction batches;
        each batch yields product lots that are tested, released and shipped. Glycerol phase, wash water and other waste streams are
        tracked in their containers until a hauler takes them, and every transfer is booked in grams in one ledger, so the mass balance
        of any period and the history of any lot can be shown.
      </p>

      <h2 id="counts">At a glance</h2>
      <dl className="counts" aria-labelledby="counts">
        <div>
          <dt>Sources</dt>
          <dd>
            <Link href="/sources">{d.counts.sources}</Link>
          </dd>
        </div>
        <div>
          <dt>Pickups in {d.month.label}</dt>
          <dd>
            <Link href="/pickups">{d.counts.pickupsThisMonth}</Link>
          </dd>
        </div>
        <div>
          <dt>Feedstock lots</dt>
          <dd>
            <Link href="/lots">{d.counts.lots}</Link>
          </dd>
        </div>
        <div>
          <dt>Batches</dt>
          <dd>
            <Link href="/batches">{d.counts.batches}</Link>
          </dd>
        </div>
        <div>
          <dt>Product lots</dt>
          <dd>
            <Link href="/products">{d.counts.productLots}</Link>
          </dd>
        </div>
        <div>
          <dt>Shipments</dt>
          <dd>
            <Link href="/shipments">{d.counts.shipments}</Link>
          </dd>
        </div>
      </dl>

      <div className="panels">
        <section className="panel wide" aria-labelledby="tanks-h">
          <h2 id="tanks-h">Tank levels</h2>
          {d.tanks.length === 0 ? (
            <Empty>No tanks recorded yet.</Empty>
          ) : (
            <>
              <div className="table-wrap">
                <table>
                  <thead>
                    <tr>
                      <th scope="col">Tank</th>
                      <th scope="col">Service</th>
                      <th scope="col" className="num">
                        Book stock
                      </th>
                      <th scope="col" className="num">
                        Capacity
                      </th>
                      <th scope="col">Fill (estimate)</th>
                      <th scope="col">Last gauge</th>
                    </tr>
                  </thead>
                  <tbody>
                    {d.tanks.map((t) => (
                      <tr key={t.code}>
                        <td>
                          <CodeLink href={`/tanks/${encodeURIComponent(t.code)}`} code={t.code} /> <span className="muted">{t.name}</span>
                        </td>
                        <td>{labelOf(t.service)}</td>
                        <td className="num">{kg(t.stockG)}</td>
                        <td className="num">{litres(t.capacityMl, 0)}</td>
                        <td>
                          <FillBar tank={t} />
                        </td>
                        <td className="nowrap">
                          {t.lastGauge ? (
                            <>
                              {litres(t.lastGauge.volumeMl, 0)} <span className="muted">on {day(t.lastGauge.at, tz)}</span>
                            </>
                          ) : (
                            <span className="muted">none</span>
                          )}
                        </td>
                      </tr>
                    ))}
                  </tbody>
                </table>
              </div>
              <DensityNote tanks={d.tanks} />
            </>
          )}
        </section>

        <section className="panel" aria-labelledby="lab-h">
          <h2 id="lab-h">Lots waiting for lab results</h2>
          {d.quarantinedLots.length === 0 ? (
            <Empty>No lots are waiting for the lab.</Empty>
          ) : (
            <>
              <div className="table-wrap">
                <table>
                  <thead>
                    <tr>
                      <th scope="col">Lot</th>
                      <th scope="col">Material</th>
                      <th scope="col">Received</th>
                      <th scope="col" className="num">
                        Mass
                      </th>
                      <th scope="col" className="num">
                        FFA
                      </th>
                    </tr>
                  </thead>
                  <tbody>
                    {d.quarantinedLots.map((l) => (
                      <tr key={l.code}>
                        <td>
                          <CodeLink href={`/lots/${encodeURIComponent(l.code)}`} code={l.code} />
                        </td>
                        <td>{labelOf(l.material)}</td>
                        <td className="nowrap">{when(l.receivedAt, tz)}</td>
                        <td className="num">{kg(l.massG)}</td>
                        <td className="num">{l.ffaPct === null ? <span className="muted">not yet</span> : pct(l.ffaPct)}</td>
                      </tr>
                    ))}
                  </tbody>
                </table>
              </div>
              {d.quarantinedTotal > d.quarantinedLots.length ? (
                <Note>
                  Showing {d.quarantinedLots.length} of {d.quarantinedTotal}. <Link href="/lots">All lots</Link>
                </Note>
              ) : null}
            </>
          )}
        </section>

        <section className="panel" aria-labelledby="batches-h">
          <h2 id="batches-h">Batches in progress</h2>
          {d.batchesInProgress.length === 0 ? (
            <Empty>No batches are planned or reacting.</Empty>
          ) : (
            <div className="table-wrap">
              <table>
                <thead>
                  <tr>
                    <th scope="col">Batch</th>
                    <th scope="col">Status</th>
                    <th scope="col">Planned</th>
                    <th scope="col">Started</th>
                    <th scope="col" className="num">
                      Target oil
                    </th>
                  </tr>
                </thead>
                <tbody>
                  {d.batchesInProgress.map((b) => (
                    <tr key={b.code}>
                      <td>
                        <CodeLink href={`/batches/${encodeURIComponent(b.code)}`} code={b.code} />
                      </td>
                      <td>
                        <Status code={b.status} />
                      </td>
                      <td className="nowrap">{when(b.plannedAt, tz)}</td>
                      <td className="nowrap">{when(b.startedAt, tz)}</td>
                      <td className="num">{kg(b.targetOilG)}</td>
                    </tr>
                  ))}
                </tbody>
              </table>
            </div>
          )}
        </section>

        <section className="panel" aria-labelledby="waste-h">
          <h2 id="waste-h">Waste containers on site</h2>
          {d.wasteOnSite.length === 0 ? (
            <Empty>No waste containers are on site.</Empty>
          ) : (
            <>
              <div className="table-wrap">
                <table>
                  <thead>
                    <tr>
                      <th scope="col">Container</th>
                      <th scope="col">Stream</th>
                      <th scope="col">Started</th>
                      <th scope="col" className="num">
                        Days on site
                      </th>
                      <th scope="col">Due off site</th>
                    </tr>
                  </thead>
                  <tbody>
                    {d.wasteOnSite.map((w) => {
                      const due = waste?.byCode.get(w.code);
                      return (
                        <tr key={w.code}>
                          <td>
                            <Link href={`/waste/${encodeURIComponent(w.code)}`}>{w.code}</Link>
                          </td>
                          <td>{labelOf(w.stream)}</td>
                          <td className="nowrap">{day(w.accumulationStart, tz)}</td>
                          <td className="num">{daysBetween(w.accumulationStart, now)}</td>
                          <td className="nowrap">
                            {due === undefined ? (
                              <span className="muted">not assessed</span>
                            ) : due.dueDate === null ? (
                              <span className="muted">no time limit</span>
                            ) : (
                              <>
                                {due.dueDate}{" "}
                                {due.overdue ? <span className="status status-overdue">overdue</span> : <span className="muted">({due.daysLeft} days left)</span>}
                              </>
                            )}
                          </td>
                        </tr>
                      );
                    })}
                  </tbody>
                </table>
              </div>
              <Note>
                {waste
                  ? `${waste.assumption.note} Rules: ${waste.ruleSet}. ${waste.note}`
                  : "Due dates could not be worked out from the recorded data; days on site are counted from the accumulation start."}{" "}
                <Link href="/waste">Waste details</Link>
              </Note>
            </>
          )}
        </section>

        <section className="panel" aria-labelledby="period-h">
          <h2 id="period-h">Accounting period</h2>
          {d.currentPeriod === null ? (
            <Empty>
              No accounting period covers today ({day(now, tz)}). <Link href="/periods">All periods</Link>
            </Empty>
          ) : (
            <>
              <p>
                {day(d.currentPeriod.startsAt, tz)} to {day(new Date(d.currentPeriod.endsAt.getTime() - 1), tz)}{" "}
                <span className={`status status-${d.currentPeriod.status === "OPEN" ? "open-period" : "closed"}`}>
                  {d.currentPeriod.status === "OPEN" ? "Open" : "Closed"}
                </span>
              </p>
              <Note>
                {d.currentPeriod.status === "OPEN"
                  ? "Movements dated in this period can still be booked."
                  : `Closed${d.currentPeriod.closedBy ? ` by ${d.currentPeriod.closedBy}` : ""}: movements dated in it are refused.`}{" "}
                <Link href="/periods">All periods</Link>
              </Note>
            </>
          )}
        </section>
      </div>
    </>
  );
}
