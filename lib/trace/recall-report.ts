// The recall report's data: built once from the recall answer, rendered by the page, the CSV and the PDF.
import { labelOf } from "@/lib/core/vocabulary";
import { reportDay } from "@/lib/report/report";
import type { ReportContext, ReportDoc, ReportTable } from "@/lib/report/report";
import type { RecallReport } from "@/lib/trace/recall";

export const RECALL_TABLES = ["customers", "shipments", "product-lots", "on-site", "reached"] as const;
export type RecallTable = (typeof RECALL_TABLES)[number];

/** "Source R001 Harbour Grill, material that moved in 2026-10-01 to 2026-10-14". */
export function recallSubjectText(r: Pick<RecallReport, "subject" | "query">, timeZone: string): string {
  const what =
    r.subject.kind === "SOURCE" ? `Source ${r.subject.label}` : `${labelOf(r.subject.kind)} ${r.subject.code}`;
  const { from, to } = r.query;
  if (from === null && to === null) return `${what}, everything that moved in`;
  const last = to === null ? null : new Date(to.getTime() - 1);
  const span = `${from === null ? "the start" : reportDay(from, timeZone)} to ${last === null ? "now" : reportDay(last, timeZone)}`;
  return `${what}, ${r.subject.kind === "SOURCE" ? "pickups and deliveries recorded" : "material that moved in"} ${span}`;
}

function table(key: RecallTable, heading: string, t: Omit<ReportTable, "key" | "heading">): ReportTable {
  return { key, heading, ...t };
}

const total = (label: string, n: number) => [label, ...Array<null>(n)];

/** Who the material reached: customers and the shipments that carried it. */
function customerTables(r: RecallReport, opts: { withCustomers: boolean }): [ReportTable, ReportTable] {
  const customers = table("customers", "Customers reached", {
    columns: [
      { key: "customer", header: "Customer", kind: "text" },
      { key: "customer_code", header: "Code", kind: "text" },
      { key: "shipments", header: "Shipments", kind: "count" },
      { key: "mass", header: "Traced material", kind: "mass" },
      { key: "share", header: "Share", kind: "pct" },
      { key: "first_shipped", header: "First shipped", kind: "day" },
      { key: "last_shipped", header: "Last shipped", kind: "day" },
    ],
    rows: r.customers.map((c) => [c.customer.name, c.customer.code, c.shipments, c.grams, c.pct, c.firstAt, c.lastAt]),
    total: [
      "TOTAL",
      null,
      r.customers.reduce((s, c) => s + c.shipments, 0),
      r.customers.reduce((s, c) => s + c.grams, 0),
      r.customers.reduce((s, c) => s + c.pct, 0),
      null,
      null,
    ],
    empty: "None of this material has been shipped to a customer.",
  });
  const shipments = table("shipments", "Shipments", {
    columns: [
      { key: "shipment", header: "Shipment", kind: "holder" },
      ...(opts.withCustomers ? [{ key: "customer", header: "Customer", kind: "text" as const }] : []),
      { key: "shipped", header: "Shipped", kind: "day" },
      { key: "mass", header: "Traced material", kind: "mass" },
      { key: "share", header: "Share", kind: "pct" },
    ],
    rows: r.shipments.map((s) => [
      s.holder,
      ...(opts.withCustomers ? [s.customer?.name ?? null] : []),
      s.firstAt,
      s.heldG,
      s.pct,
    ]),
    total: [...total("TOTAL", opts.withCustomers ? 2 : 1), r.shippedG, r.shipments.reduce((s, h) => s + h.pct, 0)],
    empty: "Nothing of it has been shipped.",
  });
  return [customers, shipments];
}

/** Where the material is: product lots reached, what is still on site, every place reached. */
function placeTables(r: RecallReport): ReportTable[] {
  const lots = table("product-lots", "Product lots reached", {
    columns: [
      { key: "product_lot", header: "Product lot", kind: "holder" },
      { key: "status", header: "Status", kind: "status" },
      { key: "reason", header: "Reason", kind: "text" },
      { key: "received", header: "Received", kind: "mass" },
      { key: "share", header: "Share", kind: "pct" },
      { key: "still_in_lot", header: "Still in the lot", kind: "mass" },
      { key: "made", header: "First received", kind: "day" },
    ],
    rows: r.productLots.map((p) => [
      p.holder,
      p.standing ? labelOf(p.standing.status) : null,
      p.standing?.reason ?? null,
      p.receivedG,
      p.pct,
      p.heldG,
      p.firstAt,
    ]),
    total: [
      "TOTAL",
      null,
      null,
      r.productLots.reduce((s, p) => s + p.receivedG, 0),
      r.productLots.reduce((s, p) => s + p.pct, 0),
      r.productLots.reduce((s, p) => s + p.heldG, 0),
      null,
    ],
    empty: "No product lot was made from this material.",
  });
  const onSite = table("on-site", "Still on site", {
    columns: [
      { key: "holder", header: "Where", kind: "holder" },
      { key: "kind", header: "Kind", kind: "text" },
      { key: "stage", header: "Stage", kind: "text" },
      { key: "held", header: "Held there", kind: "mass" },
      { key: "share", header: "Share of traced", kind: "pct" },
    ],
    rows: r.onSite.map((h) => [
      h.holder,
      labelOf(h.holder.kind),
      h.stageLabel,
      h.heldG,
      r.tracedG === 0 ? 0 : (h.heldG * 100) / r.tracedG,
    ]),
    total: ["TOTAL", null, null, r.onSiteG, r.tracedG === 0 ? 0 : (r.onSiteG * 100) / r.tracedG],
    empty: "None of it is on site any more.",
  });
  const reached = table("reached", "Every place reached", {
    columns: [
      { key: "holder", header: "Holder", kind: "holder" },
      { key: "kind", header: "Kind", kind: "text" },
      { key: "stage", header: "Stage", kind: "text" },
      { key: "received", header: "Received", kind: "mass" },
      { key: "held", header: "Held or left the books there", kind: "mass" },
      { key: "first", header: "First", kind: "day" },
      { key: "last", header: "Last", kind: "day" },
    ],
    rows: r.holders.map((h) => [
      h.holder,
      labelOf(h.holder.kind),
      h.stageLabel,
      h.receivedG,
      h.heldG,
      h.firstAt,
      h.lastAt,
    ]),
    total: ["TOTAL", null, null, null, r.holders.reduce((s, h) => s + h.heldG, 0), null, null],
    empty: "The material has not moved anywhere.",
  });
  return [lots, onSite, reached];
}

export function buildRecallDoc(r: RecallReport, ctx: ReportContext, opts: { withCustomers: boolean }): ReportDoc {
  const [customers, shipments] = customerTables(r, opts);
  return {
    slug: "recall",
    title: "Recall: where the material went",
    plant: ctx.plant,
    subject: recallSubjectText(r, ctx.timeZone),
    producedAt: ctx.producedAt,
    producedBy: ctx.producedBy,
    timeZone: ctx.timeZone,
    ledger: r.ledger,
    facts: [
      ["Material followed", `${kgFacts(r.tracedG)} in ${r.seedMoves} movement${r.seedMoves === 1 ? "" : "s"}`],
      ["Shipped", kgFacts(r.shippedG)],
      ["Still on site", kgFacts(r.onSiteG)],
      ["Product lots to hold", r.toHold.length === 0 ? "none" : r.toHold.join(", ")],
    ],
    notes: [
      "Masses come from replaying the movement ledger forward under each tank's mixing model, in whole grams. A tank mixes what it holds, so material that went into it reaches every later draw in proportion. Shares are of the material followed.",
      ...(opts.withCustomers
        ? []
        : ["Customers are left out of this copy (the reader's role does not see customers)."]),
    ],
    cautions: [],
    tables: [...(opts.withCustomers ? [customers] : []), shipments, ...placeTables(r)],
  };
}

function kgFacts(grams: number): string {
  return `${(grams / 1000).toLocaleString("en-US", { minimumFractionDigits: 3, maximumFractionDigits: 3 })} kg`;
}
