// npm run load — many people at once against the built app (`next start`) on a fresh demo database.
//   npm run load                     SQLite
//   npm run load -- --pg             PostgreSQL (its own database, created and dropped)
//   npm run load -- --both           both, then the PostgreSQL/SQLite ratio
//   options: --duration=10 (s per run)  --connections=1,10,50  --days=182 (demo length)  --two (PostgreSQL:
//   a second server process on the same database; bookings to one, reads to the other, answers compared)
//   --keep-template (keep the PostgreSQL demo template for the next run; the SQLite one stays in data/)
//   --routes (first each route of the mix and the floor alone, at 1 and 10 connections)
//   --years=10 (any whole N ≥ 1: the synthetic N-year ledger of npm run bench instead of the demo, with the
//   reader, the writer, its tanks and one source added; routes it cannot answer are left out and named)
// Builds nothing; needs an existing `next build`. Goals print PASS/MISS and never change the exit code;
// the run fails only when it cannot measure (no build, no server, a sign-in refused).
import os from "node:os";
import { randomUUID } from "node:crypto";
import { openDb } from "@/lib/core/connect";
import { AppServer, createDemoDatabase, findFreePort, requireBuild } from "@/bench/load-server";
import {
  countOverdraws,
  floorMix,
  readDemoCodes,
  readMix,
  READER_LOGIN,
  WRITER_LOGIN,
  writeMix,
} from "@/bench/load-mix";
import type { DemoCodes, MixRequest } from "@/bench/load-mix";
import { compareServers } from "@/bench/load-two";
import { describeErrors, fetchOnce, measure, pct, signIn } from "@/bench/load-measure";
import type { RunResult } from "@/bench/load-measure";
import { printTable } from "@/bench/measure";
import {
  createHistoryDatabase,
  firstAnswers,
  historyCodes,
  historyHeader,
  historyOf,
  historyReadMix,
} from "@/bench/load-history";

const arg = (name: string, fallback: string) =>
  process.argv.find((a) => a.startsWith(`--${name}=`))?.slice(name.length + 3) ?? fallback;
const DURATION_S = Number(arg("duration", "10"));
const CONNECTIONS = arg("connections", "1,10,50").split(",").map(Number);
const DAYS = Number(arg("days", "182"));
const WANT_PG = process.argv.includes("--pg") || process.argv.includes("--both");
const WANT_SQLITE = !process.argv.includes("--pg") || process.argv.includes("--both");
const WANT_TWO = process.argv.includes("--two");
const KEEP_TEMPLATE = process.argv.includes("--keep-template");
const WANT_ROUTES = process.argv.includes("--routes");
// --years=N: one synthetic history, written into each database measured.
const HISTORY = arg("years", "") === "" ? null : historyOf(Number(arg("years", "")));
// --sections=writes (or floor, read, writes in any combination) runs only those, e.g. under APP_CPU_PROF_DIR.
const SECTIONS = arg("sections", "floor,read,writes").split(",");
const PORTS = { from: Number(process.env.LOAD_PORT_FROM ?? 4170), to: Number(process.env.LOAD_PORT_TO ?? 4199) };

const GOALS = { mixToFloor: 0.5, readP95Ms: 300, writeP95Ms: 500 } as const;

/**
 * Where the bookings draw from: a tank of the run's own (so the demo's tanks never fill) receives 1 kg
 * at a time from the demo's feedstock tanks and lots that accept a trial move (each trial is a booking).
 */
async function findTransfers(
  base: string,
  cookie: string,
  stocked: ReadonlyArray<{ kind: "TANK" | "LOT"; code: string }>,
  port: number,
): Promise<DemoCodes["transfers"]> {
  const post = (path: string, body: unknown) =>
    fetchOnce(`${base}${path}`, {
      method: "POST",
      headers: { "content-type": "application/json", origin: base, cookie, "idempotency-key": randomUUID() },
      body: JSON.stringify(body),
    });
  const sink = `LOAD-${port}`;
  const made = await post("/api/tanks", {
    code: sink,
    name: "Load run receiving tank",
    service: "FEEDSTOCK",
    capacityL: 1_000_000,
  });
  if (!made.ok) throw new Error(`the load run's tank was refused: ${made.status} ${await made.text()}`);
  const found: DemoCodes["transfers"] = [];
  const refusals: string[] = [];
  for (const from of stocked) {
    const r = await post("/api/transfers", {
      fromCode: from.code,
      fromKind: from.kind,
      toTankCode: sink,
      at: new Date(Date.now() - 120_000).toISOString(),
      massKg: 1,
      note: "load run: trial",
    });
    if (r.ok) found.push({ fromKind: from.kind, fromCode: from.code, toTankCode: sink });
    else refusals.push(`${from.kind} ${from.code}: ${r.status} ${(await r.text()).slice(0, 160)}`);
  }
  if (found.length === 0)
    throw new Error(
      `nothing could be moved into the load run's tank, so the write mix cannot run:\n${refusals.join("\n")}`,
    );
  return found;
}

const f0 = (n: number) => (Number.isFinite(n) ? n.toFixed(0) : "–");
const f1 = (n: number) => (Number.isFinite(n) ? n.toFixed(1) : "–");

function printRun(r: RunResult): void {
  console.log(
    `\n-- ${r.section}, ${r.connections} connection${r.connections === 1 ? "" : "s"}: ${f1(r.rps)} req/s, p50 ${f0(r.p50)} ms, p95 ${f0(r.p95)} ms, p99 ${f0(r.p99)} ms, errors ${describeErrors(r)}${r.refused ? `, refused bookings ${r.refused}` : ""}, server peak RSS ${f0(r.peakMb)} MB`,
  );
  printTable(
    [
      ["route", "requests", "req/s", "p50 ms", "p95 ms", "p99 ms", "errors"],
      ...[...r.routes].map(([route, s]) => [
        route,
        String(s.count),
        f1(s.count / r.durationS),
        f0(pct(s.latencies, 50)),
        f0(pct(s.latencies, 95)),
        f0(pct(s.latencies, 99)),
        String(s.errors),
      ]),
    ],
    [false, true, true, true, true, true, true],
  );
}

/** Each route alone, at one connection and at ten: which answers cost what before they queue together. */
async function measureEachRoute(
  server: AppServer,
  routes: readonly MixRequest[],
  cookies: Record<MixRequest["as"], string>,
): Promise<void> {
  const rows: string[][] = [
    [
      "route alone",
      "1 conn req/s",
      "1 conn p50 ms",
      "10 conn req/s",
      "10 conn p50 ms",
      "10 conn p95 ms",
      "peak RSS MB",
    ],
  ];
  for (const m of routes) {
    const one = await measure(m.route, server, [m], cookies, 1, Math.max(3, DURATION_S / 2));
    const ten = await measure(m.route, server, [m], cookies, 10, Math.max(3, DURATION_S / 2));
    rows.push([
      m.route,
      f1(one.rps),
      f0(one.p50),
      f1(ten.rps),
      f0(ten.p50),
      f0(ten.p95),
      f0(Math.max(one.peakMb, ten.peakMb)),
    ]);
  }
  printTable(rows, rows[0]?.map((_, i) => i > 0) ?? []);
}

interface DatabaseSummary {
  kind: string;
  runs: RunResult[];
  overdraws: { before: string; after: string; new: number };
  seedMs: number;
  two: string[];
}

/** The run's fresh database (the demo, or the synthetic history with --years), its header printed. */
async function freshDatabase(kind: "sqlite" | "postgresql", port: number) {
  const what = HISTORY
    ? `synthetic ${HISTORY.years}-year ledger: ${HISTORY.moves.length.toLocaleString("en")} movements`
    : `fresh demo database (${DAYS} days)`;
  console.log(`\n==== ${kind === "sqlite" ? "SQLite" : "PostgreSQL"}: ${what}, next start on port ${port} ====`);
  const made = HISTORY
    ? await createHistoryDatabase(kind, String(port), HISTORY)
    : await createDemoDatabase(kind, String(port), DAYS);
  const took = (made.seedMs / 1000).toFixed(1);
  if (HISTORY) console.log([...historyHeader(HISTORY), `  written into a fresh database in ${took} s`].join("\n"));
  else
    console.log(
      made.seedMs > 0
        ? `  demo loaded into a template in ${took} s; this run uses a copy`
        : "  a copy of the demo template loaded earlier today",
    );
  return made;
}

async function measureDatabase(kind: "sqlite" | "postgresql", taken: Set<number>): Promise<DatabaseSummary> {
  const port = await findFreePort(PORTS.from, PORTS.to, taken);
  taken.add(port);
  const { database, seedMs, dropTemplate } = await freshDatabase(kind, port);
  const servers: AppServer[] = [];
  try {
    const server = await AppServer.start(database.url, port);
    servers.push(server);
    const cookies = {
      reader: await signIn(server.base, READER_LOGIN),
      writer: await signIn(server.base, WRITER_LOGIN),
    };
    const db = await openDb(database.url);
    const found = HISTORY ? historyCodes(HISTORY) : await readDemoCodes(db);
    const codes: DemoCodes = {
      ...found,
      transfers: await findTransfers(server.base, cookies.writer, found.stocked, port),
    };
    const before = await countOverdraws(db);
    console.log(
      `  asking about shipment ${codes.shipment}, lot ${codes.lot}; pickups from ${codes.source}; 1 kg moves from ${codes.transfers.map((x) => x.fromCode).join(", ")}`,
    );
    const reads = HISTORY ? historyReadMix(codes, HISTORY) : readMix(codes);
    if (HISTORY) console.log(await firstAnswers(server, reads, cookies));
    const sections = (
      [
        ["floor", "floor", floorMix(reads)],
        ["read", "read mix", reads],
        ["writes", "10 % writes", writeMix(codes, reads)],
      ] as const
    )
      .filter(([key]) => SECTIONS.includes(key))
      .map(([, name, mix]): [string, MixRequest[]] => [name, mix]);
    // One untimed round so the first timed run does not pay for the first trace index or page compile.
    await measure("warm-up", server, [...reads, ...floorMix(reads)], cookies, 1, 3).catch(() => undefined);
    const runs: RunResult[] = [];
    if (WANT_ROUTES) {
      const floor = floorMix(reads);
      const firstOf = (kind: MixRequest["kind"]) => floor.filter((m) => m.kind === kind).slice(0, 1);
      await measureEachRoute(server, [...reads, ...firstOf("json"), ...firstOf("page")], cookies);
    }
    for (const connections of CONNECTIONS) {
      for (const [section, mix] of sections) {
        const r = await measure(section, server, mix, cookies, connections, DURATION_S);
        printRun(r);
        runs.push(r);
      }
    }
    const after = await countOverdraws(db);
    const two: string[] = [];
    if (kind === "postgresql" && WANT_TWO) {
      const port2 = await findFreePort(PORTS.from, PORTS.to, taken);
      taken.add(port2);
      const second = await AppServer.start(database.url, port2);
      servers.push(second);
      // On a long history the second process's first trace outlasts the short warm-up compareServers gives it.
      if (HISTORY) console.log(await firstAnswers(second, reads, cookies, "the second process"));
      two.push(...(await compareServers(server, second, codes, DURATION_S, reads)));
    }
    await db.$disconnect();
    const fmt = (o: { negative: number; mismatched: number }) =>
      `${o.negative} below zero, ${o.mismatched} not equal to their movements`;
    return {
      kind,
      runs,
      seedMs,
      overdraws: {
        before: fmt(before),
        after: fmt(after),
        new: after.negative - before.negative + (after.mismatched - before.mismatched),
      },
      two,
    };
  } finally {
    for (const s of servers) await s.stop();
    await database.drop();
    // PostgreSQL templates go with the run unless asked to keep them; the SQLite template stays in data/.
    if (kind === "postgresql" && !KEEP_TEMPLATE) await dropTemplate();
  }
}

function summarise(all: DatabaseSummary[]): void {
  console.log("\n==== Summary ====");
  const rows: string[][] = [
    [
      "database",
      "connections",
      "floor req/s",
      "mix req/s",
      "mix ÷ floor",
      "mix p95 ms",
      "mix errors",
      "10 % writes req/s",
      "writes p95 ms",
      "writes errors",
      "refused bookings",
      "peak RSS MB",
    ],
  ];
  const goals: string[][] = [["goal", "database", "measured", "verdict"]];
  for (const d of all) {
    for (const c of CONNECTIONS) {
      const get = (s: string) => d.runs.find((r) => r.section === s && r.connections === c);
      const floor = get("floor");
      const mix = get("read mix");
      const writes = get("10 % writes");
      if (!floor || !mix || !writes) continue;
      rows.push([
        d.kind,
        String(c),
        f1(floor.rps),
        f1(mix.rps),
        (mix.rps / floor.rps).toFixed(2),
        f0(mix.p95),
        String(mix.errors),
        f1(writes.rps),
        f0(writes.p95),
        String(writes.errors),
        String(writes.refused),
        f0(Math.max(floor.peakMb, mix.peakMb, writes.peakMb)),
      ]);
      if (c === Math.max(...CONNECTIONS)) {
        const v = (ok: boolean) => (ok ? "PASS" : "MISS");
        goals.push([
          `read mix ≥ ${GOALS.mixToFloor} of the floor at ${c}`,
          d.kind,
          (mix.rps / floor.rps).toFixed(2),
          v(mix.rps / floor.rps >= GOALS.mixToFloor),
        ]);
        goals.push([
          `read mix p95 ≤ ${GOALS.readP95Ms} ms at ${c}`,
          d.kind,
          `${f0(mix.p95)} ms`,
          v(mix.p95 <= GOALS.readP95Ms),
        ]);
        goals.push(["read mix 0 errors", d.kind, String(mix.errors), v(mix.errors === 0)]);
        goals.push([
          `10 % writes p95 ≤ ${GOALS.writeP95Ms} ms at ${c}`,
          d.kind,
          `${f0(writes.p95)} ms`,
          v(writes.p95 <= GOALS.writeP95Ms),
        ]);
        goals.push(["0 over-draws after the write runs", d.kind, String(d.overdraws.new), v(d.overdraws.new === 0)]);
      }
    }
    console.log(`  ${d.kind}: books before the runs: ${d.overdraws.before}; after: ${d.overdraws.after}`);
    for (const line of d.two) console.log(`  ${d.kind} two processes: ${line}`);
  }
  printTable(rows, rows[0]?.map((_, i) => i > 0) ?? []);
  const sqlite = all.find((d) => d.kind === "sqlite");
  const pgs = all.find((d) => d.kind === "postgresql");
  if (sqlite && pgs) {
    for (const section of ["floor", "read mix", "10 % writes"]) {
      for (const c of CONNECTIONS) {
        const a = sqlite.runs.find((r) => r.section === section && r.connections === c);
        const b = pgs.runs.find((r) => r.section === section && r.connections === c);
        if (a && b)
          console.log(
            `  PostgreSQL/SQLite, ${section} at ${c}: p95 ${(b.p95 / a.p95).toFixed(2)}×, throughput ${(b.rps / a.rps).toFixed(2)}×`,
          );
        if (a && b && section === "read mix" && c === Math.max(...CONNECTIONS))
          goals.push([
            "PostgreSQL p95 ≤ 2× SQLite (read mix)",
            "both",
            `${(b.p95 / a.p95).toFixed(2)}×`,
            b.p95 <= 2 * a.p95 ? "PASS" : "MISS",
          ]);
      }
    }
  }
  printTable(goals, [false, false, true, false]);
}

requireBuild();
console.log("Tracevat load run");
console.log(
  `  node ${process.version}, ${os.cpus().length} cores (${os.cpus()[0]?.model ?? "unknown CPU"}), load average ${os
    .loadavg()
    .map((l) => l.toFixed(1))
    .join(" ")}`,
);
console.log(
  `  ${DURATION_S} s per run at ${CONNECTIONS.join(", ")} connections; the load generator shares the machine with the server, so figures are a lower bound.`,
);
const taken = new Set<number>();
const summaries: DatabaseSummary[] = [];
if (WANT_SQLITE) summaries.push(await measureDatabase("sqlite", taken));
if (WANT_PG) summaries.push(await measureDatabase("postgresql", taken));
summarise(summaries);
console.log(
  `  load average at the end ${os
    .loadavg()
    .map((l) => l.toFixed(1))
    .join(" ")}`,
);
process.exit(0);
