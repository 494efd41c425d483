import { recordQcResult } from "@/lib/product/product.service";
import { recordingRoute } from "@/lib/api/handle.service";

export const dynamic = "force-dynamic";

/** Records one QC result of a held product lot, judged at once against the lot's specification; a second result for a property supersedes the first. */
export const POST = recordingRoute("POST /api/products/qc", ["PRODUCTION", "COMPLIANCE"], recordQcResult);
