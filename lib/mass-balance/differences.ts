// The closure that can fail: what the books hold against what was measured. A balance whose outputs
// are typed to match its inputs always closes; here the measured quantities are the record and every
// difference between them and the books is reported, signed so that a positive figure is material
// the books expected and no measurement found:
//   unmeasured batch differences  charged − everything weighed or gauged out (booked when a batch finishes)
//   receiving differences         pickup estimates − the plant's measurement of the lot
//   gauge-vs-book differences     book stock − the latest gauge reading of each tank
// Their sum as a share of the inputs is flagged against the site's tolerance.
import type { BalanceHolder, BalanceMove, Closure, ClosureTolerance } from "@/lib/mass-balance/balance-types";

export interface GaugeDifference {
  holderId: number;
  bookG: number;
  measuredG: number;
}

export interface Differences {
  unmeasuredG: number;
  receivingG: number;
  gaugeG: number;
  totalG: number;
  /** What entered the scope's stock in the period (the closure's base). */
  baseG: number;
  closure: Closure;
}

export interface DifferencesInput {
  holders: readonly BalanceHolder[];
  moves: readonly BalanceMove[];
  period: { startMs: number; endMs: number };
  /** Whether a holder is in the balance's scope (site and material kind). */
  inScope: (h: BalanceHolder) => boolean;
  gauges?: readonly GaugeDifference[];
  baseG: number;
  tolerance: ClosureTolerance;
  /** classifyClosure from period-balance, passed in so the two modules do not import each other. */
  classify: (imbalanceG: number, baseG: number, tolerance: ClosureTolerance) => Closure;
}

export function computeDifferences(input: DifferencesInput): Differences {
  const scoped = new Set<number>();
  for (const h of input.holders) if (input.inScope(h)) scoped.add(h.id);
  let unmeasuredG = 0;
  let receivingG = 0;
  for (const m of input.moves) {
    if (m.at < input.period.startMs || m.at >= input.period.endMs) continue;
    const fromIn = m.fromHolderId !== null && scoped.has(m.fromHolderId);
    const toIn = scoped.has(m.toHolderId);
    if (fromIn === toIn) continue;
    const signed = fromIn ? m.massG : -m.massG;
    if (m.role === "UNMEASURED") unmeasuredG += signed;
    else if (m.receiving === true) receivingG += signed;
  }
  let gaugeG = 0;
  for (const g of input.gauges ?? []) if (scoped.has(g.holderId)) gaugeG += g.bookG - g.measuredG;
  const totalG = unmeasuredG + receivingG + gaugeG;
  return {
    unmeasuredG,
    receivingG,
    gaugeG,
    totalG,
    baseG: input.baseG,
    closure: input.classify(totalG, input.baseG, input.tolerance),
  };
}
