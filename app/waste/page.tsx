import Link from "next/link";
import type { Metadata } from "next";
import { labelOf, WASTE_STREAMS } from "@/lib/core/vocabulary";
import { getUtcOffsetMin } from "@/lib/period/site-time";
import { getWasteDueBoard, listDisposals, listWasteContainers } from "@/lib/waste/container.store";
import { day, daysBetween, kg, litres, when } from "@/app/_ui/format";
import { loadSite } from "@/app/_ui/site";
import { CodeLink, Empty, HistoryLink, NoSite, Note, Status } from "@/app/_ui/ui";
import { Cautions } from "@/app/_ui/kit";
import { OpenContainerForm } from "@/app/waste/container-forms";

export const dynamic = "force-dynamic";
export const metadata: Metadata = { title: "Waste" };

export default async function WastePage() {
  const { db, site, user } = await loadSite();
  if (!site) return <NoSite />;
  const now = user.now;
  const canOpen = user.role === "PRODUCTION" || user.role === "COMPLIANCE";
  const [containers, disposals, due] = await Promise.all([
    listWasteContainers(db, site.id),
    listDisposals(db, site.id),
    getWasteDueBoard(db, site.id, now, getUtcOffsetMin(site.timeZone, now)),
  ]);
  const tz = site.timeZone;
  return (
    <>
      <h1>Waste</h1>
      <p className="lede">
        Containers that collect glycerol phase, wash water, spent filter media and other waste streams, and the hauls
        that took them away.
      </p>
      <p>
        <a href="/waste/due">What falls due for haul-away, by stream, with totals for the hauler</a>
      </p>

      <h2>Containers</h2>
      {containers.length === 0 ? (
        <Empty>No waste containers recorded yet.</Empty>
      ) : (
        <>
          <div className="table-wrap">
            <table>
              <thead>
                <tr>
                  <th scope="col">Container</th>
                  <th scope="col">Stream</th>
                  <th scope="col">Location</th>
                  <th scope="col">Status</th>
                  <th scope="col">Started</th>
                  <th scope="col" className="num">
                    Days on site
                  </th>
                  <th scope="col">Due off site</th>
                  <th scope="col">Hazard</th>
                  <th scope="col" className="num">
                    Book stock
                  </th>
                  <th scope="col" className="num">
                    Capacity
                  </th>
                  <th scope="col">History</th>
                </tr>
              </thead>
              <tbody>
                {containers.map((c) => {
                  const d = due?.byCode.get(c.code);
                  const onSite = c.status !== "SHIPPED";
                  return (
                    <tr key={c.code} id={c.code}>
                      <td className="nowrap">
                        <CodeLink href={`/waste/${encodeURIComponent(c.code)}`} code={c.code} />
                        {c.satellite ? <span className="tag">satellite</span> : null}
                      </td>
                      <td>{labelOf(c.stream)}</td>
                      <td>{c.location || <span className="muted">—</span>}</td>
                      <td>
                        <Status code={c.status} />
                      </td>
                      <td className="nowrap">{day(c.accumulationStart, tz)}</td>
                      <td className="num">{onSite ? daysBetween(c.accumulationStart, now) : "—"}</td>
                      <td className="nowrap">
                        {!onSite ? (
                          <span className="muted">hauled away</span>
                        ) : d === undefined ? (
                          <span className="muted">not assessed</span>
                        ) : d.dueDate === null ? (
                          <span className="muted">no time limit</span>
                        ) : (
                          <span>
                            {d.dueDate}{" "}
                            {d.overdue ? (
                              <span className="status status-overdue">overdue</span>
                            ) : (
                              <span className="muted">({d.daysLeft} d)</span>
                            )}
                          </span>
                        )}
                      </td>
                      <td>{d ? labelOf(d.hazard) : <span className="muted">—</span>}</td>
                      <td className="num">{kg(c.stockG)}</td>
                      <td className="num">{litres(c.capacityMl, 0)}</td>
                      <td>
                        <HistoryLink kind="waste" recordKey={c.code} label="waste container" />
                      </td>
                    </tr>
                  );
                })}
              </tbody>
            </table>
          </div>
          {due ? (
            <>
              <Note>
                Due dates from {due.ruleSet}. {due.assumption.note} Containers marked satellite are treated as one
                satellite area, with their volume estimated from book mass at a nominal density. {due.note}{" "}
                <Link href="/waste/rules">Waste rule set</Link>
              </Note>
              {due.issues.length > 0 ? (
                <ul className="warning" aria-label="Waste warnings">
                  {due.issues.map((i) => (
                    <li key={i}>{i}</li>
                  ))}
                </ul>
              ) : null}
            </>
          ) : (
            <Note>
              Due dates could not be worked out from the recorded data; days on site count from the accumulation start.
            </Note>
          )}
        </>
      )}

      {canOpen ? (
        <section aria-labelledby="open-container">
          <h2 id="open-container">Open a container</h2>
          <Cautions
            title="Before placing a waste container"
            items={[
              "Glycerol phase and methanol-rich liquid are flammable: place their containers away from ignition sources and fill them with bonded and grounded transfer.",
              "Oily or methanol-wet spent filter media can heat itself: use a closed metal bin, away from buildings.",
              "Label the container with its contents and the accumulation start as your site's procedure requires.",
            ]}
          />
          <OpenContainerForm
            streams={WASTE_STREAMS.map((s) => [s, labelOf(s)] as const)}
            nowLocal={when(now, tz).replace(" ", "T")}
          />
        </section>
      ) : null}

      <h2>Disposals</h2>
      {disposals.length === 0 ? (
        <Empty>No waste has been hauled away yet.</Empty>
      ) : (
        <div className="table-wrap">
          <table>
            <thead>
              <tr>
                <th scope="col">Manifest or document</th>
                <th scope="col">Collected</th>
                <th scope="col">Hauler</th>
                <th scope="col">Destination facility</th>
                <th scope="col">From containers</th>
                <th scope="col" className="num">
                  Mass
                </th>
                <th scope="col">History</th>
              </tr>
            </thead>
            <tbody>
              {disposals.map((d) => (
                <tr key={d.documentNo} id={d.documentNo}>
                  <td className="nowrap">{d.documentNo}</td>
                  <td className="nowrap">{when(d.disposedAt, tz)}</td>
                  <td>{d.hauler}</td>
                  <td>{d.destination || <span className="muted">not recorded</span>}</td>
                  <td>
                    {d.containerCodes.map((c, i) => (
                      <span key={c}>
                        {i > 0 ? ", " : ""}
                        <a href={`/waste/${encodeURIComponent(c)}`}>{c}</a>
                      </span>
                    ))}
                  </td>
                  <td className="num">{kg(d.massG)}</td>
                  <td>
                    <HistoryLink kind="disposal" recordKey={d.documentNo} label="disposal" />
                  </td>
                </tr>
              ))}
            </tbody>
          </table>
        </div>
      )}
    </>
  );
}
