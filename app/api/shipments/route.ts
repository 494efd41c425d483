import { recordShipment } from "@/lib/shipment/shipment.service";
import { recordingRoute } from "@/lib/api/handle.service";

/** Records a shipment with one or more lines, all in one transaction; held lots and over-draws are refused. */
export const POST = recordingRoute("POST /api/shipments", ["COMPLIANCE"], recordShipment);
