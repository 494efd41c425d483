import type { EndpointDoc } from "@/lib/api/openapi";

/** Lab results and batch planning endpoints. */
export const LAB_ENDPOINTS: EndpointDoc[] = [];
