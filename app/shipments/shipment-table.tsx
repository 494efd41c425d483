import Link from "next/link";
import type { ShipmentListRow } from "@/lib/shipment/shipment.store";
import { DataTable } from "@/app/_ui/kit";
import type { Column } from "@/app/_ui/kit";
import { kg, litres, when } from "@/app/_ui/format";
import { CodeLink, HistoryLink, HolderLink } from "@/app/_ui/ui";

/** The shipments list used on the shipments page and on a customer's page. */
export function ShipmentTable({
  rows,
  timeZone,
  showCustomer = true,
  caption,
}: {
  rows: readonly ShipmentListRow[];
  timeZone: string;
  showCustomer?: boolean;
  caption: string;
}) {
  const columns: Array<Column<ShipmentListRow>> = [
    {
      key: "doc",
      header: "Document",
      cell: (s) => <CodeLink href={`/shipments/${encodeURIComponent(s.documentNo)}`} code={s.documentNo} />,
    },
    { key: "at", header: "Shipped", cell: (s) => <span className="nowrap">{when(s.shippedAt, timeZone)}</span> },
    ...(showCustomer
      ? [
          {
            key: "customer",
            header: "Customer",
            cell: (s: ShipmentListRow) =>
              s.customerCode ? (
                <Link href={`/customers/${encodeURIComponent(s.customerCode)}`}>{s.customer}</Link>
              ) : (
                s.customer
              ),
          },
        ]
      : []),
    {
      key: "from",
      header: "Loaded from",
      cell: (s) =>
        s.from.length === 0
          ? "—"
          : s.from.map((h, i) => (
              <span key={h.id}>
                {i > 0 ? ", " : null}
                <HolderLink holder={h} />
              </span>
            )),
    },
    { key: "vehicle", header: "Vehicle", cell: (s) => s.vehicle || "—" },
    { key: "mass", header: "Mass", numeric: true, cell: (s) => kg(s.massG) },
    { key: "volume", header: "Volume", numeric: true, cell: (s) => litres(s.volumeMl) },
    { key: "claim", header: "Certified claim", cell: (s) => (s.certifiedClaim ? "Yes" : "No") },
    {
      key: "history",
      header: "History",
      cell: (s) => <HistoryLink kind="shipment" recordKey={s.documentNo} label="shipment" />,
    },
  ];
  return (
    <DataTable
      caption={caption}
      columns={columns}
      rows={rows}
      rowKey={(s) => s.documentNo}
      empty="No shipments recorded yet."
    />
  );
}
