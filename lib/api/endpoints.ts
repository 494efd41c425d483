// Every JSON endpoint registers its document here; app/api/openapi.json serves the whole list.
import type { EndpointDoc } from "@/lib/api/openapi";

export const ENDPOINTS: EndpointDoc[] = [];
