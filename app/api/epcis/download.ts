import "server-only";
import { NextResponse } from "next/server";
import { respond } from "@/lib/api/json-route.service";
import type { Result } from "@/lib/core/result";
import type { EpcisExport } from "@/lib/epcis/epcis.service";

/** An EPCIS document is answered as itself (JSON-LD, as a partner's tools expect), a refusal as the usual issues. */
export function answerEpcis(r: Result<EpcisExport>): NextResponse {
  if (!r.ok) return respond(r);
  return new NextResponse(JSON.stringify(r.value.document, null, 1), {
    status: 200,
    headers: {
      "content-type": "application/ld+json; charset=utf-8",
      "content-disposition": `attachment; filename="${r.value.fileName}"`,
      "cache-control": "no-store",
    },
  });
}
