import { fail, ok } from "@/lib/core/result";
import type { Result } from "@/lib/core/result";
import { compareMoves, formatMoveField } from "@/lib/ledger/moves";
import type { HolderKind, TraceHolder, TraceMove } from "@/lib/ledger/moves";

/**
 * What we treat as a cycle: a holder that stands for one quantity of material (a pickup, lot, batch,
 * product lot, shipment …) receiving material that may contain its own earlier output, i.e. a
 * time-respecting chain of moves X → … → X where each move comes later in ledger order than the one
 * before. That would make the holder its own ancestor (a batch charged with the ester it made), which
 * a genealogy cannot express; rework must be booked as a new batch or lot.
 * Reusable vessels (tanks, by default) are exempt as X — they receive and send repeatedly by design —
 * but chains may pass through them. Conservative: a chain counts even if a tank was emptied on the way.
 * A chain that runs backwards in time (X received from a tank before X's material went into it) is not
 * a cycle, so static holder-graph loops through tanks are allowed.
 */
export interface TraceCycle {
  /** The holder that would become its own ancestor. */
  holderId: number;
  /** Moves of the chain in ledger order: from the move out of holderId to the move back into it. */
  moveIds: number[];
}

export interface CycleOptions {
  /** Holder kinds that are reusable vessels, exempt as cycle ends. Default: TANK. */
  reusableKinds?: readonly HolderKind[];
}

export const DEFAULT_REUSABLE_KINDS: readonly HolderKind[] = ["TANK"];

/**
 * The cycle the new move would close, or null. `moves` is the existing ledger (assumed cycle-free);
 * newMove takes its place in ledger order by (at, id), so a back-dated move is checked both ways.
 * A move already in `moves` with newMove's id is replaced by it. O(n log n) for the sort, O(n) after.
 */
export function getCycleThrough(
  moves: readonly TraceMove[],
  newMove: TraceMove,
  holders: ReadonlyMap<number, TraceHolder>,
  options: CycleOptions = {},
): TraceCycle | null {
  const reusable = new Set(options.reusableKinds ?? DEFAULT_REUSABLE_KINDS);
  const isCycleEnd = (holderId: number) => {
    const kind = holders.get(holderId)?.kind;
    return kind === undefined || !reusable.has(kind);
  };
  if (newMove.fromHolderId === null) return null;
  if (newMove.fromHolderId === newMove.toHolderId && isCycleEnd(newMove.toHolderId)) {
    return { holderId: newMove.toHolderId, moveIds: [newMove.id] };
  }
  const sorted = moves
    .filter((m) => m.id !== newMove.id)
    .concat([newMove])
    .sort(compareMoves);
  const p = sorted.indexOf(newMove);

  // latest[h]: the latest position at which material can leave h and still reach newMove's source
  // before newMove; next[h]: the move it leaves by.
  const latest = new Map<number, number>([[newMove.fromHolderId, p]]);
  const next = new Map<number, TraceMove>([[newMove.fromHolderId, newMove]]);
  for (let q = p - 1; q >= 0; q--) {
    const m = sorted[q];
    if (m === undefined || m.fromHolderId === null || latest.has(m.fromHolderId)) continue;
    const onward = latest.get(m.toHolderId);
    if (onward !== undefined && onward > q) {
      latest.set(m.fromHolderId, q);
      next.set(m.fromHolderId, m);
    }
  }

  // earliest[h]: the earliest position at which material newMove delivers can arrive in h;
  // prev[h]: the move it arrives by.
  const earliest = new Map<number, number>([[newMove.toHolderId, p]]);
  const prev = new Map<number, TraceMove>([[newMove.toHolderId, newMove]]);
  for (let q = p + 1; q < sorted.length; q++) {
    const m = sorted[q];
    if (m === undefined || m.fromHolderId === null || earliest.has(m.toHolderId)) continue;
    const arrived = earliest.get(m.fromHolderId);
    if (arrived !== undefined && arrived < q) {
      earliest.set(m.toHolderId, q);
      prev.set(m.toHolderId, m);
    }
  }

  const candidates = [newMove.toHolderId, newMove.fromHolderId, ...[...latest.keys()].sort((a, b) => a - b)];
  const end = candidates.find((h) => latest.has(h) && earliest.has(h) && isCycleEnd(h));
  if (end === undefined) return null;

  const out: number[] = [];
  for (let h: number | null = end; h !== null;) {
    const m = next.get(h);
    if (m === undefined || m === newMove) break;
    out.push(m.id);
    h = m.toHolderId;
  }
  const back: number[] = [];
  for (let h: number | null = end; h !== null;) {
    const m = prev.get(h);
    if (m === undefined || m === newMove) break;
    back.push(m.id);
    h = m.fromHolderId;
  }
  return { holderId: end, moveIds: [...out, newMove.id, ...back.reverse()] };
}

export function wouldCreateCycle(
  moves: readonly TraceMove[],
  newMove: TraceMove,
  holders: ReadonlyMap<number, TraceHolder>,
  options: CycleOptions = {},
): boolean {
  return getCycleThrough(moves, newMove, holders, options) !== null;
}

/** The Result form for write paths: refuses a move that would close a cycle ("TRACE.CYCLE"). */
export function refuseCycle(
  moves: readonly TraceMove[],
  newMove: TraceMove,
  holders: ReadonlyMap<number, TraceHolder>,
  options: CycleOptions = {},
): Result<void> {
  const cycle = getCycleThrough(moves, newMove, holders, options);
  if (cycle === null) return ok(undefined);
  const kind = holders.get(cycle.holderId)?.kind ?? "holder";
  return fail(
    "TRACE.CYCLE",
    `Move ${newMove.id} would send ${kind} ${cycle.holderId} material that may contain its own earlier output (via moves ${cycle.moveIds.join(" → ")}); book rework as a new batch or lot.`,
    formatMoveField(newMove.id, "toHolderId"),
  );
}
