import { recordDisposal } from "@/lib/waste/container.service";
import { recordingRoute } from "@/lib/api/handle.service";

/** Records a haul-away under its manifest; refused when it is more than the container holds (409). */
export const POST = recordingRoute("POST /api/waste/disposals", ["COMPLIANCE"], recordDisposal);
