// A monthly snapshot read back from the database in two steps: its head (format and what it had applied)
// when the index is built, which is all the check against the ledger needs, and its body (the holders'
// mixtures, about 90 kB of JSON each at ten years) only when a trace resumes from it. A restarted server
// then reads one or two bodies instead of parsing all of them (about 11 MB at ten years) before its first
// answer. Pure: the store reads the text, this module checks and parses it.
import { REPLAY_SNAPSHOT_FORMAT } from "@/lib/trace/replay";
import type { ReplaySnapshot } from "@/lib/trace/replay";

export type SnapshotHead = Pick<ReplaySnapshot, "format" | "applied">;
type SnapshotBody = Pick<ReplaySnapshot, "holders" | "leftOut">;

/**
 * Thrown when a trace reaches the holders of a snapshot whose body has not been read yet: the trace
 * service reads it (withSnapshotBodies) and runs the computation again, which is pure, so nothing is lost.
 */
export class SnapshotBodyMissing extends Error {
  declare readonly snapshot: ReplaySnapshot;
  constructor(snapshot: ReplaySnapshot) {
    super("a stored trace snapshot is needed before its body has been read");
    this.name = "SnapshotBodyMissing";
    // Not enumerable: a log line that records this error must not walk the snapshot (its body is what is missing).
    Object.defineProperty(this, "snapshot", { value: snapshot, enumerable: false });
  }
}

/**
 * What is known about each snapshot read back in two steps. Kept on globalThis, like the trace cache that
 * holds the snapshots: the server loads this module once for pages and once for API routes, and a
 * snapshot read by one must be readable, and its body fillable, from the other.
 */
interface StoredState {
  bodies: WeakMap<ReplaySnapshot, SnapshotBody>;
  waiting: WeakSet<ReplaySnapshot>;
  unreadable: WeakSet<ReplaySnapshot>;
}
const home = globalThis as unknown as { tracevatStoredSnapshots?: StoredState };
const { bodies, waiting, unreadable } = (home.tracevatStoredSnapshots ??= {
  bodies: new WeakMap(),
  waiting: new WeakSet(),
  unreadable: new WeakSet(),
});

/** Whether err is a SnapshotBodyMissing, from whichever copy of this module threw it. */
export function isSnapshotBodyMissing(err: unknown): err is SnapshotBodyMissing {
  return err instanceof Error && err.name === "SnapshotBodyMissing" && "snapshot" in err;
}

function isPosition(v: unknown): boolean {
  if (v === null) return true;
  if (typeof v !== "object") return false;
  const p = v as { moveId?: unknown; at?: unknown };
  return typeof p.moveId === "number" && typeof p.at === "number";
}

/** The head of a stored snapshot (format and applied), or null when it is not one of the current format. */
export function headOf(format: unknown, applied: unknown): SnapshotHead | null {
  if (format !== REPLAY_SNAPSHOT_FORMAT || applied === null || typeof applied !== "object") return null;
  const a = applied as { count?: unknown; massSumG?: unknown; last?: unknown };
  if (typeof a.count !== "number" || typeof a.massSumG !== "number" || !isPosition(a.last)) return null;
  const last = a.last as { moveId: number; at: number } | null;
  return {
    format: REPLAY_SNAPSHOT_FORMAT,
    applied: {
      count: a.count,
      massSumG: a.massSumG,
      last: last === null ? null : { moveId: last.moveId, at: last.at },
    },
  };
}

function bodyOf(s: ReplaySnapshot): SnapshotBody {
  const body = bodies.get(s);
  if (body === undefined) throw new SnapshotBodyMissing(s);
  return body;
}

/** A snapshot whose holders (and left-out list) are there once fillBody has been given its stored text. */
export function snapshotFromHead(head: SnapshotHead): ReplaySnapshot {
  const s = { format: head.format, applied: head.applied } as ReplaySnapshot;
  Object.defineProperty(s, "holders", { enumerable: true, get: () => bodyOf(s).holders });
  Object.defineProperty(s, "leftOut", { enumerable: true, get: () => bodyOf(s).leftOut });
  waiting.add(s);
  return s;
}

/** Whether this snapshot's body still has to be read (fillBody). */
export function needsBody(s: ReplaySnapshot): boolean {
  return waiting.has(s);
}

/** Whether this snapshot's stored body turned out unreadable, or not the snapshot its head described: never resume from it. */
export function isUnreadable(s: ReplaySnapshot): boolean {
  return unreadable.has(s);
}

function sameHead(a: SnapshotHead["applied"], b: unknown): boolean {
  const h = headOf(REPLAY_SNAPSHOT_FORMAT, b);
  if (h === null) return false;
  const x = h.applied;
  return (
    a.count === x.count &&
    a.massSumG === x.massSumG &&
    (a.last === null || x.last === null
      ? a.last === x.last
      : a.last.moveId === x.last.moveId && a.last.at === x.last.at)
  );
}

/**
 * Gives a snapshot made by snapshotFromHead its stored text (null: the row is gone). The text must be the
 * snapshot the head described, with a holder list; otherwise the snapshot is marked unreadable. Returns
 * whether the snapshot can be resumed from.
 */
export function fillBody(s: ReplaySnapshot, text: string | null): boolean {
  if (!waiting.has(s)) return !unreadable.has(s);
  waiting.delete(s);
  let parsed: unknown = null;
  try {
    parsed = text === null ? null : JSON.parse(text);
  } catch {
    parsed = null;
  }
  const p = parsed as Partial<ReplaySnapshot> | null;
  const leftOut: unknown = p?.leftOut;
  if (
    p === null ||
    typeof p !== "object" ||
    p.format !== s.format ||
    !sameHead(s.applied, p.applied) ||
    !Array.isArray(p.holders) ||
    !(leftOut === undefined || Array.isArray(leftOut))
  ) {
    unreadable.add(s);
    return false;
  }
  bodies.set(s, { holders: p.holders, ...(p.leftOut === undefined ? {} : { leftOut: p.leftOut }) });
  return true;
}
