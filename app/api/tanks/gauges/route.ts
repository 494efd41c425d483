import { recordGauge } from "@/lib/tank/tank.service";
import { recordingRoute } from "@/lib/api/handle.service";

/** Records a tank gauge (volume, or level through the tank's calibration table) with the book stock at its time. */
export const POST = recordingRoute("POST /api/tanks/gauges", ["PRODUCTION"], recordGauge);
