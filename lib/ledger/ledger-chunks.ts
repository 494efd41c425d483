// A site's movement rows in full chunks of typed-array columns, so a restarted server reads its ledger
// as a few binary values instead of one text value per row it has to split and parse. Pure: the store
// (ledger-chunks.store.ts) reads and writes the chunks and checks them against the ledger with the
// figures computed here.

/** One movement row as the trace reads it: times in epoch milliseconds. */
export interface MoveRow {
  id: number;
  at: number;
  fromHolderId: number | null;
  toHolderId: number;
  massG: number;
  reversesId: number | null;
}

/** Raised whenever the layout below changes; a stored chunk of another format is rebuilt. */
export const LEDGER_CHUNK_FORMAT = "tracevat.ledger-chunk/1";

/** Rows per chunk: only full chunks are stored, the rows after the last one are read as they are. */
export const LEDGER_CHUNK_ROWS = 16_384;

/** Bytes per row: time (float64), then id, from, to, grams and reversed id (int32 each; -1 for none). */
const ROW_BYTES = 8 + 5 * 4;
const NONE = -1;

/**
 * What a run of rows adds up to, compared with the same figures the database computes over the id range
 * the chunks cover: a chunk that disagrees (a restored or edited database, a row committed late under a
 * lower id) is not used.
 */
export interface ChunkCheck {
  count: number;
  lastId: number;
  massG: number;
  fromIds: number;
  toIds: number;
  reversesIds: number;
  /** Σ whole seconds of the movement times (rounded down), as the database computes them. */
  seconds: number;
}

export const EMPTY_CHECK: ChunkCheck = {
  count: 0,
  lastId: 0,
  massG: 0,
  fromIds: 0,
  toIds: 0,
  reversesIds: 0,
  seconds: 0,
};

export function checkOf(rows: readonly MoveRow[]): ChunkCheck {
  const c = { ...EMPTY_CHECK };
  for (const r of rows) addToCheck(c, r);
  return c;
}

function addToCheck(c: ChunkCheck, r: MoveRow): void {
  c.count += 1;
  c.lastId = Math.max(c.lastId, r.id);
  c.massG += r.massG;
  c.fromIds += r.fromHolderId ?? 0;
  c.toIds += r.toHolderId;
  c.reversesIds += r.reversesId ?? 0;
  c.seconds += Math.floor(r.at / 1000);
}

export function addChecks(a: ChunkCheck, b: ChunkCheck): ChunkCheck {
  return {
    count: a.count + b.count,
    lastId: Math.max(a.lastId, b.lastId),
    massG: a.massG + b.massG,
    fromIds: a.fromIds + b.fromIds,
    toIds: a.toIds + b.toIds,
    reversesIds: a.reversesIds + b.reversesIds,
    seconds: a.seconds + b.seconds,
  };
}

export function sameCheck(a: ChunkCheck, b: ChunkCheck): boolean {
  return (
    a.count === b.count &&
    a.lastId === b.lastId &&
    a.massG === b.massG &&
    a.fromIds === b.fromIds &&
    a.toIds === b.toIds &&
    a.reversesIds === b.reversesIds &&
    a.seconds === b.seconds
  );
}

function int32(n: number | null): number {
  return n === null ? NONE : n;
}

/** Packs rows (ascending ids, each a 32-bit integer, as Prisma's Int columns are) into one chunk body. */
export function encodeChunk(rows: readonly MoveRow[]): Uint8Array {
  const n = rows.length;
  const buffer = new ArrayBuffer(n * ROW_BYTES);
  const at = new Float64Array(buffer, 0, n);
  const ints = new Int32Array(buffer, n * 8, n * 5);
  rows.forEach((r, i) => {
    at[i] = r.at;
    ints[i] = r.id;
    ints[n + i] = int32(r.fromHolderId);
    ints[2 * n + i] = r.toHolderId;
    ints[3 * n + i] = r.massG;
    ints[4 * n + i] = int32(r.reversesId);
  });
  return new Uint8Array(buffer);
}

/** A decoded chunk: one typed array per column; NONE (-1) stands for no holder or no reversed movement. */
export interface MoveColumns {
  count: number;
  at: Float64Array;
  id: Int32Array;
  from: Int32Array;
  to: Int32Array;
  mass: Int32Array;
  reverses: Int32Array;
}

export const NO_ID = NONE;

/**
 * The columns of a chunk body, or null when the body does not hold `count` rows with ascending ids after
 * `afterId` ending at `lastId` (then the chunk is rebuilt like one that no longer fits the ledger).
 */
export function decodeChunk(
  body: Uint8Array,
  range: { afterId: number; lastId: number; count: number },
): MoveColumns | null {
  const n = range.count;
  if (n <= 0 || body.byteLength !== n * ROW_BYTES) return null;
  // A copy on its own buffer: the database hands back views at any offset, and a Float64Array needs 8.
  const buffer = body.slice().buffer;
  const ints = new Int32Array(buffer, n * 8, n * 5);
  const c: MoveColumns = {
    count: n,
    at: new Float64Array(buffer, 0, n),
    id: ints.subarray(0, n),
    from: ints.subarray(n, 2 * n),
    to: ints.subarray(2 * n, 3 * n),
    mass: ints.subarray(3 * n, 4 * n),
    reverses: ints.subarray(4 * n, 5 * n),
  };
  let previous = range.afterId;
  for (let i = 0; i < n; i++) {
    const id = c.id[i] ?? 0;
    if (id <= previous || !Number.isSafeInteger(c.at[i])) return null;
    previous = id;
  }
  return previous === range.lastId ? c : null;
}

/**
 * The check figures of a decoded chunk (as checkOf of its rows), summed straight from the columns: no
 * object per row (at ten years a restart checks 213 k rows this way).
 */
export function checkOfColumns(c: MoveColumns): ChunkCheck {
  let lastId = 0;
  let massG = 0;
  let fromIds = 0;
  let toIds = 0;
  let reversesIds = 0;
  let seconds = 0;
  for (let i = 0; i < c.count; i++) {
    const id = c.id[i] ?? 0;
    const from = c.from[i] ?? NONE;
    const reverses = c.reverses[i] ?? NONE;
    if (id > lastId) lastId = id;
    massG += c.mass[i] ?? 0;
    fromIds += from === NONE ? 0 : from;
    toIds += c.to[i] ?? 0;
    reversesIds += reverses === NONE ? 0 : reverses;
    seconds += Math.floor((c.at[i] ?? 0) / 1000);
  }
  return { count: c.count, lastId, massG, fromIds, toIds, reversesIds, seconds };
}

/** Full chunks of the rows after `afterId` (taken in id order); the rows left over stay unchunked. */
export function splitIntoChunks(
  rows: readonly MoveRow[],
  afterId: number,
  rowsPerChunk = LEDGER_CHUNK_ROWS,
): Array<{ afterId: number; lastId: number; rows: MoveRow[] }> {
  const chunks: Array<{ afterId: number; lastId: number; rows: MoveRow[] }> = [];
  if (rows.length < rowsPerChunk) return chunks;
  const after = rows.filter((r) => r.id > afterId).sort((a, b) => a.id - b.id);
  let start = afterId;
  for (let i = 0; i + rowsPerChunk <= after.length; i += rowsPerChunk) {
    const part = after.slice(i, i + rowsPerChunk);
    const lastId = part[part.length - 1]?.id ?? start;
    chunks.push({ afterId: start, lastId, rows: part });
    start = lastId;
  }
  return chunks;
}
