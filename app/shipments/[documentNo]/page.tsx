import type { Metadata } from "next";
import Link from "next/link";
import { notFound } from "next/navigation";
import { getMadeOf } from "@/lib/feedstock/lot-flow.service";
import { getShipmentDetail } from "@/lib/product/product.store";
import { kg, litres, when } from "@/app/_ui/format";
import { codeParam } from "@/app/_ui/links";
import { MadeOf } from "@/app/_ui/made-of";
import { loadSite } from "@/app/_ui/site";
import { Facts, HolderLink, MovementTable, NoSite } from "@/app/_ui/ui";

export const dynamic = "force-dynamic";

type Props = { params: Promise<{ documentNo: string }> };

export async function generateMetadata({ params }: Props): Promise<Metadata> {
  return { title: `Shipment ${codeParam((await params).documentNo)}` };
}

export default async function ShipmentPage({ params }: Props) {
  const { db, site } = await loadSite();
  if (!site) return <NoSite />;
  const s = await getShipmentDetail(db, site.id, codeParam((await params).documentNo));
  if (!s) notFound();
  const madeOf = await getMadeOf(db, site.id, s.holderId, new Date());
  const tz = site.timeZone;
  return (
    <>
      <p className="crumbs">
        <Link href="/shipments">Shipments</Link> /
      </p>
      <h1>Shipment {s.documentNo}</h1>
      <Facts
        items={[
          ["Customer", s.customer],
          ["Shipped", when(s.shippedAt, tz)],
          ["Loaded from", <HolderLink key="f" holder={s.from} />],
          ["Mass", kg(s.massG, 3)],
          ["Volume", litres(s.volumeMl)],
          ["Certified claim", s.certifiedClaim ? "Yes" : "No"],
        ]}
      />
      <h2>Loading movements</h2>
      <MovementTable rows={s.incoming} timeZone={tz} side="to" />
      <h2>Feedstock and reagent lots in this shipment</h2>
      <MadeOf madeOf={madeOf} what="shipment" />
    </>
  );
}
