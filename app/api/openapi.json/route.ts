import { NextResponse } from "next/server";
import { ENDPOINTS } from "@/lib/api/endpoints";
import { buildOpenApi } from "@/lib/api/openapi";

export const dynamic = "force-static";

export function GET(): NextResponse {
  return NextResponse.json(
    buildOpenApi(ENDPOINTS, {
      title: "Tracevat API",
      version: "0.1.0",
      description: "Feedstock inventory and traceability for a biodiesel plant. Every response is {ok:true,value} or {ok:false,issues:[{code,message,field}]}. Sign in first; the session cookie authorises each call.",
    }),
  );
}
