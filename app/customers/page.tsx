import type { Metadata } from "next";
import Link from "next/link";
import { listCustomers } from "@/lib/customer/customer.store";
import type { CustomerRow } from "@/lib/customer/customer.store";
import { DataTable, StatusMark } from "@/app/_ui/kit";
import type { Column } from "@/app/_ui/kit";
import { when } from "@/app/_ui/format";
import { loadSite } from "@/app/_ui/site";
import { HistoryLink, NoSite } from "@/app/_ui/ui";
import { NewCustomerForm } from "@/app/customers/customer-forms";
import { CUSTOMER_VIEWERS } from "@/app/customers/viewers";

export const dynamic = "force-dynamic";
export const metadata: Metadata = { title: "Customers" };

export default async function CustomersPage() {
  const { db, site, user } = await loadSite();
  if (!site) return <NoSite />;
  if (!CUSTOMER_VIEWERS.has(user.role)) {
    return (
      <>
        <h1>Customers</h1>
        <p className="form-error" role="alert">
          The customer list is kept by compliance staff. Shipments, with the customer each went to, are on the{" "}
          <Link href="/shipments">shipments</Link> page.
        </p>
      </>
    );
  }
  const rows = await listCustomers(db, site.id);
  const tz = site.timeZone;
  const columns: Array<Column<CustomerRow>> = [
    {
      key: "name",
      header: "Customer",
      cell: (c) => <Link href={`/customers/${encodeURIComponent(c.code)}`}>{c.name}</Link>,
    },
    { key: "code", header: "Code", cell: (c) => <span className="code">{c.code}</span> },
    { key: "address", header: "Delivery address", cell: (c) => c.address || "—" },
    { key: "contact", header: "Contact", cell: (c) => c.contact || "—" },
    { key: "shipments", header: "Shipments", numeric: true, cell: (c) => c.shipments },
    { key: "last", header: "Last shipment", cell: (c) => <span className="nowrap">{when(c.lastShippedAt, tz)}</span> },
    {
      key: "state",
      header: "State",
      cell: (c) => <StatusMark code={c.active ? "ACTIVE_CUSTOMER" : "INACTIVE_CUSTOMER"} />,
    },
    {
      key: "history",
      header: "History",
      cell: (c) => <HistoryLink kind="customer" recordKey={c.code} label="customer" />,
    },
  ];
  return (
    <>
      <h1>Customers</h1>
      <p className="lede">
        Who the site ships finished fuel to. A customer is never deleted: one that is no longer supplied is marked so,
        and keeps its shipments.
      </p>
      <DataTable
        caption={`${rows.length} customer${rows.length === 1 ? "" : "s"}`}
        columns={columns}
        rows={rows}
        rowKey={(c) => c.code}
        empty="No customers recorded yet."
      />
      {user.role === "COMPLIANCE" ? (
        <section aria-labelledby="new-customer">
          <h2 id="new-customer">Record a customer</h2>
          <NewCustomerForm />
        </section>
      ) : null}
    </>
  );
}
