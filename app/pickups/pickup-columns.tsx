import Link from "next/link";
import { labelOf } from "@/lib/core/vocabulary";
import type { PickupRow } from "@/lib/feedstock/pickup.store";
import { kg, litres, num, when } from "@/app/_ui/format";
import type { Column } from "@/app/_ui/kit";
import { CodeLink, HistoryLink } from "@/app/_ui/ui";

type PickupColumn = Column<PickupRow>;

/** The columns a list of pickups may show, by key; each page picks those it needs, in its order. */
export function pickupColumns(tz: string) {
  return {
    pickup: {
      key: "pickup",
      header: "Pickup",
      title: true,
      cell: (p) => <CodeLink href={`/pickups/${encodeURIComponent(p.code)}`} code={p.code} />,
    },
    observed: {
      key: "observed",
      header: "Observed",
      cell: (p) => <span className="nowrap">{when(p.observedAt, tz)}</span>,
    },
    source: {
      key: "source",
      header: "Source",
      cell: (p) => (
        <>
          <Link
            href={`/sources/${encodeURIComponent(p.sourceCode)}`}
            aria-label={`Source ${p.sourceCode} ${p.sourceName}`}
          >
            {p.sourceCode}
          </Link>{" "}
          <span className="muted">{p.sourceName}</span>
        </>
      ),
    },
    collector: { key: "collector", header: "Collector", cell: (p) => p.collector },
    material: { key: "material", header: "Material", cell: (p) => labelOf(p.material) },
    containers: { key: "containers", header: "Containers", numeric: true, cell: (p) => p.containers },
    volume: { key: "volume", header: "Volume", numeric: true, cell: (p) => litres(p.volumeMl) },
    temp: { key: "temp", header: "Temp.", unit: "°C", numeric: true, cell: (p) => num(p.tempC, 1) },
    mass: { key: "mass", header: "Mass", numeric: true, cell: (p) => kg(p.massG) },
    lot: {
      key: "lot",
      header: "Lot",
      cell: (p) =>
        p.lotCode ? (
          <CodeLink href={`/lots/${encodeURIComponent(p.lotCode)}`} code={p.lotCode} />
        ) : (
          <span className="muted">not yet in a lot</span>
        ),
    },
    history: {
      key: "history",
      header: "History",
      cell: (p) => <HistoryLink kind="pickup" recordKey={p.code} label="pickup" />,
    },
  } satisfies Record<string, PickupColumn>;
}
