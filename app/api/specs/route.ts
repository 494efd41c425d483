import { saveSiteSpec } from "@/lib/spec/site-spec.service";
import { recordingRoute } from "@/lib/api/handle.service";

/** Writes a site specification: version 1 of a new name, or the next version of an existing one. */
export const POST = recordingRoute("POST /api/specs", ["COMPLIANCE"], saveSiteSpec);
