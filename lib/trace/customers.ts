// Which customers a forward trace's shipments went to, and how much of the traced material each
// received. Pure: the names come in from the shipment records.

export interface ShipmentCustomer {
  name: string;
  code: string | null;
}

export interface CustomerShare {
  customer: ShipmentCustomer;
  /** Grams of the traced material in this customer's shipments. */
  grams: number;
  shipments: number;
}

/**
 * Puts each shipment row's customer next to it and totals the traced grams per customer (largest
 * first). Rows that are not shipments, or shipments without a known customer, are left as they are.
 */
export function attachCustomers<R extends { holder: { id: number; kind: string }; heldG: number }>(
  rows: readonly R[],
  customers: ReadonlyMap<number, ShipmentCustomer>,
): { rows: Array<R & { customer?: ShipmentCustomer }>; byCustomer: CustomerShare[] } {
  const totals = new Map<string, CustomerShare>();
  const out = rows.map((r) => {
    const c = r.holder.kind === "SHIPMENT" ? customers.get(r.holder.id) : undefined;
    if (c === undefined) return r;
    const key = c.code ?? `name:${c.name}`;
    const t = totals.get(key) ?? { customer: c, grams: 0, shipments: 0 };
    t.grams += r.heldG;
    t.shipments += 1;
    totals.set(key, t);
    return { ...r, customer: c };
  });
  const byCustomer = [...totals.values()].sort(
    (a, b) => b.grams - a.grams || a.customer.name.localeCompare(b.customer.name),
  );
  return { rows: out, byCustomer };
}
