// The figures that read the database, on SQLite and on PostgreSQL with the same 10-year history: the
// floor read, the app's ledger load, the trace index's first build, the first trace after a restart
// (stored ledger chunks and snapshots, every in-memory cache cleared), warm traces and the quarter balance through the
// services. Prints each row on both databases, their ratio (goal ≤ 2×) and each goal's PASS/MISS.
import { rmSync } from "node:fs";
import type { PlantHistory } from "@/bench/plant-history";
import { openFloorReader, writeLedgerDatabase } from "@/bench/ledger-database";
import { createBenchPgDatabase, openPgFloorReader, writeHistoryPostgres } from "@/bench/pg-history";
import { formatMs, formatRatio, measureAsync, measureSync, MemoryWatch, printTable } from "@/bench/measure";
import type { Timing } from "@/bench/measure";
import { openDb } from "@/lib/core/connect";
import type { Db } from "@/lib/core/connect";
import type { Result } from "@/lib/core/result";
import { loadTraceLedger } from "@/lib/ledger/movement.store";
import {
  clearTraceCache,
  flushTraceSnapshots,
  requireLedgerState,
  traceLotMaterial,
  traceReceived,
} from "@/lib/trace/trace.service";
import { deleteTraceSnapshots } from "@/lib/trace/snapshot.store";
import { deleteLedgerChunks } from "@/lib/ledger/ledger-chunks.store";
import { getBalanceReport, getBalanceReportFromWholeLedger } from "@/lib/mass-balance/balance.service";
import { clearBalanceCache, getBalanceReportCached } from "@/lib/mass-balance/balance-cache.service";
import { clearAnswerCaches } from "@/bench/answer-caches";

export const DB_GOALS = {
  traceP95Ms: 25,
  firstTraceMs: 1000,
  closedQuarterP95Ms: 25,
  openQuarterP95Ms: 100,
  pgRatio: 2,
} as const;

type Provider = "SQLite" | "PostgreSQL";
export type GoalLine = [string, string, string, string];

interface Row {
  key: string;
  label: string;
  /** Which figure of the timing is graded and compared: the median or the p95. */
  stat: "median" | "p95" | "once";
  goalMs?: number;
  goalText?: string;
}

const ROWS: Row[] = [
  { key: "floor", label: "floor: SQL read of the site's ledger rows", stat: "median" },
  { key: "load", label: "loadTraceLedger (Prisma): holders, tanks, moves", stat: "median" },
  { key: "build", label: "trace index, first build (nothing stored)", stat: "once", goalText: "one-off" },
  {
    key: "restart-back",
    label: "first backward trace after a restart (stored chunks, snapshots)",
    stat: "once",
    goalMs: DB_GOALS.firstTraceMs,
  },
  {
    key: "restart-fwd",
    label: "first lot trace (back + forward) after a restart",
    stat: "once",
    goalMs: DB_GOALS.firstTraceMs,
  },
  { key: "back", label: "backward trace, last product lot (traceReceived)", stat: "p95", goalMs: DB_GOALS.traceP95Ms },
  {
    key: "fwd",
    label: "lot trace, early lot: back + forward (traceLotMaterial)",
    stat: "p95",
    goalMs: DB_GOALS.traceP95Ms,
  },
  {
    key: "q-whole",
    label: "quarter balance 2026-Q3 from the whole ledger (as before the books brought forward)",
    stat: "p95",
  },
  {
    key: "q-first",
    label: "quarter balance 2026-Q3, first after a restart (books brought forward built)",
    stat: "once",
    goalText: "one-off",
  },
  {
    key: "q-computed",
    label: "quarter balance 2026-Q3, computed (getBalanceReport)",
    stat: "p95",
    goalMs: DB_GOALS.openQuarterP95Ms,
  },
  {
    key: "q-kept",
    label: "quarter balance 2026-Q3, same position (kept answer)",
    stat: "p95",
    goalMs: DB_GOALS.closedQuarterP95Ms,
  },
  {
    key: "q-booked",
    label: "open quarter 2026-Q3 after a booking dated in it (kept-answer path)",
    stat: "p95",
    goalMs: DB_GOALS.openQuarterP95Ms,
  },
];

function requireOk<T>(what: string, r: Result<T>): T {
  if (!r.ok) throw new Error(`${what} failed: ${r.issues.map((i) => `${i.code} ${i.message}`).join("; ")}`);
  return r.value;
}

const FAST = { runs: 20, warmup: true };
const SLOWISH = { runs: 3, warmup: true };

/** CPU milliseconds this process spent in each one-off call (user + system): less bent by a busy machine than the wall clock. */
const cpuOf = new WeakMap<Timing, number>();

async function once(fn: () => Promise<void>): Promise<Timing> {
  const cpu0 = process.cpuUsage();
  const t0 = performance.now();
  await fn();
  const ms = performance.now() - t0;
  const cpu = process.cpuUsage(cpu0);
  const t: Timing = { runs: 1, medianMs: ms, p95Ms: ms, minMs: ms, maxMs: ms, reducedFrom: null };
  cpuOf.set(t, (cpu.user + cpu.system) / 1000);
  return t;
}

function cpuText(t: Timing | undefined): string {
  const cpu = t === undefined ? undefined : cpuOf.get(t);
  return cpu === undefined ? "" : formatMs(cpu);
}

/** Times the service figures on one open database holding the history's site. */
export async function measureServices(db: Db, h: PlantHistory, memory: MemoryWatch): Promise<Map<string, Timing>> {
  const out = new Map<string, Timing>();
  const now = new Date(h.endMs + 5 * 86_400_000);
  out.set("load", await measureAsync(async () => void (await loadTraceLedger(db, h.siteId)), SLOWISH, memory));
  // The first build ever: nothing stored, the whole ledger read and replayed, its chunks and monthly
  // snapshots stored.
  clearTraceCache();
  await deleteTraceSnapshots(db, h.siteId);
  await deleteLedgerChunks(db, h.siteId);
  out.set("build", await once(async () => void requireOk("first build", await requireLedgerState(db, h.siteId, now))));
  await flushTraceSnapshots();
  memory.sample();
  // A restart: every in-memory cache cleared, the stored snapshots kept.
  clearAnswerCaches();
  out.set(
    "restart-back",
    await once(
      async () =>
        void requireOk("traceReceived", await traceReceived(db, h.siteId, h.probes.lateProductLotHolderId, now)),
    ),
  );
  await flushTraceSnapshots();
  clearAnswerCaches();
  out.set(
    "restart-fwd",
    await once(
      async () =>
        void requireOk("traceLotMaterial", await traceLotMaterial(db, h.siteId, h.probes.earlyLotHolderId, now)),
    ),
  );
  await flushTraceSnapshots();
  memory.sample();
  out.set(
    "back",
    await measureAsync(
      async () =>
        void requireOk("traceReceived", await traceReceived(db, h.siteId, h.probes.lateProductLotHolderId, now)),
      FAST,
      memory,
    ),
  );
  out.set(
    "fwd",
    await measureAsync(
      async () =>
        void requireOk("traceLotMaterial", await traceLotMaterial(db, h.siteId, h.probes.earlyLotHolderId, now)),
      FAST,
      memory,
    ),
  );
  await measureBalance(db, h, memory, out);
  clearTraceCache();
  clearBalanceCache();
  return out;
}

/** The quarter balance rows: whole ledger, first after a restart, computed, kept, and after a booking. */
async function measureBalance(db: Db, h: PlantHistory, memory: MemoryWatch, out: Map<string, Timing>): Promise<void> {
  const now = new Date(h.endMs + 5 * 86_400_000);
  const site = { id: h.siteId, timeZone: "UTC" };
  const quarter = { period: "QUARTER", year: "2026", quarter: "3" };
  const report = async () => void requireOk("getBalanceReport", await getBalanceReport(db, site, quarter, now));
  out.set(
    "q-whole",
    await measureAsync(
      async () => void requireOk("whole-ledger balance", await getBalanceReportFromWholeLedger(db, site, quarter, now)),
      SLOWISH,
      memory,
    ),
  );
  clearAnswerCaches();
  out.set("q-first", await once(report));
  out.set("q-computed", await measureAsync(report, FAST, memory));
  clearBalanceCache();
  const kept = async () =>
    void requireOk("getBalanceReportCached", await getBalanceReportCached(db, site, quarter, now));
  out.set("q-kept", await measureAsync(kept, FAST, memory));
  // A booking dated in the quarter (the ledger's own table, as the bench wrote it): the position moves,
  // the answer changes and is computed again; the books brought forward to the quarter start still stand.
  let booked = 0;
  const book = async () => {
    booked += 1;
    await db.movement.create({
      data: {
        siteId: h.siteId,
        at: new Date(h.endMs - 86_400_000 + booked),
        role: "RECEIPT",
        toHolderId: h.probes.earlyLotHolderId,
        massG: 1_000,
        recordedById: 1,
      },
    });
  };
  out.set("q-booked", await measureAsync(kept, FAST, memory, book));
  clearTraceCache();
  clearBalanceCache();
}

async function measureSqlite(h: PlantHistory, memory: MemoryWatch): Promise<Map<string, Timing>> {
  const file = `/tmp/tracevat-bench-db-${h.years}y.db`;
  const written = await writeLedgerDatabase(h, file);
  const reader = openFloorReader(file, h.siteId);
  const floor = measureSync(() => void reader.read(), FAST, memory);
  reader.close();
  const db = await openDb(written.url);
  try {
    const out = await measureServices(db, h, memory);
    out.set("floor", floor);
    return out;
  } finally {
    await db.$disconnect();
    for (const suffix of ["", "-wal", "-shm"]) rmSync(`${file}${suffix}`, { force: true });
  }
}

async function measurePostgres(h: PlantHistory, memory: MemoryWatch): Promise<Map<string, Timing>> {
  const database = await createBenchPgDatabase(`${h.years}y_${process.pid}`);
  try {
    await writeHistoryPostgres(database.url, h, 1);
    const reader = await openPgFloorReader(database.url, h.siteId);
    const floor = await measureAsync(async () => void (await reader.read()), FAST, memory);
    await reader.close();
    const db = await openDb(database.url);
    try {
      const out = await measureServices(db, h, memory);
      out.set("floor", floor);
      return out;
    } finally {
      await db.$disconnect();
    }
  } finally {
    await database.drop();
  }
}

function statOf(t: Timing | undefined, stat: Row["stat"]): number {
  if (t === undefined) return Number.NaN;
  return stat === "p95" ? t.p95Ms : t.medianMs;
}

/** Runs the section; returns its goal lines and the peak memory of each database's part. */
export async function runDatabaseBench(h: PlantHistory): Promise<{ goals: GoalLine[]; peaks: [string, number][] }> {
  console.log(`\n== Both databases: the ${h.years}-year history through the app's stores and services ==`);
  const results = new Map<Provider, Map<string, Timing>>();
  const peaks: [string, number][] = [];
  for (const provider of ["SQLite", "PostgreSQL"] as const) {
    const memory = new MemoryWatch();
    memory.reset();
    const t0 = performance.now();
    results.set(provider, provider === "SQLite" ? await measureSqlite(h, memory) : await measurePostgres(h, memory));
    console.log(`  ${provider}: written and measured in ${((performance.now() - t0) / 1000).toFixed(0)} s`);
    peaks.push([`databases: ${provider}`, memory.peakMb]);
  }
  const goals: GoalLine[] = [];
  const rows = ROWS.map((row) => {
    const s = statOf(results.get("SQLite")?.get(row.key), row.stat);
    const p = statOf(results.get("PostgreSQL")?.get(row.key), row.stat);
    const ratio = p / s;
    const ratioVerdict = ratio <= DB_GOALS.pgRatio ? "PASS" : "MISS";
    goals.push([`PostgreSQL ≤ ${DB_GOALS.pgRatio}× SQLite`, row.label, formatRatio(ratio), ratioVerdict]);
    let goal = row.goalText ?? "—";
    if (row.goalMs !== undefined) {
      const limit = row.goalMs;
      const verdicts = [s, p].map((ms) => (ms <= limit ? "PASS" : "MISS"));
      goal = `≤ ${limit} ms: ${verdicts.join(" / ")}`;
      for (const [i, provider] of (["SQLite", "PostgreSQL"] as const).entries())
        goals.push([
          `${row.stat === "p95" ? "p95" : "time"} ≤ ${limit} ms (${provider})`,
          row.label,
          `${formatMs(i === 0 ? s : p)} ms`,
          verdicts[i] ?? "",
        ]);
    }
    const cpu = [cpuText(results.get("SQLite")?.get(row.key)), cpuText(results.get("PostgreSQL")?.get(row.key))];
    return [
      row.label,
      row.stat,
      formatMs(s),
      formatMs(p),
      formatRatio(ratio),
      ratioVerdict,
      goal,
      cpu[0] === "" ? "" : `${cpu[0]} / ${cpu[1] ?? ""}`,
    ];
  });
  printTable(
    [
      [`figure (${h.years} years)`, "stat", "SQLite ms", "PostgreSQL ms", "PG/SQLite", "≤ 2×", "goal (SQLite / PG)"],
      ...rows,
    ],
    [false, false, true, true, true, false, false],
  );
  console.log(
    "  once = one timed call; a restart is simulated by clearing every in-memory cache and index (the stored LedgerChunk and TraceSnapshot rows stay).",
  );
  console.log(
    "  CPU ms = user + system time of this process during a one-off call; on PostgreSQL the server's own work is not in it.",
  );
  console.log(
    "  The quarter's kept answer is the app's path for the same question at the same ledger position (a closed quarter keeps it across bookings).",
  );
  console.log(
    "  The pure computations in the sections above read no database, so their figures are the same on both; these rows are the ones that differ.",
  );
  for (const [name, mbPeak] of peaks) console.log(`  peak RSS, ${name}: ${mbPeak.toFixed(0)} MB`);
  return { goals, peaks };
}
