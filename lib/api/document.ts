// The one OpenAPI document of the service: served at /api/openapi.json, validated by the unit tests
// and turned into client types by `npm run api:types`.
import { ENDPOINTS } from "@/lib/api/endpoints";
import { buildOpenApi } from "@/lib/api/openapi";

export const API_INFO = {
  title: "Tracevat API",
  version: "0.1.0",
  description:
    "Feedstock inventory and traceability for a biodiesel plant. Every JSON response is {ok:true,value} or {ok:false,issues:[{code,message,field}]}; exports (PDF, EPCIS) answer with the file itself on success. Sign in first; the session cookie authorises each call.",
};

export function buildApiDocument(): Record<string, unknown> {
  return buildOpenApi(ENDPOINTS, API_INFO);
}
