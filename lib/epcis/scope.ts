// Which holders a trace answer covers, for an EPCIS export of that answer. Pure.
import type { EpcisMove } from "@/lib/epcis/epcis";

function reach(start: readonly number[], next: ReadonlyMap<number, readonly number[]>): Set<number> {
  const seen = new Set<number>(start);
  const stack = [...start];
  while (stack.length > 0) {
    const id = stack.pop() as number;
    for (const n of next.get(id) ?? []) {
      if (!seen.has(n)) {
        seen.add(n);
        stack.push(n);
      }
    }
  }
  return seen;
}

function edges(moves: readonly EpcisMove[]): { down: Map<number, number[]>; up: Map<number, number[]> } {
  const down = new Map<number, number[]>();
  const up = new Map<number, number[]>();
  for (const m of moves) {
    if (m.fromHolderId === null) continue;
    down.set(m.fromHolderId, [...(down.get(m.fromHolderId) ?? []), m.toHolderId]);
    up.set(m.toHolderId, [...(up.get(m.toHolderId) ?? []), m.fromHolderId]);
  }
  return { down, up };
}

/**
 * Backward answer: the holders on some path from the answer's entry holders (where its material was
 * booked in) to the traced holder — upstream of the target and downstream of an origin.
 */
export function backwardScope(moves: readonly EpcisMove[], targetId: number, entryIds: readonly number[]): Set<number> {
  const { down, up } = edges(moves);
  const upstream = reach([targetId], up);
  const downstream = reach(entryIds, down);
  return new Set([...upstream].filter((id) => downstream.has(id)));
}

/** Forward answer: the entry holders and every holder that received part of their material. */
export function forwardScope(
  moves: readonly EpcisMove[],
  entryIds: readonly number[],
  reachedIds: readonly number[],
): Set<number> {
  const { down } = edges(moves);
  const downstream = reach(entryIds, down);
  return new Set([...entryIds, ...reachedIds.filter((id) => downstream.has(id))]);
}
