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
  BatchTally,
  CarriedBooks,
  ClosureTolerance,
  ProcessView,
} from "@/lib/mass-balance/balance-types";

const USUAL_INPUTS = new Set<MoveRole>(BATCH_INPUT_ROLES);
const USUAL_OUTPUTS = new Set<MoveRole>(BATCH_OUTPUT_ROLES);

function addTo<K extends string>(rec: Partial<Record<K, number>>, key: K, g: number): void {
  rec[key] = (rec[key] ?? 0) + g;
}

/** Adds a batch's movements to what its earlier movements added up to (nothing, without `from`). */
export function tallyBatch(id: number, moves: readonly BalanceMove[], from?: BatchTally): BatchTally {
  // Nothing more moved: the earlier tally as it is (tallies are never changed once made).
  if (from !== undefined && moves.length === 0) return from;
  const inputsByRole: Partial<Record<MoveRole, number>> = { ...from?.inputsByRole };
  const outputsByRole: Partial<Record<MoveRole, number>> = { ...from?.outputsByRole };
  const unusual = new Set<MoveRole>(from?.unusualRoles);
  let bin = from?.inputsG ?? 0;
  let bout = from?.outputsG ?? 0;
  let unmeasuredG = from?.unmeasuredG ?? 0;
  let touched = from?.touched ?? false;
  for (const m of moves) {
    if (m.role === "UNMEASURED") {
      unmeasuredG += m.fromHolderId === id ? m.massG : -m.massG;
    } else if (m.toHolderId === id) {
      touched = true;
      bin += m.massG;
      addTo(inputsByRole, m.role, m.massG);
      if (!USUAL_INPUTS.has(m.role)) unusual.add(m.role);
    } else if (m.fromHolderId === id) {
      touched = true;
      bout += m.massG;
      addTo(outputsByRole, m.role, m.massG);
      if (!USUAL_OUTPUTS.has(m.role)) unusual.add(m.role);
    }
  }
  const unusualRoles = [...unusual].sort();
  return { inputsG: bin, outputsG: bout, unmeasuredG, inputsByRole, outputsByRole, unusualRoles, touched };
}

/** One batch's balance from its movements; null when nothing moved and it did not finish in the period. */
export function batchBalance(
  b: BalanceHolder,
  moves: readonly BalanceMove[],
  finishedInPeriod: boolean,
  tolerance: ClosureTolerance,
  carried?: BatchTally,
): BatchBalance | null {
  const t = tallyBatch(b.id, moves, carried);
  if (!t.touched && !finishedInPeriod) return null;
  return {
    holderId: b.id,
    completedAt: b.completedAt ?? null,
    inputsG: t.inputsG,
    outputsG: t.outputsG,
    imbalanceG: t.inputsG - t.outputsG,
    unmeasuredG: t.unmeasuredG,
    inputsByRole: t.inputsByRole,
    outputsByRole: t.outputsByRole,
    unusualRoles: t.unusualRoles,
    closure: classifyClosure(t.inputsG - t.outputsG, t.inputsG, tolerance),
  };
}

export function computeProcessView(
  batches: readonly BalanceHolder[],
  moves: readonly BalanceMove[],
  period: { startMs: number; endMs: number },
  tolerance: ClosureTolerance,
  carried?: CarriedBooks,
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
  // Movements before the books brought forward are already in their batches' tallies.
  const fromMs = carried?.atMs ?? Number.NEGATIVE_INFINITY;
  for (const m of moves) {
    if (m.at >= period.endMs || m.at < fromMs) continue;
    movesOf.get(m.toHolderId)?.push(m);
    if (m.fromHolderId !== null) movesOf.get(m.fromHolderId)?.push(m);
  }

  for (const b of relevant) {
    const completedAt = b.completedAt ?? null;
    const finishedInPeriod = completedAt !== null && completedAt < period.endMs;
    const row = batchBalance(b, movesOf.get(b.id) ?? [], finishedInPeriod, tolerance, carried?.batches.get(b.id));
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
