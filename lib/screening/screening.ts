// What screening reads about one source and what it raises. Pure: the service turns rows into these
// facts (local months and hours already worked out in the site's time zone).
import type { DeclaredCapacity } from "@/lib/screening/capacity";

export const SIGNALS = [
  "OVER_CAPACITY",
  "OWN_HISTORY",
  "PEER_GROUP",
  "FRESH_OIL",
  "WATER_HIGH",
  "INSOLUBLES_HIGH",
  "DENSITY_RANGE",
  "LEVEL_SHIFT",
  "INTERVAL_SHIFT",
  "OFF_HOURS",
  "PHONE_FAR",
  "CERTIFIED_OVER_CAPACITY",
] as const;
export type Signal = (typeof SIGNALS)[number];

/** Our own names for the signals, as compliance sees them. */
export const SIGNAL_LABELS: Record<Signal, string> = {
  OVER_CAPACITY: "More than the source can give",
  OWN_HISTORY: "Far above its own usual month",
  PEER_GROUP: "Far above sources of its kind",
  FRESH_OIL: "Looks like fresh oil",
  WATER_HIGH: "Water far above its usual",
  INSOLUBLES_HIGH: "Insolubles far above its usual",
  DENSITY_RANGE: "Density out of range for the material",
  LEVEL_SHIFT: "Sudden change of volume level",
  INTERVAL_SHIFT: "Sudden change of pickup interval",
  OFF_HOURS: "Pickup outside opening hours",
  PHONE_FAR: "Collector's phone far from the address",
  CERTIFIED_OVER_CAPACITY: "Certified volume beyond capacity",
};

export interface PickupFact {
  code: string;
  at: number;
  /** Local calendar month, "2026-11", and how to say it, "November 2026". */
  month: string;
  monthLabel: string;
  /** Local time of day in hours, 0 ≤ h < 24. */
  localHour: number;
  litres: number;
  lotCode: string | null;
  /** NEAR | KM_1 | KM_10 | FAR, or null when the phone did not share its location. */
  distanceBand: string | null;
  certified: boolean;
}

export interface LotFact {
  code: string;
  at: number;
  material: string;
  acidValue: number | null;
  waterPct: number | null;
  insolublesPct: number | null;
  densityKgM3: number;
  densityMeasured: boolean;
}

export interface SourceFacts {
  code: string;
  kind: string;
  capacity: DeclaredCapacity | null;
  opensHour: number | null;
  closesHour: number | null;
  certificateNo: string | null;
  certificateExpires: number | null;
  /** In time order. */
  pickups: PickupFact[];
  lots: LotFact[];
}

export interface Flag {
  signal: Signal;
  subjectKey: string;
  /** One sentence with its numbers. */
  message: string;
  measured: number;
  threshold: number;
  pickupCodes: string[];
  lotCodes: string[];
}

export interface MonthVolume {
  month: string;
  label: string;
  litres: number;
  pickupCodes: string[];
  lotCodes: string[];
}

/** Litres collected per local month, in month order. */
export function monthlyVolumes(pickups: readonly PickupFact[]): MonthVolume[] {
  const by = new Map<string, MonthVolume>();
  for (const p of pickups) {
    const m = by.get(p.month) ?? { month: p.month, label: p.monthLabel, litres: 0, pickupCodes: [], lotCodes: [] };
    m.litres += p.litres;
    m.pickupCodes.push(p.code);
    if (p.lotCode !== null && !m.lotCodes.includes(p.lotCode)) m.lotCodes.push(p.lotCode);
    by.set(p.month, m);
  }
  return [...by.values()].sort((a, b) => a.month.localeCompare(b.month));
}

const whole = new Intl.NumberFormat("en-GB", { maximumFractionDigits: 0 });
const oneDp = new Intl.NumberFormat("en-GB", { minimumFractionDigits: 1, maximumFractionDigits: 1 });
const twoDp = new Intl.NumberFormat("en-GB", { minimumFractionDigits: 2, maximumFractionDigits: 2 });

export function wholeNumber(n: number): string {
  return whole.format(n);
}
export function oneDecimal(n: number): string {
  return oneDp.format(n);
}
export function twoDecimals(n: number): string {
  return twoDp.format(n);
}
