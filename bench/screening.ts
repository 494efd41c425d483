// Source checks benchmark (issue 17): every signal over every source for a full period of 10 years of
// synthetic history — the pure part of a period check from the queue page (the database read is the
// pickups and lots tables in time order, measured by the floor figures above).
import { formatMs, formatRuns, measureSync, MemoryWatch, printTable } from "@/bench/measure";
import { createRandom } from "@/bench/seeded-random";
import { monthlyVolumes } from "@/lib/screening/screening";
import type { LotFact, PickupFact, SourceFacts } from "@/lib/screening/screening";
import { DEFAULT_SCREENING_SETTINGS } from "@/lib/screening/screening-defaults";
import { indexKindMonths, peersOf, screenSource } from "@/lib/screening/screen-source";

const GOAL_MS = 2_000; // our own goal: a period check answers within a page load
const DAY = 86_400_000;

function syntheticSources(years: number, endMs: number): SourceFacts[] {
  const rand = createRandom(1717);
  const start = endMs - years * 365.2425 * DAY;
  const sources: SourceFacts[] = [];
  const kinds = [
    ...Array<string>(40).fill("RESTAURANT"),
    ...Array<string>(10).fill("FOOD_PROCESSOR"),
    ...Array<string>(6).fill("DROP_OFF"),
  ];
  kinds.forEach((kind, i) => {
    const every = kind === "RESTAURANT" ? 1 + (i % 4) : kind === "FOOD_PROCESSOR" ? 7 : 14;
    const litres = kind === "RESTAURANT" ? 90 + (i % 7) * 45 : kind === "FOOD_PROCESSOR" ? 1500 : 600;
    const pickups: PickupFact[] = [];
    const lots: LotFact[] = [];
    for (let t = start + rand.between(0, every) * DAY; t < endMs; t += (every + (rand.next() < 0.15 ? 1 : 0)) * DAY) {
      const d = new Date(t);
      const month = `${d.getUTCFullYear()}-${String(d.getUTCMonth() + 1).padStart(2, "0")}`;
      const code = `PU-${i}-${pickups.length}`;
      const lotCode = kind === "RESTAURANT" ? null : `L-${i}-${lots.length}`;
      pickups.push({
        code,
        at: t,
        month,
        monthLabel: month,
        localHour: 7 + rand.between(0, 8),
        litres: litres * rand.between(0.6, 1.25),
        lotCode,
        distanceBand: rand.next() < 0.5 ? "NEAR" : null,
        certified: i % 3 !== 2,
      });
      if (lotCode !== null)
        lots.push({
          code: lotCode,
          at: t,
          material: "USED_COOKING_OIL",
          acidValue: rand.between(1.6, 11),
          waterPct: rand.between(0.05, 1.2),
          insolublesPct: rand.between(0.05, 0.4),
          densityKgM3: 915,
          densityMeasured: false,
        });
    }
    sources.push({
      code: `S${i}`,
      kind,
      capacity: {
        basis: "MONTHLY",
        fryers: null,
        fryerLitres: null,
        changesPerWeek: null,
        declaredLitresPerMonth: litres * 30,
      },
      opensHour: 6,
      closesHour: 23,
      certificateNo: `C-${i}`,
      certificateExpires: endMs + 90 * DAY,
      pickups,
      lots,
    });
  });
  return sources;
}

/** Screens every source as runScreen does: monthly volumes per source, peers of the same kind, all signals. */
function screenAll(sources: readonly SourceFacts[], now: number): number {
  const index = indexKindMonths(
    sources.map((s) => ({ code: s.code, kind: s.kind, months: monthlyVolumes(s.pickups) })),
  );
  let flags = 0;
  for (const s of sources)
    flags += screenSource(s, {
      settings: DEFAULT_SCREENING_SETTINGS,
      now,
      peerLitres: peersOf(index, s.kind, s.code),
      kindLabel: s.kind,
    }).length;
  return flags;
}

export function runScreeningBench(): Array<[string, string, string, string]> {
  console.log("\n== Source checks: every signal over every source, full period (pure, synthetic) ==");
  const memory = new MemoryWatch();
  const endMs = Date.UTC(2026, 11, 1);
  const rows: string[][] = [];
  const goals: Array<[string, string, string, string]> = [];
  for (const years of [1, 10]) {
    const sources = syntheticSources(years, endMs);
    const pickups = sources.reduce((a, s) => a + s.pickups.length, 0);
    const lots = sources.reduce((a, s) => a + s.lots.length, 0);
    let flags = 0;
    const t = measureSync(
      () => {
        flags = screenAll(sources, endMs);
      },
      { runs: 5, warmup: true, slowMs: 5_000, slowRuns: 3 },
      memory,
    );
    rows.push([
      `${years} y`,
      String(sources.length),
      String(pickups),
      String(lots),
      String(flags),
      formatRuns(t),
      formatMs(t.medianMs),
      formatMs(t.p95Ms),
    ]);
    if (years === 10)
      goals.push([
        `period check ≤ ${GOAL_MS} ms at 10y (our own goal)`,
        `${sources.length} sources, ${pickups} pickups, ${lots} lots`,
        `${formatMs(t.medianMs)} ms median`,
        t.medianMs <= GOAL_MS ? "PASS" : "MISS",
      ]);
  }
  printTable(
    [["history", "sources", "pickups", "lots", "flags", "runs", "median ms", "p95 ms"], ...rows],
    [false, true, true, true, true, true, true, true],
  );
  console.log(`  peak RSS sampled: ${memory.peakMb.toFixed(0)} MB`);
  return goals;
}
