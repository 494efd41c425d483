import Link from "next/link";
import { labelOf } from "@/lib/core/vocabulary";
import type { LotDetail } from "@/lib/feedstock/lot-detail.store";
import { kg, litres, num, pct, when } from "@/app/_ui/format";
import { DataTable, StatusMark } from "@/app/_ui/kit";
import type { Column } from "@/app/_ui/kit";
import { CodeLink } from "@/app/_ui/ui";

type Titration = LotDetail["titrations"][number];
type LabTest = LotDetail["labTests"][number];
type LotPickup = LotDetail["pickups"][number];

const tested = (at: Date, tz: string) => <span className="nowrap">{when(at, tz)}</span>;
const state = (voided: boolean) => (voided ? <StatusMark code="VOID" label="Voided" /> : "Valid");
/** "OLEIC" → "Oleic". */
const word = (code: string) => code.charAt(0) + code.slice(1).toLowerCase();

function titrationColumns(tz: string): Array<Column<Titration>> {
  return [
    { key: "tested", header: "Tested", cell: (t) => tested(t.testedAt, tz) },
    { key: "analyst", header: "Analyst", cell: (t) => t.analyst },
    { key: "sample", header: "Sample", unit: "g", numeric: true, cell: (t) => num(t.sampleMassG, 3) },
    { key: "titrant", header: "Titrant", cell: (t) => labelOf(t.titrant) },
    { key: "strength", header: "Strength", unit: "mol/L", numeric: true, cell: (t) => num(t.concentrationMolL, 4) },
    { key: "titre", header: "Titre", unit: "mL", numeric: true, cell: (t) => num(t.titreMl, 2) },
    { key: "blank", header: "Blank", unit: "mL", numeric: true, cell: (t) => num(t.blankMl, 2) },
    { key: "basis", header: "FFA as", cell: (t) => `${word(t.basis)} acid` },
    { key: "ffa", header: "FFA", numeric: true, cell: (t) => pct(t.ffaPct) },
    { key: "av", header: "Acid value", unit: "mg KOH/g", numeric: true, cell: (t) => num(t.acidValue, 2) },
    { key: "state", header: "State", cell: (t) => state(t.voided) },
  ];
}

function labTestColumns(tz: string): Array<Column<LabTest>> {
  return [
    { key: "tested", header: "Tested", cell: (t) => tested(t.testedAt, tz) },
    { key: "test", header: "Test", cell: (t) => word(t.kind) },
    { key: "method", header: "Method", cell: (t) => t.method },
    { key: "analyst", header: "Analyst", cell: (t) => t.analyst },
    { key: "result", header: "Result", numeric: true, cell: (t) => pct(t.valuePct) },
    { key: "state", header: "State", cell: (t) => state(t.voided) },
  ];
}

function pickupColumns(tz: string): Array<Column<LotPickup>> {
  return [
    {
      key: "pickup",
      header: "Pickup",
      cell: (p) => <CodeLink href={`/pickups/${encodeURIComponent(p.code)}`} code={p.code} />,
    },
    { key: "observed", header: "Observed", cell: (p) => tested(p.observedAt, tz) },
    {
      key: "source",
      header: "Source",
      cell: (p) => (
        <>
          <Link href={`/sources/${encodeURIComponent(p.sourceCode)}`}>{p.sourceCode}</Link>{" "}
          <span className="muted">{p.sourceName}</span>
        </>
      ),
    },
    { key: "volume", header: "Volume", numeric: true, cell: (p) => litres(p.volumeMl) },
    { key: "mass", header: "Estimated mass", numeric: true, cell: (p) => kg(p.massG) },
  ];
}

/** The lot's lab results (titrations and other tests) and, for pooled pickups, the pickups in it. */
export function LotRecords({ lot, timeZone }: { lot: LotDetail; timeZone: string }) {
  return (
    <>
      <h2>Titrations</h2>
      <DataTable
        caption="Titrations"
        hideCaption
        columns={titrationColumns(timeZone)}
        rows={lot.titrations}
        rowKey={(t) => t.id}
        empty="No titrations recorded yet."
      />
      <h2>Other lab tests</h2>
      <DataTable
        caption="Other lab tests"
        hideCaption
        columns={labTestColumns(timeZone)}
        rows={lot.labTests}
        rowKey={(t) => t.id}
        empty="No other lab tests recorded yet."
      />
      {lot.origin === "PICKUPS" ? (
        <>
          <h2>Pickups in this lot</h2>
          <DataTable
            caption="Pickups in this lot"
            hideCaption
            columns={pickupColumns(timeZone)}
            rows={lot.pickups}
            rowKey={(p) => p.code}
            empty="No pickups are linked to this lot."
          />
        </>
      ) : null}
    </>
  );
}
