import { recordCharacterisation } from "@/lib/waste/container.service";
import { recordingRoute } from "@/lib/api/handle.service";

/** Records lab results for a container's contents; the hazard assessment and due dates use them at once. */
export const POST = recordingRoute(
  "POST /api/waste/characterisation",
  ["PRODUCTION", "COMPLIANCE"],
  recordCharacterisation,
);
