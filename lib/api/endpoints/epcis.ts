// EPCIS 2.0 exports: the events of a balance period or behind a trace answer, as GS1 EPCIS 2.0 JSON-LD.
import type { EndpointDoc } from "@/lib/api/openapi";
import { BalanceQuerySchema } from "@/lib/api/endpoints/trace";
import { EpcisDocumentSchema } from "@/lib/epcis/epcis-document.schema";
import { EpcisTraceQuerySchema } from "@/lib/epcis/epcis.schema";

const IDS =
  "Lots are named by material class and lot number (LGTIN class URIs, urn:epc:class:lgtin, when the site has a GS1 Company Prefix; otherwise the site's own URIs), the plant and its tanks by SGLN or the site's own URIs; quantities in kg (UN/CEFACT KGM).";

export const EPCIS_ENDPOINTS: EndpointDoc[] = [
  {
    method: "get",
    path: "/api/epcis/period",
    tag: "Exports",
    contentType: "application/ld+json",
    summary: `GS1 EPCIS 2.0 events of a balance period (same query as GET /api/balance): pickups and receipts and moves between holders as ObjectEvents (tank moves with source and destination locations, shipments with their customer where the reader may see customers), finished batches as TransformationEvents from inputs to outputs. Every event time falls in the period. ${IDS} Compliance and administrators.`,
    input: BalanceQuerySchema,
    output: EpcisDocumentSchema,
  },
  {
    method: "get",
    path: "/api/epcis/trace",
    tag: "Exports",
    contentType: "application/ld+json",
    summary: `GS1 EPCIS 2.0 events behind one trace answer: dir=back with kind PRODUCT_LOT, TANK, SHIPMENT or BATCH (the movements on paths from its origins to it), or dir=fwd with kind SOURCE, PICKUP or LOT (the movements into every holder its material reached). ${IDS} Production, compliance and administrators.`,
    input: EpcisTraceQuerySchema,
    output: EpcisDocumentSchema,
  },
];
