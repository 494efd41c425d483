import type { EndpointDoc } from "@/lib/api/openapi";

/** Traceability, balances and waste endpoints. */
export const TRACE_ENDPOINTS: EndpointDoc[] = [];
