import type { Metadata } from "next";
import Link from "next/link";
import { TraceThis } from "@/app/_ui/trace-this";
import { notFound } from "next/navigation";
import { getMadeOf } from "@/lib/feedstock/lot-flow.service";
import type { MovementView } from "@/lib/ledger/movement.store";
import { getShipmentRecord } from "@/lib/shipment/shipment.store";
import { DataTable, RecordHeader } from "@/app/_ui/kit";
import { kg, kgExact, litres, num, when } from "@/app/_ui/format";
import { codeParam } from "@/app/_ui/links";
import { MadeOf } from "@/app/_ui/made-of";
import { loadSite } from "@/app/_ui/site";
import { HistoryLink, HolderLink, NoSite } from "@/app/_ui/ui";
import { PrintShipment } from "@/app/shipments/print-button";

export const dynamic = "force-dynamic";

type Props = { params: Promise<{ documentNo: string }> };

export async function generateMetadata({ params }: Props): Promise<Metadata> {
  return { title: `Shipment ${codeParam((await params).documentNo)}` };
}

export default async function ShipmentPage({ params }: Props) {
  const { db, site, user } = await loadSite();
  if (!site) return <NoSite />;
  const s = await getShipmentRecord(db, site.id, codeParam((await params).documentNo));
  if (!s) notFound();
  const madeOf = await getMadeOf(db, site.id, s.holderId, new Date());
  const tz = site.timeZone;
  const customer = s.customerRef ? (
    <Link href={`/customers/${encodeURIComponent(s.customerRef.code)}`}>{s.customer}</Link>
  ) : (
    s.customer
  );
  return (
    <article className="shipment-doc">
      <RecordHeader
        kind="Shipment"
        number={s.documentNo}
        back={{ href: "/shipments", label: "Shipments" }}
        facts={[
          ["Customer", customer],
          ["Delivery address", s.customerRef?.address || "—"],
          ["Shipped", when(s.shippedAt, tz)],
          ["Vehicle", s.vehicle || "—"],
          ["Compartment", s.compartment || "—"],
          ["Mass", kgExact(s.massG)],
          ["Volume", litres(s.volumeMl)],
          ["Certified claim", s.certifiedClaim ? "Yes" : "No"],
          ["Shipped from", site.name],
        ]}
        actions={
          <span className="no-print">
            <PrintShipment /> <HistoryLink kind="shipment" recordKey={s.documentNo} label="shipment" />{" "}
            <TraceThis kind="SHIPMENT" code={s.documentNo} role={user.role} back />
          </span>
        }
      />
      <h2>Lines</h2>
      <DataTable<MovementView>
        caption={`${s.lines.length} loading line${s.lines.length === 1 ? "" : "s"}`}
        columns={[
          { key: "n", header: "Line", numeric: true, cell: (m) => s.lines.indexOf(m) + 1 },
          { key: "from", header: "Loaded from", cell: (m) => <HolderLink holder={m.from} /> },
          { key: "mass", header: "Mass", numeric: true, cell: (m) => kg(m.massG, 3) },
          {
            key: "volume",
            header: "Volume",
            numeric: true,
            cell: (m) => (m.volumeMl === null ? "—" : litres(m.volumeMl)),
          },
          {
            key: "temp",
            header: "Loading temperature",
            numeric: true,
            cell: (m) => (m.tempC === null ? "—" : `${num(m.tempC, 1)} °C`),
          },
          { key: "no", header: "Movement", numeric: true, cell: (m) => m.id },
        ]}
        rows={s.lines}
        rowKey={(m) => m.id}
        empty="No loading recorded."
      />
      <h2>Feedstock and reagent lots in this shipment</h2>
      <MadeOf madeOf={madeOf} what="shipment" />
      <div className="doc-sign" aria-hidden="true">
        <p>Loaded by (name, signature)</p>
        <p>Received by (name, signature)</p>
      </div>
    </article>
  );
}
