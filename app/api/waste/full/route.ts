import { markContainerFull } from "@/lib/waste/container.service";
import { recordingRoute } from "@/lib/api/handle.service";

/** Marks an open container full; refused when it is already full or hauled away (409). */
export const POST = recordingRoute("POST /api/waste/full", ["PRODUCTION", "COMPLIANCE"], markContainerFull);
