// Printable reports: each answers a PDF (format=pdf, the default) or one of its tables as CSV
// (format=csv&table=<key>), from the same data the page shows. Every report carries the plant, its
// subject or period, when and by whom it was produced, and the ledger position it was computed at.
import { z } from "zod";
import type { EndpointDoc } from "@/lib/api/openapi";
import { BackwardTraceQuerySchema, BalanceQuerySchema, WasteDuePageQuerySchema } from "@/lib/api/endpoints/trace";
import { RECALL_KINDS } from "@/lib/trace/recall.schema";
import { oneOf } from "@/lib/core/fields";

const FormatQuery = z.object({
  format: oneOf("Format", ["pdf", "csv"] as const)
    .optional()
    .describe("pdf (default) or csv"),
  table: z.string().optional().describe("With format=csv: which table (the page's CSV links name them)"),
});

const RecallReportQuery = FormatQuery.extend({
  kind: oneOf("Start from", RECALL_KINDS),
  code: z.string().describe("Source code, pickup, lot, tank, batch or product lot code"),
  from: z.string().optional().describe("First day (YYYY-MM-DD, site time): only material that moved in from then"),
  to: z.string().optional().describe("Last day, included (YYYY-MM-DD, site time)"),
});

export const REPORT_ENDPOINTS: EndpointDoc[] = [
  {
    method: "get",
    path: "/trace/recall/report",
    tag: "Reports",
    summary:
      "Recall report: every product lot, shipment and customer the material of a source (pickups and deliveries within the days given), pickup, lot, tank (what moved in within the days), batch or product lot reached, with kg and share, first and last shipment date, and what is still on site. Tables: customers, shipments, product-lots, on-site, reached. Production, compliance and administrators; customers are left out for production.",
    input: RecallReportQuery,
  },
  {
    method: "get",
    path: "/trace/report",
    tag: "Reports",
    summary:
      "Trace report: what a product lot, tank at a time, shipment or batch is made of, by source, lot, pickup, material and certification, with reagents. Tables: sources, lots, pickups, materials, certification, reagents. Production, compliance and administrators.",
    input: FormatQuery.extend(BackwardTraceQuerySchema.shape),
  },
  {
    method: "get",
    path: "/balance/report",
    tag: "Reports",
    summary:
      "Period balance statement: opening stock and receipts against outputs, closing stock and what is unaccounted, by material kind, batches finished, and book stock against the tank gauges. Tables: statement, materials, batches, gauges. Compliance and administrators.",
    input: FormatQuery.extend(BalanceQuerySchema.shape),
  },
  {
    method: "get",
    path: "/balance/custody/report",
    tag: "Reports",
    summary:
      "Chain-of-custody statement for a balance period: certified inputs by characteristic set, conversions, certified claims and the accounts' period figures. Tables: inputs, conversions, claims, accounts. Compliance and administrators.",
    input: FormatQuery.extend({
      period: z.string().optional().describe("Balance period label, e.g. 2026-Q4"),
      operatorType: z.string().optional(),
    }),
  },
  {
    method: "get",
    path: "/waste/due/report",
    tag: "Reports",
    summary:
      "Waste list for the hauler: containers on site with stream, quantity, due date, characterisation, hazard flags and the usual cautions, and what falls due by stream. Tables: containers, due-by-stream. Production, compliance and administrators.",
    input: FormatQuery.extend(WasteDuePageQuerySchema.shape),
  },
  {
    method: "get",
    path: "/lots/{code}/report",
    tag: "Reports",
    summary:
      "Lot history: pickups or delivery, lab results, and where the lot's material went. Tables: pickups, lab, where-it-went. Production, compliance and administrators.",
    input: FormatQuery,
  },
];
