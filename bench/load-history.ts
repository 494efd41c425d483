// npm run load -- --years=N: the synthetic N-year plant history (bench/plant-history.ts) instead of the
// demo. The history is the ledger only (one site, holders, movements), so the run adds what the app needs
// to be signed in to and asked real questions, each through the app's own insert path: the reader and the
// writer (demo logins and password, hashed as the app hashes them), the generator's six tanks as the app's
// tanks (the transfers draw from them) and the synthetic restaurant R1 as a source (the pickups posted
// name it). Routes whose answer rests on records the ledger lacks are left out and named in the header.
import { deploy } from "@/prisma/migrate";
import { openDb } from "@/lib/core/connect";
import type { Db } from "@/lib/core/connect";
import { hashPassword } from "@/lib/auth/password";
import { insertUser } from "@/lib/site/site.store";
import { insertTank, serviceMaterial } from "@/lib/tank/tank.store";
import { createSource } from "@/lib/source/source.service";
import { DEFAULT_DENSITY_TABLE, densityAt, requireDensityEntry } from "@/lib/quantity/density";
import { PEOPLE } from "@/seeds/names";
import { generatePlantHistory, PLANT_TANKS } from "@/bench/plant-history";
import type { PlantHistory } from "@/bench/plant-history";
import { writeLedgerDatabase } from "@/bench/ledger-database";
import { writeHistoryPostgres } from "@/bench/pg-history";
import { createDatabase } from "@/bench/load-server";
import type { AppServer, LoadDatabase } from "@/bench/load-server";
import { DEMO_PASSWORD, readMix, READER_LOGIN, WRITER_LOGIN } from "@/bench/load-mix";
import type { DemoCodes, MixRequest } from "@/bench/load-mix";
import { fetchOnce } from "@/bench/load-measure";

/** The read-mix routes a synthetic ledger cannot answer for real, and why. */
const LEFT_OUT: Readonly<Record<string, string>> = {
  "page /lots": "the ledger's lots are holders only, with no lot records (material, volume, lab status)",
  "page /waste/due": "its waste containers are holders only, with no container records (stream, start, capacity)",
  "json grid rows (pickups)": "its pickups are holders only, with no pickup records (source, collector, volume)",
};

/** The source the write mix's pickups name: the generator's first restaurant, recorded as the app records one. */
const PICKUP_SOURCE = { code: "R1", material: "USED_COOKING_OIL" } as const;

/** The history's user (written with the ledger as id 1) recorded the bench's own additions. */
const BENCH_USER_ID = 1;

export function historyOf(years: number): PlantHistory {
  if (!Number.isInteger(years) || years < 1) throw new Error(`--years must be a whole number ≥ 1, got ${years}`);
  return generatePlantHistory({ years });
}

function codeOf(h: PlantHistory, holderId: number): string {
  const holder = h.holders[holderId - 1];
  if (holder === undefined || holder.id !== holderId) throw new Error(`the history has no holder ${holderId}`);
  return holder.code;
}

/** The last full month of the history (it ends on a month start). */
export function lastMonthOf(h: PlantHistory): { year: number; month: number } {
  const d = new Date(h.endMs - 86_400_000);
  return { year: d.getUTCFullYear(), month: d.getUTCMonth() + 1 };
}

/**
 * What the run asks about, from the ledger as the bench's probes choose it: the last shipment (backward)
 * and the early certified lot (forward, to the end of the ledger); bookings draw from the feedstock tanks.
 */
export function historyCodes(
  h: PlantHistory,
): Omit<DemoCodes, "transfers"> & { stocked: Array<{ kind: "TANK"; code: string }> } {
  const lastShipment = h.moves[h.probes.lastShipmentMoveId - 1];
  if (lastShipment === undefined) throw new Error("the history has no last shipment");
  const stocked = PLANT_TANKS.filter((t) => t.service === "FEEDSTOCK")
    .map((t) => h.holders.find((x) => x.kind === "TANK" && x.code === t.code))
    .filter((x) => x !== undefined && (h.finalStockG.get(x.id) ?? 0) >= 1_000_000)
    .map((x) => ({ kind: "TANK" as const, code: x?.code ?? "" }));
  return {
    shipment: codeOf(h, lastShipment.toHolderId),
    lot: codeOf(h, h.probes.earlyLotHolderId),
    source: PICKUP_SOURCE.code,
    material: PICKUP_SOURCE.material,
    stocked,
  };
}

/** The read mix without the routes left out, the balance asked for the history's last full month. */
export function historyReadMix(codes: DemoCodes, h: PlantHistory): MixRequest[] {
  const { year, month } = lastMonthOf(h);
  return readMix(codes)
    .filter((m) => LEFT_OUT[m.route] === undefined)
    .map((m) =>
      m.path.startsWith("/api/balance")
        ? {
            ...m,
            route: "json balance (last month of the history)",
            path: `/api/balance?period=MONTH&year=${year}&month=${month}`,
          }
        : m,
    );
}

/** The header lines: which history, what was added to it, and what the mix leaves out and why. */
export function historyHeader(h: PlantHistory): string[] {
  const { year, month } = lastMonthOf(h);
  return [
    `  synthetic ${h.years}-year ledger: ${h.moves.length.toLocaleString("en")} movements, ${h.holders.length.toLocaleString("en")} holders (${h.counts.lots.toLocaleString("en")} lots, ${h.counts.shipments.toLocaleString("en")} shipments), ${new Date(h.startMs).toISOString().slice(0, 10)} to ${new Date(h.endMs).toISOString().slice(0, 10)}`,
    `  added for the run: users ${READER_LOGIN} and ${WRITER_LOGIN}, the tanks ${PLANT_TANKS.map((t) => t.code).join(", ")} as tank records, source ${PICKUP_SOURCE.code}`,
    `  the balance is asked for ${year}-${String(month).padStart(2, "0")}, the history's last full month; page / shows its tanks and periods, and no lab, batch or waste work (none is recorded)`,
    ...Object.entries(LEFT_OUT).map(([route, why]) => `  left out of the mixes: ${route}, because ${why}`),
    "  the 10 % writes move 1 kg from the feedstock tanks only (the ledger's lots have no lab acceptance to draw on)",
  ];
}

async function addUsers(db: Db, siteId: number): Promise<void> {
  const passwordHash = await hashPassword(DEMO_PASSWORD);
  for (const login of [READER_LOGIN, WRITER_LOGIN]) {
    const p = PEOPLE.find((x) => x.login === login);
    if (p === undefined) throw new Error(`no demo person ${login}`);
    await insertUser(db, { siteId, login, fullName: p.fullName, role: p.role, passwordHash });
  }
}

/** The generator's tanks as tank records on their existing holders; capacity the generator's tonnes at the service's density at 15 °C. */
async function addTanks(db: Db, h: PlantHistory): Promise<void> {
  await db.$transaction(async (tx) => {
    for (const t of PLANT_TANKS) {
      const holder = h.holders.find((x) => x.kind === "TANK" && x.code === t.code);
      if (holder === undefined) throw new Error(`the history has no tank ${t.code}`);
      const rho = densityAt(requireDensityEntry(DEFAULT_DENSITY_TABLE, serviceMaterial(t.service)), 15);
      await insertTank(tx, {
        siteId: h.siteId,
        holderId: holder.id,
        code: t.code,
        name: `${t.code} (synthetic plant)`,
        service: t.service,
        capacityMl: Math.ceil(((t.capacityT * 1_000_000) / rho) * 1000),
        mixing: holder.mixing,
        strappingJson: "",
      });
    }
  });
}

async function addSource(db: Db, siteId: number): Promise<void> {
  const made = await createSource(
    db,
    { siteId, userId: BENCH_USER_ID, now: new Date() },
    {
      code: PICKUP_SOURCE.code,
      name: "Restaurant R1 (synthetic plant)",
      kind: "RESTAURANT",
      materials: [PICKUP_SOURCE.material],
    },
  );
  if (!made.ok) throw new Error(`source ${PICKUP_SOURCE.code} refused: ${JSON.stringify(made.issues)}`);
}

/**
 * A fresh database (data/load-<tag>.db, or the PostgreSQL database tracevat_load_<tag>, dropped by the
 * caller) holding the history and the records added for the run; returns how long writing took.
 */
export async function createHistoryDatabase(
  kind: "sqlite" | "postgresql",
  tag: string,
  h: PlantHistory,
): Promise<{ database: LoadDatabase; seedMs: number; dropTemplate: () => Promise<void> }> {
  const t0 = performance.now();
  const database = await createDatabase(kind, tag);
  try {
    if (kind === "sqlite") await writeLedgerDatabase(h, database.url.slice("file:".length));
    else {
      await deploy(database.url);
      await writeHistoryPostgres(database.url, h, BENCH_USER_ID);
    }
    const db = await openDb(database.url);
    try {
      await addUsers(db, h.siteId);
      await addTanks(db, h);
      await addSource(db, h.siteId);
    } finally {
      await db.$disconnect();
    }
  } catch (e) {
    await database.drop();
    throw e;
  }
  return { database, seedMs: performance.now() - t0, dropTemplate: () => Promise.resolve() };
}

/**
 * Each read route once, in order, before anything is timed: what a restarted server's first questions on
 * this history cost (the first one reads the ledger and builds the trace index). Returns a printable line.
 */
export async function firstAnswers(
  server: AppServer,
  reads: readonly MixRequest[],
  cookies: Record<MixRequest["as"], string>,
  who = "the server",
): Promise<string> {
  const parts: string[] = [];
  for (const m of reads) {
    const t0 = performance.now();
    const r = await fetchOnce(`${server.base}${m.path}`, {
      headers: { cookie: cookies[m.as], accept: m.kind === "page" ? "text/html" : "application/json" },
    });
    await r.arrayBuffer();
    if (!r.ok) throw new Error(`${m.route} answered ${r.status} on the history: the run cannot measure it`);
    parts.push(`${m.route} ${((performance.now() - t0) / 1000).toFixed(2)} s`);
  }
  return `  first answers after ${who} started, one each in order: ${parts.join("; ")}`;
}
