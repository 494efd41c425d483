import { describe, expect, it } from "vitest";
import { attachCustomers } from "@/lib/trace/customers";

describe("attachCustomers", () => {
  const rows = [
    { holder: { id: 1, kind: "TANK" }, heldG: 500 },
    { holder: { id: 2, kind: "SHIPMENT" }, heldG: 300 },
    { holder: { id: 3, kind: "SHIPMENT" }, heldG: 200 },
    { holder: { id: 4, kind: "SHIPMENT" }, heldG: 900 },
    { holder: { id: 5, kind: "SHIPMENT" }, heldG: 50 },
  ];
  const customers = new Map([
    [2, { name: "Alpha Carriers", code: "A" }],
    [3, { name: "Alpha Carriers", code: "A" }],
    [4, { name: "Beta Ferries", code: "B" }],
    [5, { name: "Old free-text name", code: null }],
  ]);

  it("puts the customer next to each shipment and totals per customer, largest first", () => {
    const r = attachCustomers(rows, customers);
    expect(r.rows.map((x) => ("customer" in x ? x.customer?.name : undefined))).toEqual([
      undefined,
      "Alpha Carriers",
      "Alpha Carriers",
      "Beta Ferries",
      "Old free-text name",
    ]);
    expect(r.byCustomer).toEqual([
      { customer: { name: "Beta Ferries", code: "B" }, grams: 900, shipments: 1 },
      { customer: { name: "Alpha Carriers", code: "A" }, grams: 500, shipments: 2 },
      { customer: { name: "Old free-text name", code: null }, grams: 50, shipments: 1 },
    ]);
  });

  it("leaves rows alone when no customer is known", () => {
    const r = attachCustomers(rows, new Map());
    expect(r.rows).toEqual(rows);
    expect(r.byCustomer).toEqual([]);
  });
});
