import { openWasteContainer } from "@/lib/waste/container.service";
import { recordingRoute } from "@/lib/api/handle.service";

/** Opens a waste container: stream, location, accumulation start, capacity, satellite area. */
export const POST = recordingRoute("POST /api/waste/containers", ["PRODUCTION", "COMPLIANCE"], openWasteContainer);
