// Ledger chunks (lib/ledger/ledger-chunks.ts), the id map (lib/ledger/id-map.ts) and the index's fast
// path (indexLedger): our own consistency checks, each against the plain computation it replaces.
import { describe, expect, it } from "vitest";
import {
  checkOf,
  checkOfColumns,
  decodeChunk,
  encodeChunk,
  sameCheck,
  splitIntoChunks,
} from "@/lib/ledger/ledger-chunks";
import type { MoveRow } from "@/lib/ledger/ledger-chunks";
import { denseLookupOf, idMapOf } from "@/lib/ledger/id-map";
import { compareMoves, indexLedger } from "@/lib/ledger/moves";
import type { TraceHolder, TraceMove } from "@/lib/ledger/moves";

const ROWS: MoveRow[] = [
  { id: 3, at: Date.UTC(2026, 0, 1, 6), fromHolderId: null, toHolderId: 1, massG: 5000, reversesId: null },
  { id: 4, at: Date.UTC(2026, 0, 1, 7, 0, 0, 999), fromHolderId: 1, toHolderId: 2, massG: 2000, reversesId: null },
  { id: 9, at: Date.UTC(2026, 0, 2), fromHolderId: 2, toHolderId: 1, massG: 2000, reversesId: 4 },
];

describe("ledger chunks", () => {
  it("decode gives back every column of what was encoded", () => {
    const c = decodeChunk(encodeChunk(ROWS), { afterId: 2, lastId: 9, count: 3 });
    expect(c).not.toBeNull();
    const back = Array.from({ length: c?.count ?? 0 }, (_, i) => ({
      id: c?.id[i],
      at: c?.at[i],
      fromHolderId: c?.from[i] === -1 ? null : c?.from[i],
      toHolderId: c?.to[i],
      massG: c?.mass[i],
      reversesId: c?.reverses[i] === -1 ? null : c?.reverses[i],
    }));
    expect(back).toEqual(ROWS);
    expect(c && sameCheck(checkOfColumns(c), checkOf(ROWS))).toBe(true);
  });

  it("reads a body at any offset of a larger buffer", () => {
    const body = encodeChunk(ROWS);
    const padded = new Uint8Array(body.byteLength + 3);
    padded.set(body, 3);
    expect(decodeChunk(padded.subarray(3), { afterId: 2, lastId: 9, count: 3 })?.id[2]).toBe(9);
  });

  it("refuses a body that does not hold the range it is stored under", () => {
    const body = encodeChunk(ROWS);
    expect(decodeChunk(body, { afterId: 3, lastId: 9, count: 3 })).toBeNull();
    expect(decodeChunk(body, { afterId: 2, lastId: 8, count: 3 })).toBeNull();
    expect(decodeChunk(body, { afterId: 2, lastId: 9, count: 2 })).toBeNull();
    expect(decodeChunk(body.subarray(1), { afterId: 2, lastId: 9, count: 3 })).toBeNull();
  });

  it("the check sees a changed gram, holder, reversal or second", () => {
    const base = checkOf(ROWS);
    const changed = (patch: Partial<MoveRow>) => checkOf([{ ...(ROWS[0] as MoveRow), ...patch }, ...ROWS.slice(1)]);
    expect(sameCheck(changed({ massG: 5001 }), base)).toBe(false);
    expect(sameCheck(changed({ toHolderId: 2 }), base)).toBe(false);
    expect(sameCheck(changed({ fromHolderId: 2 }), base)).toBe(false);
    expect(sameCheck(changed({ reversesId: 1 }), base)).toBe(false);
    expect(sameCheck(changed({ at: (ROWS[0]?.at ?? 0) + 1000 }), base)).toBe(false);
    expect(sameCheck(changed({}), base)).toBe(true);
  });

  it("splits only full chunks, in id order, each starting where the last ended", () => {
    const rows = [5, 1, 4, 2, 3, 7, 6].map((id) => ({ ...(ROWS[0] as MoveRow), id }));
    const chunks = splitIntoChunks(rows, 0, 3);
    expect(chunks.map((c) => [c.afterId, c.lastId, c.rows.map((r) => r.id)])).toEqual([
      [0, 3, [1, 2, 3]],
      [3, 6, [4, 5, 6]],
    ]);
    expect(splitIntoChunks(rows, 3, 3).map((c) => c.lastId)).toEqual([6]);
    expect(splitIntoChunks(rows, 0, 8)).toEqual([]);
  });
});

describe("id map", () => {
  const asMap = (m: ReadonlyMap<number, number> | null) => new Map([...(m ?? new Map<number, number>())]);

  it("answers like a Map for dense and for sparse ids", () => {
    for (const ids of [
      [4, 2, 3, 7],
      [1, 1_000_000, 5],
    ]) {
      const m = idMapOf(
        ids.length,
        (i) => ids[i] ?? 0,
        (i) => i * 10,
      );
      const plain = new Map(ids.map((id, i) => [id, i * 10]));
      expect(m?.size).toBe(plain.size);
      expect(asMap(m)).toEqual(plain);
      for (const probe of [0, 1, 2, 3, 4, 5, 6, 7, 8, 2.5, -1, 1_000_000]) {
        expect(m?.get(probe)).toBe(plain.get(probe));
        expect(m?.has(probe)).toBe(plain.has(probe));
      }
    }
  });

  it("is null when an id repeats", () => {
    expect(
      idMapOf(
        3,
        (i) => [1, 2, 1][i] ?? 0,
        (i) => i,
      ),
    ).toBeNull();
    expect(
      idMapOf(
        3,
        (i) => [1, 9_000_000, 1][i] ?? 0,
        (i) => i,
      ),
    ).toBeNull();
  });
});

describe("dense lookup", () => {
  it("answers get, has, size and iteration exactly as its map, for dense and for sparse keys", () => {
    for (const ids of [
      [40, 20, 30, 70, 21],
      [1, 1_000_000, 5],
      [-3, 0, 2],
    ]) {
      const map = new Map(ids.map((id) => [id, { id }]));
      const view = denseLookupOf(map);
      expect(view.size).toBe(map.size);
      expect([...view]).toEqual([...map]);
      expect([...view.keys()]).toEqual(ids);
      expect([...view.values()]).toEqual([...map.values()]);
      const seen: number[] = [];
      view.forEach((v, k, m) => {
        expect(m.get(k)).toBe(v);
        seen.push(k);
      });
      expect(seen).toEqual(ids);
      for (const probe of [...ids, 19, 22, 71, 0, -4, 2.5, 20.5, Number.NaN, 1e12, -1e12]) {
        expect(view.get(probe)).toBe(map.get(probe));
        expect(view.has(probe)).toBe(map.has(probe));
      }
    }
  });

  it("reads by id from an array only when the keys are dense", () => {
    const dense = new Map([10, 11, 13].map((id) => [id, { id }]));
    expect(denseLookupOf(dense)).not.toBe(dense);
    const sparse = new Map([1, 9_000_000].map((id) => [id, { id }]));
    expect(denseLookupOf(sparse)).toBe(sparse);
  });
});

describe("indexLedger's fast path", () => {
  const holders: TraceHolder[] = [1, 2, 3].map((id) => ({ id, kind: "TANK", mixing: "MIXED" }));
  const moves: TraceMove[] = [
    { id: 1, at: 100, fromHolderId: null, toHolderId: 1, massG: 10 },
    { id: 2, at: 200, fromHolderId: 1, toHolderId: 2, massG: 4 },
    { id: 3, at: 150, fromHolderId: null, toHolderId: 3, massG: 6 },
    { id: 4, at: 200, fromHolderId: 3, toHolderId: 2, massG: 1 },
  ];

  it("indexes moves given in any order the same way", () => {
    const sorted = [...moves].sort(compareMoves);
    const a = indexLedger(holders, moves);
    const b = indexLedger(holders, sorted);
    const c = indexLedger(holders, [...moves].reverse());
    for (const r of [a, b, c]) {
      if (!r.ok) throw new Error("expected an index");
      expect(r.value.moves.map((m) => m.id)).toEqual([1, 3, 2, 4]);
      expect([1, 2, 3, 4].map((id) => r.value.positionOf.get(id))).toEqual([0, 2, 1, 3]);
      expect(r.value.into.get(2)).toEqual([2, 3]);
      expect(r.value.outOf.get(1)).toEqual([2]);
      expect(r.value.massPrefixG).toEqual([0, 10, 16, 20, 21]);
    }
  });

  it("names a repeated id and a bad move as the full check does", () => {
    const repeated = indexLedger(holders, [...moves, { ...(moves[0] as TraceMove), at: 300 }]);
    expect(repeated.ok ? [] : repeated.issues.map((i) => i.code)).toEqual(["TRACE.DUPLICATE_MOVE"]);
    const bad = indexLedger(holders, [...moves, { id: 5, at: 300, fromHolderId: 2, toHolderId: 9, massG: 0 }]);
    expect(bad.ok ? [] : bad.issues.map((i) => i.code)).toEqual(["TRACE.INVALID_MOVE", "TRACE.UNKNOWN_HOLDER"]);
  });
});
