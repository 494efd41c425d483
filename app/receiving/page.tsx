import type { Metadata } from "next";
import Link from "next/link";
import { countLotsWithPrefix, listPickupsNotInLot } from "@/lib/collect/collect.store";
import { labelOf } from "@/lib/core/vocabulary";
import { day, kg, litres, when } from "@/app/_ui/format";
import { loadSite } from "@/app/_ui/site";
import { NoSite } from "@/app/_ui/ui";
import { Cautions } from "@/app/_ui/kit";
import { listTankLevels } from "@/lib/tank/tank.store";
import { ReceiveForm } from "@/app/receiving/receive-form";
import type { ReceivingRow } from "@/app/receiving/receive-form";

export const dynamic = "force-dynamic";
export const metadata: Metadata = { title: "Receiving" };

const RECEIVING_CAUTIONS = [
  "Received oil may be hot: hot oil burns, and hoses may be under pressure. Check the valve line-up and the tank's level before pumping.",
  "Trap grease gives off hydrogen sulfide, which can kill without warning and dulls the sense of smell. Never enter a grease pit, tank or container; unload and sample from outside, with the site's gas monitoring and procedures.",
];

export default async function ReceivingPage() {
  const { db, site, user } = await loadSite();
  if (!site) return <NoSite />;
  const tz = site.timeZone;
  const [pickups, tankLevels] = await Promise.all([listPickupsNotInLot(db, site.id), listTankLevels(db, site.id)]);
  const tanks = tankLevels
    .filter((t) => t.service === "FEEDSTOCK")
    .map((t) => ({
      code: t.code,
      label: `${t.code} ${t.name} — room for about ${kg(Math.max(0, t.capacityG - t.stockG), 0)}`,
    }));
  const prefix = `L-${day(user.now, tz).replace(/-/g, "").slice(2)}-`;
  const suggestedCode = `${prefix}${String((await countLotsWithPrefix(db, site.id, prefix)) + 1).padStart(2, "0")}`;
  const rows: ReceivingRow[] = pickups.map((p) => ({
    code: p.code,
    day: day(p.observedAt, tz),
    observed: when(p.observedAt, tz),
    source: `${p.sourceCode} ${p.sourceName}`,
    material: labelOf(p.material),
    collector: p.collector,
    containers: p.containers,
    volume: litres(p.volumeMl),
    mass: kg(p.stockG),
  }));
  return (
    <>
      <h1>Receiving</h1>
      <p className="lede">
        Turn the pickups that reached the plant into feedstock lots. Choose one pickup to make its own lot, or several
        of one material to pool them into one lot (one tank load). Each pickup stays linked to its lot for tracing. The
        plant&apos;s measurement is the lot&apos;s mass; any difference from the kerbside estimates is booked openly as
        a receiving difference. A lot goes into a tank after it is accepted: by the lab, or here, when pooling straight
        into a tank, by you with a reason. <Link href="/labels">Print lot labels</Link>.
      </p>
      <Cautions items={RECEIVING_CAUTIONS} title="Before unloading and pumping" />
      <ReceiveForm rows={rows} suggestedCode={suggestedCode} mayReceive={user.role === "PRODUCTION"} tanks={tanks} />
    </>
  );
}
