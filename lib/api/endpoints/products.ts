import { z } from "zod";
import type { EndpointDoc } from "@/lib/api/openapi";
import { ChooseSpecSchema, ProductDecisionSchema, QcResultSchema } from "@/lib/product/product.schema";

/** QC results, specification choice, release decisions and the certificate of analysis of product lots. */
export const PRODUCT_ENDPOINTS: EndpointDoc[] = [
  {
    method: "post",
    path: "/api/products/qc",
    tag: "Products",
    summary:
      "Record a QC result of a held product lot (production or compliance; Idempotency-Key header required). Judged at once against the lot's specification; a second result for a property supersedes the first.",
    input: QcResultSchema,
    output: z.object({
      id: z.number().int(),
      verdict: z.enum(["PASS", "FAIL", "REPORTED", "NOT_JUDGED"]),
      supersedesId: z.number().int().nullable(),
      property: z.string(),
    }),
  },
  {
    method: "post",
    path: "/api/products/spec",
    tag: "Products",
    summary:
      "Choose the specification a held product lot is judged against (compliance; Idempotency-Key header required)",
    input: ChooseSpecSchema,
    output: z.object({ code: z.string(), specKey: z.string(), releasable: z.boolean() }),
  },
  {
    method: "post",
    path: "/api/products/decisions",
    tag: "Products",
    summary:
      "Release, release with a deviation, hold or reject a product lot (compliance; Idempotency-Key header required). Release is judged afresh against the current specification; 409 PRODUCT.NOT_RELEASABLE when a required result is missing or out of limits.",
    input: ProductDecisionSchema,
    output: z.object({ code: z.string(), status: z.enum(["HELD", "RELEASED", "REJECTED"]), deviation: z.boolean() }),
  },
  {
    method: "get",
    path: "/api/products/{code}/certificate",
    tag: "Products",
    contentType: "application/pdf",
    summary: "Certificate of analysis as application/pdf; a lot not released prints NOT RELEASED across each page",
  },
];
