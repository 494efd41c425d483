// Every signal over one source's facts; the caller persists what comes back.
import { flagDensityRange, flagFreshOil, flagLabExcess } from "@/lib/screening/lot-signals";
import { flagIntervalShift, flagLevelShift, flagOffHours, flagPhoneFar } from "@/lib/screening/pattern-signals";
import { monthlyVolumes } from "@/lib/screening/screening";
import type { Flag, SourceFacts } from "@/lib/screening/screening";
import type { ScreeningSettings } from "@/lib/screening/screening-defaults";
import {
  flagCertifiedOverCapacity,
  flagOverCapacity,
  flagOwnHistory,
  flagPeerGroup,
} from "@/lib/screening/volume-signals";

export interface ScreenContext {
  settings: ScreeningSettings;
  now: number;
  /** Litres per local month of the other sources of the same kind. */
  peerLitres: ReadonlyMap<string, readonly number[]>;
  kindLabel: string;
}

/** Litres per local month of every source, by kind: built once per run; a source's peers are the others. */
export type KindMonths = Map<string, Map<string, Array<{ code: string; litres: number }>>>;

export function indexKindMonths(
  sources: ReadonlyArray<{ code: string; kind: string; months: ReadonlyArray<{ month: string; litres: number }> }>,
): KindMonths {
  const out: KindMonths = new Map();
  for (const s of sources) {
    const byMonth = out.get(s.kind) ?? new Map<string, Array<{ code: string; litres: number }>>();
    for (const m of s.months) {
      const list = byMonth.get(m.month) ?? [];
      list.push({ code: s.code, litres: m.litres });
      byMonth.set(m.month, list);
    }
    out.set(s.kind, byMonth);
  }
  return out;
}

export function peersOf(index: KindMonths, kind: string, code: string): Map<string, number[]> {
  const out = new Map<string, number[]>();
  for (const [month, list] of index.get(kind) ?? [])
    out.set(
      month,
      list.filter((x) => x.code !== code).map((x) => x.litres),
    );
  return out;
}

export function screenSource(f: SourceFacts, ctx: ScreenContext): Flag[] {
  const s = ctx.settings;
  const months = monthlyVolumes(f.pickups);
  const z = s.robustZ.value;
  const floor = s.madFloorShare.value;
  const minHistory = s.minHistory.value;
  const lots = [...f.lots].sort((a, b) => a.at - b.at);
  const certificate =
    f.certificateNo !== null && f.certificateExpires !== null
      ? { no: f.certificateNo, expires: f.certificateExpires, months: s.certificateMonths.value }
      : null;
  return [
    ...flagOverCapacity(months, f.capacity, s.capacityRatio.value),
    ...flagOwnHistory(months, z, floor, minHistory),
    ...flagPeerGroup(months, ctx.peerLitres, ctx.kindLabel, z, s.minPeers.value),
    ...flagFreshOil(lots, s.freshAcidValue.value),
    ...flagLabExcess(lots, "waterPct", { z, floorShare: floor, minHistory, minExcess: s.waterExcessPct.value }),
    ...flagLabExcess(lots, "insolublesPct", {
      z,
      floorShare: floor,
      minHistory,
      minExcess: s.insolublesExcessPct.value,
    }),
    ...flagDensityRange(lots, s.densityMinKgM3.value, s.densityMaxKgM3.value),
    ...flagLevelShift(f.pickups, s.shiftWindow.value, s.shiftRatio.value),
    ...flagIntervalShift(f.pickups, s.shiftWindow.value, s.shiftRatio.value, s.intervalMinDays.value),
    ...flagOffHours(f.pickups, f.opensHour, f.closesHour, s.hoursMargin.value),
    ...flagPhoneFar(f.pickups),
    ...flagCertifiedOverCapacity(f.pickups, f.capacity, certificate, ctx.now, s.capacityRatio.value),
  ];
}
