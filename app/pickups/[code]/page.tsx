import type { Metadata } from "next";
import Link from "next/link";
import { TraceThis } from "@/app/_ui/trace-this";
import { notFound } from "next/navigation";
import { labelOf } from "@/lib/core/vocabulary";
import { getPickupDetail } from "@/lib/feedstock/lot-detail.store";
import { kg, litres, num, when } from "@/app/_ui/format";
import { codeParam } from "@/app/_ui/links";
import { loadSite } from "@/app/_ui/site";
import { CodeLink, Facts, NoSite, Note, Status } from "@/app/_ui/ui";

export const dynamic = "force-dynamic";

type Props = { params: Promise<{ code: string }> };

export async function generateMetadata({ params }: Props): Promise<Metadata> {
  return { title: `Pickup ${codeParam((await params).code)}` };
}

const LOOK: Readonly<Record<string, string>> = { NONE: "None seen", TRACE: "Trace", LAYER: "A layer", "": "—" };

function lag(observed: Date, received: Date): string {
  const minutes = Math.round((received.getTime() - observed.getTime()) / 60_000);
  if (Math.abs(minutes) < 60) return `${minutes} min`;
  const hours = minutes / 60;
  return Math.abs(hours) < 48 ? `${num(hours, 1)} h` : `${num(hours / 24, 1)} days`;
}

export default async function PickupPage({ params }: Props) {
  const { db, site, user } = await loadSite();
  if (!site) return <NoSite />;
  const p = await getPickupDetail(db, site.id, codeParam((await params).code));
  if (!p) notFound();
  const tz = site.timeZone;
  return (
    <>
      <p className="crumbs">
        <Link href="/pickups">Pickups</Link> /
      </p>
      <h1>Pickup {p.code}</h1>
      <Facts
        items={[
          [
            "Source",
            <>
              <Link href={`/sources/${encodeURIComponent(p.source.code)}`}>{p.source.code}</Link> {p.source.name}{" "}
              <span className="muted">({labelOf(p.source.kind)})</span>
            </>,
          ],
          ["Collector", p.collector],
          ["Material", labelOf(p.material)],
          ["Observed (collector's device)", when(p.observedAt, tz)],
          ["Received by the server", `${when(p.receivedAt, tz)} (${lag(p.observedAt, p.receivedAt)} later)`],
          ["Containers", `${p.containers}${p.containerTags.length ? `: ${p.containerTags.join(", ")}` : ""}`],
          ["Volume observed", litres(p.volumeMl)],
          ["Oil temperature", `${num(p.tempC, 1)} °C`],
          ["Mass (estimate from volume)", kg(p.massG, 3)],
          ["Still booked to the pickup", kg(p.stockG, 3)],
          ["Water seen", LOOK[p.waterLook] ?? p.waterLook],
          ["Solids seen", LOOK[p.solidsLook] ?? p.solidsLook],
        ]}
      />
      <TraceThis kind="PICKUP" code={p.code} role={user.role} />
      {p.notes ? <p>Notes: {p.notes}</p> : null}
      <h2>Lot</h2>
      {p.lot ? (
        <p>
          Received into lot <CodeLink href={`/lots/${encodeURIComponent(p.lot.code)}`} code={p.lot.code} /> on{" "}
          {when(p.lot.receivedAt, tz)} <Status code={p.lot.status} />
        </p>
      ) : (
        <p className="empty">Not received into a lot yet: the oil is still on the truck or at the source.</p>
      )}
      <Note>
        The collector&apos;s observed time comes from the device and may be earlier than the time the record reached the
        server when the device was offline.
      </Note>
    </>
  );
}
