import { recordPickup } from "@/lib/feedstock/pickup.service";
import { recordingRoute } from "@/lib/api/handle.service";
import { thenScreen } from "@/lib/screening/screening.service";

/** Records one pickup; collectors record their own, production staff may record for them. */
export const POST = recordingRoute(
  "POST /api/pickups",
  ["COLLECTOR", "PRODUCTION"],
  thenScreen(recordPickup, (saved) => ({ pickupCodes: [saved.code] })),
);
