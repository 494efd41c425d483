import type { Metadata } from "next";
import { listPeriods } from "@/lib/period/period.store";
import { listPeriodEvents } from "@/lib/mass-balance/balance.store";
import { PeriodActionForm } from "@/app/balance/period-form";
import { day, when } from "@/app/_ui/format";
import { loadSite } from "@/app/_ui/site";
import { Empty, HistoryLink, NoSite, Note } from "@/app/_ui/ui";

export const dynamic = "force-dynamic";
export const metadata: Metadata = { title: "Accounting periods" };

export default async function PeriodsPage() {
  const { db, site, user } = await loadSite();
  if (!site) return <NoSite />;
  const [periods, events] = await Promise.all([listPeriods(db, site.id), listPeriodEvents(db, site.id, { take: 20 })]);
  const canClose = user.role === "COMPLIANCE";
  const now = new Date();
  const tz = site.timeZone;
  return (
    <>
      <h1>Accounting periods</h1>
      <p className="lede">The periods the books are balanced and closed by. Once a period is closed, no movement dated inside it can be booked until a compliance user reopens it.</p>
      {periods.length === 0 ? (
        <Empty>No accounting periods recorded yet.</Empty>
      ) : (
        <>
          <div className="table-wrap">
            <table>
              <thead>
                <tr>
                  <th scope="col">From</th>
                  <th scope="col">To (last day)</th>
                  <th scope="col">Status</th>
                  <th scope="col">Last change</th>
                  <th scope="col">By</th>
                  <th scope="col" className="num">
                    Movements
                  </th>
                  <th scope="col">Balance</th>
                  <th scope="col">History</th>
                  {canClose ? <th scope="col">Close or reopen</th> : null}
                </tr>
              </thead>
              <tbody>
                {periods.map((p) => {
                  const current = p.startsAt <= now && now < p.endsAt;
                  return (
                    <tr key={p.id}>
                      <td className="nowrap">
                        {day(p.startsAt, tz)}
                        {current ? <span className="tag">today</span> : null}
                      </td>
                      <td className="nowrap">{day(new Date(p.endsAt.getTime() - 1), tz)}</td>
                      <td>
                        <span className={`status status-${p.status === "OPEN" ? "open-period" : "closed"}`}>{p.status === "OPEN" ? "Open" : "Closed"}</span>
                      </td>
                      <td className="nowrap">{p.lastEvent ? `${p.lastEvent.action === "REOPEN" ? "Reopened" : "Closed"} ${when(p.lastEvent.at, tz)}` : "—"}</td>
                      <td>{p.lastEvent?.by ?? "—"}</td>
                      <td className="num">{p.movements}</td>
                      <td>
                        <a href={`/balance?${new URLSearchParams({ period: "CUSTOM", start: day(p.startsAt, tz), end: day(p.endsAt, tz) }).toString()}`}>balance</a>
                      </td>
                      <td>
                        <HistoryLink kind="period" recordKey={String(p.id)} label={`accounting period ${day(p.startsAt, tz).slice(0, 7)}, record`} />
                      </td>
                      {canClose ? (
                        <td>
                          {p.status === "CLOSED" ? (
                            <PeriodActionForm periodId={p.id} action="reopen" periodLabel={day(p.startsAt, tz).slice(0, 7)} />
                          ) : p.endsAt <= now ? (
                            <PeriodActionForm periodId={p.id} action="close" periodLabel={day(p.startsAt, tz).slice(0, 7)} />
                          ) : (
                            <span className="muted">not ended yet</span>
                          )}
                        </td>
                      ) : null}
                    </tr>
                  );
                })}
              </tbody>
            </table>
          </div>
          <Note>A period runs from the start of its first day up to, not including, the start of the day after its last day.</Note>
          <h2>Closes and reopens</h2>
          {events.length === 0 ? (
            <Empty>No period has been closed or reopened yet.</Empty>
          ) : (
            <div className="table-wrap">
              <table>
                <thead>
                  <tr>
                    <th scope="col">When</th>
                    <th scope="col">Period</th>
                    <th scope="col">Action</th>
                    <th scope="col">By</th>
                    <th scope="col">Reason</th>
                  </tr>
                </thead>
                <tbody>
                  {events.map((e) => (
                    <tr key={e.id}>
                      <td className="nowrap">{when(e.at, tz)}</td>
                      <td className="nowrap">{day(e.periodStartsAt, tz)}</td>
                      <td>{e.action === "CLOSE" ? "Closed" : "Reopened"}</td>
                      <td>{e.by}</td>
                      <td>{e.reason}</td>
                    </tr>
                  ))}
                </tbody>
              </table>
            </div>
          )}
        </>
      )}
    </>
  );
}
