import type { Metadata } from "next";
import Link from "next/link";
import { countLotsWithPrefix, listPickupsNotInLot } from "@/lib/collect/collect.store";
import { labelOf } from "@/lib/ledger/kinds";
import { day, kg, litres, when } from "@/app/_ui/format";
import { loadSite } from "@/app/_ui/site";
import { NoSite } from "@/app/_ui/ui";
import { ReceiveForm } from "@/app/receiving/receive-form";
import type { ReceivingRow } from "@/app/receiving/receive-form";

export const dynamic = "force-dynamic";
export const metadata: Metadata = { title: "Receiving" };

export default async function ReceivingPage() {
  const { db, site, user } = await loadSite();
  if (!site) return <NoSite />;
  const tz = site.timeZone;
  const pickups = await listPickupsNotInLot(db, site.id);
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
        Turn the pickups that reached the plant into feedstock lots. Choose one pickup to make its own lot, or several of one material to pool them into one lot (one tank load). Each pickup stays linked to its lot for tracing. The
        plant&apos;s measurement is the lot&apos;s mass; any difference from the kerbside estimates is booked openly as a receiving difference. A lot goes into a tank after the lab accepts it. <Link href="/labels">Print lot labels</Link>.
      </p>
      <ReceiveForm rows={rows} suggestedCode={suggestedCode} mayReceive={user.role === "PRODUCTION"} />
    </>
  );
}
