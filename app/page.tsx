import Link from "next/link";
import { getUtcOffsetMin } from "@/lib/period/site-time";
import { getDashboard } from "@/app/_today/today";
import { getWasteDueBoard } from "@/lib/waste/container.store";
import { day } from "@/app/_ui/format";
import { loadSite } from "@/app/_ui/site";
import { Empty, NoSite, Note } from "@/app/_ui/ui";
import { BatchPanel, LabPanel, TankPanel, WastePanel } from "@/app/_today/panels";

export const dynamic = "force-dynamic";

export default async function TodayPage() {
  const { db, site } = await loadSite();
  if (!site) return <NoSite />;
  const now = new Date();
  const [d, waste] = await Promise.all([
    getDashboard(db, site, now),
    getWasteDueBoard(db, site.id, now, getUtcOffsetMin(site.timeZone, now)),
  ]);
  const tz = site.timeZone;
  return (
    <>
      <h1>Today at {site.name}</h1>
      <p className="lede">
        Tracevat keeps the feedstock inventory and traceability of a biodiesel plant. Oil collected at restaurants and
        delivered by suppliers is recorded as pickups, pooled into lots that wait for the lab, moved into tanks and
        charged into reaction batches; each batch yields product lots that are tested, released and shipped. Glycerol
        phase, wash water and other waste streams are tracked in their containers until a hauler takes them, and every
        transfer is booked in grams in one ledger, so the mass balance of any period and the history of any lot can be
        shown.
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
        <TankPanel d={d} tz={tz} />
        <LabPanel d={d} tz={tz} />
        <BatchPanel d={d} tz={tz} />
        <WastePanel d={d} waste={waste} tz={tz} now={now} />

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
