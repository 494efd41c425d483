import type { EndpointDoc } from "@/lib/api/openapi";
import { CustomerSchema } from "@/lib/customer/customer.schema";
import { ShipmentRecordSchema } from "@/lib/shipment/shipment.schema";

/** Customers and shipments (compliance). Writes need an Idempotency-Key header. */
export const SHIPMENT_ENDPOINTS: EndpointDoc[] = [
  {
    method: "post",
    path: "/api/customers",
    tag: "Shipments",
    summary: "Record a customer (Idempotency-Key header required)",
    input: CustomerSchema,
  },
  {
    method: "post",
    path: "/api/shipments",
    tag: "Shipments",
    summary:
      "Record a shipment to a customer: one or more lines, each from a released product lot or a product tank, in kg or in litres with the temperature; all lines or none (Idempotency-Key header required)",
    input: ShipmentRecordSchema,
  },
];
