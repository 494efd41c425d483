// Every signal over one source's facts; the caller persists what comes back.
import { flagDensityRange, flagFreshOil, flagLabExcess } from "@/lib/screening/lot-signals";
import { flagIntervalShift, flagLevelShift, flagOffHours, flagPhoneFar } from "@/lib/screening/pattern-signals";
import { monthlyVolumes } from "@/lib/screening/screening";
import type { Flag, SourceFacts } from "@/lib/screening/screening";
import type { ScreeningSettings } from "@/lib/screening/screening-defaults";
import { flagCertifiedOverCapacity, flagOverCapacity, flagOwnHistory, flagPeerGroup } from "@/lib/screening/volume-signals";

export interface ScreenContext {
  settings: ScreeningSettings;
  now: number;
  /** Litres per local month of the other sources of the same kind. */
  peerLitres: ReadonlyMap<string, readonly number[]>;
  kindLabel: string;
}

export function screenSource(f: SourceFacts, ctx: ScreenContext): Flag[] {
  const s = ctx.settings;
  const months = monthlyVolumes(f.pickups);
  const z = s.robustZ.value;
  const floor = s.madFloorShare.value;
  const minHistory = s.minHistory.value;
  const lots = [...f.lots].sort((a, b) => a.at - b.at);
  const certificate = f.certificateNo !== null && f.certificateExpires !== null ? { no: f.certificateNo, expires: f.certificateExpires, months: s.certificateMonths.value } : null;
  return [
    ...flagOverCapacity(months, f.capacity, s.capacityRatio.value),
    ...flagOwnHistory(months, z, floor, minHistory),
    ...flagPeerGroup(months, ctx.peerLitres, ctx.kindLabel, z, s.minPeers.value),
    ...flagFreshOil(lots, s.freshAcidValue.value),
    ...flagLabExcess(lots, "waterPct", { z, floorShare: floor, minHistory, minExcess: s.waterExcessPct.value }),
    ...flagLabExcess(lots, "insolublesPct", { z, floorShare: floor, minHistory, minExcess: s.insolublesExcessPct.value }),
    ...flagDensityRange(lots, s.densityMinKgM3.value, s.densityMaxKgM3.value),
    ...flagLevelShift(f.pickups, s.shiftWindow.value, s.shiftRatio.value),
    ...flagIntervalShift(f.pickups, s.shiftWindow.value, s.shiftRatio.value, s.intervalMinDays.value),
    ...flagOffHours(f.pickups, f.opensHour, f.closesHour, s.hoursMargin.value),
    ...flagPhoneFar(f.pickups),
    ...flagCertifiedOverCapacity(f.pickups, f.capacity, certificate, ctx.now, s.capacityRatio.value),
  ];
}
