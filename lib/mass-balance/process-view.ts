// The process view of a period: each batch's inputs (oil and reagents) against its outputs (ester,
// glycerol phase, wash water, recovered methanol, recorded losses), the batches finished in the period
// added up and those still running listed apart.
import { BATCH_INPUT_ROLES, BATCH_OUTPUT_ROLES, MOVE_ROLES } from "@/lib/core/vocabulary";
import type { MoveRole } from "@/lib/core/vocabulary";
import { classifyClosure } from "@/lib/mass-balance/balance-rules";
import type {
  BalanceHolder,
  BalanceMove,
  BatchBalance,
  ClosureTolerance,
  ProcessView,
} from "@/lib/mass-balance/balance-types";

const USUAL_INPUTS = new Set<MoveRole>(BATCH_INPUT_ROLES);
const USUAL_OUTPUTS = new Set<MoveRole>(BATCH_OUTPUT_ROLES);

function addTo<K extends string>(rec: Partial<Record<K, number>>, key: K, g: number): void {
  rec[key] = (rec[key] ?? 0) + g;
}

/** One batch's balance from its movements; null when nothing moved and it did not finish in the period. */
export function batchBalance(
  b: BalanceHolder,
  moves: readonly BalanceMove[],
  finishedInPeriod: boolean,
  tolerance: ClosureTolerance,
): BatchBalance | null {
  const inputsByRole: Partial<Record<MoveRole, number>> = {};
  const outputsByRole: Partial<Record<MoveRole, number>> = {};
  const unusual = new Set<MoveRole>();
  let bin = 0;
  let bout = 0;
  let unmeasuredG = 0;
  let touched = false;
  for (const m of moves) {
    if (m.role === "UNMEASURED") {
      unmeasuredG += m.fromHolderId === b.id ? m.massG : -m.massG;
    } else if (m.toHolderId === b.id) {
      touched = true;
      bin += m.massG;
      addTo(inputsByRole, m.role, m.massG);
      if (!USUAL_INPUTS.has(m.role)) unusual.add(m.role);
    } else if (m.fromHolderId === b.id) {
      touched = true;
      bout += m.massG;
      addTo(outputsByRole, m.role, m.massG);
      if (!USUAL_OUTPUTS.has(m.role)) unusual.add(m.role);
    }
  }
  if (!touched && !finishedInPeriod) return null;
  return {
    holderId: b.id,
    completedAt: b.completedAt ?? null,
    inputsG: bin,
    outputsG: bout,
    imbalanceG: bin - bout,
    unmeasuredG,
    inputsByRole,
    outputsByRole,
    unusualRoles: [...unusual].sort(),
    closure: classifyClosure(bin - bout, bin, tolerance),
  };
}

export function computeProcessView(
  batches: readonly BalanceHolder[],
  moves: readonly BalanceMove[],
  period: { startMs: number; endMs: number },
  tolerance: ClosureTolerance,
): ProcessView {
  const completed: BatchBalance[] = [];
  const inProgress: BatchBalance[] = [];
  const totalIn: Partial<Record<MoveRole, number>> = {};
  const totalOut: Partial<Record<MoveRole, number>> = {};
  let inputsG = 0;
  let outputsG = 0;

  // One pass over the ledger, bucketing the movements into and out of each batch still relevant to
  // the period (not finished before it), instead of one pass per batch.
  const relevant = batches.filter(
    (b) => b.completedAt === null || b.completedAt === undefined || b.completedAt >= period.startMs,
  );
  const movesOf = new Map<number, BalanceMove[]>(relevant.map((b) => [b.id, []]));
  for (const m of moves) {
    if (m.at >= period.endMs) continue;
    movesOf.get(m.toHolderId)?.push(m);
    if (m.fromHolderId !== null) movesOf.get(m.fromHolderId)?.push(m);
  }

  for (const b of relevant) {
    const completedAt = b.completedAt ?? null;
    const finishedInPeriod = completedAt !== null && completedAt < period.endMs;
    const row = batchBalance(b, movesOf.get(b.id) ?? [], finishedInPeriod, tolerance);
    if (row === null) continue;
    if (!finishedInPeriod) {
      inProgress.push(row);
      continue;
    }
    completed.push(row);
    inputsG += row.inputsG;
    outputsG += row.outputsG;
    for (const r of MOVE_ROLES) {
      const gIn = row.inputsByRole[r];
      const gOut = row.outputsByRole[r];
      if (gIn !== undefined) addTo(totalIn, r, gIn);
      if (gOut !== undefined) addTo(totalOut, r, gOut);
    }
  }

  return {
    completed,
    inProgress,
    inputsG,
    outputsG,
    imbalanceG: inputsG - outputsG,
    inputsByRole: totalIn,
    outputsByRole: totalOut,
    closure: classifyClosure(inputsG - outputsG, inputsG, tolerance),
  };
}
