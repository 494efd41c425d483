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

describe("a snapshot read by one copy of the module and used by another", () => {
  // The server loads a module once for pages and once for API routes; both share the trace cache, so a
  // snapshot read back by one copy is resumed and filled by the other (found by the two-process load run).
  it("is filled and read across copies, and its missing body is recognised by either", async () => {
    const { vi } = await import("vitest");
    const index = plantIndex();
    const whole = snapshotAt(index, 4);
    vi.resetModules();
    const pages = await import("@/lib/trace/stored-snapshot");
    vi.resetModules();
    const routes = await import("@/lib/trace/stored-snapshot");
    expect(routes.snapshotFromHead).not.toBe(pages.snapshotFromHead);
    const head = pages.headOf(whole.format, JSON.parse(JSON.stringify(whole.applied)));
    if (head === null) throw new Error("expected a head");
    const lazy = pages.snapshotFromHead(head);
    let thrown: unknown = null;
    try {
      void lazy.holders;
    } catch (err) {
      thrown = err;
    }
    expect(routes.isSnapshotBodyMissing(thrown)).toBe(true);
    expect(routes.needsBody(lazy)).toBe(true);
    expect(routes.fillBody(lazy, JSON.stringify(whole))).toBe(true);
    expect(pages.needsBody(lazy)).toBe(false);
    expect(lazy.holders).toEqual(whole.holders);
  });
});
