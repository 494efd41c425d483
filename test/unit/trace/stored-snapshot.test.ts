// A stored snapshot read head first (lib/trace/stored-snapshot.ts): a trace resuming from it before its
// body is read is stopped (and the service reads the body and runs it again); a body that is not the
// snapshot its head described is never resumed from. Our own consistency checks: a snapshot filled from
// its stored JSON resumes exactly as the snapshot it was written from.
import { describe, expect, it } from "vitest";
import { traceHolder } from "@/lib/trace/genealogy";
import { indexLedger } from "@/lib/ledger/moves";
import type { LedgerIndex } from "@/lib/ledger/moves";
import { createReplay } from "@/lib/trace/replay";
import type { ReplaySnapshot } from "@/lib/trace/replay";
import {
  fillBody,
  headOf,
  isUnreadable,
  needsBody,
  SnapshotBodyMissing,
  snapshotFromHead,
} from "@/lib/trace/stored-snapshot";
import { LOT_A, PLANT_HOLDERS, PLANT_MOVES } from "./fixtures";

function plantIndex(): LedgerIndex {
  const index = indexLedger(PLANT_HOLDERS, PLANT_MOVES);
  if (!index.ok) throw new Error(JSON.stringify(index.issues));
  return index.value;
}

/** A snapshot after the first `count` moves of the plant ledger, as a build takes and stores it. */
function snapshotAt(index: LedgerIndex, count: number): ReplaySnapshot {
  const replay = createReplay(index.holders);
  for (const m of index.moves.slice(0, count)) {
    const applied = replay.apply(m);
    if (!applied.ok) throw new Error(JSON.stringify(applied.issues));
  }
  return replay.snapshot();
}

function lazyOf(s: ReplaySnapshot): ReplaySnapshot {
  const head = headOf(s.format, JSON.parse(JSON.stringify(s.applied)));
  if (head === null) throw new Error("expected a head");
  return snapshotFromHead(head);
}

describe("stored snapshots read head first", () => {
  const index = plantIndex();
  const stored = snapshotAt(index, 2);

  it("stops a trace that reaches the holders before the body is read", () => {
    const lazy = lazyOf(stored);
    expect(needsBody(lazy)).toBe(true);
    expect(lazy.applied).toEqual(stored.applied);
    expect(() => traceHolder(index, LOT_A, { from: lazy })).toThrow(SnapshotBodyMissing);
  });

  it("resumes from the filled snapshot exactly as from the one it was written from", () => {
    const lazy = lazyOf(stored);
    expect(fillBody(lazy, JSON.stringify(stored))).toBe(true);
    expect(needsBody(lazy)).toBe(false);
    expect(traceHolder(index, LOT_A, { from: lazy })).toEqual(traceHolder(index, LOT_A, { from: stored }));
    expect(JSON.parse(JSON.stringify(lazy))).toEqual(JSON.parse(JSON.stringify(stored)));
  });

  it("marks unreadable a body that is not JSON, has no holder list, or is another position's snapshot", () => {
    const other = snapshotAt(index, 3);
    const bodies = [
      JSON.stringify(stored).slice(0, -5),
      JSON.stringify({ ...stored, holders: undefined }),
      JSON.stringify(other),
      null,
    ];
    for (const body of bodies) {
      const lazy = lazyOf(stored);
      expect(fillBody(lazy, body)).toBe(false);
      expect(isUnreadable(lazy)).toBe(true);
      expect(needsBody(lazy)).toBe(false);
    }
  });

  it("reads a head only of the current format with the applied figures", () => {
    expect(headOf("tracevat.replay/0", stored.applied)).toBeNull();
    expect(headOf(stored.format, { count: 1, massSumG: "7", last: null })).toBeNull();
    expect(headOf(stored.format, { count: 1, massSumG: 7, last: { moveId: 1 } })).toBeNull();
    expect(headOf(stored.format, stored.applied)).toEqual({ format: stored.format, applied: stored.applied });
  });
});
