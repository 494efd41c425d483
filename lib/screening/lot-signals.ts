// Quality signals: lab results that do not fit the material or the source's own history.
import { robustScore } from "@/lib/screening/robust";
import { oneDecimal, twoDecimals, wholeNumber } from "@/lib/screening/screening";
import type { Flag, LotFact } from "@/lib/screening/screening";

/** Materials booked as oil that has been used for frying. */
export const USED_OIL_MATERIALS: ReadonlySet<string> = new Set(["USED_COOKING_OIL", "YELLOW_GREASE", "TRAP_GREASE"]);
/** Liquid vegetable oils, whose density range the density signal checks. */
export const VEGETABLE_OIL_MATERIALS: ReadonlySet<string> = new Set([
  "USED_COOKING_OIL",
  "SOYBEAN",
  "CANOLA",
  "OTHER_OIL",
]);

/**
 * A lot booked as used oil whose acid value is at or below the fresh refined oil limit
 * (Codex CXS 210-1999: ≤ 0.6 mg KOH/g). Frying raises acid value, so this is the fresh-oil signature.
 */
export function flagFreshOil(lots: readonly LotFact[], freshAcidValue: number): Flag[] {
  return lots
    .filter((l) => USED_OIL_MATERIALS.has(l.material) && l.acidValue !== null && l.acidValue <= freshAcidValue)
    .map((l) => ({
      signal: "FRESH_OIL",
      subjectKey: l.code,
      message: `Lot ${l.code} is booked as used oil but its acid value is ${twoDecimals(l.acidValue ?? 0)} mg KOH/g, at or below the ${twoDecimals(freshAcidValue)} mg KOH/g allowed in fresh refined oil.`,
      measured: l.acidValue ?? 0,
      threshold: freshAcidValue,
      pickupCodes: [],
      lotCodes: [l.code],
    }));
}

/**
 * A lot whose water (or insolubles) is far above the source's lots: the modified z-score against the median
 * and 1.4826 × MAD of all its lots (Iglewicz & Hoaglin 1993: one pass, O(n log n)) above z, and at least
 * minExcess percentage points above the median, so a steady dry source does not flag a small change.
 */
export function flagLabExcess(
  lots: readonly LotFact[],
  which: "waterPct" | "insolublesPct",
  opts: { z: number; floorShare: number; minHistory: number; minExcess: number },
): Flag[] {
  const measured = lots.filter((l) => l[which] !== null);
  if (measured.length < opts.minHistory + 1) return [];
  const word = which === "waterPct" ? "water" : "insolubles";
  const flags: Flag[] = [];
  const all = measured.map((o) => o[which] ?? 0);
  const base = robustScore(0, all, opts.floorShare);
  for (const l of measured) {
    const v = l[which] ?? 0;
    const excess = v - base.median;
    const s = { median: base.median, z: base.scale > 0 ? excess / base.scale : excess > 0 ? Infinity : 0 };
    if (s.z <= opts.z || excess < opts.minExcess) continue;
    flags.push({
      signal: which === "waterPct" ? "WATER_HIGH" : "INSOLUBLES_HIGH",
      subjectKey: l.code,
      message: `Lot ${l.code} has ${twoDecimals(v)} % ${word} against this source's usual ${twoDecimals(s.median)} % (median of its ${all.length} lots): ${twoDecimals(excess)} points and ${oneDecimal(s.z)} spreads above (flagged above ${oneDecimal(opts.z)} spreads and ${twoDecimals(opts.minExcess)} points).`,
      measured: excess,
      threshold: opts.minExcess,
      pickupCodes: [],
      lotCodes: [l.code],
    });
  }
  return flags;
}

/** A measured density outside the range of liquid vegetable oil; water, other fats or mineral oil move it. */
export function flagDensityRange(lots: readonly LotFact[], minKgM3: number, maxKgM3: number): Flag[] {
  return lots
    .filter(
      (l) =>
        l.densityMeasured &&
        VEGETABLE_OIL_MATERIALS.has(l.material) &&
        (l.densityKgM3 < minKgM3 || l.densityKgM3 > maxKgM3),
    )
    .map((l) => ({
      signal: "DENSITY_RANGE",
      subjectKey: l.code,
      message: `Lot ${l.code} has a measured density of ${wholeNumber(l.densityKgM3)} kg/m³ at 15 °C, outside the ${wholeNumber(minKgM3)}–${wholeNumber(maxKgM3)} kg/m³ expected of vegetable oil.`,
      measured: l.densityKgM3,
      threshold: l.densityKgM3 < minKgM3 ? minKgM3 : maxKgM3,
      pickupCodes: [],
      lotCodes: [l.code],
    }));
}
