import "server-only";
import type { Db, Tx } from "@/lib/core/connect";

export interface CustomerFields {
  code: string;
  name: string;
  address: string;
  contact: string;
  active: boolean;
}

export interface CustomerRow extends CustomerFields {
  shipments: number;
  lastShippedAt: Date | null;
}

/** Every customer of the site with how many shipments went to them and when the last one left. */
export async function listCustomers(db: Db, siteId: number): Promise<CustomerRow[]> {
  const [rows, stats] = await Promise.all([
    db.customer.findMany({ where: { siteId }, orderBy: [{ active: "desc" }, { name: "asc" }, { code: "asc" }] }),
    db.shipment.groupBy({
      by: ["customerId"],
      where: { siteId, customerId: { not: null } },
      _count: { _all: true },
      _max: { shippedAt: true },
    }),
  ]);
  const byId = new Map(stats.map((s) => [s.customerId, s]));
  return rows.map((r) => {
    const s = byId.get(r.id);
    return {
      code: r.code,
      name: r.name,
      address: r.address,
      contact: r.contact,
      active: r.active,
      shipments: s?._count._all ?? 0,
      lastShippedAt: s?._max.shippedAt ?? null,
    };
  });
}

/** Customers a shipment can go to (active ones), for the shipment form. */
export async function listCustomerChoices(db: Db, siteId: number): Promise<Array<{ code: string; name: string }>> {
  return db.customer.findMany({
    where: { siteId, active: true },
    orderBy: [{ name: "asc" }, { code: "asc" }],
    select: { code: true, name: true },
  });
}

export async function getCustomer(
  db: Db | Tx,
  siteId: number,
  code: string,
): Promise<(CustomerFields & { id: number }) | null> {
  return db.customer.findUnique({
    where: { siteId_code: { siteId, code } },
    select: { id: true, code: true, name: true, address: true, contact: true, active: true },
  });
}

export async function insertCustomer(
  tx: Tx,
  c: { siteId: number; code: string; name: string; address: string; contact: string; createdAt: Date },
): Promise<{ id: number; code: string }> {
  return tx.customer.create({ data: { ...c, active: true }, select: { id: true, code: true } });
}

export async function updateCustomer(
  tx: Tx,
  id: number,
  c: { name: string; address: string; contact: string; active: boolean },
): Promise<void> {
  await tx.customer.update({ where: { id }, data: c });
}
