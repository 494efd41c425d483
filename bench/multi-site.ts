// Ten sites × ten years in one PostgreSQL database: each site's trace and balance timed through the
// services, and an isolation check that fails the run if any answer for one site contains another
// site's rows, or differs from the same site's answer in a database holding that site alone.
import { generatePlantHistory } from "@/bench/plant-history";
import type { PlantHistory } from "@/bench/plant-history";
import { createBenchPgDatabase, shiftHistory, writeHistoryPostgres } from "@/bench/pg-history";
import { formatMs, measureAsync, MemoryWatch, printTable } from "@/bench/measure";
import type { GoalLine } from "@/bench/databases";
import { clearAnswerCaches } from "@/bench/answer-caches";
import { openDb } from "@/lib/core/connect";
import type { Db } from "@/lib/core/connect";
import type { Result } from "@/lib/core/result";
import { flushTraceSnapshots, traceLotMaterial, traceReceived } from "@/lib/trace/trace.service";
import { getBalanceReport } from "@/lib/mass-balance/balance.service";
import { getBalanceReportCached } from "@/lib/mass-balance/balance-cache.service";
import { computePeriodBalance } from "@/lib/mass-balance/period-balance";
import { getQuarterPeriod } from "@/lib/mass-balance/period";

export const SITE_GOALS = { traceP95Ms: 50 } as const;
const ID_STRIDE = 1_000_000;
const FAST = { runs: 20, warmup: true };

function requireOk<T>(what: string, r: Result<T>): T {
  if (!r.ok) throw new Error(`${what} failed: ${r.issues.map((i) => `${i.code} ${i.message}`).join("; ")}`);
  return r.value;
}

function check(condition: boolean, what: string): void {
  if (!condition) throw new Error(`multi-site isolation check failed: ${what}`);
}

/** Site k (1-based): its own seed, and holder and move ids in their own block of a million. */
export function siteHistory(k: number, years: number): PlantHistory {
  const h = generatePlantHistory({ years, seed: 20_261_202 + (k - 1), siteId: k });
  return k === 1 ? h : shiftHistory(h, k, (k - 1) * ID_STRIDE, (k - 1) * ID_STRIDE);
}

interface SiteAnswers {
  back: unknown;
  lot: unknown;
  balance: unknown;
}

/** The answers compared between databases, without timings and without the objects that name the index. */
async function answersOf(db: Db, h: PlantHistory, now: Date): Promise<SiteAnswers> {
  const back = requireOk("traceReceived", await traceReceived(db, h.siteId, h.probes.lateProductLotHolderId, now));
  const lot = requireOk("traceLotMaterial", await traceLotMaterial(db, h.siteId, h.probes.earlyLotHolderId, now));
  const balance = requireOk(
    "getBalanceReport",
    await getBalanceReport(
      db,
      { id: h.siteId, timeZone: "UTC" },
      { period: "QUARTER", year: "2026", quarter: "3" },
      now,
    ),
  );
  const { computeMs: _ignored, ...steady } = balance;
  return { back: back.back, lot: { back: lot.back, fwd: lot.fwd }, balance: JSON.parse(JSON.stringify(steady)) };
}

/** Every holder and move an answer names belongs to the site. */
function checkOwnRows(h: PlantHistory, a: SiteAnswers): void {
  const holders = new Set(h.holders.map((x) => x.id));
  const moves = new Set(h.moves.map((m) => m.id));
  const back = a.back as { received: { origins: { originId: number }[] }; stock: { origins: { originId: number }[] } };
  const lot = a.lot as {
    fwd: { holders: { holderId: number }[]; moves: { moveId: number }[]; originIds: number[] };
  };
  // An origin is the entry move that brought the material into the books.
  const foreignHolders = lot.fwd.holders.map((x) => x.holderId).filter((id) => !holders.has(id));
  const foreignMoves = [
    ...back.received.origins.map((o) => o.originId),
    ...back.stock.origins.map((o) => o.originId),
    ...lot.fwd.originIds,
    ...lot.fwd.moves.map((m) => m.moveId),
  ].filter((id) => !moves.has(id));
  check(
    foreignHolders.length === 0,
    `site ${h.siteId}: trace names holders of another site (${foreignHolders.slice(0, 3).join(", ")})`,
  );
  check(
    foreignMoves.length === 0,
    `site ${h.siteId}: trace names moves of another site (${foreignMoves.slice(0, 3).join(", ")})`,
  );
  // The balance's totals equal the pure computation over this site's own rows.
  const pure = computePeriodBalance({
    holders: h.holders,
    moves: h.moves,
    period: getQuarterPeriod(2026, 3, 0),
    scope: { siteId: h.siteId },
  });
  const stock = (a.balance as { stock: { openingG: number; receipts: { totalG: number }; closingG: number } }).stock;
  check(
    pure.ok &&
      pure.value.stock.openingG === stock.openingG &&
      pure.value.stock.receipts.totalG === stock.receipts.totalG &&
      pure.value.stock.closingG === stock.closingG,
    `site ${h.siteId}: the quarter balance differs from the site's own rows`,
  );
}

export async function runMultiSiteBench(
  options: { sites?: number; years?: number; aloneChecks?: number[] } = {},
): Promise<{ goals: GoalLine[]; peaks: [string, number][] }> {
  const sites = options.sites ?? 10;
  const years = options.years ?? 10;
  const aloneChecks = options.aloneChecks ?? [2, sites];
  console.log(`\n== ${sites} sites × ${years} years in one PostgreSQL database ==`);
  const memory = new MemoryWatch();
  memory.reset();
  const started = performance.now();
  const database = await createBenchPgDatabase(`sites_${process.pid}`);
  const goals: GoalLine[] = [];
  const rows: string[][] = [];
  try {
    let moves = 0;
    let writeMs = 0;
    for (let k = 1; k <= sites; k++) {
      const h = siteHistory(k, years);
      moves += h.moves.length;
      writeMs += await writeHistoryPostgres(database.url, h, k);
      memory.sample();
    }
    console.log(`  written: ${sites} sites, ${moves} movements in ${(writeMs / 1000).toFixed(0)} s`);
    const db = await openDb(database.url);
    const kept = new Map<number, SiteAnswers>();
    try {
      for (let k = 1; k <= sites; k++) {
        const h = siteHistory(k, years);
        const now = new Date(h.endMs + 5 * 86_400_000);
        clearAnswerCaches();
        const t0 = performance.now();
        const answers = await answersOf(db, h, now);
        const firstMs = performance.now() - t0;
        await flushTraceSnapshots();
        checkOwnRows(h, answers);
        if (aloneChecks.includes(k)) kept.set(k, answers);
        const back = await measureAsync(
          async () => void requireOk("traceReceived", await traceReceived(db, k, h.probes.lateProductLotHolderId, now)),
          FAST,
          memory,
        );
        const lot = await measureAsync(
          async () => void requireOk("traceLotMaterial", await traceLotMaterial(db, k, h.probes.earlyLotHolderId, now)),
          FAST,
          memory,
        );
        const quarter = { period: "QUARTER", year: "2026", quarter: "3" };
        const balance = await measureAsync(
          async () =>
            void requireOk("balance", await getBalanceReportCached(db, { id: k, timeZone: "UTC" }, quarter, now)),
          FAST,
          memory,
        );
        for (const [label, t] of [
          ["backward trace", back],
          ["lot trace (back + forward)", lot],
        ] as const)
          goals.push([
            `${sites}-site trace p95 ≤ ${SITE_GOALS.traceP95Ms} ms`,
            `site ${k}: ${label}`,
            `${formatMs(t.p95Ms)} ms`,
            t.p95Ms <= SITE_GOALS.traceP95Ms ? "PASS" : "MISS",
          ]);
        rows.push([
          String(k),
          String(h.moves.length),
          formatMs(firstMs),
          formatMs(back.medianMs),
          formatMs(back.p95Ms),
          formatMs(lot.medianMs),
          formatMs(lot.p95Ms),
          formatMs(balance.p95Ms),
          back.p95Ms <= SITE_GOALS.traceP95Ms && lot.p95Ms <= SITE_GOALS.traceP95Ms ? "PASS" : "MISS",
        ]);
        clearAnswerCaches();
        memory.sample();
      }
    } finally {
      await db.$disconnect();
    }
    printTable(
      [
        [
          "site",
          "moves",
          "first answers ms",
          "back median",
          "back p95",
          "lot median",
          "lot p95",
          "balance kept p95",
          `trace p95 ≤ ${SITE_GOALS.traceP95Ms} ms`,
        ],
        ...rows,
      ],
      [false, true, true, true, true, true, true, true, false],
    );
    // The same site alone in a database of its own must give the same answers.
    for (const k of aloneChecks) {
      const h = siteHistory(k, years);
      const alone = await createBenchPgDatabase(`site${k}_alone_${process.pid}`);
      try {
        await writeHistoryPostgres(alone.url, h, k);
        const db = await openDb(alone.url);
        try {
          clearAnswerCaches();
          const answers = await answersOf(db, h, new Date(h.endMs + 5 * 86_400_000));
          await flushTraceSnapshots();
          check(
            JSON.stringify(answers) === JSON.stringify(kept.get(k)),
            `site ${k}: its answers in the shared database differ from the same site alone`,
          );
        } finally {
          await db.$disconnect();
          clearAnswerCaches();
        }
      } finally {
        await alone.drop();
      }
    }
  } finally {
    await database.drop();
  }
  console.log(
    `  isolation: every holder and move named by each site's trace answers is the site's own; each quarter balance equals the pure computation over the site's own rows;`,
  );
  console.log(
    `  sites ${aloneChecks.join(" and ")} answered the same (traces and balance, byte for byte) in a database holding that site alone. Checked; a failure stops the run.`,
  );
  console.log(
    "  first answers = the site's first backward trace, lot trace and balance on an empty cache with no stored snapshots (index build included).",
  );
  console.log(
    `  whole section ${((performance.now() - started) / 1000).toFixed(0)} s; peak RSS ${memory.peakMb.toFixed(0)} MB`,
  );
  goals.push([
    `${sites}-site isolation`,
    "no answer names another site's rows; equal to the site alone",
    "checked",
    "PASS",
  ]);
  return { goals, peaks: [[`${sites} sites on PostgreSQL`, memory.peakMb]] };
}
