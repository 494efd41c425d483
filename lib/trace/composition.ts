import { invariant } from "@/lib/core/result";
import { splitWholeGrams } from "@/lib/quantity/allocate";

/**
 * Grams per origin, as two parallel arrays sorted by ascending origin id with every entry > 0.
 * The order is part of the rounding rule: when a split ties, allocateByWeight gives the spare gram to
 * the earlier key, i.e. to the lower origin id (the origin that entered the books first).
 */
export interface CompositionParts {
  readonly originIds: readonly number[];
  readonly grams: readonly number[];
}

export const EMPTY_PARTS: CompositionParts = { originIds: [], grams: [] };

/** Parts in arrays nobody else refers to: a layer may take them over instead of copying them. */
export interface OwnedParts {
  originIds: number[];
  grams: number[];
}

export function sumParts(parts: CompositionParts): number {
  let total = 0;
  for (const g of parts.grams) total += g;
  return total;
}

/**
 * Sorted merge into new arrays: O(a + b). The arrays are sized once for the worst case and cut to
 * length, rather than grown by push (growing copies them again and again: most of a replay's garbage).
 */
export function mergeParts(a: CompositionParts, b: CompositionParts): { originIds: number[]; grams: number[] } {
  const aIds = a.originIds;
  const bIds = b.originIds;
  const aGrams = a.grams;
  const bGrams = b.grams;
  const na = aIds.length;
  const nb = bIds.length;
  const originIds = new Array<number>(na + nb);
  const grams = new Array<number>(na + nb);
  let i = 0;
  let j = 0;
  let k = 0;
  while (i < na && j < nb) {
    const ia = aIds[i] ?? 0;
    const ib = bIds[j] ?? 0;
    if (ia < ib) {
      originIds[k] = ia;
      grams[k++] = aGrams[i++] ?? 0;
    } else if (ib < ia) {
      originIds[k] = ib;
      grams[k++] = bGrams[j++] ?? 0;
    } else {
      originIds[k] = ia;
      grams[k++] = (aGrams[i++] ?? 0) + (bGrams[j++] ?? 0);
    }
  }
  for (; i < na; i++, k++) {
    originIds[k] = aIds[i] ?? 0;
    grams[k] = aGrams[i] ?? 0;
  }
  for (; j < nb; j++, k++) {
    originIds[k] = bIds[j] ?? 0;
    grams[k] = bGrams[j] ?? 0;
  }
  originIds.length = k;
  grams.length = k;
  return { originIds, grams };
}

/**
 * Merges many part lists (e.g. FIFO layers, a pool's pending deposits) two smallest first, so a large
 * list among many small ones is copied once rather than once per level of a pairwise tree: the merged
 * lists come out in ascending size, so two queues (the sorted inputs, the merged) replace a heap.
 */
export function mergeAllParts(list: readonly CompositionParts[]): CompositionParts {
  const inputs = list.filter((p) => p.originIds.length > 0).sort((a, b) => a.originIds.length - b.originIds.length);
  if (inputs.length <= 1) return inputs[0] ?? EMPTY_PARTS;
  const merged: CompositionParts[] = [];
  let i = 0;
  let j = 0;
  const next = (): CompositionParts | undefined => {
    const a = inputs[i];
    const b = merged[j];
    if (a !== undefined && (b === undefined || a.originIds.length <= b.originIds.length)) {
      i++;
      return a;
    }
    if (b !== undefined) j++;
    return b;
  };
  for (;;) {
    const a = next();
    const b = next();
    if (a === undefined) return EMPTY_PARTS;
    if (b === undefined) return a;
    merged.push(mergeParts(a, b));
  }
}

/** A holder-owned, mutable composition (a MIXED pool or one FIFO layer). Same ordering rules as CompositionParts. */
export interface MutableLayer {
  originIds: number[];
  grams: number[];
  /** Grams including pending deposits. */
  totalG: number;
  /**
   * Deposits not merged in yet (owned copies). A sink such as a site's loss holder receives thousands
   * of deposits and is never drawn from; merging each one at once would cost O(size) per deposit.
   */
  pending: CompositionParts[];
  pendingLength: number;
}

const SETTLE_AT_LEAST = 1024;
/** Pending entries settled by in-place insertion; more are merged in one pass. */
const INSERT_UP_TO = 32;
/** Pending deposits merged into the layer one after the other; more are merged among themselves first. */
const MERGE_ONE_BY_ONE = 4;
/** takeFromLayer's floors and remainders, reused from draw to draw (the replay is single-threaded and does not re-enter). */
let floorBuffer = new Float64Array(1024);
let remBuffer = new Float64Array(1024);

/** A layer holding a copy of parts; totalG is Σ parts.grams when the caller knows it (a move's mass). */
export function copyToLayer(parts: CompositionParts, totalG = sumParts(parts)): MutableLayer {
  return adoptAsLayer({ originIds: [...parts.originIds], grams: [...parts.grams] }, totalG);
}

/** A layer made of the parts' own arrays (no copy); totalG = Σ parts.grams. */
export function adoptAsLayer(parts: OwnedParts, totalG: number): MutableLayer {
  return { originIds: parts.originIds, grams: parts.grams, totalG, pending: [], pendingLength: 0 };
}

/** Merges pending deposits into the layer; call before reading or drawing from it. */
export function settleLayer(layer: MutableLayer): MutableLayer {
  if (layer.pending.length === 0) return layer;
  if (layer.pendingLength <= INSERT_UP_TO) {
    // A few entries into a large pool: insert in place rather than rebuild both arrays.
    for (const part of layer.pending) {
      for (let k = 0; k < part.originIds.length; k++) {
        const id = part.originIds[k] ?? 0;
        const g = part.grams[k] ?? 0;
        const at = findInsertion(layer.originIds, id);
        if (layer.originIds[at] === id) layer.grams[at] = (layer.grams[at] ?? 0) + g;
        else {
          layer.originIds.splice(at, 0, id);
          layer.grams.splice(at, 0, g);
        }
      }
    }
    layer.pending = [];
    layer.pendingLength = 0;
    return layer;
  }
  // Merged into the layer's own arrays in place: a pool drawn from after every few deposits would
  // otherwise get new arrays at each draw. A few deposits go in one by one (a tank's deposits mostly
  // hold the origins it holds already, so each pass costs about the pool); many are merged among
  // themselves first, two smallest first (a sink's thousands of deposits).
  if (layer.pending.length <= MERGE_ONE_BY_ONE) for (const part of layer.pending) mergeIntoLayer(layer, part);
  else mergeIntoLayer(layer, mergeAllParts(layer.pending));
  layer.pending = [];
  layer.pendingLength = 0;
  return layer;
}

/**
 * Adds parts into the layer's arrays (which the layer owns) as mergeParts would, without new arrays: the
 * shared ids are counted first, the arrays grow to the merged length and are filled from the back, so
 * no entry is overwritten before it is read (the write position never falls below the layer's read one).
 */
function mergeIntoLayer(layer: MutableLayer, parts: CompositionParts): void {
  const ids = layer.originIds;
  const grams = layer.grams;
  const bIds = parts.originIds;
  const bGrams = parts.grams;
  const na = ids.length;
  const nb = bIds.length;
  let shared = 0;
  for (let i = 0, j = 0; i < na && j < nb;) {
    const a = ids[i] ?? 0;
    const b = bIds[j] ?? 0;
    if (a < b) i++;
    else if (b < a) j++;
    else {
      shared++;
      i++;
      j++;
    }
  }
  // One growth to the merged length (pushing one by one would reallocate each array several times).
  ids.length = na + nb - shared;
  grams.length = na + nb - shared;
  let i = na - 1;
  let j = nb - 1;
  for (let k = na + nb - shared - 1; j >= 0; k--) {
    const a = i >= 0 ? (ids[i] ?? 0) : Number.NEGATIVE_INFINITY;
    const b = bIds[j] ?? 0;
    if (a > b) {
      ids[k] = a;
      grams[k] = grams[i--] ?? 0;
    } else if (b > a) {
      ids[k] = b;
      grams[k] = bGrams[j--] ?? 0;
    } else {
      ids[k] = a;
      grams[k] = (grams[i--] ?? 0) + (bGrams[j--] ?? 0);
    }
  }
}

/**
 * Splits massG off a layer in proportion to its grams (allocateByWeight: largest remainder, exact
 * integers) and returns what leaves; the layer keeps the rest, origins that reach 0 g drop out.
 * A part never exceeds the holding: floor(m·g/M) ≤ g − 1 for m < M and the spare gram adds at most 1
 * (exact in doubles while the stock is below 2^52 g).
 */
export function takeFromLayer(layer: MutableLayer, massG: number): OwnedParts {
  settleLayer(layer);
  if (!(Number.isSafeInteger(massG) && massG > 0 && massG <= layer.totalG))
    invariant(false, `cannot take ${massG} g off ${layer.totalG} g`);
  if (massG === layer.totalG) {
    const all = { originIds: layer.originIds, grams: layer.grams };
    layer.originIds = [];
    layer.grams = [];
    layer.totalG = 0;
    return all;
  }
  const n = layer.originIds.length;
  if (floorBuffer.length < n) {
    floorBuffer = new Float64Array(Math.max(n, floorBuffer.length * 2));
    remBuffer = new Float64Array(floorBuffer.length);
  }
  const floors = floorBuffer;
  const rems = remBuffer;
  const { threshold, ties } = splitWholeGrams(massG, layer.grams, layer.totalG, floors, rems);
  // One walk: each origin's part (its floor, plus a spare gram as splitWholeGrams says), what leaves
  // and what stays. The taken arrays start at the layer's length and are cut to what was taken.
  let tiesLeft = ties;
  const ids = layer.originIds;
  const grams = layer.grams;
  const takenIds = new Array<number>(n);
  const takenGrams = new Array<number>(n);
  let t = 0;
  let kept = 0;
  for (let i = 0; i < n; i++) {
    const rem = rems[i] ?? 0;
    let part = floors[i] ?? 0;
    if (rem > threshold) part++;
    else if (rem === threshold && tiesLeft > 0) {
      part++;
      tiesLeft--;
    }
    const id = ids[i] ?? 0;
    const held = grams[i] ?? 0;
    if (part > held) invariant(false, `split gave origin ${id} ${part} g of its ${held} g`);
    if (part > 0) {
      takenIds[t] = id;
      takenGrams[t] = part;
      t++;
    }
    if (held > part) {
      ids[kept] = id;
      grams[kept] = held - part;
      kept++;
    }
  }
  takenIds.length = t;
  takenGrams.length = t;
  ids.length = kept;
  grams.length = kept;
  layer.totalG -= massG;
  return { originIds: takenIds, grams: takenGrams };
}

/**
 * Adds parts into a layer: appends at once when every id is newer (the usual case), else buffers the
 * deposit and merges once the buffer outgrows the layer, so a deposit costs amortised O(its size · log).
 */
export function addToLayer(
  layer: MutableLayer,
  parts: CompositionParts,
  totalG = sumParts(parts),
  /** The caller hands the parts over: a buffered deposit keeps them instead of a copy. */
  owned = false,
): void {
  const last = layer.originIds[layer.originIds.length - 1];
  const first = parts.originIds[0];
  if (first === undefined) return;
  layer.totalG += totalG;
  if (layer.pending.length === 0 && (last === undefined || first > last)) {
    for (let i = 0; i < parts.originIds.length; i++) {
      layer.originIds.push(parts.originIds[i] ?? 0);
      layer.grams.push(parts.grams[i] ?? 0);
    }
    return;
  }
  layer.pending.push(owned ? parts : { originIds: [...parts.originIds], grams: [...parts.grams] });
  layer.pendingLength += parts.originIds.length;
  if (layer.pendingLength > Math.max(SETTLE_AT_LEAST, layer.originIds.length)) settleLayer(layer);
}

/** First index whose id is ≥ id. */
function findInsertion(ids: readonly number[], id: number): number {
  let lo = 0;
  let hi = ids.length;
  while (lo < hi) {
    const mid = (lo + hi) >>> 1;
    if ((ids[mid] ?? id) < id) lo = mid + 1;
    else hi = mid;
  }
  return lo;
}

/** Grams of the given origins in parts; walks whichever side is shorter. */
export function sumPartsOf(parts: CompositionParts, originIds: ReadonlySet<number>): number {
  let total = 0;
  if (originIds.size < parts.originIds.length) {
    for (const id of originIds) {
      const i = findOrigin(parts, id);
      if (i >= 0) total += parts.grams[i] ?? 0;
    }
  } else {
    parts.originIds.forEach((id, i) => {
      if (originIds.has(id)) total += parts.grams[i] ?? 0;
    });
  }
  return total;
}

export function getOriginGrams(parts: CompositionParts, originId: number): number {
  const i = findOrigin(parts, originId);
  return i >= 0 ? (parts.grams[i] ?? 0) : 0;
}

function findOrigin(parts: CompositionParts, originId: number): number {
  const i = findInsertion(parts.originIds, originId);
  return parts.originIds[i] === originId ? i : -1;
}

/** Adds parts into a Map accumulator (used for "received" totals over many moves). */
export function addPartsToTally(tally: Map<number, number>, parts: CompositionParts): void {
  parts.originIds.forEach((id, i) => {
    tally.set(id, (tally.get(id) ?? 0) + (parts.grams[i] ?? 0));
  });
}

export function tallyToParts(tally: ReadonlyMap<number, number>): CompositionParts {
  const entries = [...tally].filter(([, g]) => g > 0).sort((a, b) => a[0] - b[0]);
  return { originIds: entries.map(([id]) => id), grams: entries.map(([, g]) => g) };
}
