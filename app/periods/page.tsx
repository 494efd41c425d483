import type { Metadata } from "next";
import { listPeriods } from "@/lib/period/period.store";
import { day, when } from "@/app/_ui/format";
import { loadSite } from "@/app/_ui/site";
import { Empty, NoSite, Note } from "@/app/_ui/ui";

export const dynamic = "force-dynamic";
export const metadata: Metadata = { title: "Accounting periods" };

export default async function PeriodsPage() {
  const { db, site } = await loadSite();
  if (!site) return <NoSite />;
  const periods = await listPeriods(db, site.id);
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
                  <th scope="col">Closed</th>
                  <th scope="col">Closed by</th>
                  <th scope="col" className="num">
                    Movements
                  </th>
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
                      <td className="nowrap">{when(p.closedAt, tz)}</td>
                      <td>{p.closedBy ?? "—"}</td>
                      <td className="num">{p.movements}</td>
                    </tr>
                  );
                })}
              </tbody>
            </table>
          </div>
          <Note>A period runs from the start of its first day up to, not including, the start of the day after its last day.</Note>
        </>
      )}
    </>
  );
}
