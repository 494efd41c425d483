// What each signal reads and which thresholds decide it, for the queue page's explanation table.
import type { Signal } from "@/lib/screening/screening";
import type { ScreeningSettings } from "@/lib/screening/screening-defaults";

export const SIGNAL_RULES: ReadonlyArray<{
  signal: Signal;
  reads: string;
  settings: ReadonlyArray<keyof ScreeningSettings>;
}> = [
  {
    signal: "OVER_CAPACITY",
    reads: "Litres collected in a month against the declared capacity a month",
    settings: ["capacityRatio"],
  },
  {
    signal: "OWN_HISTORY",
    reads:
      "Litres in a month against the source's other months: median and 1.4826 × median absolute deviation (Hampel 1974; Rousseeuw & Croux 1993)",
    settings: ["robustZ", "madFloorShare", "minHistory"],
  },
  {
    signal: "PEER_GROUP",
    reads: "Litres in a month against sources of the same kind that month, on a log scale",
    settings: ["robustZ", "minPeers"],
  },
  { signal: "FRESH_OIL", reads: "Latest acid value of a lot booked as used oil", settings: ["freshAcidValue"] },
  {
    signal: "WATER_HIGH",
    reads: "Latest water result of a lot against the source's other lots",
    settings: ["robustZ", "waterExcessPct", "minHistory"],
  },
  {
    signal: "INSOLUBLES_HIGH",
    reads: "Latest insolubles result of a lot against the source's other lots",
    settings: ["robustZ", "insolublesExcessPct", "minHistory"],
  },
  {
    signal: "DENSITY_RANGE",
    reads: "Measured density at 15 °C of a vegetable oil lot",
    settings: ["densityMinKgM3", "densityMaxKgM3"],
  },
  {
    signal: "LEVEL_SHIFT",
    reads: "Median litres of the latest pickups against the pickups before",
    settings: ["shiftRatio", "shiftWindow"],
  },
  {
    signal: "INTERVAL_SHIFT",
    reads: "Median days between the latest pickups against the intervals before",
    settings: ["shiftRatio", "shiftWindow", "intervalMinDays"],
  },
  {
    signal: "OFF_HOURS",
    reads: "Local time a pickup was logged against the declared opening hours",
    settings: ["hoursMargin"],
  },
  {
    signal: "PHONE_FAR",
    reads: "Distance band the collector's phone shared (never the track): flagged beyond 1 km",
    settings: [],
  },
  {
    signal: "CERTIFIED_OVER_CAPACITY",
    reads: "Certified litres over the certificate's period against capacity × months elapsed",
    settings: ["capacityRatio", "certificateMonths"],
  },
];
