import type { Metadata } from "next";
import Link from "next/link";
import { notFound } from "next/navigation";
import { getCustomer } from "@/lib/customer/customer.store";
import { listShipmentRows } from "@/lib/shipment/shipment.store";
import { RecordHeader } from "@/app/_ui/kit";
import { codeParam, PAGE_SIZE, pageParam } from "@/app/_ui/links";
import { loadSite } from "@/app/_ui/site";
import { HistoryLink, NoSite, Pager } from "@/app/_ui/ui";
import { ChangeCustomerForm } from "@/app/customers/customer-forms";
import { CUSTOMER_VIEWERS } from "@/app/customers/viewers";
import { ShipmentTable } from "@/app/shipments/shipment-table";

export const dynamic = "force-dynamic";

type Props = { params: Promise<{ code: string }>; searchParams: Promise<{ page?: string | string[] }> };

export async function generateMetadata({ params }: Props): Promise<Metadata> {
  return { title: `Customer ${codeParam((await params).code)}` };
}

export default async function CustomerPage({ params, searchParams }: Props) {
  const { db, site, user } = await loadSite();
  if (!site) return <NoSite />;
  if (!CUSTOMER_VIEWERS.has(user.role)) {
    return (
      <p className="form-error" role="alert">
        Customer records are kept by compliance staff. See the <Link href="/shipments">shipments</Link> instead.
      </p>
    );
  }
  const code = codeParam((await params).code);
  const c = await getCustomer(db, site.id, code);
  if (!c) notFound();
  const page = pageParam((await searchParams).page);
  const { rows, total } = await listShipmentRows(db, site.id, {
    customerCode: c.code,
    skip: (page - 1) * PAGE_SIZE,
    take: PAGE_SIZE,
  });
  const canChange = user.role === "COMPLIANCE";
  return (
    <>
      <RecordHeader
        kind="Customer"
        number={c.name}
        status={{ code: c.active ? "ACTIVE_CUSTOMER" : "INACTIVE_CUSTOMER" }}
        back={{ href: "/customers", label: "Customers" }}
        facts={[
          [
            "Code",
            <span key="c" className="code">
              {c.code}
            </span>,
          ],
          ["Delivery address", c.address || "—"],
          ["Contact", c.contact || "—"],
          ["Shipments", String(total)],
        ]}
        actions={
          <>
            {canChange && c.active ? (
              <Link href={`/shipments/new?customer=${encodeURIComponent(c.code)}`}>
                Record a shipment to this customer
              </Link>
            ) : null}{" "}
            <HistoryLink kind="customer" recordKey={c.code} label="customer" />
          </>
        }
      />
      <h2>Shipments to {c.name}</h2>
      <ShipmentTable
        rows={rows}
        timeZone={site.timeZone}
        showCustomer={false}
        caption={`${total} shipment${total === 1 ? "" : "s"}, newest first`}
      />
      <Pager basePath={`/customers/${encodeURIComponent(c.code)}`} page={page} total={total} pageSize={PAGE_SIZE} />
      {canChange ? (
        <details className="correction">
          <summary>Change this customer</summary>
          <ChangeCustomerForm customer={c} />
        </details>
      ) : null}
    </>
  );
}
