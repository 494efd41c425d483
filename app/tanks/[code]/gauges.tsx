import { labelOf } from "@/lib/core/vocabulary";
import type { SiteRole } from "@/lib/core/vocabulary";
import type { GaugeView } from "@/lib/tank/tank.store";
import { gaugeVsBook, parseStrapping } from "@/lib/tank/strapping";
import { DEFAULT_DENSITY_TABLE, densityAt, requireDensityEntry } from "@/lib/quantity/density";
import type { MaterialKind } from "@/lib/quantity/density";
import { ConfidenceMark, DataTable } from "@/app/_ui/kit";
import type { Column } from "@/app/_ui/kit";
import { kg, litres, num, when } from "@/app/_ui/format";
import { GaugeForm } from "@/app/tanks/gauge-form";
import { siteLocalInput } from "@/app/tanks/site-clock";

function signedKg(g: number): string {
  return `${g > 0 ? "+" : g < 0 ? "−" : ""}${kg(Math.abs(g), 1)}`;
}

export function gaugeColumns(timeZone: string): Column<GaugeView>[] {
  const diff = (g: GaugeView) => (g.bookStockG === null ? null : gaugeVsBook(g.massG, g.bookStockG));
  return [
    { key: "at", header: "Gauged", cell: (g) => <span className="nowrap">{when(g.at, timeZone)}</span> },
    {
      key: "read",
      header: "Reading",
      cell: (g) =>
        g.method === "LEVEL" && g.levelMm !== null
          ? `Level ${g.levelMm.toLocaleString("en")} mm → ${litres(g.volumeMl)}`
          : `${litres(g.volumeMl)} read`,
    },
    {
      key: "temp",
      header: "Temperature, density at 15 °C",
      cell: (g) =>
        `${num(g.tempC, 1)} °C, ${g.densityKgM3 === null ? "table density" : `${num(g.densityKgM3, 1)} kg/m³ measured`}`,
    },
    { key: "mass", header: "Gauged mass", numeric: true, cell: (g) => kg(g.massG) },
    {
      key: "book",
      header: "Book stock then",
      numeric: true,
      cell: (g) => (g.bookStockG === null ? "—" : kg(g.bookStockG)),
    },
    {
      key: "diff",
      header: "Gauge − book",
      numeric: true,
      cell: (g) => {
        const d = diff(g);
        if (!d) return "—";
        return `${signedKg(d.differenceG)}${d.differencePct === null ? "" : ` (${d.differencePct > 0 ? "+" : d.differencePct < 0 ? "−" : ""}${num(Math.abs(d.differencePct), 2)} %)`}`;
      },
    },
    { key: "who", header: "Recorded by", cell: (g) => g.recordedBy ?? <span className="muted">—</span> },
    { key: "note", header: "Note", cell: (g) => g.note },
  ];
}

/** "Record a gauge reading" with the book stock now, then the past readings against the book. */
export function GaugeSection(props: {
  tank: { code: string; service: string; stockG: number; strappingJson: string };
  material: MaterialKind;
  gauges: GaugeView[];
  timeZone: string;
  now: Date;
  role: SiteRole;
}) {
  const { tank } = props;
  const table = parseStrapping(tank.strappingJson);
  const entry = requireDensityEntry(DEFAULT_DENSITY_TABLE, props.material);
  const densityHint = (
    <>
      Leave empty to use the table density for {labelOf(tank.service).toLowerCase()}, {num(densityAt(entry, 15), 1)}{" "}
      kg/m³ at 15 °C{" "}
      <ConfidenceMark level={entry.status === "sourced" ? "published" : "check"} anchor={`density-${props.material}`} />
    </>
  );
  return (
    <section aria-labelledby="gauge-h">
      <h2 id="gauge-h">Record a gauge reading</h2>
      <p>
        Book stock now: <strong>{kg(tank.stockG, 1)}</strong>. The reading is kept beside the book stock at its own
        time, and the difference is shown below.
      </p>
      {props.role === "PRODUCTION" ? (
        <GaugeForm
          tankCode={tank.code}
          nowLocal={siteLocalInput(props.now, props.timeZone)}
          table={table}
          densityHint={densityHint}
        />
      ) : (
        <p className="muted">Production staff record gauge readings.</p>
      )}
      <DataTable
        caption="Past gauge readings against the book stock"
        columns={gaugeColumns(props.timeZone)}
        rows={props.gauges}
        rowKey={(g) => g.id}
        empty="No gauge readings recorded yet."
      />
    </section>
  );
}
