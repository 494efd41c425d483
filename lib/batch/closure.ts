// A batch's closure: what was charged against what was weighed or gauged out. The remainder is the
// batch's unmeasured difference (booked by the service when the batch finishes, never typed); recorded
// losses (a spill with its reason) are kept apart from it. Pure: movements in, figures out.
import { classifyClosure } from "@/lib/mass-balance/period-balance";
import type { Closure, ClosureTolerance } from "@/lib/mass-balance/period-balance";

export interface BatchFlow {
  role: string;
  massG: number;
  /** IN: into the batch; OUT: out of it. */
  direction: "IN" | "OUT";
}

export interface BatchClosure {
  /** Oil and reagents charged. */
  chargedG: number;
  /** Ester, glycerol phase, the batch's share of the wash water, recovered methanol. */
  measuredG: number;
  recordedLossG: number;
  /** charged − measured − recorded losses: what no measurement found. Positive = less came out than went in. */
  differenceG: number;
  /** The unmeasured difference as booked so far (net of any unmeasured gain). */
  bookedG: number;
  closure: Closure;
}

/** The closure of one batch from its movements (reversed pairs already left out). */
export function summarizeBatchClosure(flows: readonly BatchFlow[], tolerance: ClosureTolerance): BatchClosure {
  let chargedG = 0;
  let measuredG = 0;
  let recordedLossG = 0;
  let bookedG = 0;
  for (const f of flows) {
    if (f.role === "UNMEASURED") bookedG += f.direction === "OUT" ? f.massG : -f.massG;
    else if (f.direction === "IN") chargedG += f.massG;
    else if (f.role === "LOSS") recordedLossG += f.massG;
    else measuredG += f.massG;
  }
  const differenceG = chargedG - measuredG - recordedLossG;
  return {
    chargedG,
    measuredG,
    recordedLossG,
    differenceG,
    bookedG,
    closure: classifyClosure(differenceG, chargedG, tolerance),
  };
}

/**
 * What to book so the reactor ends empty: `heldG` is in the batch before the outputs are drawn and
 * `measuredG` is everything drawn out (recorded losses included). More measured than held is an
 * unmeasured gain, booked into the batch first so the draws never over-draw it.
 */
export function planUnmeasuredBooking(heldG: number, measuredG: number): { gainG: number; differenceG: number } {
  return heldG >= measuredG
    ? { gainG: 0, differenceG: heldG - measuredG }
    : { gainG: measuredG - heldG, differenceG: 0 };
}
