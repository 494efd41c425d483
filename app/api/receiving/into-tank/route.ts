import { receiveLotIntoTank } from "@/lib/feedstock/receive-tank.service";
import { recordingRoute } from "@/lib/api/handle.service";

/** Pools pickups into a lot, accepts it with a reason and moves all of it into a tank: one transaction. */
export const POST = recordingRoute("POST /api/receiving/into-tank", ["PRODUCTION"], receiveLotIntoTank);
