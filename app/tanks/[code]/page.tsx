import type { Metadata } from "next";
import Link from "next/link";
import { TraceThis } from "@/app/_ui/trace-this";
import { notFound } from "next/navigation";
import { labelOf } from "@/lib/core/vocabulary";
import { getHolderRef, listHolderMovements } from "@/lib/ledger/movement.store";
import { listTankLevels } from "@/lib/tank/tank.store";
import { kg, litres, num, when } from "@/app/_ui/format";
import { codeParam } from "@/app/_ui/links";
import { loadSite } from "@/app/_ui/site";
import { DensityNote, FillBar } from "@/app/_ui/tank-ui";
import { getTankStrapping, listGauges } from "@/lib/tank/tank.store";
import { DEFAULT_DENSITY_TABLE, requireDensityEntry } from "@/lib/quantity/density";
import { MoveSection } from "@/app/tanks/move-section";
import { GaugeSection } from "@/app/tanks/[code]/gauges";
import { TankStockPicture } from "@/app/tanks/[code]/stock-picture";
import { Empty, Facts, MovementTable, NoSite, Note } from "@/app/_ui/ui";
import { Cautions } from "@/app/_ui/kit";

export const dynamic = "force-dynamic";

type Props = { params: Promise<{ code: string }> };

export async function generateMetadata({ params }: Props): Promise<Metadata> {
  return { title: `Tank ${codeParam((await params).code)}` };
}

export default async function TankPage({ params }: Props) {
  const { db, site, user } = await loadSite();
  if (!site) return <NoSite />;
  const code = codeParam((await params).code);
  const tank = (await listTankLevels(db, site.id)).find((t) => t.code === code);
  const holder = await getHolderRef(db, site.id, "TANK", code);
  if (!tank || !holder) notFound();
  const tz = site.timeZone;
  const [moves, strapping] = await Promise.all([
    listHolderMovements(db, holder.id),
    getTankStrapping(db, site.id, code),
  ]);
  const gauges = strapping ? await listGauges(db, strapping.id) : [];
  const entry = requireDensityEntry(DEFAULT_DENSITY_TABLE, tank.nominalMaterial);
  const sumIn = moves.incoming.reduce((s, m) => s + m.massG, 0);
  const sumOut = moves.outgoing.reduce((s, m) => s + m.massG, 0);
  return (
    <>
      <p className="crumbs">
        <Link href="/tanks">Tanks</Link> /
      </p>
      <h1>
        Tank {tank.code}: {tank.name}
      </h1>
      <Facts
        items={[
          ["Service", labelOf(tank.service)],
          ["Mixing model", labelOf(tank.mixing)],
          ["Capacity", litres(tank.capacityMl, 0)],
          ["Book stock", kg(tank.stockG, 3)],
          ["Fill (estimate)", <FillBar key="f" tank={tank} />],
          ["Nominal density", `${num(tank.nominalDensityKgM3, 1)} kg/m³ (${tank.nominalDensityStatus})`],
          [
            "Last gauge",
            tank.lastGauge
              ? `${litres(tank.lastGauge.volumeMl)} = ${kg(tank.lastGauge.massG)} on ${when(tank.lastGauge.at, tz)}${tank.lastGauge.bookStockG === null ? "" : ` (book then ${kg(tank.lastGauge.bookStockG)})`}`
              : "never gauged",
          ],
        ]}
      />
      <DensityNote tanks={[tank]} />
      <TankStockPicture
        db={db}
        siteId={site.id}
        code={tank.code}
        capacityG={tank.capacityG}
        timeZone={tz}
        now={user.now}
      />
      <TraceThis kind="TANK" code={tank.code} role={user.role} back />
      {tank.service === "METHANOL" ? (
        <Cautions
          title="Methanol tank"
          items={[
            "Methanol is toxic by swallowing, breathing and through the skin, and highly flammable; its flame can be almost invisible in daylight.",
            "No ignition sources, hot work or smoking near the tank or its vent; bond and ground every transfer; keep the tank closed and the area ventilated.",
            "Wear chemical-resistant gloves and eye protection when connecting or sampling; keep water spray or alcohol-resistant foam at hand as the site's fire plan says.",
          ]}
        />
      ) : null}

      <MoveSection
        db={db}
        siteId={site.id}
        timeZone={tz}
        now={user.now}
        role={user.role}
        from={{ kind: "TANK", code: tank.code, service: tank.service, stockG: tank.stockG }}
        density={{
          entry,
          basis: `Uses the table density for ${labelOf(tank.service).toLowerCase()}, ${num(tank.nominalDensityKgM3, 1)} kg/m³ at 15 °C.`,
        }}
        title="Move to another tank"
      />

      <GaugeSection
        tank={{
          code: tank.code,
          service: tank.service,
          stockG: tank.stockG,
          strappingJson: strapping?.strappingJson ?? "",
        }}
        material={tank.nominalMaterial}
        gauges={gauges}
        timeZone={tz}
        now={user.now}
        role={user.role}
      />

      <h2>Movements in</h2>
      {moves.incomingTotal === 0 ? (
        <Empty>Nothing has been moved into this tank yet.</Empty>
      ) : (
        <>
          <MovementTable rows={moves.incoming} timeZone={tz} side="to" />
          <Note>
            {moves.incomingTotal > moves.incoming.length
              ? `First ${moves.incoming.length} of ${moves.incomingTotal} shown; `
              : ""}
            {moves.incoming.length} movements, {kg(sumIn)} in total.
          </Note>
        </>
      )}
      <h2>Movements out</h2>
      {moves.outgoingTotal === 0 ? (
        <Empty>Nothing has been drawn from this tank yet.</Empty>
      ) : (
        <>
          <MovementTable rows={moves.outgoing} timeZone={tz} side="from" />
          <Note>
            {moves.outgoingTotal > moves.outgoing.length
              ? `First ${moves.outgoing.length} of ${moves.outgoingTotal} shown; `
              : ""}
            {moves.outgoing.length} movements, {kg(sumOut)} in total.
          </Note>
        </>
      )}
    </>
  );
}
