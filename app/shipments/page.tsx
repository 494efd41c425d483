import type { Metadata } from "next";
import { listCustomerChoices } from "@/lib/customer/customer.store";
import { listShipmentRows, listShippableStock } from "@/lib/shipment/shipment.store";
import { when } from "@/app/_ui/format";
import { PAGE_SIZE, pageParam } from "@/app/_ui/links";
import { loadSite } from "@/app/_ui/site";
import { NoSite, Pager } from "@/app/_ui/ui";
import { RecordShipmentForm } from "@/app/shipments/shipment-form";
import { ReadyToShip } from "@/app/shipments/ready-to-ship";
import { LoadingCautions } from "@/app/shipments/loading-cautions";
import { ShipmentTable } from "@/app/shipments/shipment-table";

export const dynamic = "force-dynamic";
export const metadata: Metadata = { title: "Shipments" };

export default async function ShipmentsPage({ searchParams }: { searchParams: Promise<{ page?: string | string[] }> }) {
  const { db, site, user } = await loadSite();
  if (!site) return <NoSite />;
  const page = pageParam((await searchParams).page);
  const canRecord = user.role === "COMPLIANCE";
  const [{ rows, total }, customers, ready] = await Promise.all([
    listShipmentRows(db, site.id, { skip: (page - 1) * PAGE_SIZE, take: PAGE_SIZE }),
    canRecord ? listCustomerChoices(db, site.id) : Promise.resolve([]),
    canRecord ? listShippableStock(db, site.id) : Promise.resolve([]),
  ]);
  const tz = site.timeZone;
  return (
    <>
      <h1>Shipments</h1>
      <p className="lede">
        Finished fuel leaving the site, newest first, with the customer and the lots or tanks it was loaded from.
      </p>
      {canRecord ? (
        <details className="record-form">
          <summary>Record a shipment</summary>
          <div className="form-with-aside">
            <RecordShipmentForm customers={customers} defaults={{ shippedAt: when(user.now, tz).replace(" ", "T") }} />
            <div>
              <ReadyToShip rows={ready} />
              <LoadingCautions />
            </div>
          </div>
        </details>
      ) : null}
      <ShipmentTable rows={rows} timeZone={tz} caption={`${total} shipment${total === 1 ? "" : "s"}`} />
      <Pager basePath="/shipments" page={page} total={total} pageSize={PAGE_SIZE} />
    </>
  );
}
