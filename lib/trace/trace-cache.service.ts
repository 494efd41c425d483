import "server-only";
import { log } from "@/lib/log/log.service";
// The server keeps, per site, one index of the ledger plus monthly replay snapshots (without the
// terminal holders), keyed by the ledger version (movement count and last id: movements are
// append-only, so any booking changes it, and the next index reads only the new rows). Answers are
// kept per version, so the page, its CSV, the API and the record pages share one computation.
import type { Db } from "@/lib/core/connect";
import { fail, failMany, ok } from "@/lib/core/result";
import type { Result } from "@/lib/core/result";
import { extendTraceLedger, loadChunkedTraceLedger, loadTraceLedger } from "@/lib/ledger/movement.store";
import type { TraceLedger } from "@/lib/ledger/movement.store";
import { saveLedgerChunks } from "@/lib/ledger/ledger-chunks.store";
import { idMapOf } from "@/lib/ledger/id-map";
import type { TraceMove } from "@/lib/ledger/moves";
import { samePosition } from "@/lib/ledger/position";
import type { LedgerPosition } from "@/lib/ledger/position";
import { getLedgerPosition } from "@/lib/ledger/position.store";
import {
  describeIssues,
  freshnessOf,
  indexAfter,
  renameIssues,
  sameVersion,
  snapshotFits,
} from "@/lib/trace/ledger-state";
import type { LedgerState } from "@/lib/trace/ledger-state";
import { extendSnapshotsOffThread } from "@/lib/trace/snapshot-worker.service";
import type { ReplaySnapshot } from "@/lib/trace/replay";
import { loadSnapshotBody, loadTraceSnapshots, saveTraceSnapshots } from "@/lib/trace/snapshot.store";
import { isSnapshotBodyMissing } from "@/lib/trace/stored-snapshot";
import { getLedgerVersion, listEntryHolderFacts, listTankServices } from "@/lib/trace/trace.store";
import type { EntryHolderFacts, LedgerVersion } from "@/lib/trace/trace.store";

/** Answers kept per site and ledger version. */
const MAX_CACHED_ANSWERS = 64;

const cacheHome = globalThis as unknown as {
  tracevatTraceCache?: Map<number, Promise<Result<LedgerState>>>;
  tracevatTraceWarming?: Set<number>;
};
const cache: Map<number, Promise<Result<LedgerState>>> = (cacheHome.tracevatTraceCache ??= new Map<
  number,
  Promise<Result<LedgerState>>
>());
/** Sites whose index is being built by warmTraceCache (set before the version query, so two pages start one build). */
const warming: Set<number> = (cacheHome.tracevatTraceWarming ??= new Set());
/** Per site with a save running: the latest snapshots still to store (null: none newer than the running save). */
const unsaved = new Map<number, { order: "dated" | "booked"; snapshots: readonly ReplaySnapshot[] } | null>();

async function buildState(
  db: Db,
  siteId: number,
  version: LedgerVersion,
  position: LedgerPosition,
  previous: LedgerState | null,
  now: Date,
): Promise<Result<LedgerState>> {
  const started = performance.now();
  // The stored snapshots are read meanwhile (they are checked against the index below).
  const storedDated = previous === null ? loadTraceSnapshots(db, siteId, "dated") : null;
  storedDated?.catch(() => undefined); // awaited below unless the ledger fails first
  const [{ ledger, appendedTo }, tankService] = await Promise.all([
    readLedger(db, siteId, version, previous),
    listTankServices(db, siteId),
  ]);
  const { moves } = ledger;
  const realAt =
    idMapOf(
      moves.length,
      (i) => (moves[i] as TraceMove).id,
      (i) => (moves[i] as TraceMove).at,
    ) ?? new Map(moves.map((m) => [m.id, m.at]));
  let problem: string | null = null;
  for (const order of ["dated", "booked"] as const) {
    const indexed = indexAfter(appendedTo, ledger, order);
    if (!indexed.ok) return failMany(renameIssues(ledger, indexed.issues));
    const index = indexed.value;
    // A fresh process resumes from the snapshots stored in the database, if they still fit this ledger.
    const kept =
      previous === null
        ? await (order === "dated" && storedDated !== null ? storedDated : loadTraceSnapshots(db, siteId, order))
        : previous.order === order
          ? previous.snapshots
          : [];
    const reusable = kept.filter((s) => snapshotFits(index, s));
    // The replay resumes from the latest that fits; a stored one whose body turns out unreadable is rebuilt.
    for (let last = reusable.at(-1); last !== undefined && !(await loadSnapshotBody(db, last)); last = reusable.at(-1))
      reusable.pop();
    const snapshots = await extendSnapshotsOffThread(index, reusable, realAt);
    if (!snapshots.ok) {
      problem ??= describeIssues(ledger, snapshots.issues);
      continue;
    }
    storeSnapshots(db, siteId, order, snapshots.value);
    return ok({
      siteId,
      version,
      position,
      ledger,
      index,
      order,
      orderProblem: problem,
      realAt,
      snapshots: snapshots.value,
      indexedAt: now,
      indexMs: performance.now() - started,
      answers: new Map(),
      carriedByFeeder: new Map(),
      tankService,
      facts: null,
    });
  }
  return fail(
    "TRACE.LEDGER_NOT_REPLAYABLE",
    `The movement ledger cannot be replayed in date order or in booking order: ${problem ?? "unknown reason"}`,
  );
}

/**
 * After a booking, only what is new is read (holders and movements are append-only) and the ledger is
 * the previous one with rows appended (`appendedTo`); a fresh process reads the stored ledger chunks and
 * the rows after them, and stores the full chunks it lacked.
 */
async function readLedger(
  db: Db,
  siteId: number,
  version: LedgerVersion,
  previous: LedgerState | null,
): Promise<{ ledger: TraceLedger; appendedTo: LedgerState | null }> {
  if (previous === null) return { ledger: await readStored(db, siteId), appendedTo: null };
  const extended = await extendTraceLedger(db, siteId, previous.ledger, version.count);
  return extended !== null
    ? { ledger: extended, appendedTo: previous }
    : { ledger: await loadTraceLedger(db, siteId), appendedTo: null };
}

async function readStored(db: Db, siteId: number): Promise<TraceLedger> {
  const { ledger, chunks } = await loadChunkedTraceLedger(db, siteId);
  inBackground(
    saveLedgerChunks(db, siteId, chunks).catch((err: unknown) =>
      log.warn({ err, siteId }, "ledger chunks were not stored"),
    ),
  );
  return ledger;
}

/**
 * Stores a site's snapshots in the background, one save per site at a time; a build that finishes while
 * a save runs leaves its list to be saved next. A failed save only costs the next start a replay.
 */
function storeSnapshots(db: Db, siteId: number, order: "dated" | "booked", snapshots: readonly ReplaySnapshot[]): void {
  const running = unsaved.has(siteId);
  unsaved.set(siteId, { order, snapshots });
  if (running) return;
  const next = async (): Promise<void> => {
    for (let job = unsaved.get(siteId); job !== undefined && job !== null; job = unsaved.get(siteId)) {
      unsaved.set(siteId, null);
      await saveTraceSnapshots(db, siteId, job.order, job.snapshots).catch((err: unknown) =>
        log.warn({ err, siteId }, "trace snapshots were not stored"),
      );
    }
    unsaved.delete(siteId);
  };
  inBackground(next());
}

const savesRunning = new Set<Promise<void>>();

function inBackground(save: Promise<unknown>): void {
  savesRunning.add(save.then(() => undefined));
}

/** Resolves once every snapshot and ledger-chunk save started so far has finished (tests; an orderly shutdown). */
export async function flushTraceSnapshots(): Promise<void> {
  while (savesRunning.size > 0) {
    const running = [...savesRunning];
    await Promise.all(running);
    for (const p of running) savesRunning.delete(p);
  }
}

/** The site's indexed ledger for its current version: reused while no movement is booked. */
export async function requireLedgerState(db: Db, siteId: number, now: Date): Promise<Result<LedgerState>> {
  // The position first (two key reads): unchanged means nothing was booked since the state was built.
  const position = await getLedgerPosition(db, siteId);
  const pending = cache.get(siteId);
  // A build that threw (a database fault, say) is not kept: this request builds again.
  const current = pending === undefined ? null : await pending.catch(() => null);
  const kept = current?.ok ? current.value : null;
  if (kept?.position && samePosition(kept.position, position)) return ok(kept);
  // Moved: count the movements (read after the position, so the version holds at least what it names).
  const version = await getLedgerVersion(db, siteId);
  if (kept && sameVersion(kept.version, version)) {
    kept.position = position;
    return ok(kept);
  }
  const again = cache.get(siteId);
  if (again !== pending && again !== undefined) {
    const other = await again;
    if (other.ok && sameVersion(other.value.version, version)) return other;
  }
  const next = buildState(db, siteId, version, position, kept, now);
  cache.set(siteId, next);
  next.catch(() => {
    if (cache.get(siteId) === next) cache.delete(siteId);
  });
  return next;
}

/** Forgets the cached index of every site (tests, or after a database file is replaced). */
export function clearTraceCache(): void {
  cache.clear();
}

/**
 * Runs a computation on a state, reading each stored snapshot body it turns out to need (a restarted
 * server reads the bodies lazily) and running it again: it is pure, so a second run gives what one run
 * with every body at hand would. Each round reads a body it has not tried before, so this ends; asked
 * for one it already tried (found unreadable), the error goes on instead of looping.
 */
export async function withSnapshotBodies<T>(db: Db, compute: () => T | Promise<T>): Promise<T> {
  const tried = new Set<ReplaySnapshot>();
  for (;;) {
    try {
      return await compute();
    } catch (err) {
      if (!isSnapshotBodyMissing(err) || tried.has(err.snapshot)) throw err;
      tried.add(err.snapshot);
      await loadSnapshotBody(db, err.snapshot);
    }
  }
}

export function requireFacts(db: Db, state: LedgerState): Promise<Map<number, EntryHolderFacts>> {
  state.facts ??= listEntryHolderFacts(db, state.siteId);
  return state.facts;
}

export async function answer<T>(
  db: Db,
  siteId: number,
  now: Date,
  key: string,
  compute: (state: LedgerState) => Promise<Result<Omit<T, "freshness">>>,
): Promise<Result<T>> {
  const started = performance.now();
  const stateR = await requireLedgerState(db, siteId, now);
  if (!stateR.ok) return stateR;
  const state = stateR.value;
  const kept = state.answers.get(key) as Promise<Result<Omit<T, "freshness">>> | undefined;
  const cached = kept !== undefined;
  let pending = kept;
  if (pending === undefined) {
    const computing = withSnapshotBodies(db, () => compute(state));
    pending = computing;
    state.answers.set(key, computing);
    // A computation that threw is not an answer: the next reader tries again.
    computing.catch(() => {
      if (state.answers.get(key) === computing) state.answers.delete(key);
    });
    if (state.answers.size > MAX_CACHED_ANSWERS) {
      const oldest = state.answers.keys().next().value;
      if (oldest !== undefined) state.answers.delete(oldest);
    }
  }
  const result = await pending;
  if (!result.ok) return result;
  return ok({ ...result.value, freshness: freshnessOf(state, performance.now() - started, cached) } as T);
}

/**
 * Starts building the site's trace index in the background if nothing is cached for it yet, so the
 * first trace after a server start does not wait for the whole-ledger replay. Never throws.
 */
export function warmTraceCache(db: Db, siteId: number, now: Date): void {
  if (cache.has(siteId) || warming.has(siteId)) return;
  warming.add(siteId);
  requireLedgerState(db, siteId, now)
    .then((state) => {
      if (!state.ok) log.warn({ siteId, issues: state.issues }, "the trace index could not be built");
    })
    .catch((err: unknown) => {
      log.error({ err, siteId }, "building the trace index failed");
      cache.delete(siteId);
    })
    .finally(() => warming.delete(siteId));
}
