// Every JSON endpoint documents itself in one of the files under endpoints/; the OpenAPI document
// at /api/openapi.json is built from this list and the endpoints' own zod schemas.
import type { EndpointDoc } from "@/lib/api/openapi";
import { LAB_ENDPOINTS } from "@/lib/api/endpoints/lab";
import { TRACE_ENDPOINTS } from "@/lib/api/endpoints/trace";
import { RECORD_ENDPOINTS } from "@/lib/api/endpoints/records";
import { GRID_ENDPOINTS } from "@/lib/api/endpoints/grid";
import { WASTE_ENDPOINTS } from "@/lib/api/endpoints/waste";
import { TANK_ENDPOINTS } from "@/lib/api/endpoints/tanks";
import { SHIPMENT_ENDPOINTS } from "@/lib/api/endpoints/shipments";
import { SPEC_ENDPOINTS } from "@/lib/api/endpoints/specs";
import { PRODUCT_ENDPOINTS } from "@/lib/api/endpoints/products";
import { EPCIS_ENDPOINTS } from "@/lib/api/endpoints/epcis";
import { REPORT_ENDPOINTS } from "@/lib/api/endpoints/reports";

export const ENDPOINTS: EndpointDoc[] = [
  ...LAB_ENDPOINTS,
  ...TRACE_ENDPOINTS,
  ...RECORD_ENDPOINTS,
  ...GRID_ENDPOINTS,
  ...WASTE_ENDPOINTS,
  ...TANK_ENDPOINTS,
  ...SHIPMENT_ENDPOINTS,
  ...SPEC_ENDPOINTS,
  ...PRODUCT_ENDPOINTS,
  ...EPCIS_ENDPOINTS,
  ...REPORT_ENDPOINTS,
];
