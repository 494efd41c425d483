// Volume signals: against what the source declared, its own history, and sources of its kind.
import { plausibleLitresPerMonth } from "@/lib/screening/capacity";
import type { DeclaredCapacity } from "@/lib/screening/capacity";
import { robustScore } from "@/lib/screening/robust";
import { oneDecimal, wholeNumber } from "@/lib/screening/screening";
import type { Flag, MonthVolume } from "@/lib/screening/screening";

/** A month above ratio × the declared capacity. */
export function flagOverCapacity(
  months: readonly MonthVolume[],
  capacity: DeclaredCapacity | null,
  ratio: number,
): Flag[] {
  const cap = plausibleLitresPerMonth(capacity);
  if (cap === null || cap <= 0) return [];
  return months
    .filter((m) => m.litres / cap > ratio)
    .map((m) => {
      const r = m.litres / cap;
      return {
        signal: "OVER_CAPACITY",
        subjectKey: m.month,
        message: `${wholeNumber(m.litres)} L in ${m.label} against a declared ${wholeNumber(cap)} L/month: ${oneDecimal(r)}× (flagged above ${oneDecimal(ratio)}×).`,
        measured: r,
        threshold: ratio,
        pickupCodes: m.pickupCodes,
        lotCodes: m.lotCodes,
      };
    });
}

/**
 * A month far above the source's other months: robust z of its litres against the others' median and
 * 1.4826 × MAD (Hampel 1974; Rousseeuw & Croux 1993), flagged above z (Iglewicz & Hoaglin 1993: 3.5).
 * Only the high side: less oil than usual is no sign of oil from elsewhere.
 */
export function flagOwnHistory(
  months: readonly MonthVolume[],
  z: number,
  floorShare: number,
  minHistory: number,
): Flag[] {
  if (months.length < minHistory + 1) return [];
  const flags: Flag[] = [];
  months.forEach((m, i) => {
    const others = months.filter((_, j) => j !== i).map((o) => o.litres);
    const s = robustScore(m.litres, others, floorShare);
    if (s.z <= z) return;
    flags.push({
      signal: "OWN_HISTORY",
      subjectKey: m.month,
      message: `${wholeNumber(m.litres)} L in ${m.label} against a usual ${wholeNumber(s.median)} L/month (robust spread ${wholeNumber(s.scale)} L over ${others.length} other months): ${oneDecimal(s.z)} spreads above, flagged above ${oneDecimal(z)}.`,
      measured: s.z,
      threshold: z,
      pickupCodes: m.pickupCodes,
      lotCodes: m.lotCodes,
    });
  });
  return flags;
}

/**
 * A month far above what sources of the same kind gave that month. Sizes of sources spread by factors,
 * so the comparison is on the logarithm of litres (our own choice), with the same robust z.
 */
export function flagPeerGroup(
  months: readonly MonthVolume[],
  peerLitres: ReadonlyMap<string, readonly number[]>,
  kindLabel: string,
  z: number,
  minPeers: number,
): Flag[] {
  const flags: Flag[] = [];
  for (const m of months) {
    const peers = (peerLitres.get(m.month) ?? []).filter((l) => l > 0);
    if (peers.length < minPeers || m.litres <= 0) continue;
    const s = robustScore(Math.log(m.litres), peers.map(Math.log), 0);
    if (s.z <= z) continue;
    flags.push({
      signal: "PEER_GROUP",
      subjectKey: m.month,
      message: `${wholeNumber(m.litres)} L in ${m.label}; ${peers.length} other ${kindLabel.toLowerCase()} sources gave a median ${wholeNumber(Math.exp(s.median))} L that month: ${oneDecimal(m.litres / Math.exp(s.median))}× theirs, ${oneDecimal(s.z)} spreads above on a log scale, flagged above ${oneDecimal(z)}.`,
      measured: s.z,
      threshold: z,
      pickupCodes: m.pickupCodes,
      lotCodes: m.lotCodes,
    });
  }
  return flags;
}

/** Certified litres from the source over its certificate's period against capacity × the months elapsed. */
export function flagCertifiedOverCapacity(
  pickups: ReadonlyArray<{ code: string; at: number; litres: number; certified: boolean; lotCode: string | null }>,
  capacity: DeclaredCapacity | null,
  certificate: { no: string; expires: number; months: number } | null,
  now: number,
  ratio: number,
): Flag[] {
  const cap = plausibleLitresPerMonth(capacity);
  if (cap === null || cap <= 0 || certificate === null) return [];
  const start = addMonths(certificate.expires, -certificate.months);
  const end = Math.min(certificate.expires, now);
  if (end <= start) return [];
  const inPeriod = pickups.filter((p) => p.certified && p.at >= start && p.at < end);
  const litres = inPeriod.reduce((a, p) => a + p.litres, 0);
  const monthsElapsed = (end - start) / MS_PER_MEAN_MONTH;
  const plausible = cap * monthsElapsed;
  const r = litres / plausible;
  if (r <= ratio) return [];
  return [
    {
      signal: "CERTIFIED_OVER_CAPACITY",
      subjectKey: certificate.no,
      message: `${wholeNumber(litres)} L certified under ${certificate.no} in ${oneDecimal(monthsElapsed)} months against a plausible ${wholeNumber(plausible)} L (${wholeNumber(cap)} L/month): ${oneDecimal(r)}×, flagged above ${oneDecimal(ratio)}×.`,
      measured: r,
      threshold: ratio,
      pickupCodes: inPeriod.map((p) => p.code),
      lotCodes: [...new Set(inPeriod.flatMap((p) => (p.lotCode === null ? [] : [p.lotCode])))],
    },
  ];
}

/** Mean Gregorian month in milliseconds: 365.2425 days / 12. */
export const MS_PER_MEAN_MONTH = (365.2425 / 12) * 86_400_000;

function addMonths(ms: number, months: number): number {
  const d = new Date(ms);
  d.setUTCMonth(d.getUTCMonth() + months);
  return d.getTime();
}
