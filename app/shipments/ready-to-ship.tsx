import type { ShippableStock } from "@/lib/shipment/shipment.store";
import { DataTable } from "@/app/_ui/kit";
import { kg } from "@/app/_ui/format";
import { HolderLink } from "@/app/_ui/ui";

/** Finished fuel that may leave the site now: product tanks and released product lots with stock. */
export function ReadyToShip({ rows }: { rows: readonly ShippableStock[] }) {
  return (
    <DataTable
      caption="Ready to ship: product tanks and released product lots"
      columns={[
        { key: "what", header: "Lot or tank", cell: (r) => <HolderLink holder={r} /> },
        { key: "stock", header: "Book stock", numeric: true, cell: (r) => kg(r.stockG, 1) },
      ]}
      rows={rows}
      rowKey={(r) => `${r.kind}:${r.code}`}
      empty="No released fuel in stock."
    />
  );
}
