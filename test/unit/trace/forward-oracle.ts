// A deliberately plain forward trace for the property tests: replays every move from the ledger start
// with one Map of grams per origin per layer and the rounding rule written out again (largest
// remainder, ties to the lower origin id), so it shares no code with lib/trace's replay or its
// early stop. Slow on purpose: O(moves × mixture size) with sorting on every draw.
import type { ForwardTrace } from "@/lib/trace/genealogy";
import type { LedgerIndex, TraceMove } from "@/lib/ledger/moves";
import type { ReplaySnapshot } from "@/lib/trace/replay";

type Grams = Map<number, number>;

interface OracleHolder {
  fifo: boolean;
  /** MIXED: at most one layer; FIFO: oldest first. */
  layers: Grams[];
}

/** Splits `take` grams off a layer in proportion to its grams, the spare grams by largest remainder. */
function splitLayer(layer: Grams, take: number): Grams {
  const entries = [...layer].sort((a, b) => a[0] - b[0]);
  const total = entries.reduce((s, [, g]) => s + g, 0);
  const raw = entries.map(([id, g], i) => {
    const exact = (take * g) / total;
    const floor = Math.floor(exact);
    return { id, i, part: floor, rem: exact - floor };
  });
  let left = take - raw.reduce((s, r) => s + r.part, 0);
  for (const r of [...raw].sort((a, b) => b.rem - a.rem || a.i - b.i)) {
    if (left <= 0) break;
    r.part += 1;
    left -= 1;
  }
  const out: Grams = new Map();
  for (const r of raw) {
    if (r.part === 0) continue;
    out.set(r.id, r.part);
    const keep = (layer.get(r.id) ?? 0) - r.part;
    if (keep > 0) layer.set(r.id, keep);
    else layer.delete(r.id);
  }
  return out;
}

function totalOf(layer: Grams): number {
  let s = 0;
  for (const g of layer.values()) s += g;
  return s;
}

function draw(h: OracleHolder, massG: number): Grams {
  const out: Grams = new Map();
  let left = massG;
  while (left > 0) {
    const layer = h.layers[0];
    if (layer === undefined) throw new Error("oracle: overdraw");
    const piece = Math.min(left, totalOf(layer));
    for (const [id, g] of splitLayer(layer, piece)) out.set(id, (out.get(id) ?? 0) + g);
    left -= piece;
    if (layer.size === 0) h.layers.shift();
  }
  return out;
}

function deposit(h: OracleHolder, parts: Grams): void {
  const pool = h.fifo ? undefined : h.layers[0];
  if (pool === undefined) h.layers.push(new Map(parts));
  else for (const [id, g] of parts) pool.set(id, (pool.get(id) ?? 0) + g);
}

/** What traceForward must answer, except movesReplayed (how much work it did is its own business). */
export function forwardOracle(
  index: LedgerIndex,
  originIds: readonly number[],
  options: { at?: number; from?: ReplaySnapshot } = {},
): Omit<ForwardTrace, "movesReplayed"> {
  const set = new Set(originIds);
  const at = options.at ?? Number.POSITIVE_INFINITY;
  const inWindow = index.moves.filter((m) => m.at <= at);
  const target = inWindow.length - 1;
  const from = options.from !== undefined && options.from.applied.count <= target + 1 ? options.from : undefined;
  const start = from?.applied.count ?? 0;
  const holders = new Map<number, OracleHolder>();
  const holder = (id: number): OracleHolder => {
    let h = holders.get(id);
    if (h === undefined) {
      h = { fifo: index.holders.get(id)?.mixing === "FIFO", layers: [] };
      holders.set(id, h);
    }
    return h;
  };
  const setGrams = (parts: Grams): number => [...parts].reduce((s, [id, g]) => s + (set.has(id) ? g : 0), 0);
  const received = new Map<number, number>();
  const moves: Array<{ moveId: number; grams: number }> = [];
  inWindow.forEach((m: TraceMove, pos) => {
    const parts = m.fromHolderId === null ? new Map([[m.id, m.massG]]) : draw(holder(m.fromHolderId), m.massG);
    deposit(holder(m.toHolderId), parts);
    const grams = setGrams(parts);
    if (pos >= start && grams > 0) {
      moves.push({ moveId: m.id, grams });
      received.set(m.toHolderId, (received.get(m.toHolderId) ?? 0) + grams);
    }
  });
  // Started before the set entered, the held grams are counted from the moves; resumed later, they are
  // read off the restored mixtures, which a snapshot's left-out holders do not have.
  const firstOrigin = Math.min(...[...set].map((id) => index.positionOf.get(id) ?? Number.POSITIVE_INFINITY));
  const unknown = new Set(start <= firstOrigin ? [] : (from?.leftOut ?? []));
  const held = new Map<number, number>();
  for (const [id, h] of holders) {
    const g = h.layers.reduce((s, layer) => s + setGrams(layer), 0);
    if (g > 0 && !unknown.has(id)) held.set(id, g);
  }
  const ids = [...new Set([...received.keys(), ...held.keys()])].sort((a, b) => a - b);
  const entered = inWindow.filter((m) => set.has(m.id) && m.fromHolderId === null);
  const last = inWindow[target];
  return {
    originIds: [...set].sort((a, b) => a - b),
    enteredG: entered.reduce((s, m) => s + m.massG, 0),
    asOf: last === undefined ? null : { moveId: last.id, at: last.at },
    receivedSince: from === undefined ? null : from.applied.last,
    holders: ids.map((holderId) => ({
      holderId,
      kind: index.holders.get(holderId)?.kind ?? "TANK",
      receivedG: received.get(holderId) ?? 0,
      heldG: held.get(holderId) ?? 0,
    })),
    moves,
  };
}
