import { decideProductLot } from "@/lib/product/product.service";
import { recordingRoute } from "@/lib/api/handle.service";

export const dynamic = "force-dynamic";

/** Release (judged afresh against the current specification), release with a deviation, hold or reject a product lot; all but a plain release need a reason. */
export const POST = recordingRoute("POST /api/products/decisions", ["COMPLIANCE"], decideProductLot);
