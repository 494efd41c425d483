// The thresholds behind every screening signal, each with where it comes from. No standard defines
// "implausible used cooking oil"; where the trade publishes nothing the value is our own choice and says so.
import { defineSourced } from "@/lib/chemistry/sourced-value";
import type { SourcedValue } from "@/lib/chemistry/sourced-value";

export interface ScreeningSettings {
  capacityRatio: SourcedValue;
  robustZ: SourcedValue;
  madFloorShare: SourcedValue;
  minHistory: SourcedValue;
  minPeers: SourcedValue;
  freshAcidValue: SourcedValue;
  waterExcessPct: SourcedValue;
  insolublesExcessPct: SourcedValue;
  densityMinKgM3: SourcedValue;
  densityMaxKgM3: SourcedValue;
  shiftRatio: SourcedValue;
  shiftWindow: SourcedValue;
  intervalMinDays: SourcedValue;
  hoursMargin: SourcedValue;
  certificateMonths: SourcedValue;
}

export const DEFAULT_SCREENING_SETTINGS: ScreeningSettings = {
  capacityRatio: defineSourced(
    1.5,
    "× declared capacity",
    "no published threshold; a declared capacity is an estimate",
    "common practice",
    "our own choice",
  ),
  robustZ: defineSourced(
    3.5,
    "robust standard deviations",
    "Iglewicz & Hoaglin 1993, modified z-score > 3.5 (NIST/SEMATECH e-Handbook §1.3.5.17)",
    "verified",
  ),
  madFloorShare: defineSourced(
    0.1,
    "× median",
    "no published value; keeps a very steady history from flagging small changes",
    "common practice",
    "our own choice",
  ),
  minHistory: defineSourced(6, "months or lots", "no published value", "common practice", "our own choice"),
  minPeers: defineSourced(5, "sources of the same kind", "no published value", "common practice", "our own choice"),
  freshAcidValue: defineSourced(
    0.6,
    "mg KOH/g",
    "Codex CXS 210-1999: refined oils acid value ≤ 0.6 mg KOH/g",
    "verified",
    "used frying oil at or below the fresh-oil limit is our own inference",
  ),
  waterExcessPct: defineSourced(
    1,
    "percentage points above the source's median",
    "no published threshold",
    "common practice",
    "our own choice",
  ),
  insolublesExcessPct: defineSourced(
    0.5,
    "percentage points above the source's median",
    "no published threshold",
    "common practice",
    "our own choice",
  ),
  densityMinKgM3: defineSourced(
    895,
    "kg/m³ at 15 °C",
    "vegetable oils 0.91–0.93 g/mL at 20 °C (Codex CXS 210-1999, from memory); margin is our own choice",
    "from memory",
  ),
  densityMaxKgM3: defineSourced(
    935,
    "kg/m³ at 15 °C",
    "vegetable oils 0.91–0.93 g/mL at 20 °C (Codex CXS 210-1999, from memory); margin is our own choice",
    "from memory",
  ),
  shiftRatio: defineSourced(2, "× the earlier median", "no published threshold", "common practice", "our own choice"),
  shiftWindow: defineSourced(
    4,
    "latest pickups against the ones before",
    "no published value",
    "common practice",
    "our own choice",
  ),
  intervalMinDays: defineSourced(
    3,
    "days of change in the usual interval",
    "no published value; a daily route slipping a day over a weekend is normal",
    "common practice",
    "our own choice",
  ),
  hoursMargin: defineSourced(
    1,
    "hours outside the declared opening hours",
    "no published value",
    "common practice",
    "our own choice",
  ),
  certificateMonths: defineSourced(
    12,
    "months a certificate covers",
    "certificates commonly run one year (from memory)",
    "from memory",
  ),
};

export type ScreeningSettingKey = keyof ScreeningSettings;
export const SCREENING_SETTING_KEYS = [
  "capacityRatio",
  "robustZ",
  "madFloorShare",
  "minHistory",
  "minPeers",
  "freshAcidValue",
  "waterExcessPct",
  "insolublesExcessPct",
  "densityMinKgM3",
  "densityMaxKgM3",
  "shiftRatio",
  "shiftWindow",
  "intervalMinDays",
  "hoursMargin",
  "certificateMonths",
] as const satisfies readonly ScreeningSettingKey[];

/** Our own names for the settings, as the references page and the queue page show them. */
export const SCREENING_SETTING_LABELS: Record<keyof ScreeningSettings, string> = {
  capacityRatio: "Month or certificate period above declared capacity",
  robustZ: "Far from the usual: robust standard deviations",
  madFloorShare: "Smallest spread counted, share of the usual",
  minHistory: "History needed before comparing",
  minPeers: "Sources of the same kind needed",
  freshAcidValue: "Acid value at or below which used oil looks fresh",
  waterExcessPct: "Water above the source's usual",
  insolublesExcessPct: "Insolubles above the source's usual",
  densityMinKgM3: "Lowest density of vegetable oil",
  densityMaxKgM3: "Highest density of vegetable oil",
  shiftRatio: "Sudden change of level or interval",
  shiftWindow: "Pickups compared for a sudden change",
  intervalMinDays: "Smallest change of interval counted",
  hoursMargin: "Margin around opening hours",
  certificateMonths: "Period a certificate covers",
};

/** How to show a setting's confidence: a published value, or one to check before relying on it. */
export function confidenceOf(s: SourcedValue): "published" | "check" {
  return s.status === "verified" || s.status === "computed" ? "published" : "check";
}
