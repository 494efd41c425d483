import type { EndpointDoc } from "@/lib/api/openapi";
import { LotIntoTankSchema } from "@/lib/feedstock/lot.schema";
import { GaugeSchema } from "@/lib/tank/tank.schema";

/** Tank gauges and receiving straight into a tank. Writes need an Idempotency-Key header. */
export const TANK_ENDPOINTS: EndpointDoc[] = [
  {
    method: "post",
    path: "/api/tanks/gauges",
    tag: "Records",
    summary:
      "Record a tank gauge: method VOLUME (volumeL) or LEVEL (levelMm through the tank's calibration table), tempC, optional densityKgM3 at 15 °C; answers the gauged mass and the book stock at that time (Idempotency-Key header required)",
    input: GaugeSchema,
  },
  {
    method: "post",
    path: "/api/receiving/into-tank",
    tag: "Records",
    summary:
      "Pool pickups into a lot, accept it with acceptReason and move all of it into tankCode, all-or-nothing (Idempotency-Key header required)",
    input: LotIntoTankSchema,
  },
];
