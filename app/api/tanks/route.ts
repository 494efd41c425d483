import { createTank } from "@/lib/tank/tank.service";
import { recordingRoute } from "@/lib/api/handle.service";

export const POST = recordingRoute("POST /api/tanks", ["PRODUCTION"], createTank);
