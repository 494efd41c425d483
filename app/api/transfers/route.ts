import { transferToTank } from "@/lib/tank/tank.service";
import { recordingRoute } from "@/lib/api/handle.service";

/** Moves material from a lot, tank or product lot into a tank; the draw is guarded against over-drawing. */
export const POST = recordingRoute("POST /api/transfers", ["PRODUCTION"], transferToTank);
