import { NextResponse } from "next/server";
import { getDb } from "@/lib/core/db";
import { respond } from "@/lib/api/json-route.service";
import { requireRole } from "@/lib/auth/request.service";
import { productCertificatePdf } from "@/lib/product/certificate.service";
import { codeParam } from "@/app/_ui/links";
import { handled } from "@/lib/api/handle.service";

export const dynamic = "force-dynamic";

/**
 * The certificate of analysis of a product lot as a PDF. A lot that is not released gets the same sheet
 * with "NOT RELEASED" across every page and in its file name, for review; it is not a certificate.
 */
export const GET = handled(
  "GET /api/products/[code]/certificate",
  async (_request: Request, { params }: { params: Promise<{ code: string }> }): Promise<NextResponse> => {
    const who = await requireRole(["PRODUCTION", "COMPLIANCE", "ADMIN"]);
    if (!who.ok) return respond(who);
    const code = codeParam((await params).code);
    const pdf = await productCertificatePdf(await getDb(), who.value.siteId, code, who.value.now);
    if (!pdf)
      return respond({
        ok: false,
        issues: [
          { code: "RECORD.NOT_FOUND", message: `No product lot ${code} with a known specification`, field: "code" },
        ],
      });
    return new NextResponse(pdf.body as unknown as BodyInit, {
      headers: {
        "content-type": "application/pdf",
        "content-disposition": `attachment; filename="${pdf.filename}"`,
        "x-released": pdf.released ? "yes" : "no",
        "cache-control": "no-store",
      },
    });
  },
);
