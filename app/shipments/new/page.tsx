import type { Metadata } from "next";
import Link from "next/link";
import { listCustomerChoices } from "@/lib/customer/customer.store";
import { getProductLotForShipping, listShippableStock } from "@/lib/shipment/shipment.store";
import { labelOf } from "@/lib/core/vocabulary";
import { kg, when } from "@/app/_ui/format";
import { codeParam, queryValue } from "@/app/_ui/links";
import { loadSite } from "@/app/_ui/site";
import { NoSite, Note } from "@/app/_ui/ui";
import { RecordShipmentForm } from "@/app/shipments/shipment-form";
import { ReadyToShip } from "@/app/shipments/ready-to-ship";
import { LoadingCautions } from "@/app/shipments/loading-cautions";

export const dynamic = "force-dynamic";
export const metadata: Metadata = { title: "Record a shipment" };

type Search = { from?: string | string[]; customer?: string | string[] };

function one(v: string | string[] | undefined): string {
  return codeParam(queryValue(v)).trim().toUpperCase();
}

/** The shipment form on its own page, prefilled from a product lot ("ship from this lot") or a customer. */
export default async function NewShipmentPage({ searchParams }: { searchParams: Promise<Search> }) {
  const { db, site, user } = await loadSite();
  if (!site) return <NoSite />;
  if (user.role !== "COMPLIANCE") {
    return (
      <>
        <h1>Record a shipment</h1>
        <p className="form-error" role="alert">
          Shipments are recorded by compliance staff. The recorded ones are on the{" "}
          <Link href="/shipments">shipments</Link> page.
        </p>
      </>
    );
  }
  const sp = await searchParams;
  const fromCode = one(sp.from);
  const customerCode = one(sp.customer);
  const [customers, ready, lot] = await Promise.all([
    listCustomerChoices(db, site.id),
    listShippableStock(db, site.id),
    fromCode ? getProductLotForShipping(db, site.id, fromCode) : Promise.resolve(null),
  ]);
  return (
    <>
      <p className="crumbs">
        <Link href="/shipments">Shipments</Link> /
      </p>
      <h1>Record a shipment</h1>
      {lot ? (
        <Note>
          Loading from product lot {lot.code}: {labelOf(lot.status ?? "").toLowerCase()}, {kg(lot.stockG, 1)} in stock.
          {lot.status !== "RELEASED" ? " Only released product can leave the site." : ""}
        </Note>
      ) : null}
      <div className="form-with-aside">
        <RecordShipmentForm
          customers={customers}
          defaults={{
            shippedAt: when(user.now, site.timeZone).replace(" ", "T"),
            ...(customerCode ? { customerCode } : {}),
            ...(lot ? { from: { kind: "PRODUCT_LOT" as const, code: lot.code } } : {}),
          }}
        />
        <div>
          <ReadyToShip rows={ready} />
          <LoadingCautions />
        </div>
      </div>
    </>
  );
}
