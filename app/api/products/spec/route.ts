import { chooseProductSpec } from "@/lib/product/product.service";
import { recordingRoute } from "@/lib/api/handle.service";

export const dynamic = "force-dynamic";

/** Chooses the specification a held product lot is judged against. */
export const POST = recordingRoute("POST /api/products/spec", ["COMPLIANCE"], chooseProductSpec);
