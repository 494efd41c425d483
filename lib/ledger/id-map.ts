// A read-only map from movement id to a number (its position in the index, its booking time), kept in one
// typed array indexed by id when the ids are dense, as a site's movement ids are (an autoincrement key,
// with only reversed pairs left out). Filling one array costs a fraction of a Map of 222 k entries, and
// the garbage collector has one object to look at instead of a hash table. Reads answer as a Map would.

/** Ids may spread over at most this many slots per entry (plus a little) before a plain Map is used instead. */
const MAX_SPREAD = 4;

/**
 * The number of slots an array by id needs for `count` ids between `lo` and `hi`, or null when they are
 * too spread out (or not safe integers) for one: the rule every array by id here follows.
 */
export function denseSpan(lo: number, hi: number, count: number): number | null {
  const span = hi - lo + 1;
  return count > 0 && Number.isSafeInteger(lo) && Number.isSafeInteger(hi) && span <= MAX_SPREAD * count + 1024
    ? span
    : null;
}

class DenseIdMap implements ReadonlyMap<number, number> {
  constructor(
    private readonly firstId: number,
    /** NaN where no id is kept. */
    private readonly slots: Float64Array,
    readonly size: number,
  ) {}

  get(id: number): number | undefined {
    const v = this.slots[id - this.firstId];
    return v === undefined || Number.isNaN(v) || !Number.isInteger(id) ? undefined : v;
  }

  has(id: number): boolean {
    return this.get(id) !== undefined;
  }

  *entries(): MapIterator<[number, number]> {
    for (let i = 0; i < this.slots.length; i++) {
      const v = this.slots[i];
      if (v !== undefined && !Number.isNaN(v)) yield [this.firstId + i, v];
    }
  }

  *keys(): MapIterator<number> {
    for (const [id] of this.entries()) yield id;
  }

  *values(): MapIterator<number> {
    for (const [, v] of this.entries()) yield v;
  }

  [Symbol.iterator](): MapIterator<[number, number]> {
    return this.entries();
  }

  forEach(fn: (value: number, key: number, map: ReadonlyMap<number, number>) => void): void {
    for (const [id, v] of this.entries()) fn(v, id, this);
  }
}

/**
 * The map of idAt(i) → valueAt(i) for i < count (ids safe integers, values not NaN), or null when an id
 * repeats. Dense ids go into one array, ascending when iterated; sparse ones into a Map, in the order
 * given. Iterate it only where the order does not matter.
 */
export function idMapOf(
  count: number,
  idAt: (i: number) => number,
  valueAt: (i: number) => number,
): ReadonlyMap<number, number> | null {
  let lo = Number.POSITIVE_INFINITY;
  let hi = Number.NEGATIVE_INFINITY;
  for (let i = 0; i < count; i++) {
    const id = idAt(i);
    if (id < lo) lo = id;
    if (id > hi) hi = id;
  }
  const span = denseSpan(lo, hi, count);
  if (span === null) {
    const map = new Map<number, number>();
    for (let i = 0; i < count; i++) map.set(idAt(i), valueAt(i));
    return map.size === count ? map : null;
  }
  const slots = new Float64Array(span).fill(Number.NaN);
  for (let i = 0; i < count; i++) {
    const slot = idAt(i) - lo;
    if (!Number.isNaN(slots[slot] ?? 0)) return null;
    slots[slot] = valueAt(i);
  }
  return new DenseIdMap(lo, slots, count);
}

/**
 * A map keyed by dense ids (holder ids) whose get and has read one array slot instead of hashing into
 * a table of 99 k holders; size and iteration are the map's own, in its order. A replay looks up the
 * holders of every move it applies. Values are objects, so an empty slot means "not in the map".
 */
class DenseLookupMap<V extends object> implements ReadonlyMap<number, V> {
  constructor(
    private readonly map: ReadonlyMap<number, V>,
    private readonly firstId: number,
    private readonly slots: ReadonlyArray<V | undefined>,
  ) {}

  get size(): number {
    return this.map.size;
  }

  get(id: number): V | undefined {
    const slot = id - this.firstId;
    return slot >= 0 && Number.isInteger(slot) ? this.slots[slot] : undefined;
  }

  has(id: number): boolean {
    return this.get(id) !== undefined;
  }

  entries(): MapIterator<[number, V]> {
    return this.map.entries();
  }

  keys(): MapIterator<number> {
    return this.map.keys();
  }

  values(): MapIterator<V> {
    return this.map.values();
  }

  [Symbol.iterator](): MapIterator<[number, V]> {
    return this.map.entries();
  }

  forEach(fn: (value: V, key: number, map: ReadonlyMap<number, V>) => void): void {
    for (const [id, v] of this.map) fn(v, id, this);
  }
}

/**
 * The map read through an array by id when its keys are integers spread over at most MAX_SPREAD slots
 * each (plus a little); otherwise the map itself. `slots`, when the caller has them already, must hold
 * map.get(firstId + i) at i.
 */
export function denseLookupOf<V extends object>(
  map: ReadonlyMap<number, V>,
  known?: { firstId: number; slots: ReadonlyArray<V | undefined> },
): ReadonlyMap<number, V> {
  if (known !== undefined) return new DenseLookupMap(map, known.firstId, known.slots);
  let lo = Number.POSITIVE_INFINITY;
  let hi = Number.NEGATIVE_INFINITY;
  for (const id of map.keys()) {
    if (!Number.isSafeInteger(id)) return map;
    if (id < lo) lo = id;
    if (id > hi) hi = id;
  }
  const span = denseSpan(lo, hi, map.size);
  if (span === null) return map;
  const slots = new Array<V | undefined>(span);
  for (const [id, v] of map) slots[id - lo] = v;
  return new DenseLookupMap(map, lo, slots);
}
