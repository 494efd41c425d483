// A read-only map that is another map with a few entries set on top, without copying it: a booking
// changes a handful of holders' entries in maps of a hundred thousand. Layers stack up booking after
// booking; past MAX_DEPTH they are copied into one map again (through `flatten`, e.g. an array by id),
// so a read looks at a few layers at most: the trace's replay reads these maps for every move.

const MAX_DEPTH = 4;

class OverlayMap<K, V> implements ReadonlyMap<K, V> {
  readonly size: number;

  constructor(
    readonly base: ReadonlyMap<K, V>,
    readonly top: ReadonlyMap<K, V>,
    readonly depth: number,
  ) {
    let size = base.size;
    for (const k of top.keys()) if (!base.has(k)) size++;
    this.size = size;
  }

  get(key: K): V | undefined {
    return this.top.has(key) ? this.top.get(key) : this.base.get(key);
  }

  has(key: K): boolean {
    return this.top.has(key) || this.base.has(key);
  }

  *entries(): MapIterator<[K, V]> {
    for (const [k, v] of this.base) yield [k, this.top.has(k) ? (this.top.get(k) as V) : v];
    for (const [k, v] of this.top) if (!this.base.has(k)) yield [k, v];
  }

  *keys(): MapIterator<K> {
    for (const [k] of this.entries()) yield k;
  }

  *values(): MapIterator<V> {
    for (const [, v] of this.entries()) yield v;
  }

  [Symbol.iterator](): MapIterator<[K, V]> {
    return this.entries();
  }

  forEach(fn: (value: V, key: K, map: ReadonlyMap<K, V>) => void): void {
    for (const [k, v] of this.entries()) fn(v, k, this);
  }
}

/**
 * `base` with `changes` set on top (a later change of the same key wins); `base` itself is left as it
 * was. Every MAX_DEPTH layers the whole is copied into one Map and handed to `flatten`.
 */
export function withChanges<K, V>(
  base: ReadonlyMap<K, V>,
  changes: ReadonlyArray<readonly [K, V]>,
  flatten: (flat: Map<K, V>) => ReadonlyMap<K, V> = (flat) => flat,
): ReadonlyMap<K, V> {
  if (changes.length === 0) return base;
  const depth = base instanceof OverlayMap ? base.depth + 1 : 1;
  if (depth > MAX_DEPTH) {
    // The bottom map copied natively, then each layer's entries set over it in order: iterating the
    // layered map itself walks every entry through each layer's generator.
    const tops: Array<ReadonlyMap<K, V>> = [];
    let bottom: ReadonlyMap<K, V> = base;
    while (bottom instanceof OverlayMap) {
      tops.push((bottom as OverlayMap<K, V>).top);
      bottom = (bottom as OverlayMap<K, V>).base;
    }
    const flat = new Map(bottom);
    for (const top of tops.reverse()) for (const [k, v] of top) flat.set(k, v);
    for (const [k, v] of changes) flat.set(k, v);
    return flatten(flat);
  }
  return new OverlayMap(base, new Map(changes), depth);
}
