import Link from "next/link";
import type { CustomerShare, ShipmentCustomer } from "@/lib/trace/customers";
import { kg, pct } from "@/app/_ui/format";
import { TableHead, numeric } from "@/app/_ui/kit/table-head";

/** A customer's name, linked to their page when the shipment was recorded against a customer record. */
export function CustomerName({ customer }: { customer: ShipmentCustomer }) {
  return customer.code ? (
    <Link href={`/customers/${encodeURIComponent(customer.code)}`}>{customer.name}</Link>
  ) : (
    <>{customer.name}</>
  );
}

/** How much of the traced material each customer received in their shipments. */
export function CustomerShares({ rows, enteredG }: { rows: readonly CustomerShare[]; enteredG: number }) {
  if (rows.length === 0) return null;
  const total = rows.reduce((s, r) => s + r.grams, 0);
  return (
    <>
      <h3>Shipped to customers</h3>
      <div className="table-wrap">
        <table>
          <TableHead headings={["Customer", numeric("Shipments"), numeric("Of it shipped"), numeric("Share")]} />
          <tbody>
            {rows.map((r) => (
              <tr key={r.customer.code ?? r.customer.name}>
                <td>
                  <CustomerName customer={r.customer} />
                </td>
                <td className="num">{r.shipments}</td>
                <td className="num">{kg(r.grams, 3)}</td>
                <td className="num">{pct(enteredG === 0 ? 0 : (r.grams * 100) / enteredG, 2)}</td>
              </tr>
            ))}
          </tbody>
          <tfoot>
            <tr>
              <td>Total shipped</td>
              <td />
              <td className="num">{kg(total, 3)}</td>
              <td className="num">{pct(enteredG === 0 ? 0 : (total * 100) / enteredG, 2)}</td>
            </tr>
          </tfoot>
        </table>
      </div>
    </>
  );
}
