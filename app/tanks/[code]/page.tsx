import type { Metadata } from "next";
import { TraceThis } from "@/app/_ui/trace-this";
import { notFound } from "next/navigation";
import { labelOf } from "@/lib/core/vocabulary";
import { getHolderRef, listHolderMovements } from "@/lib/ledger/movement.store";
import { listTankLevels } from "@/lib/tank/tank.store";
import type { TankLevel } from "@/lib/tank/tank.store";
import type { MovementView } from "@/lib/ledger/movement.store";
import { kg, litres, num, when } from "@/app/_ui/format";
import { codeParam } from "@/app/_ui/links";
import { loadSite } from "@/app/_ui/site";
import { DensityNote, FillBar } from "@/app/_ui/tank-ui";
import { getTankStrapping, listGauges } from "@/lib/tank/tank.store";
import { DEFAULT_DENSITY_TABLE, requireDensityEntry } from "@/lib/quantity/density";
import { MoveSection } from "@/app/tanks/move-section";
import { GaugeSection } from "@/app/tanks/[code]/gauges";
import { TankStockPicture } from "@/app/tanks/[code]/stock-picture";
import { Empty, MovementTable, NoSite, Note } from "@/app/_ui/ui";
import { Cautions, RecordHeader } from "@/app/_ui/kit";

export const dynamic = "force-dynamic";

type Props = { params: Promise<{ code: string }> };

export async function generateMetadata({ params }: Props): Promise<Metadata> {
  return { title: `Tank ${codeParam((await params).code)}` };
}

const METHANOL_CAUTIONS = [
  "Methanol is toxic by swallowing, breathing and through the skin, and highly flammable; its flame can be almost invisible in daylight.",
  "No ignition sources, hot work or smoking near the tank or its vent; bond and ground every transfer; keep the tank closed and the area ventilated.",
  "Wear chemical-resistant gloves and eye protection when connecting or sampling; keep water spray or alcohol-resistant foam at hand as the site's fire plan says.",
];

function tankFacts(tank: TankLevel, tz: string): Array<readonly [string, React.ReactNode]> {
  const g = tank.lastGauge;
  return [
    ["Service", labelOf(tank.service)],
    ["Mixing model", labelOf(tank.mixing)],
    ["Capacity", litres(tank.capacityMl, 0)],
    ["Book stock", kg(tank.stockG, 3)],
    ["Fill (estimate)", <FillBar key="f" tank={tank} />],
    ["Nominal density", `${num(tank.nominalDensityKgM3, 1)} kg/m³ (${tank.nominalDensityStatus})`],
    [
      "Last gauge",
      g
        ? `${litres(g.volumeMl)} = ${kg(g.massG)} on ${when(g.at, tz)}${g.bookStockG === null ? "" : ` (book then ${kg(g.bookStockG)})`}`
        : "never gauged",
    ],
  ];
}

/** One direction of the tank's movements, with how many there are and their total mass. */
function TankMovements({
  title,
  side,
  rows,
  total,
  timeZone,
  empty,
}: {
  title: string;
  side: "from" | "to";
  rows: MovementView[];
  total: number;
  timeZone: string;
  empty: string;
}) {
  const sum = rows.reduce((s, m) => s + m.massG, 0);
  return (
    <>
      <h2>{title}</h2>
      {total === 0 ? (
        <Empty>{empty}</Empty>
      ) : (
        <>
          <MovementTable rows={rows} timeZone={timeZone} side={side} />
          <Note>
            {total > rows.length ? `First ${rows.length} of ${total} shown; ` : ""}
            {rows.length} movements, {kg(sum)} in total.
          </Note>
        </>
      )}
    </>
  );
}

type HolderMoves = Awaited<ReturnType<typeof listHolderMovements>>;

const DIRECTIONS = [
  { side: "to", title: "Movements in", empty: "Nothing has been moved into this tank yet." },
  { side: "from", title: "Movements out", empty: "Nothing has been drawn from this tank yet." },
] as const;

function TankMovementLists({ moves, timeZone }: { moves: HolderMoves; timeZone: string }) {
  return DIRECTIONS.map((d) => (
    <TankMovements
      key={d.side}
      title={d.title}
      side={d.side}
      rows={d.side === "to" ? moves.incoming : moves.outgoing}
      total={d.side === "to" ? moves.incomingTotal : moves.outgoingTotal}
      timeZone={timeZone}
      empty={d.empty}
    />
  ));
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
  return (
    <>
      <RecordHeader
        kind="Tank"
        number={tank.code}
        name={tank.name}
        back={{ href: "/tanks", label: "Tanks" }}
        facts={tankFacts(tank, tz)}
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
      {tank.service === "METHANOL" ? <Cautions title="Methanol tank" items={METHANOL_CAUTIONS} /> : null}

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

      <TankMovementLists moves={moves} timeZone={tz} />
    </>
  );
}
