import Link from "next/link";
import { labelOf } from "@/lib/core/vocabulary";
import type { PickupRow } from "@/lib/feedstock/pickup.store";
import { kg, litres, num, when } from "@/app/_ui/format";
import type { Column } from "@/app/_ui/kit";
import { CodeLink, HistoryLink } from "@/app/_ui/ui";

/** A column that reads only the fields it names, so any list of pickups with those fields can use it. */
const column = <K extends keyof PickupRow>(c: Column<Pick<PickupRow, K>>) => c;

/** The columns a list of pickups may show, by key; each page picks those it needs, in its order. */
export function pickupColumns(tz: string) {
  return {
    pickup: column<"code">({
      key: "pickup",
      header: "Pickup",
      title: true,
      cell: (p) => <CodeLink href={`/pickups/${encodeURIComponent(p.code)}`} code={p.code} />,
    }),
    observed: column<"observedAt">({
      key: "observed",
      header: "Observed",
      cell: (p) => <span className="nowrap">{when(p.observedAt, tz)}</span>,
    }),
    source: column<"sourceCode" | "sourceName">({
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
    }),
    collector: column<"collector">({ key: "collector", header: "Collector", cell: (p) => p.collector }),
    material: column<"material">({ key: "material", header: "Material", cell: (p) => labelOf(p.material) }),
    containers: column<"containers">({
      key: "containers",
      header: "Containers",
      numeric: true,
      cell: (p) => p.containers,
    }),
    volume: column<"volumeMl">({ key: "volume", header: "Volume", numeric: true, cell: (p) => litres(p.volumeMl) }),
    temp: column<"tempC">({ key: "temp", header: "Temp.", unit: "°C", numeric: true, cell: (p) => num(p.tempC, 1) }),
    mass: column<"massG">({ key: "mass", header: "Mass", numeric: true, cell: (p) => kg(p.massG) }),
    lot: column<"lotCode">({
      key: "lot",
      header: "Lot",
      cell: (p) =>
        p.lotCode ? (
          <CodeLink href={`/lots/${encodeURIComponent(p.lotCode)}`} code={p.lotCode} />
        ) : (
          <span className="muted">not yet in a lot</span>
        ),
    }),
    history: column<"code">({
      key: "history",
      header: "History",
      cell: (p) => <HistoryLink kind="pickup" recordKey={p.code} label="pickup" />,
    }),
  };
}
