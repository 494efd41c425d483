import { keptToday } from "@/app/_today/today-kept";
import { loadSite } from "@/app/_ui/site";
import { NoSite } from "@/app/_ui/ui";
import { BatchPanel, LabPanel, TankPanel, WastePanel } from "@/app/_today/panels";
import { Counts, PeriodPanel } from "@/app/_today/period-panel";

export const dynamic = "force-dynamic";

export default async function TodayPage() {
  const { db, site } = await loadSite();
  if (!site) return <NoSite />;
  const now = new Date();
  const { dashboard: d, waste } = (await keptToday(db, site, now)).value;
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

      <Counts d={d} />

      <div className="panels">
        <TankPanel d={d} tz={tz} />
        <LabPanel d={d} tz={tz} />
        <BatchPanel d={d} tz={tz} />
        <WastePanel d={d} waste={waste} tz={tz} now={now} />

        <PeriodPanel d={d} tz={tz} now={now} />
      </div>
    </>
  );
}
